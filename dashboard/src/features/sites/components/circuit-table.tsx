import { Link } from 'react-router';
import { Badge } from '../../../components/ui/badge';
import { EmptyState, ErrorState, LoadingState } from '../../../components/ui/states';
import { deviceKindLabel } from '../../../lib/labels';
import { paths } from '../../../lib/paths';
import { useSiteCircuits } from '../api/sites';
import { TableFrame } from '../../../components/ui/table';

export function CircuitTable({ siteId }: { siteId: string }) {
  const circuits = useSiteCircuits(siteId);
  if (circuits.isPending) return <LoadingState label="Loading circuits…" />;
  if (circuits.isError) return <ErrorState error={circuits.error} onRetry={() => void circuits.refetch()} />;
  if (circuits.data.items.length === 0) return <EmptyState title="No circuits at this site yet" />;
  return (
    <TableFrame
      caption="Circuits"
      columns={[
        { label: 'Circuit' },
        { label: 'Supply' },
        { label: 'Device' },
        { label: 'Conductor' },
        { label: 'Loads', align: 'right' },
      ]}
    >
      {circuits.data.items.map((c) => (
        <tr key={c.id} className="border-t border-ink-100 hover:bg-ink-50">
          <td className="px-4 py-2 font-medium text-ink-900">
            <Link
              to={paths.circuit.href(c.id)}
              className="text-ink-800 underline decoration-ink-300 underline-offset-2 hover:decoration-ink-800"
            >
              {c.label}
            </Link>
            {c.warnings.length ? (
              <span className="ml-2">
                <Badge tone="tight">
                  {c.warnings.length} warning{c.warnings.length === 1 ? '' : 's'}
                </Badge>
              </span>
            ) : null}
          </td>
          <td className="px-4 py-2">
            {c.nominalVoltageV} V, {c.mainsHz} Hz
          </td>
          <td className="px-4 py-2">
            {c.deviceRatingA} A · {deviceKindLabel(c.deviceKind)}
          </td>
          <td className="px-4 py-2">
            {[c.conductorSize, c.conductorMaterial?.toUpperCase()].filter(Boolean).join(' ') || '—'}
          </td>
          <td className="px-4 py-2 text-right">{c.loadCount}</td>
        </tr>
      ))}
    </TableFrame>
  );
}
