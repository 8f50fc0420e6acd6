/**
 * On-periods of a load: runs of samples from a rise above the on-threshold to the first sample at
 * or below the off-threshold (hysteresis). A series that starts above the on-threshold starts in an
 * on-period whose switch-on was not recorded; one that ends while on ends an on-period early.
 * Source: our design choice (threshold crossing with hysteresis, a standard event detector).
 */

import type { SampleArray } from '../validation/assert-input.js';

/** One on-period: samples [startIndex, endIndex) are "on". */
export interface OnPeriod {
  startIndex: number;
  /** First index after the period (the sample at/below the off-threshold, or the series end). */
  endIndex: number;
  /** True when the series starts in this period (no switch-on recorded). */
  startsAtSeriesStart: boolean;
  /** True when the series ends before the load switches off. */
  endsAtSeriesEnd: boolean;
}

/** On-periods of a[from, to) for the given levels (offThresholdA ≤ onThresholdA). One pass. */
export function findOnPeriods(
  a: SampleArray,
  onThresholdA: number,
  offThresholdA: number,
  from = 0,
  to: number = a.length,
): OnPeriod[] {
  if (!(offThresholdA <= onThresholdA)) {
    throw new RangeError(`offThresholdA (${offThresholdA}) must not exceed onThresholdA (${onThresholdA})`);
  }
  const periods: OnPeriod[] = [];
  let start = -1;
  for (let i = from; i < to; i++) {
    const v = a[i] as number;
    if (start < 0) {
      if (v > onThresholdA) start = i;
    } else if (v <= offThresholdA) {
      periods.push({ startIndex: start, endIndex: i, startsAtSeriesStart: start === from, endsAtSeriesEnd: false });
      start = -1;
    }
  }
  if (start >= 0) periods.push({ startIndex: start, endIndex: to, startsAtSeriesStart: start === from, endsAtSeriesEnd: true });
  return periods;
}
