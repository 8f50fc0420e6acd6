/**
 * Binary layout of a stored chunk.
 *
 * - samples: little-endian float32 raw readings, 4 bytes each.
 * - times (explicit chunks only): the microsecond step from each sample to the next as an unsigned
 *   LEB128 varint (count − 1 of them; the first time is the chunk's `firstUs` column). Steps of
 *   1 µs–16 ms take 1–3 bytes, steps up to 34 minutes 4 bytes.
 * - envelope: for each block of ENVELOPE_BLOCK_SAMPLES samples, min, max and mean as float32 (12 bytes
 *   per block), so a chart envelope over thousands of chunks reads 768 bytes per chunk instead of 16 KB.
 */
import { endianness } from 'node:os';

/**
 * Largest magnitude of a stored sample time (µs since 1970-01-01 UTC): whole microseconds and the steps
 * between them stay exact in a double up to 2^53 − 1 (Number.MAX_SAFE_INTEGER, ECMA-262), so times
 * from 1684-07-28T00:12:25.260Z to 2255-06-05T23:47:34.740Z. Ingest refuses times outside.
 */
export const MAX_ABS_TIME_US = Number.MAX_SAFE_INTEGER;
/** The storable range of sample times, as problems name it. */
export const TIME_RANGE_TEXT = 'between 1684-07-28 and 2255-06-05 (UTC)';

/** Whether `us` is a storable sample time (false for NaN and ±Infinity too). */
export function isStorableTimeUs(us: number): boolean {
  return Math.abs(us) <= MAX_ABS_TIME_US;
}

/** Samples per stored chunk. */
export const CHUNK_SAMPLES = 4096;
/** Samples per envelope block. */
export const ENVELOPE_BLOCK_SAMPLES = 64;
const ENVELOPE_BLOCK_BYTES = 12;

if (endianness() !== 'LE') {
  // Typed arrays use the platform's byte order; the stored format is little-endian.
  throw new Error('Headroom stores samples as little-endian float32 and needs a little-endian platform');
}

/** Float32 values [from, to) as a little-endian blob (a copy). */
export function encodeSamples(values: Float32Array, from = 0, to = values.length): Buffer {
  return Buffer.from(values.buffer.slice(values.byteOffset + from * 4, values.byteOffset + to * 4));
}

/** A samples blob back to float32 values (copied into an aligned array, or into `out` at `offset`). */
export function decodeSamples(blob: Uint8Array, out?: Float32Array, offset = 0): Float32Array {
  if (blob.byteLength % 4 !== 0) throw new Error(`samples blob of ${blob.byteLength} bytes is not whole float32 values`);
  const count = blob.byteLength / 4;
  const target = out ?? new Float32Array(count);
  new Uint8Array(target.buffer, target.byteOffset + offset * 4, count * 4).set(blob);
  return target;
}

/**
 * Steps between consecutive integer-microsecond times [from, to) as varints. Every step must be a
 * positive integer (the caller has checked that times increase).
 */
export function encodeTimes(timesUs: Float64Array, from: number, to: number): Buffer {
  const out = Buffer.allocUnsafe(Math.max(0, to - from - 1) * 8);
  let p = 0;
  for (let i = from + 1; i < to; i++) {
    let step = (timesUs[i] as number) - (timesUs[i - 1] as number);
    if (step < 0x80000000) {
      // Steps under 2^31 µs (35 minutes; nearly all of them) fit in int32 arithmetic, several times faster.
      let small = step | 0;
      while (small >= 0x80) {
        out[p++] = (small & 0x7f) | 0x80;
        small >>>= 7;
      }
      out[p++] = small;
      continue;
    }
    while (step >= 0x80) {
      out[p++] = (step % 0x80) | 0x80;
      step = Math.floor(step / 0x80);
    }
    out[p++] = step;
  }
  return out.subarray(0, p);
}

/** Times of a chunk in microseconds: `firstUs` then the decoded steps (into `out` at `offset` when given). */
export function decodeTimes(blob: Uint8Array, firstUs: number, count: number, out?: Float64Array, offset = 0): Float64Array {
  const target = out ?? new Float64Array(count);
  let t = firstUs;
  target[offset] = t;
  let p = 0;
  for (let i = 1; i < count; i++) {
    let step = 0;
    let scale = 1;
    let byte: number;
    do {
      byte = blob[p++] as number;
      step += (byte & 0x7f) * scale;
      scale *= 0x80;
    } while (byte & 0x80);
    t += step;
    target[offset + i] = t;
  }
  if (p !== blob.byteLength) throw new Error(`times blob holds ${blob.byteLength - p} bytes beyond ${count} samples`);
  return target;
}

/** Min, max and mean of each block of ENVELOPE_BLOCK_SAMPLES values in [from, to), as float32 triples. */
export function encodeEnvelope(values: Float32Array, from: number, to: number): Buffer {
  const blocks = Math.ceil((to - from) / ENVELOPE_BLOCK_SAMPLES);
  const out = new Float32Array(blocks * 3);
  for (let b = 0; b < blocks; b++) {
    const b0 = from + b * ENVELOPE_BLOCK_SAMPLES;
    const b1 = Math.min(to, b0 + ENVELOPE_BLOCK_SAMPLES);
    let lo = Number.POSITIVE_INFINITY;
    let hi = Number.NEGATIVE_INFINITY;
    let sum = 0;
    for (let i = b0; i < b1; i++) {
      const v = values[i] as number;
      if (v < lo) lo = v;
      if (v > hi) hi = v;
      sum += v;
    }
    out[b * 3] = lo;
    out[b * 3 + 1] = hi;
    out[b * 3 + 2] = sum / (b1 - b0);
  }
  return Buffer.from(out.buffer);
}

/** An envelope blob back to (min, max, mean) triples per block. */
export function decodeEnvelope(blob: Uint8Array): Float32Array {
  if (blob.byteLength % ENVELOPE_BLOCK_BYTES !== 0) throw new Error('envelope blob is not whole blocks');
  return decodeSamples(blob);
}
