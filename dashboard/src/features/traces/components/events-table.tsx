import { useState } from 'react';
import { EmptyState } from '../../../components/ui/states';
import { formatClockMs, formatDuration, formatValue } from '../../../lib/format';
import { TableFrame } from '../../../components/ui/table';

/** One inrush or surge as a row (times epoch ms, durations s). */
export interface TraceEventRow {
  id: string;
  kind: 'inrush' | 'surge';
  label: string;
  startAt: number;
  endAt: number;
  peakAt: number;
  peakA: number;
  /** Running current after an inrush, or the running level a surge rose from. */
  baseA: number;
  durationS: number;
  /** Inrush only: time until back within tolerance of the running current, s. */
  settleTimeS: number | null;
  i2tA2s: number;
}

/**
 * The events found in the trace. Each row is a button-like row: Enter, Space or a click zooms the chart to it.
 */
export function EventsTable({
  events,
  selectedId,
  onSelect,
}: {
  events: TraceEventRow[];
  selectedId: string | null;
  onSelect: (e: TraceEventRow) => void;
}) {
  const [kind, setKind] = useState<'all' | 'inrush' | 'surge'>('all');
  const shown = events.filter((e) => kind === 'all' || e.kind === kind);
  const counts = {
    inrush: events.filter((e) => e.kind === 'inrush').length,
    surge: events.filter((e) => e.kind === 'surge').length,
  };
  return (
    <div className="space-y-3">
      <div className="flex flex-wrap items-center gap-2" role="group" aria-label="Show events">
        {(['all', 'inrush', 'surge'] as const).map((k) => (
          <button
            key={k}
            type="button"
            aria-pressed={kind === k}
            onClick={() => setKind(k)}
            className={`rounded-full px-3 py-1 text-xs font-medium ring-1 ring-inset ${kind === k ? 'bg-ink-800 text-white ring-ink-800' : 'bg-white text-ink-800 ring-ink-300 hover:bg-ink-50'}`}
          >
            {k === 'all'
              ? `All (${events.length})`
              : k === 'inrush'
                ? `Inrush (${counts.inrush})`
                : `Surges (${counts.surge})`}
          </button>
        ))}
        <span className="text-xs text-ink-500">Select a row to zoom the chart to it.</span>
      </div>
      {shown.length === 0 ? (
        <EmptyState title={events.length === 0 ? 'No inrush or surge found in this trace' : 'None of this kind'}>
          {events.length === 0
            ? 'Events are found when the trace is closed, or with the detection settings of a re-analysis.'
            : null}
        </EmptyState>
      ) : (
        <TableFrame
          caption="Inrush events and surges"
          columns={[
            { label: 'Event' },
            { label: 'Starts' },
            { label: 'Peak', align: 'right' },
            { label: 'Running', align: 'right' },
            { label: 'Peak ÷ running', align: 'right' },
            { label: 'Duration', align: 'right' },
            { label: 'I²t', align: 'right' },
          ]}
          testId="events-table"
          scroll
        >
          {shown.map((e) => {
            const selected = e.id === selectedId;
            return (
              <tr
                key={e.id}
                onClick={() => onSelect(e)}
                className={`cursor-pointer border-t border-ink-100 ${selected ? 'bg-amber-50' : 'hover:bg-ink-50'}`}
                data-testid="event-row"
              >
                <td className="px-3 py-2">
                  <button
                    type="button"
                    aria-pressed={selected}
                    aria-label={`Zoom the chart to ${e.label}`}
                    onClick={(ev) => {
                      ev.stopPropagation();
                      onSelect(e);
                    }}
                    className="text-left font-medium text-ink-900 underline decoration-ink-300 underline-offset-2 hover:decoration-ink-800"
                  >
                    <span aria-hidden className={e.kind === 'inrush' ? 'text-verdict-dedicated' : 'text-[#7b4fb0]'}>
                      ▲{' '}
                    </span>
                    {e.label}
                  </button>
                </td>
                <td className="px-3 py-2 tabular-nums">{formatClockMs(e.startAt)}</td>
                <td className="px-3 py-2 text-right tabular-nums">{formatValue(e.peakA, 'A', 1)}</td>
                <td className="px-3 py-2 text-right tabular-nums">{formatValue(e.baseA, 'A', 1)}</td>
                <td className="px-3 py-2 text-right tabular-nums">
                  {e.baseA > 0 ? `${formatValue(e.peakA / e.baseA, '', 1)} ×` : '–'}
                </td>
                <td className="px-3 py-2 text-right tabular-nums">{formatDuration(e.settleTimeS ?? e.durationS)}</td>
                <td className="px-3 py-2 text-right tabular-nums">{formatValue(e.i2tA2s, 'A²s', 0)}</td>
              </tr>
            );
          })}
        </TableFrame>
      )}
    </div>
  );
}
