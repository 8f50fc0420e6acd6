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
import { sumSegment, type HalfCycleBlocks } from './half-cycle-blocks.js';

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

/** Shape figures of a[from, to) in one pass. RangeError for an empty range or bad samples (naming the index). */
export function waveformShape(a: SampleArray, from = 0, to: number = a.length): WaveformShape {
  assertSampleArray(a, 'samples');
  assertIndexRange(from, to, a.length, 'sample range');
  const seg = sumSegment(a, from, to, { sumSquares: 0, sum: 0, sumAbs: 0, maxAbs: 0, maxAbsIndex: 0 });
  return shapeFromSums(to - from, seg.sumSquares, seg.sum, seg.sumAbs, seg.maxAbs, seg.maxAbsIndex);
}

/** Shape figures of the whole record from its half-cycle blocks' totals (no pass over the samples). */
export function waveformShapeFromBlocks(blocks: HalfCycleBlocks): WaveformShape {
  if (blocks.sampleCount < 1) throw new RangeError('the waveform has no samples');
  return shapeFromSums(blocks.sampleCount, blocks.totalSumSquares, blocks.totalSum, blocks.totalSumAbs, blocks.peakAbsA, blocks.peakIndex);
}
