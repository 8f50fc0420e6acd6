import type { StartUpEvent, StartUpInput } from '../analysis/check/check-input.js';
import type { CurrentProfile } from '../analysis/trip/current-profile.js';
import type { Scope } from '../auth/scope.js';

/**
 * What the headroom check reads from trace storage (`services.traces`): only the calls and fields it uses,
 * so the check depends on the contract, not on how samples are stored. Times are epoch milliseconds.
 */
export interface TraceReader {
  get(
    scope: Scope,
    id: string,
  ): Promise<{ id: string; name: string; kind: 'rms' | 'waveform'; sampleCount: number; sampleRateHz: number | null }>;
  stats(
    scope: Scope,
    id: string,
    window?: { from?: number | undefined; to?: number | undefined },
    options?: { percentiles?: boolean | undefined },
  ): Promise<{ statistics: { p50A: number | null; rmsA: number; maxA: number; durationS: number } | null }>;
  events(scope: Scope, id: string): Promise<{ inrushEvents: RecordedInrush[]; surges: RecordedSurge[] }>;
  series(
    scope: Scope,
    id: string,
    window: { from?: number | undefined; to?: number | undefined },
    points: number,
  ): Promise<{
    t: number[];
    mean: Array<number | null>;
    max: Array<number | null>;
    rms: { mean: Array<number | null>; max: Array<number | null> } | null;
  }>;
}

/** An inrush event as trace storage reports it (amps, seconds, A²s; `onsetAt` epoch ms). */
export interface RecordedInrush {
  onsetAt: number;
  peakA: number;
  steadyA: number;
  timeToPeakS: number;
  settleTimeS: number | null;
  durationS: number;
  i2tA2s: number;
}

/** A surge while running, as trace storage reports it. */
export interface RecordedSurge {
  startAt: number;
  durationS: number;
  peakA: number;
  runningA: number;
  i2tA2s: number;
}

/** Buckets of the duty profile read for the thermal check: one per 1/2000 of the trace. */
export const DUTY_PROFILE_POINTS = 2000;

/** What a load's traces say, ready for the check. */
export interface TraceFigures {
  runningA: number;
  /** How the running current was read, in words. */
  runningBasis: string;
  startUp: StartUpInput | null;
  duty: CurrentProfile | null;
  inrushEvents: Array<RecordedInrush & { traceId: string }>;
  surges: Array<RecordedSurge & { traceId: string }>;
  /** Traces with samples that the figures come from. */
  usedTraceIds: string[];
  assumptions: string[];
}

/**
 * A step profile (seconds from the first bucket) from a chart envelope: the bucket means of an `rms` trace,
 * or of the half-cycle RMS series of a `waveform` trace (the mean of instantaneous values is no current).
 * Buckets without samples (gaps) are skipped, so the level before a gap holds across it. Null when fewer
 * than two buckets have a value.
 */
export function dutyProfileFromSeries(
  series: Awaited<ReturnType<TraceReader['series']>>,
  kind: 'rms' | 'waveform',
): CurrentProfile | null {
  const values = kind === 'waveform' ? series.rms?.mean : series.mean;
  if (!values) return null;
  const times: number[] = [];
  const amps: number[] = [];
  values.forEach((a, i) => {
    const t = series.t[i];
    if (a === null || a === undefined || t === undefined || !Number.isFinite(a)) return;
    if (times.length > 0 && t <= times[times.length - 1]!) return;
    times.push(t);
    amps.push(Math.max(0, a));
  });
  if (times.length < 2) return null;
  const t0 = times[0]!;
  return { timesS: Float64Array.from(times, (t) => (t - t0) / 1000), currentA: Float64Array.from(amps) };
}

/**
 * A recorded inrush as a start-up event for the check. An event that settled within one logger interval has
 * no measured length (duration and I²t 0): it is taken to last that interval, the span its RMS reading covers.
 */
function toStartUpEvent(e: RecordedInrush, intervalS: number | null): StartUpEvent {
  const measured = e.durationS > 0 || e.i2tA2s > 0 || (e.settleTimeS ?? 0) > 0;
  return {
    peakA: e.peakA,
    timeToPeakS: e.timeToPeakS,
    durationS: measured || intervalS === null ? e.durationS : intervalS,
    ...(measured ? { i2tA2s: e.i2tA2s } : {}),
    ...(e.settleTimeS === null || !measured ? {} : { settleTimeS: e.settleTimeS }),
  };
}

/**
 * A load's figures from its traces (those with samples):
 * - running current: the highest steady current after a recorded start (`steadyA` of the inrush events), the
 *   level the load settles to when it works; with no start recorded (the load ran throughout), the median
 *   (p50) of an `rms` trace, or the RMS of a `waveform` trace; the highest over the load's traces;
 * - start-up: every recorded inrush (peak, duration, I²t), on the logger's own RMS interval for `rms` traces
 *   (`sample-rms`) or the half-cycle RMS for `waveform` traces; one that settled within a logger interval is taken
 *   to last that interval;
 * - duty (thermal check): the bucket means of the longest trace over {@link DUTY_PROFILE_POINTS} buckets;
 * - surges while running are listed (their heat is in the duty).
 * Null when no linked trace has samples (the nameplate is used instead).
 */
export async function figuresFromTraces(
  reader: TraceReader,
  scope: Scope,
  loadName: string,
  traceIds: string[],
): Promise<TraceFigures | null> {
  const traces = (await Promise.all(traceIds.map((id) => reader.get(scope, id)))).filter((t) => t.sampleCount > 0);
  if (traces.length === 0) return null;
  const inrushEvents: TraceFigures['inrushEvents'] = [];
  const startEvents: StartUpEvent[] = [];
  const surges: TraceFigures['surges'] = [];
  const running: Array<{ amps: number; basis: string }> = [];
  for (const trace of traces) {
    const events = await reader.events(scope, trace.id);
    inrushEvents.push(...events.inrushEvents.map((e) => ({ ...e, traceId: trace.id })));
    const intervalS = trace.kind === 'rms' && trace.sampleRateHz ? 1 / trace.sampleRateHz : null;
    startEvents.push(
      ...events.inrushEvents
        .filter((e) => e.peakA > 0)
        .map((e) => toStartUpEvent(e, intervalS))
        .filter((e) => (e.durationS ?? 0) > 0 || (e.i2tA2s ?? 0) > 0 || (e.settleTimeS ?? 0) > 0),
    );
    surges.push(...events.surges.map((s) => ({ ...s, traceId: trace.id })));
    if (events.inrushEvents.length > 0) {
      const steady = Math.max(...events.inrushEvents.map((e) => e.steadyA));
      running.push({ amps: steady, basis: `steady current after its recorded starts in "${trace.name}"` });
      continue;
    }
    let stats = (await reader.stats(scope, trace.id)).statistics;
    if (trace.kind === 'rms' && stats && stats.p50A === null)
      stats = (await reader.stats(scope, trace.id, {}, { percentiles: true })).statistics;
    if (!stats) continue;
    running.push(
      trace.kind === 'rms'
        ? { amps: stats.p50A ?? stats.rmsA, basis: `median (p50) of "${trace.name}" (no start recorded)` }
        : { amps: stats.rmsA, basis: `RMS of the waveform "${trace.name}" (no start recorded)` },
    );
  }
  if (running.length === 0) return null;
  const top = running.reduce((a, b) => (b.amps > a.amps ? b : a));

  const basis = traces.every((t) => t.kind === 'waveform') ? 'half-cycle-rms' : 'sample-rms';
  const startUp: StartUpInput | null = startEvents.length > 0 ? { kind: 'events', events: startEvents, basis } : null;

  const longest = traces.reduce((a, b) => (b.sampleCount > a.sampleCount ? b : a));
  const duty = dutyProfileFromSeries(await reader.series(scope, longest.id, {}, DUTY_PROFILE_POINTS), longest.kind);

  const assumptions = [`${loadName}: running current ${top.amps.toFixed(2)} A, the ${top.basis}.`];
  if (basis === 'sample-rms' && startEvents.length > 0) {
    assumptions.push(`${loadName}: start-up peaks are the logger's RMS readings; a sub-interval peak can be higher.`);
  }
  return {
    runningA: top.amps,
    runningBasis: top.basis,
    startUp,
    duty,
    inrushEvents,
    surges,
    usedTraceIds: traces.map((t) => t.id),
    assumptions,
  };
}
