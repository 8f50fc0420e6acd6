/**
 * Mergeable summary of a run of samples, and the fused one-pass kernel that computes it.
 *
 * A summary holds everything needed to assemble the statistics of a window from the summaries of
 * consecutive pieces (stored chunks plus two partial edge chunks) so that they equal the direct
 * computation (up to floating-point rounding): count, mean and sum of squared deviations (Welford's
 * algorithm with Chan et al.'s pairwise merge, numerically stable even with large offsets), min and
 * max with their times, first and last sample, and the time-weighted integrals over the intervals
 * between samples (trapezoid rule; intervals longer than the gap threshold are gaps: counted,
 * never integrated). Percentiles cannot be assembled from summaries; see `statistics.ts`.
 *
 * Sources: B. P. Welford, "Note on a method for calculating corrected sums of squares and products",
 * Technometrics 4(3), 1962; T. F. Chan, G. H. Golub, R. J. LeVeque, "Algorithms for computing the
 * sample variance: analysis and recommendations", The American Statistician 37(3), 1983 (pairwise
 * update). Within a block of samples the kernel uses the two-pass algorithm (mean, then squared
 * deviations), which Chan et al. recommend; blocks are then merged pairwise.
 */

import {
  MAX_ABS_CURRENT_A,
  MAX_ABS_TIME_S,
  assertFiniteNumber,
  assertIndexRange,
  assertSampleArray,
  throwAtFirstBadValue,
  type SampleArray,
} from '../validation/assert-input.js';
import { throwTimestampError, timeAt, type TimeAxis } from '../time/time-axis.js';
import { timeAboveOnSegment } from './linear-segment.js';

/** An interval between two consecutive samples that is a gap: [startS, endS]. */
export interface GapInterval {
  startS: number;
  endS: number;
}

/**
 * Mergeable summary of samples [from, to) of a series. Plain JSON-able numbers.
 * Units: A for currents, s for times, A·s and A²·s for the integrals.
 * Derived figures: sum = count · meanA; sum of squares = m2A2 + count · meanA².
 */
export interface SampleSummary {
  /** Number of samples. */
  count: number;
  /** Arithmetic mean of the samples (A). */
  meanA: number;
  /** Sum of squared deviations from the mean (A²), Welford's M2. */
  m2A2: number;
  minA: number;
  /** Time of the first occurrence of the minimum (s). */
  minTimeS: number;
  maxA: number;
  /** Time of the first occurrence of the maximum (s). */
  maxTimeS: number;
  firstTimeS: number;
  firstA: number;
  lastTimeS: number;
  lastA: number;
  /** Total length of the intervals that are not gaps (s). */
  coveredTimeS: number;
  /** ∫ i dt over the covered intervals, trapezoid rule (A·s). */
  integralAs: number;
  /** ∫ i² dt over the covered intervals, trapezoid rule on i² (A²·s). */
  integralA2s: number;
  /** Intervals longer than this (s) are gaps; null: no interval is a gap. */
  gapThresholdS: number | null;
  gapCount: number;
  /** Total length of the gaps (s). */
  gapTimeS: number;
  /** The longest gap (the earliest of equals), or null. */
  longestGap: GapInterval | null;
  /** Current levels (A) whose time-above is accumulated, fixed when the summary is made. */
  thresholdsA: number[];
  /** Time (s) strictly above each of thresholdsA over the covered intervals (linear interpolation). */
  timeAboveS: number[];
}

/** Options of `summarise`. */
export interface SummariseOptions {
  /**
   * Intervals longer than this (s) are gaps; null: none is. Summaries merge only when they share it,
   * so a store should fix it once per trace (e.g. gapThresholdFromSpacing of the trace's spacing).
   */
  gapThresholdS: number | null;
  /** Current levels (A) to accumulate time above; default none. */
  thresholdsA?: readonly number[];
  /** When given, every gap found is appended here (in time order) until it holds `maxGapsListed`. */
  gapSink?: GapInterval[];
  /** Cap for gapSink; default 100. */
  maxGapsListed?: number;
}

/** Samples per block of the kernel: small enough to stay in cache between the passes over a block. */
export const SUMMARY_BLOCK_SAMPLES = 4096;

/** Default cap on the number of gaps listed individually. */
export const DEFAULT_MAX_GAPS_LISTED = 100;

/** Checks a gap threshold (null or > 0) and a thresholds list (finite values). */
export function assertSummaryOptions(gapThresholdS: number | null, thresholdsA: readonly number[]): void {
  if (gapThresholdS !== null) {
    assertFiniteNumber(gapThresholdS, 'gapThresholdS');
    if (gapThresholdS <= 0) throw new RangeError(`gapThresholdS must be greater than 0 (got ${gapThresholdS})`);
  }
  if (!Array.isArray(thresholdsA)) throw new RangeError('thresholdsA must be an array of numbers');
  thresholdsA.forEach((h, k) => assertFiniteNumber(h, `thresholdsA[${k}]`));
}

/** Mutable accumulator shared by the block kernels. */
interface Accumulator {
  count: number;
  mean: number;
  m2: number;
  min: number;
  minIndex: number;
  max: number;
  maxIndex: number;
  covered: number;
  integral2x: number; // 2 × ∫ i dt (the trapezoid's 1/2 applied at the end)
  integral2x2: number; // 2 × ∫ i² dt
  gapCount: number;
  gapTime: number;
  longestStart: number;
  longestEnd: number;
  timeAbove: Float64Array;
  // The block being scanned (set by valuesPass).
  blockSum: number;
  blockSquares: number;
  blockMin: number;
  blockMinIndex: number;
  blockMax: number;
  blockMaxIndex: number;
}

function recordGap(acc: Accumulator, startS: number, endS: number, options: SummariseOptions): void {
  const length = endS - startS;
  acc.gapCount += 1;
  acc.gapTime += length;
  if (acc.gapCount === 1 || length > acc.longestEnd - acc.longestStart) {
    acc.longestStart = startS;
    acc.longestEnd = endS;
  }
  const sink = options.gapSink;
  if (sink && sink.length < (options.maxGapsListed ?? DEFAULT_MAX_GAPS_LISTED)) sink.push({ startS, endS });
}

/**
 * Summary of samples a[from, to) at times `axis` (see SampleSummary). One fused pass, block by
 * block; nothing the size of the input is allocated. Throws a RangeError for an empty or bad range,
 * a non-finite or out-of-range value (|a| > MAX_ABS_CURRENT_A), or timestamps that are not finite
 * and strictly increasing, naming the first bad index.
 */
export function summarise(
  axis: TimeAxis,
  a: SampleArray,
  from: number,
  to: number,
  options: SummariseOptions,
): SampleSummary {
  assertSampleArray(a, 'samples');
  assertIndexRange(from, to, a.length, 'sample range');
  const thresholds = options.thresholdsA ?? [];
  assertSummaryOptions(options.gapThresholdS, thresholds);
  const explicit = axis.kind === 'explicit' ? axis.timesS : null;
  if (explicit !== null) {
    if (explicit.length !== a.length) {
      throw new RangeError(`timestamps has ${explicit.length} elements but there are ${a.length} samples`);
    }
    const first = explicit[from] as number;
    const last = explicit[to - 1] as number;
    // Strictly increasing (checked in the kernel) and both ends in range means every time is.
    if (!(Math.abs(first) <= MAX_ABS_TIME_S)) throw new RangeError(`timestamps[${from}] = ${first} is not a finite time within ±${MAX_ABS_TIME_S} s`);
    if (!(Math.abs(last) <= MAX_ABS_TIME_S)) throwExplicitEnd(explicit, from, to);
  }
  const gap = options.gapThresholdS ?? Number.POSITIVE_INFINITY;
  const acc: Accumulator = {
    count: 0, mean: 0, m2: 0,
    min: Number.POSITIVE_INFINITY, minIndex: from, max: Number.NEGATIVE_INFINITY, maxIndex: from,
    covered: 0, integral2x: 0, integral2x2: 0,
    gapCount: 0, gapTime: 0, longestStart: 0, longestEnd: 0,
    timeAbove: new Float64Array(thresholds.length),
    blockSum: 0, blockSquares: 0, blockMin: 0, blockMinIndex: 0, blockMax: 0, blockMaxIndex: 0,
  };
  const dt = explicit === null ? 1 / (axis as { rateHz: number }).rateHz : 0;
  if (explicit === null && dt > gap) {
    // A gap threshold below the sample spacing makes every interval a gap.
    for (let i = from + 1; i < to; i++) recordGap(acc, timeAt(axis, i - 1), timeAt(axis, i), options);
  }
  const uniformIntegrates = explicit === null && dt <= gap;
  scanBlocks(acc, a, explicit, from, to, uniformIntegrates ? dt : 0, gap, thresholds, options);
  return {
    count: acc.count,
    meanA: acc.mean,
    m2A2: acc.m2,
    minA: acc.min,
    minTimeS: timeAt(axis, acc.minIndex),
    maxA: acc.max,
    maxTimeS: timeAt(axis, acc.maxIndex),
    firstTimeS: timeAt(axis, from),
    firstA: a[from] as number,
    lastTimeS: timeAt(axis, to - 1),
    lastA: a[to - 1] as number,
    coveredTimeS: acc.covered,
    integralAs: acc.integral2x / 2,
    integralA2s: acc.integral2x2 / 2,
    gapThresholdS: options.gapThresholdS,
    gapCount: acc.gapCount,
    gapTimeS: acc.gapTime,
    longestGap: acc.gapCount > 0 ? { startS: acc.longestStart, endS: acc.longestEnd } : null,
    thresholdsA: [...thresholds],
    timeAboveS: Array.from(acc.timeAbove),
  };
}

function throwExplicitEnd(t: Float64Array, from: number, to: number): never {
  // Either a timestamp inside is bad (found by the scan) or the last one is out of range.
  for (let i = from + 1; i < to; i++) if (!((t[i] as number) > (t[i - 1] as number))) throwTimestampError(t, i);
  throw new RangeError(`timestamps[${to - 1}] = ${String(t[to - 1])} is not a finite time within ±${MAX_ABS_TIME_S} s`);
}

/**
 * The scan over samples [from, to), block by block (each block stays in cache between its passes):
 * a values pass (sum, sum of squares, min and max), the check for bad values, a second pass for the
 * block's M2 (and, with explicit times, the trapezoid sums and gaps), the pairwise merge into the
 * running moments, then one short pass per threshold. Hot loops are kept free of rare work, and
 * the scan lives outside `summarise`: V8 compiles these loops markedly worse when they are
 * inlined into a larger function or share a body with rarely taken branches.
 */
function scanBlocks(
  acc: Accumulator,
  a: SampleArray,
  explicit: Float64Array | null,
  from: number,
  to: number,
  dt: number,
  gap: number,
  thresholds: readonly number[],
  options: SummariseOptions,
): void {
  const firstThreshold = thresholds.length > 0 ? (thresholds[0] as number) : Number.NaN;
  for (let b0 = from; b0 < to; b0 += SUMMARY_BLOCK_SAMPLES) {
    const b1 = Math.min(to, b0 + SUMMARY_BLOCK_SAMPLES);
    // Intervals ending at samples i0 .. b1 - 1 (each joins a sample to the one before it).
    const i0 = b0 === from ? from + 1 : b0;
    valuesPass(acc, a, b0, b1);
    if (acc.blockSum !== acc.blockSum || acc.blockMin < -MAX_ABS_CURRENT_A || acc.blockMax > MAX_ABS_CURRENT_A) {
      // NaN poisons the sum; ±Infinity and out-of-range values show in the extremes.
      throwAtFirstBadValue(a, b0, b1, MAX_ABS_CURRENT_A, 'samples');
    }
    const n = b1 - b0;
    const blockMean = acc.blockSum / n;
    let blockM2: number;
    if (explicit !== null) {
      blockM2 = explicitSecondPass(acc, a, explicit, b0, i0, b1, blockMean, gap, firstThreshold, options);
    } else {
      blockM2 = squaredDeviations(a, b0, b1, blockMean);
      if (dt > 0) addUniformIntegrals(acc, a, b0, i0, b1, dt);
    }
    const total = acc.count + n;
    const delta = blockMean - acc.mean;
    acc.mean += (delta * n) / total;
    acc.m2 += blockM2 + (delta * delta * acc.count * n) / total;
    acc.count = total;
    if (acc.blockMin < acc.min) {
      acc.min = acc.blockMin;
      acc.minIndex = acc.blockMinIndex;
    }
    if (acc.blockMax > acc.max) {
      acc.max = acc.blockMax;
      acc.maxIndex = acc.blockMaxIndex;
    }
    if (i0 < b1) {
      // With explicit times the first threshold rides along in the second pass.
      for (let k = explicit !== null ? 1 : 0; k < thresholds.length; k++) {
        const h = thresholds[k] as number;
        const above = explicit !== null ? timeAboveExplicit(a, explicit, i0, b1, h, gap) : dt > 0 ? timeAboveUniform(a, i0, b1, h) * dt : 0;
        acc.timeAbove[k] = (acc.timeAbove[k] as number) + above;
      }
    }
  }
}

/**
 * Sum, sum of squares, min and max (first occurrence) of a[b0, b1), two samples per step with
 * separate accumulators (the loop is bound by add latency), into acc.block*.
 */
function valuesPass(acc: Accumulator, a: SampleArray, b0: number, b1: number): void {
  let sumEven = 0;
  let sumOdd = 0;
  let squaresEven = 0;
  let squaresOdd = 0;
  let lo = Number.POSITIVE_INFINITY;
  let hi = Number.NEGATIVE_INFINITY;
  let loIndex = b0;
  let hiIndex = b0;
  const end2 = b0 + ((b1 - b0) & ~1);
  for (let i = b0; i < end2; i += 2) {
    const v = a[i] as number;
    const w = a[i + 1] as number;
    sumEven += v;
    sumOdd += w;
    squaresEven += v * v;
    squaresOdd += w * w;
    if (v < lo || w < lo) {
      if (v <= w) {
        lo = v;
        loIndex = i;
      } else {
        lo = w;
        loIndex = i + 1;
      }
    }
    if (v > hi || w > hi) {
      if (v >= w) {
        hi = v;
        hiIndex = i;
      } else {
        hi = w;
        hiIndex = i + 1;
      }
    }
  }
  if (end2 < b1) {
    const v = a[end2] as number;
    sumEven += v;
    squaresEven += v * v;
    if (v < lo) {
      lo = v;
      loIndex = end2;
    }
    if (v > hi) {
      hi = v;
      hiIndex = end2;
    }
  }
  acc.blockSum = sumEven + sumOdd;
  acc.blockSquares = squaresEven + squaresOdd;
  acc.blockMin = lo;
  acc.blockMinIndex = loIndex;
  acc.blockMax = hi;
  acc.blockMaxIndex = hiIndex;
}

/** Σ (a[i] − mean)² over a[b0, b1): the block's M2 by the two-pass method. */
function squaredDeviations(a: SampleArray, b0: number, b1: number, mean: number): number {
  let m2 = 0;
  for (let i = b0; i < b1; i++) {
    const d = (a[i] as number) - mean;
    m2 += d * d;
  }
  return m2;
}

/**
 * Trapezoid sums over the uniform intervals ending at i0..b1-1, from the block's plain sums: each
 * sample counts twice except a[i0 − 1] and a[b1 − 1], which count once.
 */
function addUniformIntegrals(acc: Accumulator, a: SampleArray, b0: number, i0: number, b1: number, dt: number): void {
  const first = a[b0] as number;
  const before = a[i0 - 1] as number;
  const last = a[b1 - 1] as number;
  const values = i0 > b0 ? acc.blockSum - first : acc.blockSum;
  const squares = i0 > b0 ? acc.blockSquares - first * first : acc.blockSquares;
  acc.integral2x += (2 * values + before - last) * dt;
  acc.integral2x2 += (2 * squares + before * before - last * last) * dt;
  acc.covered += (b1 - i0) * dt;
}

/**
 * Second pass over a block with explicit times: its M2 (returned), and the trapezoid sums and the
 * time above the first threshold `h0` (NaN: none) over the intervals ending at i0..b1-1. Intervals longer than `gap` are recorded as gaps and skipped; a
 * timestamp that is not finite or not increasing is a RangeError.
 */
function explicitSecondPass(
  acc: Accumulator,
  a: SampleArray,
  t: Float64Array,
  b0: number,
  i0: number,
  b1: number,
  mean: number,
  gap: number,
  h0: number,
  options: SummariseOptions,
): number {
  let m2 = 0;
  let above = 0;
  if (i0 > b0) {
    const d = (a[b0] as number) - mean;
    m2 = d * d;
  }
  let previous = a[i0 - 1] as number;
  let previousSquare = previous * previous;
  let previousT = t[i0 - 1] as number;
  let s1 = 0;
  let s2 = 0;
  let covered = 0;
  for (let i = i0; i < b1; i++) {
    const v = a[i] as number;
    const square = v * v;
    const d = v - mean;
    m2 += d * d;
    const ti = t[i] as number;
    const dt = ti - previousT;
    if (dt > 0 && dt <= gap) {
      s1 += (v + previous) * dt;
      s2 += (square + previousSquare) * dt;
      covered += dt;
      // h0 is NaN when there is no threshold: both comparisons are then false.
      if (v > h0 || previous > h0) above += v > h0 && previous > h0 ? dt : timeAboveOnSegment(previous, v, dt, h0);
    } else {
      irregularInterval(acc, t, i, dt, gap, options);
    }
    previous = v;
    previousSquare = square;
    previousT = ti;
  }
  acc.integral2x += s1;
  acc.integral2x2 += s2;
  acc.covered += covered;
  if (acc.timeAbove.length > 0) acc.timeAbove[0] = (acc.timeAbove[0] as number) + above;
  return m2;
}

/** An interval that is not an ordinary one: a gap (recorded) or bad timestamps (RangeError). */
function irregularInterval(acc: Accumulator, t: Float64Array, i: number, dt: number, gap: number, options: SummariseOptions): void {
  if (dt > gap) recordGap(acc, t[i - 1] as number, t[i] as number, options);
  else throwTimestampError(t, i);
}

/**
 * Time above h (in units of the spacing) over uniform intervals ending at i0..i1-1. Intervals with
 * both ends above count whole; only crossings need the interpolation of timeAboveOnSegment.
 */
function timeAboveUniform(a: SampleArray, i0: number, i1: number, h: number): number {
  let whole = 0;
  let partial = 0;
  let p = a[i0 - 1] as number;
  for (let i = i0; i < i1; i++) {
    const v = a[i] as number;
    if (v > h) {
      if (p > h) whole++;
      else partial += timeAboveOnSegment(p, v, 1, h);
    } else if (p > h) {
      partial += timeAboveOnSegment(p, v, 1, h);
    }
    p = v;
  }
  return whole + partial;
}

/** Time above h (s) over explicit intervals ending at i0..i1-1, skipping intervals longer than gap. */
function timeAboveExplicit(a: SampleArray, t: Float64Array, i0: number, i1: number, h: number, gap: number): number {
  let above = 0;
  let p = a[i0 - 1] as number;
  for (let i = i0; i < i1; i++) {
    const v = a[i] as number;
    if (v > h || p > h) {
      const dt = (t[i] as number) - (t[i - 1] as number);
      if (dt <= gap) above += v > h && p > h ? dt : timeAboveOnSegment(p, v, dt, h);
    }
    p = v;
  }
  return above;
}
