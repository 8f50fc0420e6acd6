/**
 * Shape figures of an instantaneous current waveform: peak, RMS, DC (mean), rectified mean,
 * crest factor and form factor.
 *
 * Definitions: peak = max |i| (A); RMS = √(mean of i²) (A); DC = mean of i (A); rectified mean =
 * mean of |i| (A); crest factor = peak / RMS (√2 ≈ 1.4142 for a sine, 1 for a square wave); form
 * factor = RMS / rectified mean (π / (2√2) ≈ 1.1107 for a sine). Meaningful over whole cycles.
 * Source: textbook definitions (trade-facts.md 4.1).
 */

import { assertFiniteNumber, assertIndexRange, assertSampleArray, type SampleArray } from '../validation/assert-input.js';
import type { HalfCycleBlocks } from './half-cycle-blocks.js';

/** Shape figures of a waveform segment; the ratios are null when their denominator is 0. */
export interface WaveformShape {
  sampleCount: number;
  peakA: number;
  /** Index of the first sample reaching the peak. */
  peakIndex: number;
  rmsA: number;
  dcA: number;
  rectifiedMeanA: number;
  crestFactor: number | null;
  formFactor: number | null;
}

/** Crest factor: peakA / rmsA (dimensionless); null when rmsA is 0. */
export function crestFactor(peakA: number, rmsA: number): number | null {
  assertFiniteNumber(peakA, 'peakA');
  assertFiniteNumber(rmsA, 'rmsA');
  return rmsA > 0 ? Math.abs(peakA) / rmsA : null;
}

/** Form factor: rmsA / rectifiedMeanA (dimensionless); null when rectifiedMeanA is 0. */
export function formFactor(rmsA: number, rectifiedMeanA: number): number | null {
  assertFiniteNumber(rmsA, 'rmsA');
  assertFiniteNumber(rectifiedMeanA, 'rectifiedMeanA');
  return rectifiedMeanA > 0 ? rmsA / rectifiedMeanA : null;
}

function shapeFromSums(n: number, sumSquares: number, sum: number, sumAbs: number, peakA: number, peakIndex: number): WaveformShape {
  const rmsA = Math.sqrt(sumSquares / n);
  const rectifiedMeanA = sumAbs / n;
  return {
    sampleCount: n,
    peakA,
    peakIndex,
    rmsA,
    dcA: sum / n,
    rectifiedMeanA,
    crestFactor: crestFactor(peakA, rmsA),
    formFactor: formFactor(rmsA, rectifiedMeanA),
  };
}

/** Shape figures of a[from, to) in one pass. RangeError for an empty range or non-finite samples. */
export function waveformShape(a: SampleArray, from = 0, to: number = a.length): WaveformShape {
  assertSampleArray(a, 'samples');
  assertIndexRange(from, to, a.length, 'sample range');
  let s2 = 0;
  let s1 = 0;
  let sa = 0;
  let peak = -1;
  let peakIndex = from;
  for (let i = from; i < to; i++) {
    const v = a[i] as number;
    const m = Math.abs(v);
    s2 += v * v;
    s1 += v;
    sa += m;
    if (m > peak) {
      peak = m;
      peakIndex = i;
    }
  }
  if (!Number.isFinite(s2)) throw new RangeError('samples must be finite numbers');
  return shapeFromSums(to - from, s2, s1, sa, peak, peakIndex);
}

/** Shape figures of the whole record from its half-cycle blocks' totals (no pass over the samples). */
export function waveformShapeFromBlocks(blocks: HalfCycleBlocks): WaveformShape {
  if (blocks.sampleCount < 1) throw new RangeError('the waveform has no samples');
  return shapeFromSums(blocks.sampleCount, blocks.totalSumSquares, blocks.totalSum, blocks.totalSumAbs, blocks.peakAbsA, blocks.peakIndex);
}
