import { describe, expect, it } from 'vitest';
import { encodeValues, sampleBatches } from './samples.js';

describe('sample batches', () => {
  it('when a uniform series is split, then batches are float32 little-endian and only the first carries the start', () => {
    const values = Float64Array.from({ length: 10 }, (_, i) => i * 0.5);
    const batches = [...sampleBatches({ values, rate: 1000, start: '2024-03-01T08:00:00Z' }, { batchSize: 4 })];
    expect(batches.map((b) => b.count)).toEqual([4, 4, 2]);
    expect(batches.map((b) => b.query)).toEqual([
      { rate: 1000, start: '2024-03-01T08:00:00Z', valueType: 'float32' },
      { rate: 1000, valueType: 'float32' },
      { rate: 1000, valueType: 'float32' },
    ]);
    const second = batches[1]!;
    expect(second.kind).toBe('binary');
    const view = new DataView((second.body as Uint8Array).buffer);
    // source: IEEE 754 binary32; 2.0 and 3.5 are exact, read back little-endian
    expect([view.getFloat32(0, true), view.getFloat32(12, true)]).toEqual([2, 3.5]);
    expect((second.body as Uint8Array).byteLength).toBe(16);
  });

  it('when float64 is asked, then 8 bytes per value keep every digit', () => {
    const bytes = encodeValues([0.1], 0, 1, 'float64');
    expect(new DataView(bytes.buffer).getFloat64(0, true)).toBe(0.1);
  });

  it('when explicit times are split, then each batch is JSON {t, a}, Dates as epoch ms', () => {
    const t = [new Date(1_000), new Date(2_000), new Date(3_000)];
    const batches = [...sampleBatches({ t, a: new Float32Array([1, 2, 3]) }, { batchSize: 2 })];
    expect(batches.map((b) => JSON.parse(b.body as string))).toEqual([{ t: [1000, 2000], a: [1, 2] }, { t: [3000], a: [3] }]);
    expect(batches.every((b) => b.contentType === 'application/json')).toBe(true);
  });

  it('when t and a differ in length or the batch size is not a whole number, then RangeError', () => {
    expect(() => [...sampleBatches({ t: [1, 2], a: [1] })]).toThrow(RangeError);
    expect(() => [...sampleBatches({ values: [1], rate: 1 }, { batchSize: 0 })]).toThrow(RangeError);
    expect(() => [...sampleBatches({ t: [new Date(NaN)], a: [1] })]).toThrow(/invalid Date/);
  });

  it('when there are no samples, then there are no batches', () => {
    expect([...sampleBatches({ values: [], rate: 10 })]).toEqual([]);
  });
});
