import { analyzeTrace, type AnalyzeParams, type TraceKind } from '../analysis/pipeline/analyze-trace.js';
import type { ProbeSettings } from '../analysis/probe/normalise-probe.js';
import { invalid, type ProblemFieldError } from '../errors/problem.js';
import { presentAnalysis } from './analysis-view.js';

export interface AnalyzeSamplesInput {
  kind: TraceKind;
  probe?: ProbeSettings | undefined;
  /** Epoch ms numbers or ISO 8601 strings, one format. */
  t?: Array<number | string> | undefined;
  a?: number[] | undefined;
  start?: number | string | undefined;
  rate?: number | undefined;
  values?: number[] | undefined;
  params?: AnalyzeParams | undefined;
}

/** Epoch ms of an ISO 8601 string or an epoch-ms number; null when it is neither. */
function toEpochMs(value: number | string): number | null {
  if (typeof value === 'number') return Number.isFinite(value) ? value : null;
  // Only full ISO 8601 date-times: a bare number in a string is ambiguous (seconds? ms?).
  if (!/^\d{4}-\d{2}-\d{2}T\d{2}:\d{2}/.test(value)) return null;
  const ms = Date.parse(value);
  return Number.isNaN(ms) ? null : ms;
}

/** Timestamps -> (origin in epoch ms, seconds from the origin). Errors name the offending index. */
function parseTimestamps(t: Array<number | string>): { originMs: number; timesS: Float64Array } {
  const errors: ProblemFieldError[] = [];
  const kind = typeof t[0];
  const ms = new Float64Array(t.length);
  for (let i = 0; i < t.length && errors.length < 20; i++) {
    const v = t[i] as number | string;
    if (typeof v !== kind) {
      errors.push({ detail: 'mixes epoch milliseconds and ISO 8601 strings', pointer: `/t/${i}` });
      continue;
    }
    const parsed = toEpochMs(v);
    if (parsed === null) errors.push({ detail: 'not an ISO 8601 date-time or epoch milliseconds', pointer: `/t/${i}` });
    else if (i > 0 && parsed <= (ms[i - 1] as number)) errors.push({ detail: 'timestamps must increase strictly', pointer: `/t/${i}` });
    else ms[i] = parsed;
  }
  if (errors.length) throw invalid(errors);
  const originMs = ms[0] ?? 0;
  const timesS = new Float64Array(t.length);
  for (let i = 0; i < t.length; i++) timesS[i] = ((ms[i] as number) - originMs) / 1000;
  return { originMs, timesS };
}

/** Stateless analysis of posted samples (POST /analyze). Analysis RangeErrors become 400 problems. */
export function createAnalysisService() {
  return {
    analyze(input: AnalyzeSamplesInput) {
      let originMs = 0;
      let samples: Float64Array;
      let timing: { timestampsS: Float64Array } | { startS: number; sampleRateHz: number };
      if (input.t && input.a) {
        const parsed = parseTimestamps(input.t);
        originMs = parsed.originMs;
        samples = Float64Array.from(input.a);
        timing = { timestampsS: parsed.timesS };
      } else {
        const start = input.start === undefined ? 0 : toEpochMs(input.start);
        if (start === null) throw invalid([{ detail: 'not an ISO 8601 date-time or epoch milliseconds', pointer: '/start' }]);
        originMs = start;
        samples = Float64Array.from(input.values ?? []);
        timing = { startS: 0, sampleRateHz: input.rate as number };
      }
      try {
        const result = analyzeTrace({ kind: input.kind, samples, ...timing, ...(input.probe ? { probe: input.probe } : {}) }, input.params ?? {});
        return presentAnalysis(result, originMs);
      } catch (err) {
        if (err instanceof RangeError) throw invalid([{ detail: err.message, pointer: '' }], `The samples cannot be analysed: ${err.message}`);
        throw err;
      }
    },
  };
}

export type AnalysisService = ReturnType<typeof createAnalysisService>;
