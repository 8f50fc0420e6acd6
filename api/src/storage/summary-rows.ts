/**
 * Conversions between the analysis engine's mergeable SampleSummary and the summary columns of a
 * stored chunk, plus the two small adapters storage needs that the engine does not offer:
 * rescaling a summary from raw probe units to amperes, and fixing the gap threshold of a summary that
 * holds no interval yet.
 *
 * Stored summaries are in raw probe units (the readings as sent), so that a corrected probe setting
 * changes the answers at read time without rewriting any chunk.
 */
import type { SampleSummary } from '../analysis/stats/sample-summary.js';
import type { ChunkEncoding } from '../models/trace-chunk.js';

/** The columns of one trace_chunks row. */
export interface ChunkSummaryRow {
  seq: number;
  encoding: ChunkEncoding;
  count: number;
  firstUs: number;
  lastUs: number;
  runStartUs: number | null;
  runOffset: number | null;
  rateHz: number | null;
  mean: number;
  m2: number;
  minValue: number;
  minTimeS: number;
  maxValue: number;
  maxTimeS: number;
  firstTimeS: number;
  firstValue: number;
  lastTimeS: number;
  lastValue: number;
  coveredTimeS: number;
  integral: number;
  integral2: number;
  gapCount: number;
  gapTimeS: number;
  longestGapStartS: number | null;
  longestGapEndS: number | null;
}

/**
 * The row as an object literal of one fixed shape. Rows built by the sqlite3 package get their 25
 * properties one by one and read slowly (V8 may keep them as dictionaries); rows kept in memory and
 * read thousands of times per request (window statistics, envelopes) are copied into this shape once.
 */
export function compactRow(r: ChunkSummaryRow): ChunkSummaryRow {
  return {
    seq: r.seq,
    encoding: r.encoding,
    count: r.count,
    firstUs: r.firstUs,
    lastUs: r.lastUs,
    runStartUs: r.runStartUs,
    runOffset: r.runOffset,
    rateHz: r.rateHz,
    mean: r.mean,
    m2: r.m2,
    minValue: r.minValue,
    minTimeS: r.minTimeS,
    maxValue: r.maxValue,
    maxTimeS: r.maxTimeS,
    firstTimeS: r.firstTimeS,
    firstValue: r.firstValue,
    lastTimeS: r.lastTimeS,
    lastValue: r.lastValue,
    coveredTimeS: r.coveredTimeS,
    integral: r.integral,
    integral2: r.integral2,
    gapCount: r.gapCount,
    gapTimeS: r.gapTimeS,
    longestGapStartS: r.longestGapStartS,
    longestGapEndS: r.longestGapEndS,
  };
}

/** Summary column names in table order (after traceId, seq, organisationId). */
export const SUMMARY_COLUMNS = [
  'encoding', 'count', 'firstUs', 'lastUs', 'runStartUs', 'runOffset', 'rateHz', 'mean', 'm2', 'minValue', 'minTimeS',
  'maxValue', 'maxTimeS', 'firstTimeS', 'firstValue', 'lastTimeS', 'lastValue', 'coveredTimeS', 'integral', 'integral2',
  'gapCount', 'gapTimeS', 'longestGapStartS', 'longestGapEndS',
] as const satisfies ReadonlyArray<keyof ChunkSummaryRow>;

/** The summary columns of a chunk from its SampleSummary (summaries are stored without thresholds). */
export function summaryColumns(summary: SampleSummary): Omit<ChunkSummaryRow, 'seq' | 'encoding' | 'firstUs' | 'lastUs' | 'runStartUs' | 'runOffset' | 'rateHz'> {
  return {
    count: summary.count,
    mean: summary.meanA,
    m2: summary.m2A2,
    minValue: summary.minA,
    minTimeS: summary.minTimeS,
    maxValue: summary.maxA,
    maxTimeS: summary.maxTimeS,
    firstTimeS: summary.firstTimeS,
    firstValue: summary.firstA,
    lastTimeS: summary.lastTimeS,
    lastValue: summary.lastA,
    coveredTimeS: summary.coveredTimeS,
    integral: summary.integralAs,
    integral2: summary.integralA2s,
    gapCount: summary.gapCount,
    gapTimeS: summary.gapTimeS,
    longestGapStartS: summary.longestGap?.startS ?? null,
    longestGapEndS: summary.longestGap?.endS ?? null,
  };
}

/** A stored chunk's SampleSummary, under the trace's gap threshold. */
export function summaryOfRow(row: ChunkSummaryRow, gapThresholdS: number | null): SampleSummary {
  return {
    count: row.count,
    meanA: row.mean,
    m2A2: row.m2,
    minA: row.minValue,
    minTimeS: row.minTimeS,
    maxA: row.maxValue,
    maxTimeS: row.maxTimeS,
    firstTimeS: row.firstTimeS,
    firstA: row.firstValue,
    lastTimeS: row.lastTimeS,
    lastA: row.lastValue,
    coveredTimeS: row.coveredTimeS,
    integralAs: row.integral,
    integralA2s: row.integral2,
    gapThresholdS,
    gapCount: row.gapCount,
    gapTimeS: row.gapTimeS,
    longestGap: row.longestGapStartS === null || row.longestGapEndS === null ? null : { startS: row.longestGapStartS, endS: row.longestGapEndS },
    thresholdsA: [],
    timeAboveS: [],
  };
}

/**
 * The summary of the same samples multiplied by `factor` (> 0): raw probe units to amperes.
 * Means, extremes and ∫ i dt scale by the factor; M2 and ∫ i² dt by its square; times do not change.
 * Time-above thresholds cannot be rescaled, so the summary must carry none.
 */
export function scaleSummary(summary: SampleSummary, factor: number): SampleSummary {
  if (!(factor > 0 && Number.isFinite(factor))) throw new RangeError(`scale factor must be a positive number (got ${factor})`);
  if (summary.thresholdsA.length > 0) throw new RangeError('a summary with time-above thresholds cannot be rescaled');
  if (factor === 1) return summary;
  return {
    ...summary,
    meanA: summary.meanA * factor,
    m2A2: summary.m2A2 * factor * factor,
    minA: summary.minA * factor,
    maxA: summary.maxA * factor,
    firstA: summary.firstA * factor,
    lastA: summary.lastA * factor,
    integralAs: summary.integralAs * factor,
    integralA2s: summary.integralA2s * factor * factor,
  };
}

/**
 * The summary under another gap threshold. Only a summary without intervals (one sample) can change
 * it: that is the case when a trace's first sample was stored before its spacing was known.
 */
export function withGapThreshold(summary: SampleSummary, gapThresholdS: number | null): SampleSummary {
  if (summary.gapThresholdS === gapThresholdS) return summary;
  if (summary.count > 1) throw new RangeError('the gap threshold of a summary with intervals cannot change');
  return { ...summary, gapThresholdS };
}
