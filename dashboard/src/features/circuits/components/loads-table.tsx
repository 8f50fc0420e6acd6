import { useState } from 'react';
import { Link } from 'react-router';
import { Badge } from '../../../components/ui/badge';
import { Button } from '../../../components/ui/button';
import { ConfirmDialog } from '../../../components/ui/dialog';
import { EmptyState, ErrorState } from '../../../components/ui/states';
import { formatValue } from '../../../lib/format';
import { connectionLabels } from '../../../lib/labels';
import { paths } from '../../../lib/paths';
import type { HeadroomCheck } from '../api/check';
import { useDeleteLoad, type Load } from '../api/loads';
import { LoadFormDialog } from './load-form';

const runningSourceLabels: Record<string, string> = {
  trace: 'from trace',
  'nameplate-amps': 'nameplate A',
  'nameplate-watts': 'nameplate W',
  'motor-table-430.248': 'NEC Table 430.248',
};

function nameplate(load: Load): string {
  const parts = [];
  if (load.nameplateA !== null) parts.push(formatValue(load.nameplateA, 'A', 1));
  if (load.nameplateW !== null) parts.push(formatValue(load.nameplateW, 'W', 0));
  if (load.motorHp !== null)
    parts.push(`${load.motorHp} hp${load.lockedRotorCode ? ` code ${load.lockedRotorCode}` : ''}`);
  return parts.join(' · ') || '—';
}

/** The loads on a circuit with what the check made of each (running and start-up current, and from where). */
export function LoadsTable({
  circuitId,
  loads,
  check,
  canEdit,
}: {
  circuitId: string;
  loads: Load[];
  check: HeadroomCheck | undefined;
  canEdit: boolean;
}) {
  const [editing, setEditing] = useState<Load | 'new' | null>(null);
  const [deleting, setDeleting] = useState<Load | null>(null);
  const remove = useDeleteLoad();
  const checked = new Map(check?.loads.filter((l) => l.loadId).map((l) => [l.loadId, l]));
  return (
    <div className="space-y-3">
      {canEdit ? (
        <div className="flex justify-end">
          <Button onClick={() => setEditing('new')}>Add load</Button>
        </div>
      ) : null}
      {loads.length === 0 ? (
        <EmptyState title="No loads on this circuit yet">
          Add the equipment it feeds, by nameplate or with a recorded trace.
        </EmptyState>
      ) : (
        <div className="overflow-x-auto rounded-xl border border-ink-100 bg-white shadow-sm">
          <table className="w-full text-left text-sm">
            <caption className="sr-only">Loads on this circuit</caption>
            <thead className="bg-ink-100 text-xs uppercase tracking-wider text-ink-700">
              <tr>
                <th scope="col" className="px-3 py-2">
                  Load
                </th>
                <th scope="col" className="px-3 py-2">
                  Nameplate
                </th>
                <th scope="col" className="px-3 py-2">
                  Connection
                </th>
                <th scope="col" className="px-3 py-2 text-right">
                  Running
                </th>
                <th scope="col" className="px-3 py-2 text-right">
                  Start-up peak
                </th>
                <th scope="col" className="px-3 py-2">
                  Traces
                </th>
                {canEdit ? (
                  <th scope="col" className="px-3 py-2">
                    <span className="sr-only">Actions</span>
                  </th>
                ) : null}
              </tr>
            </thead>
            <tbody>
              {loads.map((load) => {
                const c = checked.get(load.id);
                return (
                  <tr key={load.id} className="border-t border-ink-100 align-top">
                    <td className="px-3 py-2">
                      <p className="font-medium text-ink-900">{load.name}</p>
                      {load.continuous ? <Badge tone="info">continuous</Badge> : null}
                    </td>
                    <td className="px-3 py-2">{nameplate(load)}</td>
                    <td className="px-3 py-2">{connectionLabels[load.connection] ?? load.connection}</td>
                    <td className="px-3 py-2 text-right">
                      {c ? (
                        <>
                          {formatValue(c.runningA, 'A', 1)}
                          <span className="block text-xs text-ink-500">
                            {runningSourceLabels[c.runningSource] ?? c.runningSource}
                          </span>
                        </>
                      ) : (
                        '–'
                      )}
                    </td>
                    <td className="px-3 py-2 text-right">{c ? formatValue(c.startPeakA, 'A', 1) : '–'}</td>
                    <td className="px-3 py-2">
                      {load.traceIds.length ? (
                        <ul className="space-y-0.5">
                          {load.traceIds.map((id, i) => (
                            <li key={id}>
                              <Link to={paths.trace.href(id)} className="text-ink-800 underline">
                                Trace {i + 1}
                              </Link>
                            </li>
                          ))}
                        </ul>
                      ) : (
                        <span className="text-ink-500">none</span>
                      )}
                    </td>
                    {canEdit ? (
                      <td className="whitespace-nowrap px-3 py-2 text-right">
                        <Button
                          variant="ghost"
                          className="px-2 py-1"
                          onClick={() => setEditing(load)}
                          aria-label={`Edit ${load.name}`}
                        >
                          Edit
                        </Button>
                        <Button
                          variant="ghost"
                          className="px-2 py-1 text-verdict-over"
                          onClick={() => setDeleting(load)}
                          aria-label={`Delete ${load.name}`}
                        >
                          Delete
                        </Button>
                      </td>
                    ) : null}
                  </tr>
                );
              })}
            </tbody>
          </table>
        </div>
      )}
      {editing ? (
        <LoadFormDialog
          open
          circuitId={circuitId}
          {...(editing === 'new' ? {} : { load: editing })}
          onClose={() => setEditing(null)}
        />
      ) : null}
      <ConfirmDialog
        open={deleting !== null}
        title={`Delete ${deleting?.name ?? 'load'}?`}
        confirmLabel="Delete load"
        busy={remove.isPending}
        onCancel={() => setDeleting(null)}
        onConfirm={() => deleting && remove.mutate(deleting.id, { onSuccess: () => setDeleting(null) })}
      >
        <p>The load leaves this circuit and its check. Its traces are kept.</p>
        {remove.isError ? <ErrorState error={remove.error} /> : null}
      </ConfirmDialog>
    </div>
  );
}
