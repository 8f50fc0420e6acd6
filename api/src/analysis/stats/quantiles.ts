/**
 * Exact sample quantiles, "type 7" definition.
 *
 * Definition (Hyndman & Fan type 7): for n sorted values x[0..n-1] and probability p in [0, 1],
 * h = (n − 1)·p and Q(p) = x[⌊h⌋] + (h − ⌊h⌋)·(x[⌈h⌉] − x[⌊h⌋]). It is the default of numpy
 * (`numpy.percentile`, method "linear"), of R's `quantile`, and of simple-statistics `quantile`
 * (7.x; its source says "linear interpolation method (type=7 in R/numpy)"), and the definition the
 * reference-data figures use. The arithmetic below is the same expression simple-statistics
 * evaluates, so results agree bit for bit. Source: R. J. Hyndman, Y. Fan, "Sample quantiles in
 * statistical packages", The American Statistician 50(4), 1996.
 *
 * The order statistics come from `selectRanks` (histogram selection): no sort and no copy of the input.
 */

import {
  assertFiniteValues,
  assertIndexRange,
  assertSampleArray,
  MAX_ABS_CURRENT_A,
  type SampleArray,
} from '../validation/assert-input.js';
import { selectRanks } from './order-statistics.js';

/** The quantile definition used everywhere in Headroom, as stated in outputs. */
export const QUANTILE_METHOD =
  'type 7 (linear interpolation between order statistics; numpy default, R default, simple-statistics quantile)';

/** Position h = (n − 1)·p of probability p among n sorted values, and its two neighbouring ranks. */
function typeSevenPosition(n: number, p: number): { lower: number; upper: number; fraction: number } {
  const h = (n - 1) * p;
  const lower = Math.floor(h);
  return { lower, upper: Math.ceil(h), fraction: h - lower };
}

/**
 * Type 7 quantiles of values[from, to) for each probability in `probabilities` (each in [0, 1]).
 * `minA`/`maxA` may be passed when already known (they must be the exact min and max of the range)
 * to save a pass. Units: those of the values. Throws a RangeError for an empty range, a probability
 * outside [0, 1], or non-finite values (when min/max are not given).
 */
export function exactQuantiles(
  values: SampleArray,
  probabilities: readonly number[],
  from = 0,
  to: number = values.length,
  known?: { minA: number; maxA: number },
): number[] {
  assertSampleArray(values, 'values');
  assertIndexRange(from, to, values.length, 'value range');
  for (const p of probabilities) {
    if (!(p >= 0 && p <= 1)) throw new RangeError(`probability ${String(p)} must be between 0 and 1`);
  }
  let lo: number;
  let hi: number;
  if (known) {
    lo = known.minA;
    hi = known.maxA;
  } else {
    assertFiniteValues(values, 'values', MAX_ABS_CURRENT_A, from, to);
    lo = Number.POSITIVE_INFINITY;
    hi = Number.NEGATIVE_INFINITY;
    for (let i = from; i < to; i++) {
      const x = values[i] as number;
      if (x < lo) lo = x;
      if (x > hi) hi = x;
    }
  }
  const n = to - from;
  const positions = probabilities.map((p) => typeSevenPosition(n, p));
  const ranks = positions.flatMap((q) => [q.lower, q.upper]);
  const order = selectRanks(values, from, to, lo, hi, n, ranks);
  return probabilities.map((p, k) => {
    const { lower, upper, fraction } = positions[k]!;
    const xl = order.get(lower) as number;
    if (p === 1) return hi;
    if (p === 0) return lo;
    if (fraction === 0) return xl;
    const xu = order.get(upper) as number;
    return xl + fraction * (xu - xl);
  });
}

/**
 * Median (type 7 at p = 0.5) of the values in values[from, to) that are strictly greater than
 * `aboveA`, or null when there are none. Used to find the typical "on" level of a trace.
 */
export function medianAbove(values: SampleArray, aboveA: number, from = 0, to: number = values.length): number | null {
  let n = 0;
  let lo = Number.POSITIVE_INFINITY;
  let hi = Number.NEGATIVE_INFINITY;
  for (let i = from; i < to; i++) {
    const x = values[i] as number;
    if (x > aboveA) {
      n++;
      if (x < lo) lo = x;
      if (x > hi) hi = x;
    }
  }
  if (n === 0) return null;
  const { lower, upper, fraction } = typeSevenPosition(n, 0.5);
  const order = selectRanks(values, from, to, lo, hi, n, [lower, upper]);
  const xl = order.get(lower) as number;
  return fraction === 0 ? xl : xl + fraction * ((order.get(upper) as number) - xl);
}
