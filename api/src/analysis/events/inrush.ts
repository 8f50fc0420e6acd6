/**
 * Inrush (start-up) events: what happens from each recorded switch-on until the current settles.
 *
 * For each on-period that starts with a recorded switch-on (see on-periods.ts), on an RMS series
 * (an `rms` trace's samples, or a waveform's half-cycle RMS series):
 * - onsetTimeS: time of the first sample above the on-threshold.
 * - peakA / peakTimeS: the highest value within `maxInrushS` of the onset (default 10 s) and inside
 *   the on-period; timeToPeakS = peakTimeS − onsetTimeS.
 * - steadyA: the running current, the median of the on-period's samples in the second half of the
 *   time from the peak to the period's last sample (robust to surges while running).
 * - peakToSteadyRatio = peakA / steadyA (null when steadyA is 0).
 * - settled / settledAtS: the first time after the peak from which the current stays within
 *   ±settleTolerance × steadyA (default 10 %) for at least settleHoldS (default 0.5 s), or until the
 *   on-period ends if that is sooner and the run holds at least two samples; located by linear
 *   interpolation of the crossing of the tolerance band.
 *   settleTimeS = settledAtS − peakTimeS (the convention of trade-facts.md 6.5 example 24, where an
 *   exponential decay i = Is + (Ip − Is)·e^(−t/τ) settles after τ·ln((Ip − Is)/(tol·Is))).
 * - durationS and i2tA2s: from the onset to settledAtS (or, if it never settles, to the end of the
 *   peak search window); I²t is ∫ i² dt over that span by the trapezoid rule (A²s).
 * - firstCyclesPeakA: for waveform traces, the highest instantaneous |i| within the first
 *   `firstCycles` cycles (default 2) from the start of the first window above the on-threshold.
 * Defaults are our design choice; IEC 63129 and NEMA 410 define peak inrush and pulse duration for
 * lighting products (trade-facts.md 4.5) but no general settling rule exists.
 */

import { assertInRange, assertInteger, assertNonNegative, assertPositive, type SampleArray } from '../validation/assert-input.js';
import { indexAfterTime, timeAt, type TimeAxis } from '../time/time-axis.js';
import { exactQuantiles } from '../stats/quantiles.js';
import type { HalfCycleBlocks } from '../waveform/half-cycle-blocks.js';
import type { OnPeriod } from './on-periods.js';
import { crossingTime, integrateSquares } from './series-integral.js';

/** Parameters of inrush analysis (the on/off levels are in OnThresholdParams). */
export interface InrushParams {
  /** Longest time (s) after the onset in which the peak is looked for. */
  maxInrushS: number;
  /** Settling band: ±settleTolerance × steadyA (a fraction, e.g. 0.1 for 10 %). */
  settleTolerance: number;
  /** Time (s) the current must stay in the band to count as settled. */
  settleHoldS: number;
  /** Cycles after the onset searched for the highest instantaneous peak (waveform traces). */
  firstCycles: number;
}

/** Defaults: 10 s peak window, ±10 % band held 0.5 s, first 2 cycles. Our design choice. */
export const DEFAULT_INRUSH_PARAMS: Readonly<InrushParams> = Object.freeze({
  maxInrushS: 10,
  settleTolerance: 0.1,
  settleHoldS: 0.5,
  firstCycles: 2,
});

/** One start-up event. Units: A, s, A²s. */
export interface InrushEvent {
  onsetTimeS: number;
  peakA: number;
  peakTimeS: number;
  timeToPeakS: number;
  steadyA: number;
  peakToSteadyRatio: number | null;
  settled: boolean;
  settledAtS: number | null;
  settleTimeS: number | null;
  durationS: number;
  i2tA2s: number;
  firstCyclesPeakA: number | null;
  firstCyclesPeakTimeS: number | null;
  /** Time of the first sample at/below the off-threshold; null when the series ends while on. */
  offTimeS: number | null;
}

/** Checks InrushParams; RangeError naming the bad field. */
export function assertInrushParams(params: InrushParams): void {
  assertPositive(params.maxInrushS, 'maxInrushS');
  assertInRange(params.settleTolerance, Number.MIN_VALUE, 1, 'settleTolerance');
  assertNonNegative(params.settleHoldS, 'settleHoldS');
  assertInteger(params.firstCycles, 1, 'firstCycles');
}

/** Running current of a period: median of its samples in the second half of [peak, last sample]. */
export function steadyCurrent(axis: TimeAxis, a: SampleArray, period: OnPeriod, peakIndex: number): number {
  const lastIndex = period.endIndex - 1;
  const middleS = (timeAt(axis, peakIndex) + timeAt(axis, lastIndex)) / 2;
  let from = indexAfterTime(axis, peakIndex, period.endIndex, middleS);
  // Include the sample at the midpoint itself when it falls exactly on it.
  if (from > peakIndex && timeAt(axis, from - 1) === middleS) from -= 1;
  if (from >= period.endIndex) from = lastIndex;
  return exactQuantiles(a, [0.5], from, period.endIndex)[0] as number;
}

/** Where the current enters the settling band for good, or null. */
function findSettling(
  axis: TimeAxis,
  a: SampleArray,
  period: OnPeriod,
  peakIndex: number,
  steadyA: number,
  params: InrushParams,
): { index: number; atS: number } | null {
  const band = params.settleTolerance * Math.abs(steadyA);
  let candidate = -1;
  let held = false;
  for (let i = peakIndex; i < period.endIndex; i++) {
    if (Math.abs((a[i] as number) - steadyA) <= band) {
      if (candidate < 0) candidate = i;
      if (timeAt(axis, i) - timeAt(axis, candidate) >= params.settleHoldS) {
        held = true;
        break;
      }
    } else {
      candidate = -1;
    }
  }
  // A run cut short by the end of the on-period counts when it holds at least two samples.
  if (candidate < 0 || (!held && period.endIndex - candidate < 2)) return null;
  if (candidate === peakIndex) return { index: candidate, atS: timeAt(axis, candidate) };
  const before = a[candidate - 1] as number;
  const edge = before > steadyA ? steadyA + band : steadyA - band;
  return { index: candidate, atS: crossingTime(axis, a, candidate - 1, edge) };
}

/** Highest instantaneous |i| in the first cycles of a waveform event starting at series index j. */
function firstCyclesPeak(blocks: HalfCycleBlocks, seriesIndex: number, firstCycles: number): { peakA: number; timeS: number } {
  const end = Math.min(blocks.blockCount, seriesIndex + 2 * firstCycles);
  let best = seriesIndex;
  for (let k = seriesIndex; k < end; k++) if ((blocks.maxAbs[k] as number) > (blocks.maxAbs[best] as number)) best = k;
  return {
    peakA: blocks.maxAbs[best] as number,
    timeS: blocks.startS + (blocks.maxAbsIndex[best] as number) / blocks.sampleRateHz,
  };
}

/**
 * The inrush event of one on-period of series a (times `axis`). `period.startsAtSeriesStart` must be
 * false (no switch-on recorded otherwise). `blocks`, when given, are the half-cycle blocks the series
 * was made from (series index j ↔ blocks j and j + 1), for firstCyclesPeakA.
 */
export function analyseInrush(
  axis: TimeAxis,
  a: SampleArray,
  period: OnPeriod,
  params: InrushParams = DEFAULT_INRUSH_PARAMS,
  blocks?: HalfCycleBlocks,
): InrushEvent {
  assertInrushParams(params);
  const onset = period.startIndex;
  const onsetTimeS = timeAt(axis, onset);
  const searchEnd = Math.max(onset + 1, indexAfterTime(axis, onset, period.endIndex, onsetTimeS + params.maxInrushS));
  let peakIndex = onset;
  for (let i = onset + 1; i < searchEnd; i++) if ((a[i] as number) > (a[peakIndex] as number)) peakIndex = i;
  const peakA = a[peakIndex] as number;
  const peakTimeS = timeAt(axis, peakIndex);
  const steadyA = steadyCurrent(axis, a, period, peakIndex);
  const settling = findSettling(axis, a, period, peakIndex, steadyA, params);
  let endS: number;
  let endSegment: number;
  if (settling) {
    endS = settling.atS;
    endSegment = settling.atS === timeAt(axis, settling.index) ? settling.index : settling.index - 1;
  } else {
    endSegment = searchEnd - 1;
    endS = timeAt(axis, endSegment);
  }
  const firstPeak = blocks ? firstCyclesPeak(blocks, onset, params.firstCycles) : null;
  return {
    onsetTimeS,
    peakA,
    peakTimeS,
    timeToPeakS: peakTimeS - onsetTimeS,
    steadyA,
    peakToSteadyRatio: steadyA > 0 ? peakA / steadyA : null,
    settled: settling !== null,
    settledAtS: settling ? settling.atS : null,
    settleTimeS: settling ? settling.atS - peakTimeS : null,
    durationS: endS - onsetTimeS,
    i2tA2s: integrateSquares(axis, a, onset, onsetTimeS, endSegment, endS),
    firstCyclesPeakA: firstPeak ? firstPeak.peakA : null,
    firstCyclesPeakTimeS: firstPeak ? firstPeak.timeS : null,
    offTimeS: period.endsAtSeriesEnd ? null : timeAt(axis, period.endIndex),
  };
}
