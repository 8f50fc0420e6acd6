/**
 * Surges while running: excursions of the current above the running level by more than a
 * threshold, for longer than a minimum time.
 *
 * Within each on-period, after its inrush has settled (or, if it never settles, after the inrush
 * peak search window; from the start for a period already on when the series starts), a surge is a
 * maximal run of samples above level = steadyA + max(surgeThresholdFraction × steadyA, surgeFloorA), with
 * steadyA the period's running current (see inrush.ts). Its start and end are the interpolated
 * crossings of that level (the series' first/last sample when it starts or ends above it); it
 * counts when durationS ≥ surgeMinDurationS. Reported: start, end, duration, peak and its time, the
 * running level, the excess of the peak over it, and I²t over the surge (A²s, trapezoid rule).
 * Defaults: 25 % above running with a 1 A floor, at least 20 ms (one cycle at 50 Hz).
 * Source: our design choice.
 */

import { assertNonNegative, type SampleArray } from '../validation/assert-input.js';
import { timeAt, type TimeAxis } from '../time/time-axis.js';
import { crossingTime, integrateSquares } from './series-integral.js';

/** Parameters of surge detection. */
export interface SurgeParams {
  /** Excursion above the running level, as a fraction of it. */
  surgeThresholdFraction: number;
  /** Absolute floor of the excursion (A). */
  surgeFloorA: number;
  /** Shortest surge reported (s). */
  surgeMinDurationS: number;
}

/** Defaults: 25 % above running, at least 1 A above it, lasting at least 20 ms. Our design choice. */
export const DEFAULT_SURGE_PARAMS: Readonly<SurgeParams> = Object.freeze({
  surgeThresholdFraction: 0.25,
  surgeFloorA: 1,
  surgeMinDurationS: 0.02,
});

/** One surge while running. Units: A, s, A²s. */
export interface Surge {
  startS: number;
  endS: number;
  durationS: number;
  peakA: number;
  peakTimeS: number;
  runningA: number;
  /** The level the current had to exceed (A). */
  levelA: number;
  excessA: number;
  i2tA2s: number;
}

/** Checks SurgeParams; RangeError naming the bad field. */
export function assertSurgeParams(params: SurgeParams): void {
  assertNonNegative(params.surgeThresholdFraction, 'surgeThresholdFraction');
  assertNonNegative(params.surgeFloorA, 'surgeFloorA');
  assertNonNegative(params.surgeMinDurationS, 'surgeMinDurationS');
}

/**
 * Surges in samples [from, to) of series a (times `axis`) above running current `runningA`
 * (see the file comment). `to` is the end of the on-period.
 */
export function findSurges(
  axis: TimeAxis,
  a: SampleArray,
  from: number,
  to: number,
  runningA: number,
  params: SurgeParams = DEFAULT_SURGE_PARAMS,
): Surge[] {
  assertSurgeParams(params);
  const levelA = runningA + Math.max(params.surgeThresholdFraction * Math.abs(runningA), params.surgeFloorA);
  const surges: Surge[] = [];
  let i = from;
  while (i < to) {
    if ((a[i] as number) <= levelA) {
      i++;
      continue;
    }
    const runStart = i;
    let peakIndex = i;
    while (i < to && (a[i] as number) > levelA) {
      if ((a[i] as number) > (a[peakIndex] as number)) peakIndex = i;
      i++;
    }
    const runEnd = i; // first index not above the level (or `to`)
    const startsInside = runStart > from;
    const startS = startsInside ? crossingTime(axis, a, runStart - 1, levelA) : timeAt(axis, runStart);
    const endsInside = runEnd < to;
    const endS = endsInside ? crossingTime(axis, a, runEnd - 1, levelA) : timeAt(axis, runEnd - 1);
    const durationS = endS - startS;
    if (durationS >= params.surgeMinDurationS && durationS > 0) {
      const peakA = a[peakIndex] as number;
      surges.push({
        startS,
        endS,
        durationS,
        peakA,
        peakTimeS: timeAt(axis, peakIndex),
        runningA,
        levelA,
        excessA: peakA - runningA,
        i2tA2s: integrateSquares(axis, a, startsInside ? runStart - 1 : runStart, startS, endsInside ? runEnd - 1 : runEnd - 1, endS),
      });
    }
  }
  return surges;
}
