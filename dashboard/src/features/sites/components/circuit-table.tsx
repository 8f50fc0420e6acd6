import { EmptyState, ErrorState, LoadingState } from '../../../components/ui/states';
import { useSiteCircuits } from '../api/sites';

const deviceLabels: Record<string, string> = {
  'iec-b': 'IEC 60898-1 curve B',
  'iec-c': 'IEC 60898-1 curve C',
  'iec-d': 'IEC 60898-1 curve D',
  'na-thermal-magnetic': 'Thermal-magnetic (UL 489)',
  fuse: 'Fuse',
};

export function CircuitTable({ siteId }: { siteId: string }) {
  const circuits = useSiteCircuits(siteId);
  if (circuits.isPending) return <LoadingState label="Loading circuits…" />;
  if (circuits.isError) return <ErrorState error={circuits.error} onRetry={() => void circuits.refetch()} />;
  if (circuits.data.items.length === 0) return <EmptyState title="No circuits at this site yet" />;
  return (
    <div className="overflow-x-auto rounded-lg border border-ink-100 bg-white">
      <table className="w-full text-left text-sm">
        <caption className="sr-only">Circuits</caption>
        <thead className="bg-ink-100 text-xs uppercase tracking-wider text-ink-700">
          <tr>
            <th scope="col" className="px-4 py-2">Circuit</th>
            <th scope="col" className="px-4 py-2">Supply</th>
            <th scope="col" className="px-4 py-2">Device</th>
            <th scope="col" className="px-4 py-2">Conductor</th>
            <th scope="col" className="px-4 py-2 text-right">Loads</th>
          </tr>
        </thead>
        <tbody>
          {circuits.data.items.map((c) => (
            <tr key={c.id} className="border-t border-ink-100">
              <td className="px-4 py-2 font-medium text-ink-900">{c.label}</td>
              <td className="px-4 py-2">{c.nominalVoltageV} V, {c.mainsHz} Hz</td>
              <td className="px-4 py-2">{c.deviceRatingA} A · {deviceLabels[c.deviceKind] ?? c.deviceKind}</td>
              <td className="px-4 py-2">{[c.conductorSize, c.conductorMaterial?.toUpperCase()].filter(Boolean).join(' ') || '—'}</td>
              <td className="px-4 py-2 text-right">{c.loadCount}</td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}
