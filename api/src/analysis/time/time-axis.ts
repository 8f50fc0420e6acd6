/**
 * The time axis of a series of samples: either implicit (a start time and a uniform sample rate) or
 * explicit (one timestamp per sample, strictly increasing, possibly irregular). Times are in seconds,
 * from any origin (trace start or the Unix epoch); convert epoch milliseconds to seconds first.
 *
 * Keeping the uniform case implicit means a 10-million-sample waveform never needs an 80 MB array of
 * timestamps. Source: our design choice.
 */

import {
  MAX_ABS_TIME_S,
  assertFiniteNumber,
  assertInRange,
  assertPositive,
} from '../validation/assert-input.js';

/** Timestamps implied by a start time (s) and a sample rate (Hz): t[i] = startS + i / rateHz. */
export interface UniformTimeAxis {
  kind: 'uniform';
  startS: number;
  rateHz: number;
}

/** One timestamp per sample, in seconds, strictly increasing. */
export interface ExplicitTimeAxis {
  kind: 'explicit';
  timesS: Float64Array;
}

/** The time axis of a series. */
export type TimeAxis = UniformTimeAxis | ExplicitTimeAxis;

/** Highest sample rate accepted, in Hz (10 MHz). Our design choice: far above any current probe. */
export const MAX_SAMPLE_RATE_HZ = 1e7;

/** Builds a uniform axis; RangeError unless startS is finite and 0 < rateHz ≤ MAX_SAMPLE_RATE_HZ. */
export function uniformTimeAxis(startS: number, rateHz: number): UniformTimeAxis {
  assertInRange(startS, -MAX_ABS_TIME_S, MAX_ABS_TIME_S, 'startS');
  assertPositive(rateHz, 'rateHz');
  if (rateHz > MAX_SAMPLE_RATE_HZ) throw new RangeError(`rateHz must be at most ${MAX_SAMPLE_RATE_HZ} (got ${rateHz})`);
  return { kind: 'uniform', startS, rateHz };
}

/** Wraps explicit timestamps (seconds). They are checked by `assertTimeAxis` or by the kernels that scan them. */
export function explicitTimeAxis(timesS: Float64Array): ExplicitTimeAxis {
  if (!(timesS instanceof Float64Array)) throw new RangeError('timesS must be a Float64Array of seconds');
  return { kind: 'explicit', timesS };
}

/** Time (s) of sample `index` on `axis`. */
export function timeAt(axis: TimeAxis, index: number): number {
  return axis.kind === 'uniform' ? axis.startS + index / axis.rateHz : (axis.timesS[index] as number);
}

/**
 * Checks that `axis` fits a series of `length` samples: a uniform axis is valid by construction
 * (its last time must stay within ±MAX_ABS_TIME_S); an explicit axis must have exactly `length`
 * timestamps, each finite, within ±MAX_ABS_TIME_S and strictly greater than the one before.
 * Throws a RangeError naming the first bad index.
 */
export function assertTimeAxis(axis: TimeAxis, length: number): void {
  if (axis.kind === 'uniform') {
    uniformTimeAxis(axis.startS, axis.rateHz);
    assertInRange(timeAt(axis, Math.max(0, length - 1)), -MAX_ABS_TIME_S, MAX_ABS_TIME_S, 'last time');
    return;
  }
  const t = axis.timesS;
  if (t.length !== length) {
    throw new RangeError(`timestamps has ${t.length} elements but there are ${length} samples`);
  }
  if (length === 0) return;
  let previous = t[0] as number;
  assertInRange(previous, -MAX_ABS_TIME_S, MAX_ABS_TIME_S, 'timestamps[0]');
  for (let i = 1; i < length; i++) {
    const current = t[i] as number;
    if (!(current > previous)) throwTimestampError(t, i);
    previous = current;
  }
  assertInRange(previous, -MAX_ABS_TIME_S, MAX_ABS_TIME_S, `timestamps[${length - 1}]`);
}

/** Throws the RangeError for a timestamp at `index` that is not finite or not increasing. */
export function throwTimestampError(timesS: Float64Array, index: number): never {
  const current = timesS[index] as number;
  assertFiniteNumber(current, `timestamps[${index}]`);
  throw new RangeError(
    `timestamps must be strictly increasing: timestamps[${index}] = ${current} is not after timestamps[${index - 1}] = ${String(timesS[index - 1])}`,
  );
}

/** Materialises the timestamps of samples [from, to) into a new Float64Array (for small series). */
export function timesOf(axis: TimeAxis, from: number, to: number): Float64Array {
  if (axis.kind === 'explicit') return axis.timesS.slice(from, to);
  const out = new Float64Array(to - from);
  for (let i = from; i < to; i++) out[i - from] = axis.startS + i / axis.rateHz;
  return out;
}

/**
 * Index range [from, to) of the samples whose time lies in the closed window [fromS, toS], by
 * binary search (explicit axis) or arithmetic (uniform axis). The range may be empty (from === to).
 */
export function indexRangeForWindow(
  axis: TimeAxis,
  length: number,
  fromS: number,
  toS: number,
): { from: number; to: number } {
  assertFiniteNumber(fromS, 'fromS');
  assertFiniteNumber(toS, 'toS');
  if (toS < fromS) throw new RangeError(`window end ${toS} is before its start ${fromS}`);
  const firstAtOrAfter = (s: number, inclusive: boolean): number => {
    let lo = 0;
    let hi = length;
    while (lo < hi) {
      const mid = (lo + hi) >>> 1;
      const tm = timeAt(axis, mid);
      if (inclusive ? tm >= s : tm > s) hi = mid;
      else lo = mid + 1;
    }
    return lo;
  };
  return { from: firstAtOrAfter(fromS, true), to: firstAtOrAfter(toS, false) };
}

/**
 * First index in [from, to) whose time is after `limitS` (`to` when none is), by binary search.
 * Used to cut on-periods at a time.
 */
export function indexAfterTime(axis: TimeAxis, from: number, to: number, limitS: number): number {
  let lo = from;
  let hi = to;
  while (lo < hi) {
    const mid = (lo + hi) >>> 1;
    if (timeAt(axis, mid) > limitS) hi = mid;
    else lo = mid + 1;
  }
  return lo;
}
