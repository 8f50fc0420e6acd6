import { useMemo } from 'react';
import { StackedCurrentChart, type StackedSeries } from '../../../components/charts/stacked-current-chart';
import { TimeCurrentChart, type TimeCurrentPoint } from '../../../components/charts/time-current-chart';
import { Panel } from '../../../components/ui/page-header';
import { ErrorState, LoadingState } from '../../../components/ui/states';
import type { HeadroomCheck } from '../api/check';
import type { Circuit } from '../api/circuits';
import { useLoadTraces, type LoadTraceData } from '../api/load-traces';
import { tripBand } from '../utils/trip-band';

/** How long a continuous load runs by definition (NEC Article 100: 3 hours or more), s. */
const CONTINUOUS_S = 3 * 3600;
/** Span shown for loads known only by nameplate when no trace gives a length, s. */
const DEFAULT_SPAN_S = 60;

const numberField = (o: Record<string, unknown>, key: string): number | null => {
  const v = o[key];
  return typeof v === 'number' && Number.isFinite(v) ? v : null;
};

/** A load's current from its trace (the RMS series of a waveform), as seconds from the trace's start. */
function seriesFromTrace(label: string, d: LoadTraceData): StackedSeries | null {
  const s = d.series;
  if (!s || s.t.length === 0) return null;
  const t0 = s.fromTime ?? s.t[0]!;
  const values = s.rms ? s.rms.mean : s.mean;
  return { label, t: s.t.map((t) => (t - t0) / 1000), a: values };
}

/**
 * The circuit's charts: the loads' currents stacked against the rating, and the device's time-current band
 * with each measured start-up and each stacked start-up scenario as a point.
 */
export default function CircuitCharts({ circuit, check }: { circuit: Circuit; check: HeadroomCheck }) {
  const stored = check.loads.filter((l) => !l.whatIf);
  const traceIds = stored.map((l) => l.traceIds[0]).filter((id): id is string => Boolean(id));
  const traces = useLoadTraces(traceIds);
  const byTrace = useMemo(() => new Map(traces.data.map((d) => [d.traceId, d])), [traces.data]);

  const band = useMemo(() => {
    try {
      return tripBand(circuit.deviceKind, circuit.deviceRatingA);
    } catch {
      return null; // a device outside the trip models (the check says so among its warnings)
    }
  }, [circuit.deviceKind, circuit.deviceRatingA]);

  const stacked = useMemo<StackedSeries[]>(() => {
    const fromTraces = stored.map((l) => {
      const d = l.traceIds[0] ? byTrace.get(l.traceIds[0]) : undefined;
      return d ? seriesFromTrace(l.name, d) : null;
    });
    const span = Math.max(DEFAULT_SPAN_S, ...fromTraces.map((s) => (s ? (s.t[s.t.length - 1] ?? 0) : 0)));
    return stored.map(
      (l, i) => fromTraces[i] ?? { label: `${l.name} (nameplate)`, t: [0, span], a: [l.runningA, l.runningA] },
    );
  }, [stored, byTrace]);

  const points = useMemo<TimeCurrentPoint[]>(() => {
    const out: TimeCurrentPoint[] = [];
    const firstInrushS = new Map<string, number>();
    for (const l of stored) {
      const d = l.traceIds[0] ? byTrace.get(l.traceIds[0]) : undefined;
      (d?.events?.inrushEvents ?? []).forEach((e, k) => {
        const peakA = numberField(e, 'peakA');
        const durationS = numberField(e, 'settleTimeS') ?? numberField(e, 'durationS');
        if (peakA === null || durationS === null || durationS <= 0) return;
        if (!firstInrushS.has(l.name)) firstInrushS.set(l.name, durationS);
        out.push({ label: `${l.name}, start ${k + 1}`, currentA: peakA, durationS, kind: 'measured' });
      });
    }
    for (const s of check.startUps) {
      const durationS = firstInrushS.get(s.startingLoad) ?? check.parameters.assumedMotorStartS;
      if (s.stackedPeakA > 0)
        out.push({
          label: `${s.startingLoad} starting, others running`,
          currentA: s.stackedPeakA,
          durationS,
          kind: 'stacked',
        });
    }
    if (check.steady.runningTotalA > 0)
      out.push({
        label: 'All loads running (3 h, continuous)',
        currentA: check.steady.runningTotalA,
        durationS: CONTINUOUS_S,
        kind: 'stacked',
      });
    return out;
  }, [stored, byTrace, check]);

  return (
    <div className="grid gap-5 xl:grid-cols-2">
      <Panel title="Loads stacked" titleId="stacked-title">
        {traces.pending ? (
          <LoadingState label="Loading the loads' traces…" />
        ) : traces.error ? (
          <ErrorState error={traces.error} />
        ) : stacked.length === 0 ? (
          <p className="text-sm text-ink-500">No loads to stack.</p>
        ) : (
          <>
            <StackedCurrentChart
              name="stacked"
              series={stacked}
              ratingA={circuit.deviceRatingA}
              limitA={circuit.deviceRatingA * 0.8}
            />
            <p className="mt-2 text-xs text-ink-500">
              Each load from the start of its own recording; loads without a trace at their nameplate current. The check
              also tries every alignment of the start-ups.
            </p>
          </>
        )}
      </Panel>
      <Panel title="Time-current view" titleId="tcc-title">
        {band ? (
          <>
            <TimeCurrentChart
              name="time-current"
              band={band}
              points={points}
              ratingA={circuit.deviceRatingA}
              deviceLabel={band.label}
            />
            <p className="mt-2 text-xs text-ink-500">
              Shaded: where {band.label} may trip, from cold, between the fastest and the slowest device the standard
              allows (a model through its test points; the maker’s curve governs). Points left of and below the band
              hold; inside it they may trip.
            </p>
          </>
        ) : (
          <p className="text-sm text-ink-500">
            This device is outside Headroom’s trip models, so no band can be drawn.
          </p>
        )}
      </Panel>
    </div>
  );
}
