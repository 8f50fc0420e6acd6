/**
 * Time integrals of i² over part of a series, with linear interpolation between samples (the same
 * trapezoid model as the statistics), and interpolated threshold crossings. Used for the I²t (A²s)
 * of inrush events and surges. Source: trapezoid rule (textbook); I²t as the Joule integral
 * ∫ i² dt of protective-device practice (trade-facts.md 6.5 example 22).
 */

import { timeAt, type TimeAxis } from '../time/time-axis.js';
import type { SampleArray } from '../validation/assert-input.js';

/** Value of the linear interpolation of the series at time `tS`, between samples k and k + 1. */
function valueBetween(axis: TimeAxis, a: SampleArray, k: number, tS: number): number {
  const t0 = timeAt(axis, k);
  const t1 = timeAt(axis, k + 1);
  const a0 = a[k] as number;
  return a0 + ((tS - t0) / (t1 - t0)) * ((a[k + 1] as number) - a0);
}

/**
 * ∫ i² dt (A²s) from time `startS` to `endS`, where startS lies in [t[first], t[first + 1]] and
 * endS in [t[last], t[last + 1]] (or equals t[last] when last is the final sample), with i linear
 * between samples and the trapezoid rule applied to i² on each piece.
 */
export function integrateSquares(
  axis: TimeAxis,
  a: SampleArray,
  first: number,
  startS: number,
  last: number,
  endS: number,
): number {
  if (!(endS >= startS)) return 0;
  const pieceIntegral = (t0: number, v0: number, t1: number, v1: number): number => ((v0 * v0 + v1 * v1) * (t1 - t0)) / 2;
  const startValue = startS === timeAt(axis, first) ? (a[first] as number) : valueBetween(axis, a, first, startS);
  const endValue = endS === timeAt(axis, last) ? (a[last] as number) : valueBetween(axis, a, last, endS);
  if (first === last) return pieceIntegral(startS, startValue, endS, endValue);
  let total = pieceIntegral(startS, startValue, timeAt(axis, first + 1), a[first + 1] as number);
  for (let k = first + 1; k < last; k++) total += pieceIntegral(timeAt(axis, k), a[k] as number, timeAt(axis, k + 1), a[k + 1] as number);
  return total + pieceIntegral(timeAt(axis, last), a[last] as number, endS, endValue);
}

/**
 * Time (s) at which the straight line from sample k to sample k + 1 reaches `level` (which lies
 * between their values). Returns the time of sample k + 1 when the two values are equal.
 */
export function crossingTime(axis: TimeAxis, a: SampleArray, k: number, level: number): number {
  const a0 = a[k] as number;
  const a1 = a[k + 1] as number;
  const t0 = timeAt(axis, k);
  const t1 = timeAt(axis, k + 1);
  if (a1 === a0) return t1;
  return t0 + ((level - a0) / (a1 - a0)) * (t1 - t0);
}
