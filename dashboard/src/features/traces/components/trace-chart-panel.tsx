import { useMemo, useState } from 'react';
import { EnvelopeChart, type ChartEvent, type ChartLimit } from '../../../components/charts/envelope-chart';
import type { EnvelopeSeries, TimeWindow } from '../../../components/charts/envelope';
import { EmptyState, ErrorState } from '../../../components/ui/states';
import type { UseQueryResult } from '@tanstack/react-query';
import type { TraceSeries } from '../api/trace-data';
import type { Trace } from '../api/traces';
import type { TraceEventRow } from './events-table';
import { envelopeOf, type EnvelopeMode } from '../utils/envelope-of';

type Mode = EnvelopeMode;

/** Drawn while the envelope is on its way: the chart's frame without points. */
const NO_ENVELOPE: EnvelopeSeries = { t: [], min: [], max: [], mean: [] };

/**
 * The trace's chart: draws the envelope of the visible window (the page fetches a finer one after every
 * zoom or pan) with the events and the circuit's limits. Waveform traces can switch between the half-cycle
 * RMS series and the instantaneous values.
 */
export function TraceChartPanel({
  trace,
  series,
  window,
  onWindowChange,
  events,
  selectedEventId,
  onEventSelect,
  limits,
}: {
  trace: Trace;
  /** The envelope query, started by the page together with the trace's (not after it). */
  series: UseQueryResult<TraceSeries>;
  window: TimeWindow | null;
  onWindowChange: (w: TimeWindow | null) => void;
  events: TraceEventRow[];
  selectedEventId: string | null;
  onEventSelect: (id: string) => void;
  limits: ChartLimit[];
}) {
  const [mode, setMode] = useState<Mode>(trace.kind === 'waveform' ? 'rms' : 'instantaneous');
  const bounds = useMemo<TimeWindow | null>(
    () =>
      trace.firstSampleTime !== null && trace.lastSampleTime !== null
        ? { from: trace.firstSampleTime, to: Math.max(trace.lastSampleTime, trace.firstSampleTime + 1) }
        : null,
    [trace.firstSampleTime, trace.lastSampleTime],
  );
  const chartEvents = useMemo<ChartEvent[]>(
    () =>
      events.map((e) => ({
        id: e.id,
        kind: e.kind,
        startMs: e.startAt,
        endMs: e.endAt,
        peakAtMs: e.peakAt,
        peakA: e.peakA,
        label: e.label,
      })),
    [events],
  );
  const hasRms = Boolean(series.data?.rms);
  // Until the envelope arrives, the chosen mode stands (a closed waveform trace has its RMS series).
  const effectiveMode: Mode = series.data && mode === 'rms' && !hasRms ? 'instantaneous' : mode;
  const envelope = useMemo(
    () => (series.data ? envelopeOf(series.data, effectiveMode) : NO_ENVELOPE),
    [series.data, effectiveMode],
  );

  if (trace.sampleCount === 0 || !bounds)
    return (
      <EmptyState title="No samples yet">Samples appear here as soon as a device or an upload sends them.</EmptyState>
    );
  if (series.isError) return <ErrorState error={series.error} onRetry={() => void series.refetch()} />;

  return (
    <div className="space-y-2">
      {trace.kind === 'waveform' && series.data ? (
        <div className="flex items-center gap-2 text-sm" role="group" aria-label="Values shown">
          {(['rms', 'instantaneous'] as const).map((m) => (
            <button
              key={m}
              type="button"
              aria-pressed={effectiveMode === m}
              disabled={m === 'rms' && !hasRms}
              onClick={() => setMode(m)}
              className={`rounded-full px-3 py-1 text-xs font-medium ring-1 ring-inset disabled:opacity-50 ${effectiveMode === m ? 'bg-ink-800 text-white ring-ink-800' : 'bg-white text-ink-800 ring-ink-300'}`}
            >
              {m === 'rms' ? 'Half-cycle RMS' : 'Instantaneous'}
            </button>
          ))}
          {!hasRms ? <span className="text-xs text-ink-500">RMS series available once the trace is closed</span> : null}
        </div>
      ) : null}
      <EnvelopeChart
        name="trace"
        envelope={envelope}
        bounds={bounds}
        window={window}
        onWindowChange={onWindowChange}
        events={chartEvents}
        selectedEventId={selectedEventId}
        onEventSelect={onEventSelect}
        limits={limits}
        signed={effectiveMode === 'instantaneous' && trace.kind === 'waveform'}
        yLabel={effectiveMode === 'rms' && trace.kind === 'waveform' ? 'Current, half-cycle RMS (A)' : 'Current (A)'}
        busy={series.isFetching}
        waiting={series.isPending}
      />
      {series.data ? (
        <p className="text-xs text-ink-500">
          {series.data.sampleCount.toLocaleString()} samples in view, drawn as {series.data.t.length.toLocaleString()}{' '}
          buckets, each with its minimum, maximum and mean, so no peak is lost between points.
        </p>
      ) : null}
    </div>
  );
}
