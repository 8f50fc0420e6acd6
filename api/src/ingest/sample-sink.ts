/**
 * Where parsers put the samples they read: runs at uniform times, or samples at explicit times. The
 * storage batch writer implements it; parsers never see storage. Pushed arrays may be reused by the
 * parser afterwards (the sink copies).
 */
import type { UniformStart } from '../storage/batch-writer.js';

export type { UniformStart };

export interface SampleSink {
  pushUniform(values: Float32Array, start: UniformStart, rateHz: number): Promise<void>;
  pushExplicit(values: Float32Array, timesUs: Float64Array): Promise<void>;
}

/** Largest magnitude of a reading (same bound as the analysis engine's MAX_ABS_CURRENT_A). */
export const MAX_ABS_READING = 1e12;

/** Why a reading is refused, or null when it is fine. */
export function readingProblem(value: number): string | null {
  if (Number.isNaN(value)) return 'not a number (NaN)';
  if (!Number.isFinite(value)) return 'not finite (Infinity)';
  if (Math.abs(value) > MAX_ABS_READING) return `larger in magnitude than ${MAX_ABS_READING}`;
  return null;
}

/** A Float32Array or Float64Array that grows as values are appended. */
export class GrowableArray<T extends Float32Array | Float64Array> {
  private data: T;
  length = 0;

  constructor(private readonly make: (n: number) => T, initial = 4096) {
    this.data = make(initial);
  }

  push(value: number): void {
    if (this.length === this.data.length) this.grow(this.length + 1);
    this.data[this.length++] = value;
  }

  /** Makes room for n more values, for the caller to write at [length - n, length): returns the array to write them in. */
  extend(n: number): T {
    const needed = this.length + n;
    if (needed > this.data.length) this.grow(needed);
    this.length = needed;
    return this.data;
  }

  /** A backing array of at least `needed` values (doubling), holding the values so far. */
  private grow(needed: number): void {
    let size = Math.max(1, this.data.length * 2);
    while (size < needed) size *= 2;
    const bigger = this.make(size);
    bigger.set(this.data.subarray(0, this.length));
    this.data = bigger;
  }

  /** A view of values [from, to). */
  view(from = 0, to = this.length): T {
    return this.data.subarray(from, to) as T;
  }

  /** Drops the first `n` values (after they were pushed on). */
  dropFirst(n: number): void {
    if (n <= 0) return;
    this.data.copyWithin(0, n, this.length);
    this.length -= n;
  }
}

export const growableFloat32 = () => new GrowableArray((n) => new Float32Array(n));
export const growableFloat64 = () => new GrowableArray((n) => new Float64Array(n));
