/**
 * Integrals over one interval of a series under linear interpolation between its two end samples
 * (the model behind every time-weighted figure: the trapezoid rule).
 * Source: trapezoid rule (textbook numerical integration); our design choice of model.
 */

/**
 * Time (s) during which the straight line from `a0` to `a1` over `dtS` seconds lies strictly above
 * `thresholdA`. Exact for the linear model: dtS when both ends are above, 0 when neither is, else
 * the fraction of the interval past the crossing.
 */
export function timeAboveOnSegment(a0: number, a1: number, dtS: number, thresholdA: number): number {
  if (a1 > thresholdA) {
    return a0 > thresholdA ? dtS : (dtS * (a1 - thresholdA)) / (a1 - a0);
  }
  return a0 > thresholdA ? (dtS * (a0 - thresholdA)) / (a0 - a1) : 0;
}
