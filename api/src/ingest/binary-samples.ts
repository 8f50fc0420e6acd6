/**
 * `application/octet-stream` sample bodies: little-endian float32 or float64 readings at a stated
 * start and sample rate, streamed straight into the batch writer in slabs of SLAB_SAMPLES (the body
 * is never held whole; a 100-million-sample upload needs a few megabytes).
 */
import { invalidSamples } from './body-errors.js';
import { MAX_ABS_READING, type SampleSink, type UniformStart } from './sample-sink.js';

export const BINARY_VALUE_TYPES = ['float32', 'float64'] as const;
export type BinaryValueType = (typeof BINARY_VALUE_TYPES)[number];

/** Samples handed to the writer at a time. */
const SLAB_SAMPLES = 1 << 16;

export interface BinaryOptions {
  valueType: BinaryValueType;
  start: UniformStart;
  rateHz: number;
}

function badValue(index: number, value: number, size: number): never {
  const what = Number.isNaN(value) ? 'NaN' : !Number.isFinite(value) ? String(value) : `${value}, beyond ±${MAX_ABS_READING}`;
  throw invalidSamples([{ detail: `value ${index} (byte offset ${index * size}) is ${what}`, pointer: `/${index}` }]);
}

/** Reads the body into `sink`; returns the number of samples. */
export async function readBinarySamples(chunks: AsyncIterable<Buffer>, options: BinaryOptions, sink: SampleSink): Promise<number> {
  const size = options.valueType === 'float32' ? 4 : 8;
  const slab = new Float32Array(SLAB_SAMPLES);
  const staging = options.valueType === 'float32' ? slab : new Float64Array(SLAB_SAMPLES);
  const stagingBytes = new Uint8Array(staging.buffer);
  let filled = 0; // bytes in staging
  let pushed = 0; // samples handed on
  let start: UniformStart = options.start;

  const pushSlab = async (count: number) => {
    for (let i = 0; i < count; i++) {
      const v = staging[i] as number;
      // One comparison pair catches NaN, ±Infinity and out-of-range values.
      if (!(v <= MAX_ABS_READING && v >= -MAX_ABS_READING)) badValue(pushed + i, v, size);
      if (staging !== slab) slab[i] = v;
    }
    await sink.pushUniform(slab.subarray(0, count), start, options.rateHz);
    start = 'continue';
    pushed += count;
  };

  for await (const buf of chunks) {
    let p = 0;
    while (p < buf.length) {
      const take = Math.min(buf.length - p, stagingBytes.length - filled);
      stagingBytes.set(buf.subarray(p, p + take), filled);
      filled += take;
      p += take;
      if (filled === stagingBytes.length) {
        await pushSlab(SLAB_SAMPLES);
        filled = 0;
      }
    }
  }
  const total = pushed * size + filled;
  if (filled % size !== 0) {
    throw invalidSamples([{ detail: `the body has ${total} bytes, not a whole number of ${size}-byte ${options.valueType} values`, pointer: '' }]);
  }
  if (filled > 0) await pushSlab(filled / size);
  return pushed;
}
