/**
 * Reading stored traces: window statistics, chart envelopes, inrush events and surges, raw export.
 * Windows are closed intervals [from, to] in epoch milliseconds (absent: the whole trace).
 */
import type { EventParams } from '../analysis/events/detect-events.js';
import { computeStatistics } from '../analysis/stats/statistics.js';
import { halfCycleRms } from '../analysis/waveform/half-cycle-rms.js';
import type { Scope } from '../auth/scope.js';
import type { Db } from '../db/open.js';
import { Problem } from '../errors/problem.js';
import type { Trace } from '../models/trace.js';
import { readChunks, readWindowSamples } from '../storage/chunk-reader.js';
import type { ChunkStore } from '../storage/chunk-store.js';
import { bucketSeries, envelope } from '../storage/envelope.js';
import { windowSummary } from '../storage/window-summary.js';
import { presentInrush, presentStatistics, presentSurge } from './analysis-view.js';
import type { TraceCloser } from './traces-close.js';
import { ampsPerUnit, msOf, originMs, presentSummary, storedTrace } from './traces-view.js';

/** A window in epoch milliseconds; absent ends mean the trace's first or last sample. */
export interface TraceWindow {
  from?: number | undefined;
  to?: number | undefined;
}

export interface StatsOptions {
  /** Exact p50/p95/p99 (and duty cycle) from the window's samples instead of the summaries. */
  percentiles?: boolean | undefined;
  /** Threshold (A) for the duty cycle; needs the samples, like percentiles. */
  onThresholdA?: number | undefined;
  powerFactor?: number | undefined;
}

/** Most samples read for exact percentiles or an on-the-fly RMS series in one request. */
export const MAX_WINDOW_SAMPLES_READ = 20_000_000;
/** An open waveform trace's RMS series is computed on the fly for windows up to this many samples. */
export const MAX_LIVE_RMS_SAMPLES = 4_000_000;

/** The window in µs, clamped to the trace's samples; null when the trace has none. */
function windowUs(trace: Trace, window: TraceWindow): { fromUs: number; toUs: number } | null {
  if (trace.firstSampleUs === null || trace.lastSampleUs === null) return null;
  const fromUs = window.from !== undefined ? Math.max(window.from * 1000, trace.firstSampleUs) : trace.firstSampleUs;
  const toUs = window.to !== undefined ? Math.min(window.to * 1000, trace.lastSampleUs) : trace.lastSampleUs;
  return { fromUs, toUs };
}

function checkWindow(window: TraceWindow): void {
  if (window.from !== undefined && window.to !== undefined && window.to < window.from) {
    throw new Problem('validation', 'The window ends before it starts', { errors: [{ detail: 'must not be before from', parameter: 'to' }] });
  }
}

/** Shortest decimal that reads back as the same float32 (so an export re-imports bit for bit). */
export function formatFloat32(value: number): string {
  if (Number.isInteger(value) && Math.abs(value) < 1e15) return String(value);
  for (let digits = 6; digits < 9; digits++) {
    const text = value.toPrecision(digits);
    if (Math.fround(Number(text)) === value) return String(Number(text));
  }
  return String(Number(value.toPrecision(9)));
}

export function createTraceQueries(deps: { db: Db; store: ChunkStore; find: (scope: Scope, id: string) => Promise<Trace>; closer: TraceCloser }) {
  const { store, find, closer } = deps;

  /** Samples of a window as amperes with their axis (bounded by MAX_WINDOW_SAMPLES_READ). */
  async function windowAmps(trace: Trace, fromUs: number, toUs: number) {
    const rows = await store.readSummaries(trace.id, trace.chunkCount, fromUs, toUs, trace.sampleCount);
    const count = rows.reduce((n, r) => n + r.count, 0);
    if (count > MAX_WINDOW_SAMPLES_READ) {
      throw new Problem('validation', `The window holds about ${count} samples; exact percentiles read at most ${MAX_WINDOW_SAMPLES_READ}. Choose a shorter window.`, {
        errors: [{ detail: 'window too long for exact percentiles', parameter: 'percentiles' }],
      });
    }
    const samples = await readWindowSamples(store, trace.id, rows, trace.originUs as number, fromUs, toUs);
    const scale = ampsPerUnit(trace);
    const amps = new Float64Array(samples.values.length);
    for (let i = 0; i < amps.length; i++) amps[i] = (samples.values[i] as number) * scale;
    return { ...samples, amps };
  }

  return {
    /**
     * Statistics of a window. From the chunk summaries by default (every figure but percentiles, in
     * constant time whatever the window); from the samples with `percentiles` or `onThresholdA`; for
     * the whole of a closed `rms` trace, the statistics stored at close (with percentiles).
     */
    async stats(scope: Scope, id: string, window: TraceWindow = {}, options: StatsOptions = {}) {
      checkWindow(window);
      const trace = await find(scope, id);
      const range = windowUs(trace, window);
      const base = { traceId: trace.id, fromTime: msOf(range?.fromUs ?? null), toTime: msOf(range?.toUs ?? null) };
      if (!range || range.toUs < range.fromUs) return { ...base, source: 'summaries' as const, statistics: null };
      const whole = window.from === undefined && window.to === undefined;
      const plain = !options.percentiles && options.onThresholdA === undefined && options.powerFactor === undefined;
      if (whole && plain && trace.status === 'closed' && trace.kind === 'rms') {
        const stored = await closer.stored(trace);
        if (stored) return { ...base, source: 'analysis' as const, statistics: presentStatistics(stored.result.statistics, originMs(trace)) };
      }
      if (options.percentiles || options.onThresholdA !== undefined) {
        const w = await windowAmps(trace, range.fromUs, range.toUs);
        if (w.amps.length === 0) return { ...base, source: 'samples' as const, statistics: null };
        const statistics = computeStatistics(w.axis, w.amps, {
          gapThresholdS: trace.gapThresholdS,
          voltageV: trace.nominalVoltageV,
          ...(options.powerFactor !== undefined ? { powerFactor: options.powerFactor } : {}),
          ...(options.onThresholdA !== undefined ? { onThresholdA: options.onThresholdA } : {}),
        });
        return { ...base, source: 'samples' as const, statistics: presentStatistics(statistics, originMs(trace)) };
      }
      const summary = await windowSummary(store, storedTrace(trace), range.fromUs, range.toUs);
      return { ...base, source: 'summaries' as const, statistics: summary ? presentSummary(trace, summary, options.powerFactor) : null };
    },

    /**
     * Chart envelope of a window in at most `points` buckets (min, max, mean in amperes; bucket time
     * `t` is the bucket's middle, epoch ms). For waveform traces also the half-cycle RMS series per
     * bucket: stored at close, or computed on the fly for windows of an open trace up to
     * MAX_LIVE_RMS_SAMPLES samples.
     */
    async series(scope: Scope, id: string, window: TraceWindow, points: number) {
      checkWindow(window);
      const trace = await find(scope, id);
      const range = windowUs(trace, window);
      const env = range && range.toUs >= range.fromUs ? await envelope(store, storedTrace(trace), range.fromUs, range.toUs, points) : null;
      const scale = ampsPerUnit(trace);
      const b = env?.buckets;
      const scaled = (xs: Array<number | null>) => xs.map((x) => (x === null ? null : x * scale));
      const startUs = b?.startUs ?? [];
      const endUs = b?.endUs ?? [];
      let rms: { min: Array<number | null>; max: Array<number | null>; mean: Array<number | null>; source: 'analysis' | 'computed' } | null = null;
      if (trace.kind === 'waveform' && b && range) {
        const stored = trace.status === 'closed' ? await closer.stored(trace) : null;
        const origin = trace.originUs as number;
        if (stored?.rms) {
          const timesUs = stored.rms.timesS.map((s) => origin + s * 1e6);
          rms = { ...bucketSeries(b, timesUs, stored.rms.rmsA), source: 'analysis' };
        } else if (env.sampleCount <= MAX_LIVE_RMS_SAMPLES && trace.mainsHz) {
          const w = await windowAmps(trace, range.fromUs, range.toUs);
          if (w.axis.kind === 'uniform' && w.amps.length >= (3 * w.axis.rateHz) / trace.mainsHz) {
            const series = halfCycleRms(w.amps, w.axis.rateHz, trace.mainsHz, w.axis.startS);
            const timesUs = series.timesS.map((s) => origin + s * 1e6);
            rms = { ...bucketSeries(b, timesUs, series.rmsA), source: 'computed' };
          }
        }
      }
      return {
        traceId: trace.id,
        fromTime: msOf(range?.fromUs ?? null),
        toTime: msOf(range?.toUs ?? null),
        points,
        level: env?.level ?? 'samples',
        sampleCount: env?.sampleCount ?? 0,
        t: startUs.map((s, k) => (s + (endUs[k] as number)) / 2000),
        count: b?.count ?? [],
        min: scaled(b?.min ?? []),
        max: scaled(b?.max ?? []),
        mean: scaled(b?.mean ?? []),
        rms,
      };
    },

    /**
     * Inrush events and surges: those stored at close, or computed now (over the whole trace) when
     * parameters are given or the trace is still open.
     */
    async events(scope: Scope, id: string, params?: Partial<EventParams> & { mainsFrequencyHz?: number | undefined }) {
      const trace = await find(scope, id);
      const given = params && Object.values(params).some((v) => v !== undefined);
      let analysis = !given && trace.status === 'closed' ? await closer.stored(trace) : null;
      const source = analysis ? ('stored' as const) : ('computed' as const);
      if (!analysis) {
        if (trace.sampleCount === 0) {
          return { traceId: trace.id, source, inrushEvents: [], surges: [], onPeriodCount: 0, params: null };
        }
        const { mainsFrequencyHz, ...events } = params ?? {};
        analysis = await closer.analyse(trace, { ...(mainsFrequencyHz !== undefined ? { mainsFrequencyHz } : {}), events });
      }
      const origin = originMs(trace);
      const r = analysis.result;
      return {
        traceId: trace.id,
        source,
        inrushEvents: r.inrushEvents.map((e) => presentInrush(e, origin)),
        surges: r.surges.map((s) => presentSurge(s, origin)),
        onPeriodCount: r.onPeriodCount,
        params: r.params,
      };
    },

    /** The full stored analysis of a closed trace (presented), or null. */
    async analysis(scope: Scope, id: string) {
      const trace = await find(scope, id);
      const stored = trace.status === 'closed' ? await closer.stored(trace) : null;
      return stored ? { trace, result: stored.result } : { trace, result: null };
    },

    /**
     * The window's samples as text, streamed chunk by chunk: CSV (`time_ms,reading_<unit>`) or JSON
     * in the append format (`{"t": [...], "a": [...]}`), raw readings as stored (or amperes).
     */
    async exportSamples(scope: Scope, id: string, window: TraceWindow, format: 'csv' | 'json', values: 'raw' | 'amps') {
      checkWindow(window);
      const trace = await find(scope, id);
      const range = windowUs(trace, window);
      const rows = range && range.toUs >= range.fromUs ? await store.readSummaries(trace.id, trace.chunkCount, range.fromUs, range.toUs, trace.sampleCount) : [];
      const scale = values === 'amps' ? ampsPerUnit(trace) : 1;
      const unit = values === 'amps' ? 'A' : trace.probe.inputUnit;
      const format1 = values === 'amps' ? (v: number) => String(v * scale) : formatFloat32;
      async function* pieces(part: 'csv' | 't' | 'a'): AsyncGenerator<string> {
        let first = true;
        for await (const chunk of readChunks(store, trace.id, rows, 16)) {
          const lines: string[] = [];
          for (let i = 0; i < chunk.values.length; i++) {
            const us = chunk.timesUs[i] as number;
            if (!range || us < range.fromUs || us > range.toUs) continue;
            const t = String(us / 1000);
            if (part === 'csv') lines.push(`${t},${format1(chunk.values[i] as number)}\n`);
            else lines.push(part === 't' ? t : format1(chunk.values[i] as number));
          }
          if (lines.length === 0) continue;
          if (part === 'csv') yield lines.join('');
          else {
            yield (first ? '' : ',') + lines.join(',');
            first = false;
          }
        }
      }
      async function* body(): AsyncGenerator<string> {
        if (format === 'csv') {
          yield `time_ms,${values === 'amps' ? 'current' : 'reading'}_${unit}\n`;
          yield* pieces('csv');
        } else {
          yield '{"t":[';
          yield* pieces('t');
          yield '],"a":[';
          yield* pieces('a');
          yield ']}\n';
        }
      }
      return { trace, unit, body: body() };
    },
  };
}

export type TraceQueries = ReturnType<typeof createTraceQueries>;
