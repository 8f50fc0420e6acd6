/**
 * The current level above which a load counts as "on", and the lower level at which it counts as
 * "off" again (hysteresis, so noise around one level does not make a string of events).
 *
 * Default (relative to the trace, with an absolute floor): baseline = the lowest value of the
 * series; on-level = the median of the values more than `onFloorA` above the baseline (the typical
 * running current); on-threshold = baseline + max(onFloorA, onFraction × (on-level − baseline));
 * off-threshold = on-threshold − hysteresisFraction × (on-threshold − baseline). With the defaults
 * (0.5 A, 25 %, 50 %) a 10 A load over a 0 A baseline switches on above 2.5 A and off at or below
 * 1.25 A; a trace that never rises 0.5 A above its lowest value has no on-periods.
 * An explicit onThresholdA replaces the relative rule. Source: our design choice.
 */

import { assertFiniteNumber, assertInRange, assertNonNegative, type SampleArray } from '../validation/assert-input.js';
import { medianAbove } from '../stats/quantiles.js';

/** Parameters of the on/off levels. */
export interface OnThresholdParams {
  /** Fixed on-threshold (A); null: derive it from the trace (see the file comment). */
  onThresholdA: number | null;
  /** Absolute floor (A): the on-threshold is at least this far above the baseline. */
  onFloorA: number;
  /** Share of the running current above baseline at which the load counts as on. */
  onFraction: number;
  /** Share of (on-threshold − baseline) below the on-threshold at which the load counts as off again. */
  hysteresisFraction: number;
}

/** Defaults: derived threshold, floor 0.5 A, 25 % of the running level, 50 % hysteresis. Our design choice. */
export const DEFAULT_ON_THRESHOLD_PARAMS: Readonly<OnThresholdParams> = Object.freeze({
  onThresholdA: null,
  onFloorA: 0.5,
  onFraction: 0.25,
  hysteresisFraction: 0.5,
});

/** The levels used, echoed in outputs. */
export interface ResolvedOnThreshold {
  onThresholdA: number;
  offThresholdA: number;
  /** Lowest value of the series (A). */
  baselineA: number;
  /** Median of the values more than onFloorA above the baseline (A); null when there are none. */
  runningLevelA: number | null;
  /** 'given' when onThresholdA was passed, 'derived' otherwise. */
  onThresholdSource: 'given' | 'derived';
}

/** Checks OnThresholdParams; RangeError naming the bad field. */
export function assertOnThresholdParams(params: OnThresholdParams): void {
  if (params.onThresholdA !== null) assertFiniteNumber(params.onThresholdA, 'onThresholdA');
  assertNonNegative(params.onFloorA, 'onFloorA');
  assertInRange(params.onFraction, 0, 1, 'onFraction');
  assertInRange(params.hysteresisFraction, 0, 1, 'hysteresisFraction');
}

/**
 * On/off levels for series a[from, to) (see the file comment). The series must already be
 * validated (finite). `minA` may pass the known minimum to save a pass.
 */
export function resolveOnThreshold(
  a: SampleArray,
  params: OnThresholdParams = DEFAULT_ON_THRESHOLD_PARAMS,
  from = 0,
  to: number = a.length,
  minA?: number,
): ResolvedOnThreshold {
  assertOnThresholdParams(params);
  let baselineA = minA ?? Number.POSITIVE_INFINITY;
  if (minA === undefined) for (let i = from; i < to; i++) baselineA = Math.min(baselineA, a[i] as number);
  if (!Number.isFinite(baselineA)) throw new RangeError('the series has no samples');
  const runningLevelA = medianAbove(a, baselineA + params.onFloorA, from, to);
  let onThresholdA: number;
  if (params.onThresholdA !== null) onThresholdA = params.onThresholdA;
  else {
    const relative = runningLevelA === null ? 0 : params.onFraction * (runningLevelA - baselineA);
    onThresholdA = baselineA + Math.max(params.onFloorA, relative);
  }
  const offThresholdA = onThresholdA - params.hysteresisFraction * Math.max(0, onThresholdA - baselineA);
  return {
    onThresholdA,
    offThresholdA,
    baselineA,
    runningLevelA,
    onThresholdSource: params.onThresholdA !== null ? 'given' : 'derived',
  };
}
