import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { decodeEnvelope, decodeSamples, decodeTimes, encodeEnvelope, encodeSamples, encodeTimes } from './chunk-codec.js';

describe('chunk codec', () => {
  it('when times with any positive integer steps are encoded, then they decode exactly', () => {
    // source: LEB128 (DWARF 5, section 7.6) is lossless for unsigned integers; checked up to 2^50 µs steps.
    fc.assert(
      fc.property(fc.array(fc.integer({ min: 1, max: 2 ** 50 }), { maxLength: 200 }), fc.integer({ min: 0, max: 2 ** 51 }), (steps, first) => {
        const times = new Float64Array(steps.length + 1);
        times[0] = first;
        steps.forEach((s, i) => (times[i + 1] = (times[i] as number) + s));
        const blob = encodeTimes(times, 0, times.length);
        expect(Array.from(decodeTimes(blob, first, times.length))).toEqual(Array.from(times));
      }),
    );
  });

  it('when steps sit on the int32 and varint byte boundaries, then they decode exactly', () => {
    // source: LEB128 (DWARF 5, section 7.6); 2^31 is where the encoder leaves int32 arithmetic.
    const steps = [1, 0x7f, 0x80, 0x3fff, 0x4000, 0x7fffffff, 0x80000000, 0x80000001, 2 ** 32, 2 ** 35 + 3, 1];
    const times = new Float64Array(steps.length + 1);
    times[0] = 1_772_438_400_000_000;
    steps.forEach((s, i) => (times[i + 1] = (times[i] as number) + s));
    const blob = encodeTimes(times, 0, times.length);
    expect(Array.from(decodeTimes(blob, times[0] as number, times.length))).toEqual(Array.from(times));
    expect(encodeTimes(Float64Array.from([0, 0x7f, 0x7f + 0x80]), 0, 3).byteLength).toBe(3);
  });

  it('when float32 values are encoded, then they decode bit for bit, NaN payloads aside', () => {
    fc.assert(
      fc.property(fc.float32Array({ noNaN: true, maxLength: 300 }), (values) => {
        const blob = encodeSamples(values);
        expect(blob.byteLength).toBe(values.length * 4);
        // An unaligned copy must decode as well (sqlite3 hands back pooled buffers).
        const unaligned = Buffer.concat([Buffer.alloc(1), blob]).subarray(1);
        expect(Array.from(decodeSamples(unaligned))).toEqual(Array.from(values));
      }),
    );
  });

  it('when a chunk envelope is made, then each block holds its min, max and mean', () => {
    const values = Float32Array.from({ length: 130 }, (_, i) => (i % 64) - (i >= 128 ? 100 : 0));
    const env = decodeEnvelope(encodeEnvelope(values, 0, values.length));
    expect(env.length).toBe(9);
    expect(Array.from(env.subarray(0, 3))).toEqual([0, 63, 31.5]);
    expect(Array.from(env.subarray(6, 9))).toEqual([-100, -99, -99.5]);
  });
});
