/**
 * Statistics of a current series (a whole trace or a window), computed directly from the samples
 * (`computeStatistics`, with exact percentiles) or assembled from mergeable summaries
 * (`statisticsFromSummary`, without percentiles).
 *
 * Definitions (units A, s, A·h, kWh):
 * - count: number of samples; durationS: last time − first time; coveredTimeS: durationS minus gaps.
 * - min/max with the time of their first occurrence.
 * - meanA: arithmetic mean of the samples; rmsA: √(mean of squares) of the samples;
 *   standardDeviationA: population standard deviation (divide by n, as numpy.std and
 *   simple-statistics standardDeviation).
 * - timeWeightedMeanA: ∫ i dt / coveredTimeS; thermalEquivalentA: √(∫ i² dt / coveredTimeS), the
 *   constant current that heats a resistance equally over the covered time (trade-facts.md 4.1).
 *   Both by the trapezoid rule over intervals that are not gaps; null when coveredTimeS is 0.
 * - p50A/p95A/p99A: type 7 quantiles of the samples (see quantiles.ts); null from summaries.
 * - chargeAh: ∫ i dt / 3600; energyKWh at voltageV and powerFactor (null without a voltage).
 * - dutyCycle: share of coveredTimeS strictly above onThresholdA (linear interpolation), in [0, 1].
 * - timeAbove: time strictly above each threshold, and its share of coveredTimeS.
 * - gaps: intervals longer than the gap threshold; counted and listed, never integrated.
 *
 * Missing readings: the engine has no "missing" marker (non-finite values are rejected); a caller
 * drops missing readings, which leaves a longer interval that is bridged by interpolation when it
 * is within the gap threshold, and reported as a gap otherwise. Counts are counts of readings.
 */

import { DEFAULT_POWER_FACTOR } from '../power/watts-amps.js';
import { assertFiniteNumber, assertInRange, assertPositive, type SampleArray } from '../validation/assert-input.js';
import type { TimeAxis } from '../time/time-axis.js';
import { DEFAULT_GAP_FACTOR, gapThresholdFromSpacing, typicalSpacingS } from '../time/typical-spacing.js';
import { chargeAhFromIntegral, energyKWhFromIntegral } from './energy.js';
import { QUANTILE_METHOD, exactQuantiles } from './quantiles.js';
import {
  DEFAULT_MAX_GAPS_LISTED,
  summarise,
  type GapInterval,
  type SampleSummary,
} from './sample-summary.js';

/** Time spent above one threshold. */
export interface TimeAboveThreshold {
  thresholdA: number;
  timeS: number;
  /** timeS / coveredTimeS, or null when coveredTimeS is 0. */
  share: number | null;
}

/** Gaps found in the series. */
export interface GapReport {
  /** Intervals longer than this (s) are gaps; null: none can be (fewer than two samples or disabled). */
  thresholdS: number | null;
  count: number;
  totalS: number;
  longest: GapInterval | null;
  /** The first gaps in time order (at most maxGapsListed); empty when assembled from summaries. */
  listed: GapInterval[];
  /** True when more gaps exist than are listed. */
  listTruncated: boolean;
}

/** Statistics of a series; see the file comment for each definition. JSON-able. */
export interface Statistics {
  count: number;
  firstTimeS: number;
  lastTimeS: number;
  durationS: number;
  coveredTimeS: number;
  minA: number;
  minTimeS: number;
  maxA: number;
  maxTimeS: number;
  meanA: number;
  rmsA: number;
  standardDeviationA: number;
  timeWeightedMeanA: number | null;
  thermalEquivalentA: number | null;
  p50A: number | null;
  p95A: number | null;
  p99A: number | null;
  /** The quantile definition, or a note that percentiles need the samples. */
  quantileMethod: string;
  chargeAh: number;
  energyKWh: number | null;
  voltageV: number | null;
  powerFactor: number;
  onThresholdA: number | null;
  dutyCycle: number | null;
  timeAbove: TimeAboveThreshold[];
  gaps: GapReport;
}

/** Options shared by both ways of producing Statistics. */
export interface StatisticsOutputOptions {
  /** Nominal RMS voltage (V) for energy; null or absent: energy is null. */
  voltageV?: number | null;
  /** Power factor for energy, 0 < PF ≤ 1; default DEFAULT_POWER_FACTOR (1). */
  powerFactor?: number;
  /** Threshold (A) for the duty cycle; null or absent: no duty cycle. */
  onThresholdA?: number | null;
}

/** Options of `computeStatistics`. */
export interface StatisticsOptions extends StatisticsOutputOptions {
  /** First sample index (inclusive); default 0. */
  from?: number;
  /** Last sample index (exclusive); default the length. */
  to?: number;
  /** Gap threshold (s); default gapFactor × typical spacing; null: no gaps. */
  gapThresholdS?: number | null;
  /** Gap factor used when gapThresholdS is not given; default DEFAULT_GAP_FACTOR (2.5). */
  gapFactor?: number;
  /** Levels (A) to report time above; default none. */
  thresholdsA?: readonly number[];
  /** Cap on the gaps listed; default DEFAULT_MAX_GAPS_LISTED (100). */
  maxGapsListed?: number;
}

/** Note in `quantileMethod` when percentiles were not computed. */
export const PERCENTILES_NEED_SAMPLES =
  'not available: exact percentiles need the samples of the window, not summaries';

function assertOutputOptions(options: StatisticsOutputOptions): { voltageV: number | null; powerFactor: number; onThresholdA: number | null } {
  const voltageV = options.voltageV ?? null;
  if (voltageV !== null) assertPositive(voltageV, 'voltageV');
  const powerFactor = options.powerFactor ?? DEFAULT_POWER_FACTOR;
  assertInRange(powerFactor, Number.MIN_VALUE, 1, 'powerFactor');
  const onThresholdA = options.onThresholdA ?? null;
  if (onThresholdA !== null) assertFiniteNumber(onThresholdA, 'onThresholdA');
  return { voltageV, powerFactor, onThresholdA };
}

/** Thresholds to accumulate: the caller's plus the on-threshold, without duplicates, in order. */
function thresholdsWithOn(thresholdsA: readonly number[], onThresholdA: number | null): number[] {
  const all = [...thresholdsA];
  if (onThresholdA !== null && !all.includes(onThresholdA)) all.push(onThresholdA);
  return all;
}

/**
 * Statistics from a mergeable summary (see the file comment). Percentiles are null: they cannot be
 * assembled from summaries. The duty cycle needs onThresholdA among the summary's thresholdsA, and
 * timeAbove lists the summary's thresholds. `listedGaps` may pass gaps collected elsewhere.
 */
export function statisticsFromSummary(
  summary: SampleSummary,
  options: StatisticsOutputOptions = {},
  listedGaps: GapInterval[] = [],
): Statistics {
  const { voltageV, powerFactor, onThresholdA } = assertOutputOptions(options);
  if (summary.count < 1) throw new RangeError('summary holds no samples');
  const covered = summary.coveredTimeS;
  const share = (timeS: number): number | null => (covered > 0 ? Math.min(1, timeS / covered) : null);
  let dutyCycle: number | null = null;
  if (onThresholdA !== null) {
    const k = summary.thresholdsA.indexOf(onThresholdA);
    if (k < 0) throw new RangeError(`onThresholdA ${onThresholdA} is not among the summary's thresholdsA`);
    dutyCycle = share(summary.timeAboveS[k] as number);
  }
  const meanSquare = summary.m2A2 / summary.count + summary.meanA * summary.meanA;
  return {
    count: summary.count,
    firstTimeS: summary.firstTimeS,
    lastTimeS: summary.lastTimeS,
    durationS: summary.lastTimeS - summary.firstTimeS,
    coveredTimeS: covered,
    minA: summary.minA,
    minTimeS: summary.minTimeS,
    maxA: summary.maxA,
    maxTimeS: summary.maxTimeS,
    // Rounding can push the mean a hair outside [min, max]; clamp so the invariant holds.
    meanA: Math.min(summary.maxA, Math.max(summary.minA, summary.meanA)),
    rmsA: Math.sqrt(Math.max(0, meanSquare)),
    standardDeviationA: Math.sqrt(Math.max(0, summary.m2A2 / summary.count)),
    timeWeightedMeanA: covered > 0 ? Math.min(summary.maxA, Math.max(summary.minA, summary.integralAs / covered)) : null,
    thermalEquivalentA: covered > 0 ? Math.sqrt(Math.max(0, summary.integralA2s / covered)) : null,
    p50A: null,
    p95A: null,
    p99A: null,
    quantileMethod: PERCENTILES_NEED_SAMPLES,
    chargeAh: chargeAhFromIntegral(summary.integralAs),
    energyKWh: voltageV === null ? null : energyKWhFromIntegral(summary.integralAs, voltageV, powerFactor),
    voltageV,
    powerFactor,
    onThresholdA,
    dutyCycle,
    timeAbove: summary.thresholdsA.map((thresholdA, k) => ({
      thresholdA,
      timeS: summary.timeAboveS[k] as number,
      share: share(summary.timeAboveS[k] as number),
    })),
    gaps: {
      thresholdS: summary.gapThresholdS,
      count: summary.gapCount,
      totalS: summary.gapTimeS,
      longest: summary.longestGap,
      listed: listedGaps,
      listTruncated: listedGaps.length < summary.gapCount,
    },
  };
}

/**
 * Statistics of samples a[from, to) at times `axis`, directly: one fused pass for everything but
 * the percentiles, then exact type 7 p50/p95/p99 by histogram selection (two more passes, no sort,
 * no copy). See the file comment for definitions and defaults. Throws a RangeError on bad input.
 */
export function computeStatistics(axis: TimeAxis, a: SampleArray, options: StatisticsOptions = {}): Statistics {
  const from = options.from ?? 0;
  const to = options.to ?? a.length;
  const output = assertOutputOptions(options);
  const gapThresholdS =
    options.gapThresholdS !== undefined
      ? options.gapThresholdS
      : gapThresholdFromSpacing(typicalSpacingS(axis, from, to), options.gapFactor ?? DEFAULT_GAP_FACTOR);
  const gapSink: GapInterval[] = [];
  const summary = summarise(axis, a, from, to, {
    gapThresholdS,
    thresholdsA: thresholdsWithOn(options.thresholdsA ?? [], output.onThresholdA),
    gapSink,
    maxGapsListed: options.maxGapsListed ?? DEFAULT_MAX_GAPS_LISTED,
  });
  const statistics = statisticsFromSummary(summary, output, gapSink);
  const [p50, p95, p99] = exactQuantiles(a, [0.5, 0.95, 0.99], from, to, { minA: summary.minA, maxA: summary.maxA });
  statistics.p50A = p50 as number;
  statistics.p95A = p95 as number;
  statistics.p99A = p99 as number;
  statistics.quantileMethod = QUANTILE_METHOD;
  // Report only the caller's thresholds (the on-threshold shows as dutyCycle).
  const requested = options.thresholdsA ?? [];
  statistics.timeAbove = statistics.timeAbove.filter((entry) => requested.includes(entry.thresholdA));
  return statistics;
}
