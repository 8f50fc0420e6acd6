/**
 * Turning samples into append batches: explicit-time series as JSON `{ t, a }`, uniform series
 * (waveforms, fixed-rate logs) as little-endian binary at a start and rate. Pure functions, no I/O.
 */

/** A time as the API takes it: epoch milliseconds, an ISO 8601 string, or a Date. */
export type SampleTime = number | string | Date;

/** Readings at explicit times (`t` strictly increasing; one time format per call). */
export interface TimedSamples {
  t: ArrayLike<SampleTime>;
  a: ArrayLike<number>;
}

/** Uniformly sampled readings: `rate` in Hz; `start` of the first value (default: where the trace ends, or its start time). */
export interface UniformSamples {
  values: ArrayLike<number>;
  rate?: number;
  start?: SampleTime;
}

export type Samples = TimedSamples | UniformSamples;

export type BinaryValueType = 'float32' | 'float64';

/** One request's worth of samples, ready to send. */
export type SampleBatch =
  | { kind: 'json'; index: number; count: number; body: string; contentType: 'application/json'; query: Record<string, never> }
  | { kind: 'binary'; index: number; count: number; body: Uint8Array; contentType: 'application/octet-stream'; query: { rate?: number; start?: string; valueType: BinaryValueType } };

export const DEFAULT_JSON_BATCH = 50_000;
export const DEFAULT_BINARY_BATCH = 262_144;

export function isUniform(samples: Samples): samples is UniformSamples {
  return 'values' in samples;
}

export function sampleCount(samples: Samples): number {
  return isUniform(samples) ? samples.values.length : samples.t.length;
}

function timeForJson(value: SampleTime, index: number): number | string {
  if (value instanceof Date) {
    const ms = value.getTime();
    if (Number.isNaN(ms)) throw new RangeError(`t[${index}] is an invalid Date`);
    return ms;
  }
  return value;
}

/** The query form of a start time: epoch ms as a decimal string, or the ISO string as given. */
export function startParameter(start: SampleTime): string {
  if (start instanceof Date) return String(start.getTime());
  return String(start);
}

const LITTLE_ENDIAN = new Uint8Array(new Uint16Array([1]).buffer)[0] === 1;

/** Little-endian bytes of the values as float32 or float64 (copied; the input is left as it is). */
export function encodeValues(values: ArrayLike<number>, from: number, to: number, valueType: BinaryValueType): Uint8Array {
  const count = to - from;
  const array = valueType === 'float32' ? new Float32Array(count) : new Float64Array(count);
  for (let i = 0; i < count; i++) array[i] = values[from + i] as number;
  const bytes = new Uint8Array(array.buffer);
  if (!LITTLE_ENDIAN) {
    const size = array.BYTES_PER_ELEMENT;
    for (let i = 0; i < bytes.length; i += size) bytes.subarray(i, i + size).reverse();
  }
  return bytes;
}

/**
 * Splits samples into batches of at most `batchSize`. Uniform batches after the first carry no start:
 * the API continues each one where the stored series ends, so a batch never needs a computed time.
 * Throws RangeError for lengths that do not match or a batch size below 1.
 */
export function* sampleBatches(samples: Samples, options: { batchSize?: number; valueType?: BinaryValueType } = {}): Generator<SampleBatch> {
  const uniform = isUniform(samples);
  const batchSize = options.batchSize ?? (uniform ? DEFAULT_BINARY_BATCH : DEFAULT_JSON_BATCH);
  if (!Number.isInteger(batchSize) || batchSize < 1) throw new RangeError(`batchSize must be a whole number of at least 1 (got ${batchSize})`);
  if (uniform) {
    const valueType = options.valueType ?? 'float32';
    const total = samples.values.length;
    for (let from = 0, index = 0; from < total; from += batchSize, index++) {
      const to = Math.min(total, from + batchSize);
      const query: { rate?: number; start?: string; valueType: BinaryValueType } = { valueType };
      if (samples.rate !== undefined) query.rate = samples.rate;
      if (index === 0 && samples.start !== undefined) query.start = startParameter(samples.start);
      yield { kind: 'binary', index, count: to - from, body: encodeValues(samples.values, from, to, valueType), contentType: 'application/octet-stream', query };
    }
    return;
  }
  const { t, a } = samples;
  if (t.length !== a.length) throw new RangeError(`t has ${t.length} times but a has ${a.length} readings`);
  for (let from = 0, index = 0; from < t.length; from += batchSize, index++) {
    const to = Math.min(t.length, from + batchSize);
    const times: (number | string)[] = new Array(to - from);
    const readings: number[] = new Array(to - from);
    for (let i = from; i < to; i++) {
      times[i - from] = timeForJson(t[i] as SampleTime, i);
      readings[i - from] = a[i] as number;
    }
    yield { kind: 'json', index, count: to - from, body: JSON.stringify({ t: times, a: readings }), contentType: 'application/json', query: {} };
  }
}
