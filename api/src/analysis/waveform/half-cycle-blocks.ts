/**
 * The one pass over a waveform that everything else is built from: the record is cut into
 * consecutive half-cycle blocks and, for each, the sum of squares, the sum, the sum of absolute
 * values and the largest absolute value (with its index) are kept; totals cover every sample,
 * including a trailing partial block. A one-cycle RMS refreshed every half cycle is then the RMS of
 * two neighbouring blocks, and 10/12-cycle aggregates are sums of 20/24 blocks (no prefix-sum array,
 * no second pass over the samples).
 *
 * Block k spans samples [round(k·h), round((k+1)·h)) with h = sampleRate / (2 · mainsFrequency), so
 * a fractional half cycle is followed to within one sample. The grid starts at the first sample:
 * IEC 61000-4-30 synchronises windows to the voltage's zero crossings, which a current-only trace
 * does not have (our design choice, stated in the output). Source: IEC 61000-4-30 half-cycle-refreshed
 * one-cycle RMS (trade-facts.md 4.2), block decomposition ours.
 */

import {
  MAX_ABS_CURRENT_A,
  assertInRange,
  assertPositive,
  assertSampleArray,
  throwAtFirstBadValue,
  type SampleArray,
} from '../validation/assert-input.js';
import { MAX_MAINS_FREQUENCY_HZ, MIN_MAINS_FREQUENCY_HZ } from './iec-windows.js';

/** Fewest samples per half cycle accepted (below it a half-cycle RMS means little): 4. */
export const MIN_SAMPLES_PER_HALF_CYCLE = 4;

/** Per-half-cycle sums of a waveform, plus totals over every sample. */
export interface HalfCycleBlocks {
  sampleRateHz: number;
  startS: number;
  mainsFrequencyHz: number;
  /** Samples per half cycle, h = rate / (2 f) (may be fractional). */
  halfCycleSamples: number;
  /** Number of whole blocks. */
  blockCount: number;
  /** blockCount + 1 sample indexes: block k is [boundaries[k], boundaries[k + 1]). */
  boundaries: Float64Array;
  /** Σ i² per block (A²). */
  sumSquares: Float64Array;
  /** Σ i per block (A). */
  sums: Float64Array;
  /** Σ |i| per block (A). */
  sumAbs: Float64Array;
  /** max |i| per block (A). */
  maxAbs: Float64Array;
  /** Index of the first sample reaching maxAbs in each block. */
  maxAbsIndex: Float64Array;
  /** Totals over all samples (whole blocks and the trailing partial block). */
  sampleCount: number;
  totalSumSquares: number;
  totalSum: number;
  totalSumAbs: number;
  peakAbsA: number;
  peakIndex: number;
}

/** Sums over one segment of a waveform (A², A, A, A and a sample index). */
export interface SegmentSums {
  sumSquares: number;
  sum: number;
  sumAbs: number;
  maxAbs: number;
  /** Index of the first sample reaching maxAbs. */
  maxAbsIndex: number;
}

/**
 * Σ i², Σ i, Σ |i| and max |i| (with its first index) over a[b0, b1), written into `out` (returned).
 * Validates on the way: a non-finite sample or one beyond ±MAX_ABS_CURRENT_A is a RangeError
 * naming its index. The inner loop of every pass over raw waveform samples.
 */
export function sumSegment(a: SampleArray, b0: number, b1: number, out: SegmentSums): SegmentSums {
  // Two interleaved accumulators per sum halve the add-latency chains (the loop is latency-bound).
  let s2 = 0;
  let s1 = 0;
  let sa = 0;
  let s2b = 0;
  let s1b = 0;
  let sab = 0;
  let mx = -1;
  let mi = b0;
  const end2 = b0 + ((b1 - b0) & ~1);
  for (let i = b0; i < end2; i += 2) {
    const v = a[i] as number;
    const w = a[i + 1] as number;
    const m = Math.abs(v);
    const n = Math.abs(w);
    s2 += v * v;
    s2b += w * w;
    s1 += v;
    s1b += w;
    sa += m;
    sab += n;
    if (m > mx || n > mx) {
      if (m >= n) {
        if (m > mx) {
          mx = m;
          mi = i;
        }
      } else {
        mx = n;
        mi = i + 1;
      }
    }
  }
  if (end2 < b1) {
    const v = a[end2] as number;
    const m = Math.abs(v);
    s2 += v * v;
    s1 += v;
    sa += m;
    if (m > mx) {
      mx = m;
      mi = end2;
    }
  }
  s2 += s2b;
  s1 += s1b;
  sa += sab;
  // NaN poisons s1; ±Infinity and out-of-range values show in mx.
  if (s1 !== s1 || mx > MAX_ABS_CURRENT_A) throwAtFirstBadValue(a, b0, b1, MAX_ABS_CURRENT_A, 'samples');
  out.sumSquares = s2;
  out.sum = s1;
  out.sumAbs = sa;
  out.maxAbs = mx;
  out.maxAbsIndex = mi;
  return out;
}

/**
 * Cuts `a` (amperes, uniformly sampled at `sampleRateHz` from `startS`) into half-cycle blocks of
 * the `mainsFrequencyHz` fundamental and sums each (see the file comment). One pass; validates the
 * samples (finite, |i| ≤ MAX_ABS_CURRENT_A) on the way. RangeError for bad arguments, fewer than
 * MIN_SAMPLES_PER_HALF_CYCLE samples per half cycle, or bad samples (naming the index).
 */
export function halfCycleBlocks(
  a: SampleArray,
  sampleRateHz: number,
  mainsFrequencyHz: number,
  startS = 0,
): HalfCycleBlocks {
  assertSampleArray(a, 'samples');
  assertPositive(sampleRateHz, 'sampleRateHz');
  assertInRange(mainsFrequencyHz, MIN_MAINS_FREQUENCY_HZ, MAX_MAINS_FREQUENCY_HZ, 'mainsFrequencyHz');
  const h = sampleRateHz / (2 * mainsFrequencyHz);
  if (h < MIN_SAMPLES_PER_HALF_CYCLE) {
    throw new RangeError(
      `sample rate ${sampleRateHz} Hz gives ${h.toFixed(2)} samples per half cycle at ${mainsFrequencyHz} Hz; at least ${MIN_SAMPLES_PER_HALF_CYCLE} are needed`,
    );
  }
  const n = a.length;
  let blockCount = Math.floor(n / h);
  while (blockCount > 0 && Math.round(blockCount * h) > n) blockCount--;
  const boundaries = new Float64Array(blockCount + 1);
  for (let k = 0; k <= blockCount; k++) boundaries[k] = Math.round(k * h);
  const sumSquares = new Float64Array(blockCount);
  const sums = new Float64Array(blockCount);
  const sumAbs = new Float64Array(blockCount);
  const maxAbs = new Float64Array(blockCount);
  const maxAbsIndex = new Float64Array(blockCount);

  let totalSumSquares = 0;
  let totalSum = 0;
  let totalSumAbs = 0;
  let peakAbsA = 0;
  let peakIndex = 0;
  const segment: SegmentSums = { sumSquares: 0, sum: 0, sumAbs: 0, maxAbs: 0, maxAbsIndex: 0 };
  for (let k = 0; k <= blockCount; k++) {
    // k === blockCount is the trailing partial block (maybe empty): totals only.
    const b0 = boundaries[Math.min(k, blockCount)] as number;
    const b1 = k < blockCount ? (boundaries[k + 1] as number) : n;
    if (b0 >= b1) continue;
    const seg = sumSegment(a, b0, b1, segment);
    if (k < blockCount) {
      sumSquares[k] = seg.sumSquares;
      sums[k] = seg.sum;
      sumAbs[k] = seg.sumAbs;
      maxAbs[k] = seg.maxAbs;
      maxAbsIndex[k] = seg.maxAbsIndex;
    }
    totalSumSquares += seg.sumSquares;
    totalSum += seg.sum;
    totalSumAbs += seg.sumAbs;
    if (seg.maxAbs > peakAbsA) {
      peakAbsA = seg.maxAbs;
      peakIndex = seg.maxAbsIndex;
    }
  }
  return {
    sampleRateHz, startS, mainsFrequencyHz, halfCycleSamples: h, blockCount, boundaries,
    sumSquares, sums, sumAbs, maxAbs, maxAbsIndex,
    sampleCount: n, totalSumSquares, totalSum, totalSumAbs, peakAbsA, peakIndex,
  };
}
