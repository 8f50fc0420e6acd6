/**
 * Input checks shared by the analysis functions. Every public analysis function rejects bad input with
 * a `RangeError` whose message names the argument (and, for arrays, the first bad index), so the API
 * can turn it into a 400 problem without guessing what went wrong.
 */

/** Typed arrays of samples the analysis functions accept (amps, or raw probe readings). */
export type SampleArray = Float32Array | Float64Array;

/**
 * Largest magnitude accepted for a current value, in amperes (1e12 A).
 * Definition: any |value| above it is rejected as bad input. Why: squares and sums of squares of
 * larger values overflow double precision over long traces; no branch circuit comes near it.
 * Source: our design choice.
 */
export const MAX_ABS_CURRENT_A = 1e12;

/**
 * Largest magnitude accepted for a time value, in seconds (1e11 s, about 3,000 years).
 * Definition: any |t| above it is rejected. Epoch seconds (about 1.7e9) are accepted; epoch
 * milliseconds must be converted to seconds first. Source: our design choice.
 */
export const MAX_ABS_TIME_S = 1e11;

/** Throws a RangeError unless `value` is a finite number. */
export function assertFiniteNumber(value: number, name: string): void {
  if (typeof value !== 'number' || !Number.isFinite(value)) {
    throw new RangeError(`${name} must be a finite number (got ${String(value)})`);
  }
}

/** Throws a RangeError unless `value` is a finite number greater than zero. */
export function assertPositive(value: number, name: string): void {
  assertFiniteNumber(value, name);
  if (value <= 0) throw new RangeError(`${name} must be greater than 0 (got ${value})`);
}

/** Throws a RangeError unless `value` is a finite number greater than or equal to zero. */
export function assertNonNegative(value: number, name: string): void {
  assertFiniteNumber(value, name);
  if (value < 0) throw new RangeError(`${name} must not be negative (got ${value})`);
}

/** Throws a RangeError unless `value` lies in [min, max] (inclusive). */
export function assertInRange(value: number, min: number, max: number, name: string): void {
  assertFiniteNumber(value, name);
  if (value < min || value > max) {
    throw new RangeError(`${name} must be between ${min} and ${max} (got ${value})`);
  }
}

/** Throws a RangeError unless `value` is an integer >= `min`. */
export function assertInteger(value: number, min: number, name: string): void {
  if (!Number.isInteger(value) || value < min) {
    throw new RangeError(`${name} must be an integer of at least ${min} (got ${String(value)})`);
  }
}

/** Throws a RangeError unless `values` is a Float32Array or Float64Array. */
export function assertSampleArray(values: unknown, name: string): asserts values is SampleArray {
  if (!(values instanceof Float64Array) && !(values instanceof Float32Array)) {
    throw new RangeError(`${name} must be a Float32Array or Float64Array`);
  }
}

/**
 * Throws a RangeError unless [from, to) is a valid, non-empty index range inside an array of
 * `length` elements.
 */
export function assertIndexRange(from: number, to: number, length: number, name = 'range'): void {
  if (!Number.isInteger(from) || !Number.isInteger(to) || from < 0 || to > length || from >= to) {
    throw new RangeError(
      `${name} [${String(from)}, ${String(to)}) must be a non-empty index range inside 0..${length}`,
    );
  }
}

/**
 * Finds the first value in values[from, to) that is not finite or whose magnitude exceeds
 * `limit`, and throws a RangeError naming its index. Call it after a fast kernel has noticed
 * (through a NaN sum or an out-of-range min/max) that such a value exists.
 */
export function throwAtFirstBadValue(
  values: SampleArray,
  from: number,
  to: number,
  limit: number,
  name: string,
): never {
  for (let i = from; i < to; i++) {
    const v = values[i] as number;
    if (!Number.isFinite(v)) throw new RangeError(`${name}[${i}] is not a finite number (${v})`);
    if (Math.abs(v) > limit) {
      throw new RangeError(`${name}[${i}] = ${v} is outside the accepted range ±${limit}`);
    }
  }
  throw new RangeError(`${name} contains a value that is not finite or out of range`);
}

/**
 * Checks that every value in values[from, to) is finite and within ±limit, in one pass, and returns
 * their min and max (±Infinity for an empty range). Throws a RangeError naming the first bad index.
 */
export function assertFiniteValues(
  values: SampleArray,
  name: string,
  limit: number = MAX_ABS_CURRENT_A,
  from = 0,
  to: number = values.length,
): { min: number; max: number } {
  let lo = Infinity;
  let hi = -Infinity;
  let sum = 0;
  for (let i = from; i < to; i++) {
    const v = values[i] as number;
    sum += v;
    if (v < lo) lo = v;
    if (v > hi) hi = v;
  }
  // NaN makes the sum NaN; ±Infinity shows in lo/hi.
  if (sum !== sum || lo < -limit || hi > limit) throwAtFirstBadValue(values, from, to, limit, name);
  return { min: lo, max: hi };
}
