import { Link } from 'react-router';
import { Badge } from '../../../components/ui/badge';
import { formatDateTime, formatDuration, formatValue } from '../../../lib/format';
import { paths } from '../../../lib/paths';
import type { Trace, TraceSort } from '../api/traces';

type SortKey = 'name' | 'startTime' | 'createdAt';

function SortHeader({
  label,
  field,
  sort,
  onSort,
}: {
  label: string;
  field: SortKey;
  sort: TraceSort;
  onSort: (s: TraceSort) => void;
}) {
  const active = sort === field || sort === `-${field}`;
  const descending = sort === `-${field}`;
  const next: TraceSort = active && !descending ? `-${field}` : field;
  return (
    <th scope="col" className="px-3 py-2" aria-sort={active ? (descending ? 'descending' : 'ascending') : 'none'}>
      <button
        type="button"
        onClick={() => onSort(next)}
        className="inline-flex items-center gap-1 uppercase tracking-wider hover:text-ink-950"
      >
        {label}
        <span aria-hidden className={active ? 'text-ink-900' : 'text-ink-300'}>
          {active ? (descending ? '▼' : '▲') : '↕'}
        </span>
      </button>
    </th>
  );
}


/** The traces of one page, with sortable columns. */
export function TracesTable({
  traces,
  sort,
  onSort,
}: {
  traces: Trace[];
  sort: TraceSort;
  onSort: (s: TraceSort) => void;
}) {
  return (
    <div className="overflow-x-auto rounded-xl border border-ink-100 bg-white shadow-sm">
      <table className="w-full text-left text-sm" data-testid="traces-table">
        <caption className="sr-only">Traces</caption>
        <thead className="bg-ink-100 text-xs text-ink-700">
          <tr>
            <SortHeader label="Name" field="name" sort={sort} onSort={onSort} />
            <th scope="col" className="px-3 py-2 uppercase tracking-wider">
              Kind
            </th>
            <th scope="col" className="px-3 py-2 uppercase tracking-wider">
              Status
            </th>
            <SortHeader label="Recorded" field="startTime" sort={sort} onSort={onSort} />
            <th scope="col" className="px-3 py-2 text-right uppercase tracking-wider">
              Duration
            </th>
            <th scope="col" className="px-3 py-2 text-right uppercase tracking-wider">
              Max
            </th>
            <th scope="col" className="px-3 py-2 text-right uppercase tracking-wider">
              Samples
            </th>
            <SortHeader label="Added" field="createdAt" sort={sort} onSort={onSort} />
          </tr>
        </thead>
        <tbody>
          {traces.map((t) => (
            <tr key={t.id} className="border-t border-ink-100 hover:bg-ink-50">
              <td className="px-3 py-2">
                <Link
                  to={paths.trace.href(t.id)}
                  className="font-medium text-ink-900 underline decoration-ink-300 underline-offset-2 hover:decoration-ink-800"
                >
                  {t.name}
                </Link>
                {t.tags.length ? <p className="mt-0.5 text-xs text-ink-500">{t.tags.join(' · ')}</p> : null}
              </td>
              <td className="px-3 py-2">{t.kind === 'rms' ? 'RMS' : 'Waveform'}</td>
              <td className="px-3 py-2">
                <Badge tone={t.status === 'open' ? 'tight' : 'neutral'}>{t.status}</Badge>
              </td>
              <td className="whitespace-nowrap px-3 py-2">{formatDateTime(t.firstSampleTime ?? t.startTime, true)}</td>
              <td className="px-3 py-2 text-right tabular-nums">{formatDuration(t.summary?.durationS ?? null)}</td>
              <td className="px-3 py-2 text-right tabular-nums">{formatValue(t.summary?.maxA ?? null, 'A', 1)}</td>
              <td className="px-3 py-2 text-right tabular-nums">{t.sampleCount.toLocaleString()}</td>
              <td className="whitespace-nowrap px-3 py-2 text-ink-700">{formatDateTime(t.createdAt, true)}</td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}
