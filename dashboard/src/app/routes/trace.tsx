import { useCallback, useMemo, useState } from 'react';
import { Link, useNavigate, useParams, useSearchParams } from 'react-router';
import type { ChartLimit } from '../../components/charts/envelope-chart';
import { paddedWindow, type TimeWindow } from '../../components/charts/envelope';
import { Badge } from '../../components/ui/badge';
import { Button } from '../../components/ui/button';
import { ConfirmDialog } from '../../components/ui/dialog';
import { PageHeader, Panel } from '../../components/ui/page-header';
import { ErrorState, LoadingState } from '../../components/ui/states';
import {
  CHART_POINTS,
  onThresholdOf,
  useTraceEvents,
  useTraceSeries,
  useTraceStats,
  windowFromSearch,
} from '../../features/traces/api/trace-data';
import {
  useCloseTrace,
  useDeleteTrace,
  useDownloadSamples,
  useTrace,
  useTraceCircuit,
  type Trace,
} from '../../features/traces/api/traces';
import { EventsTable, type TraceEventRow } from '../../features/traces/components/events-table';
import { FiguresPanel, type TraceFigures } from '../../features/traces/components/figures-panel';
import { TraceChartPanel } from '../../features/traces/components/trace-chart-panel';
import { TraceEditDialog } from '../../features/traces/components/trace-edit-dialog';
import { eventRows } from '../../features/traces/utils/event-rows';
import { formatDateTime, formatValue, timeZoneLabel } from '../../lib/format';
import { paths } from '../../lib/paths';
import { useAbilities } from '../../lib/session';

/** The zoom window and the selected event live in the address, so a view can be shared and "back" undoes a zoom. */
function useWindowParams() {
  const [params, setParams] = useSearchParams();
  const window: TimeWindow | null = windowFromSearch(params);
  const selectedEventId = params.get('event');
  const setView = useCallback(
    (next: TimeWindow | null, eventId: string | null = null) => {
      setParams(
        (prev) => {
          const p = new URLSearchParams(prev);
          if (next) {
            p.set('from', String(Math.round(next.from)));
            p.set('to', String(Math.round(next.to)));
          } else {
            p.delete('from');
            p.delete('to');
          }
          if (eventId) p.set('event', eventId);
          else p.delete('event');
          return p;
        },
        { replace: false },
      );
    },
    [setParams],
  );
  return { window, selectedEventId, setView };
}

function probeText(trace: Trace): string {
  const { inputUnit, sensitivityPerA, loops } = trace.probe;
  const scale = inputUnit === 'A' && sensitivityPerA === 1 ? 'amperes' : `${sensitivityPerA} ${inputUnit} per A`;
  return loops > 1 ? `${scale}, ${loops} loops through the jaw (readings ÷ ${loops})` : scale;
}

/** Windows up to this many samples get exact percentiles (and a duty cycle); longer ones summaries. */
const EXACT_FIGURES_MAX_SAMPLES = 2_000_000;

/**
 * What to ask the statistics for. The whole of a closed RMS trace: the analysis stored at close (it has
 * percentiles and the duty cycle). A window: exact percentiles from its samples while it is small enough
 * to answer quickly, else the chunk summaries (no percentiles). Waveforms: no duty cycle, as the event
 * threshold is an RMS level, not one for instantaneous values.
 */
function figuresRequest(
  trace: Trace | undefined,
  window: TimeWindow | null,
  events: Parameters<typeof onThresholdOf>[0],
): { percentiles: boolean; onThresholdA: number | null } {
  if (!trace || trace.firstSampleTime === null || trace.lastSampleTime === null)
    return { percentiles: false, onThresholdA: null };
  if (!window) return { percentiles: false, onThresholdA: null };
  const span = Math.max(1, trace.lastSampleTime - trace.firstSampleTime);
  const share = Math.min(
    1,
    Math.max(0, (Math.min(window.to, trace.lastSampleTime) - Math.max(window.from, trace.firstSampleTime)) / span),
  );
  const exact = trace.sampleCount * share <= EXACT_FIGURES_MAX_SAMPLES;
  return { percentiles: exact, onThresholdA: exact && trace.kind === 'rms' ? onThresholdOf(events) : null };
}

export default function TracePage() {
  const { traceId = '' } = useParams();
  const trace = useTrace(traceId);
  const { window, selectedEventId, setView } = useWindowParams();
  // The envelope and the events are asked for at once with the trace (they need only its id), so the
  // chart draws after one round of requests.
  const series = useTraceSeries(traceId, window, CHART_POINTS);
  const events = useTraceEvents(traceId);
  // Figures come after the chart: exact percentiles of a long window are work for the server.
  const stats = useTraceStats(
    traceId,
    window,
    figuresRequest(trace.data, window, events.data),
    Boolean(trace.data && trace.data.sampleCount > 0) && !series.isPending && !events.isPending,
  );
  const circuit = useTraceCircuit(trace.data?.circuitId ?? null);
  const { canEdit } = useAbilities();
  const close = useCloseTrace(traceId);
  const remove = useDeleteTrace();
  const download = useDownloadSamples();
  const navigate = useNavigate();
  const [dialog, setDialog] = useState<'edit' | 'delete' | 'close' | null>(null);

  const rows = useMemo<TraceEventRow[]>(() => (events.data ? eventRows(events.data) : []), [events.data]);
  const limits = useMemo<ChartLimit[]>(() => {
    const rating = circuit.data?.deviceRatingA;
    if (!rating) return [];
    return [
      { id: 'rating', label: `Rating ${formatValue(rating, 'A', 0)}`, valueA: rating, tone: 'rating' },
      {
        id: 'limit80',
        label: `80 % of rating ${formatValue(rating * 0.8, 'A', 0)}`,
        valueA: rating * 0.8,
        tone: 'limit80',
      },
    ];
  }, [circuit.data?.deviceRatingA]);

  const bounds =
    trace.data && trace.data.firstSampleTime !== null && trace.data.lastSampleTime !== null
      ? { from: trace.data.firstSampleTime, to: trace.data.lastSampleTime }
      : null;
  const zoomToEvent = (row: TraceEventRow) => {
    if (!bounds) return;
    setView(paddedWindow(row.startAt, Math.max(row.endAt, row.peakAt), bounds), row.id);
  };

  if (trace.isPending) return <LoadingState label="Loading the trace…" />;
  if (trace.isError) return <ErrorState error={trace.error} onRetry={() => void trace.refetch()} />;
  const t = trace.data;
  const figures = (stats.data?.statistics ?? (window ? null : t.summary)) as TraceFigures | null;

  return (
    <section aria-labelledby="trace-title" className="space-y-5">
      <PageHeader
        back={
          <Link to={paths.traces.href()} className="text-sm text-ink-700 hover:underline">
            ← All traces
          </Link>
        }
        title={t.name}
        titleId="trace-title"
        subtitle={
          <span className="flex flex-wrap items-center gap-2">
            <Badge tone="info">{t.kind === 'rms' ? 'RMS readings' : 'Waveform'}</Badge>
            <Badge tone={t.status === 'open' ? 'tight' : 'neutral'}>{t.status}</Badge>
            <span>
              started {formatDateTime(t.firstSampleTime ?? t.startTime)} ({timeZoneLabel()})
            </span>
            {circuit.data ? (
              <span>
                on{' '}
                <Link className="text-ink-800 underline" to={paths.circuit.href(circuit.data.id)}>
                  {circuit.data.label}
                </Link>
              </span>
            ) : null}
          </span>
        }
        actions={
          <>
            <Button
              variant="secondary"
              onClick={() => download.mutate({ trace: t, window, values: 'amps' })}
              disabled={download.isPending || t.sampleCount === 0}
            >
              {download.isPending ? 'Preparing…' : window ? 'Download window (CSV)' : 'Download CSV'}
            </Button>
            {canEdit ? (
              <>
                <Button variant="secondary" onClick={() => setDialog('edit')}>
                  Edit
                </Button>
                {t.status === 'open' ? (
                  <Button variant="secondary" onClick={() => setDialog('close')} disabled={t.sampleCount === 0}>
                    Close trace
                  </Button>
                ) : null}
                <Button variant="secondary" onClick={() => setDialog('delete')}>
                  Delete
                </Button>
              </>
            ) : null}
          </>
        }
      />
      {download.isError ? <ErrorState error={download.error} title="The download failed" /> : null}
      {t.status === 'open' ? (
        <p className="rounded-lg bg-amber-50 px-4 py-2 text-sm text-ink-900">
          This trace is open: samples may still arrive.{' '}
          {events.data?.source === 'computed' ? 'Events below are computed on the fly; ' : ''}
          Close it when the recording is complete to store its analysis.
        </p>
      ) : null}

      <div className="grid gap-5 lg:grid-cols-[minmax(0,1fr)_18rem]">
        <Panel title="Current" titleId="chart-title">
          <TraceChartPanel
            trace={t}
            series={series}
            window={window}
            onWindowChange={(w) => setView(w)}
            events={rows}
            selectedEventId={selectedEventId}
            onEventSelect={(id) => {
              const row = rows.find((r) => r.id === id);
              if (row) zoomToEvent(row);
            }}
            limits={limits}
          />
        </Panel>
        <Panel title="Figures" titleId="figures-title">
          {figures ? (
            <FiguresPanel figures={figures} windowed={window !== null} kind={t.kind} />
          ) : stats.isError ? (
            <ErrorState error={stats.error} />
          ) : t.sampleCount === 0 ? (
            <p className="text-sm text-ink-500">No samples yet.</p>
          ) : (
            <LoadingState label="Computing…" />
          )}
        </Panel>
      </div>

      <Panel title="Inrush events and surges" titleId="events-title">
        {events.isPending && t.sampleCount > 0 ? (
          <LoadingState label="Finding events…" />
        ) : events.isError ? (
          <ErrorState error={events.error} onRetry={() => void events.refetch()} />
        ) : (
          <EventsTable events={rows} selectedId={selectedEventId} onSelect={zoomToEvent} />
        )}
      </Panel>

      <Panel title="Recording" titleId="recording-title">
        <dl className="grid gap-x-8 gap-y-2 text-sm sm:grid-cols-2">
          <div>
            <dt className="text-ink-500">Probe</dt>
            <dd>{probeText(t)}</dd>
          </div>
          <div>
            <dt className="text-ink-500">Sample rate</dt>
            <dd>
              {t.sampleRateHz
                ? formatValue(t.sampleRateHz, 'Hz', t.sampleRateHz < 10 ? 2 : 0)
                : 'irregular (timestamps)'}
            </dd>
          </div>
          <div>
            <dt className="text-ink-500">Supply</dt>
            <dd>
              {[t.nominalVoltageV ? `${t.nominalVoltageV} V` : null, t.mainsHz ? `${t.mainsHz} Hz` : null]
                .filter(Boolean)
                .join(', ') || 'not recorded'}
            </dd>
          </div>
          <div>
            <dt className="text-ink-500">Samples</dt>
            <dd>{t.sampleCount.toLocaleString()}</dd>
          </div>
          <div>
            <dt className="text-ink-500">Tags</dt>
            <dd className="flex flex-wrap gap-1">
              {t.tags.length ? t.tags.map((tag) => <Badge key={tag}>{tag}</Badge>) : '—'}
            </dd>
          </div>
          <div>
            <dt className="text-ink-500">Closed</dt>
            <dd>{t.closedAt ? formatDateTime(t.closedAt) : 'not yet'}</dd>
          </div>
          {t.notes ? (
            <div className="sm:col-span-2">
              <dt className="text-ink-500">Notes</dt>
              <dd className="whitespace-pre-line">{t.notes}</dd>
            </div>
          ) : null}
        </dl>
      </Panel>

      {dialog === 'edit' ? <TraceEditDialog trace={t} open onClose={() => setDialog(null)} /> : null}
      <ConfirmDialog
        open={dialog === 'close'}
        title="Close this trace?"
        confirmLabel="Close and analyse"
        busy={close.isPending}
        onCancel={() => setDialog(null)}
        onConfirm={() => close.mutate(undefined, { onSuccess: () => setDialog(null) })}
      >
        <p>
          No more samples can be added. The full analysis (percentiles, inrush events and surges) runs and is stored
          with the trace.
        </p>
        {close.isError ? <ErrorState error={close.error} /> : null}
      </ConfirmDialog>
      <ConfirmDialog
        open={dialog === 'delete'}
        title={`Delete ${t.name}?`}
        confirmLabel="Delete trace"
        busy={remove.isPending}
        onCancel={() => setDialog(null)}
        onConfirm={() =>
          remove.mutate(traceId, { onSuccess: () => void navigate(paths.traces.href(), { replace: true }) })
        }
      >
        <p>
          The trace and its {t.sampleCount.toLocaleString()} samples are deleted. Loads that used it fall back to their
          nameplates. This cannot be undone.
        </p>
        {remove.isError ? <ErrorState error={remove.error} /> : null}
      </ConfirmDialog>
    </section>
  );
}
