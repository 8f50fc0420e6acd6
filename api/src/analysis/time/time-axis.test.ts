import { describe, expect, it } from 'vitest';
import { assertTimeAxis, explicitTimeAxis, indexAfterTime, indexRangeForWindow, timeAt, timesOf, uniformTimeAxis } from './time-axis.js';
import { DEFAULT_GAP_FACTOR, gapThresholdFromSpacing, typicalSpacingS } from './typical-spacing.js';

describe('time axes', () => {
  it('gives implicit times from a start and a rate', () => {
    const axis = uniformTimeAxis(10, 4);
    expect(timeAt(axis, 0)).toBe(10);
    expect(timeAt(axis, 6)).toBe(11.5);
    expect(Array.from(timesOf(axis, 2, 5))).toEqual([10.5, 10.75, 11]);
  });

  it('finds the samples of a time window by binary search', () => {
    const explicit = explicitTimeAxis(Float64Array.from([0, 1, 2.5, 4, 7, 7.5]));
    expect(indexRangeForWindow(explicit, 6, 1, 4)).toEqual({ from: 1, to: 4 });
    expect(indexRangeForWindow(explicit, 6, 4.1, 6.9)).toEqual({ from: 4, to: 4 });
    expect(indexRangeForWindow(uniformTimeAxis(0, 10), 100, 0.25, 0.5)).toEqual({ from: 3, to: 6 });
    expect(indexAfterTime(explicit, 0, 6, 2.5)).toBe(3);
    expect(() => indexRangeForWindow(explicit, 6, 3, 2)).toThrow(RangeError);
  });

  it('checks explicit timestamps', () => {
    expect(() => assertTimeAxis(explicitTimeAxis(Float64Array.from([0, 1, 1])), 3)).toThrow(/timestamps\[2\]/);
    expect(() => assertTimeAxis(explicitTimeAxis(Float64Array.from([0, Number.NaN])), 2)).toThrow(/timestamps\[1\]/);
    expect(() => assertTimeAxis(explicitTimeAxis(Float64Array.from([0, 1])), 3)).toThrow(/3 samples/);
    expect(() => assertTimeAxis(explicitTimeAxis(Float64Array.from([0, 1e12])), 2)).toThrow(RangeError);
    expect(() => uniformTimeAxis(0, 0)).toThrow(/rateHz/);
    expect(() => uniformTimeAxis(Number.NaN, 1)).toThrow(/startS/);
    expect(() => assertTimeAxis(explicitTimeAxis(Float64Array.from([0, 0.5, 2])), 3)).not.toThrow();
  });
});

describe('typical spacing and gap threshold', () => {
  it('is the median interval (1/rate for implicit times)', () => {
    expect(typicalSpacingS(uniformTimeAxis(0, 20), 0, 100)).toBe(0.05);
    const t = Float64Array.from([0, 60, 120, 180, 300, 360, 420]); // one reading missing at 240 s
    expect(typicalSpacingS(explicitTimeAxis(t), 0, t.length)).toBe(60);
    expect(typicalSpacingS(explicitTimeAxis(t), 0, 1)).toBeNull();
  });

  it('samples long series deterministically', () => {
    const t = Float64Array.from({ length: 100_001 }, (_, i) => i * 0.5 + (i % 3 === 0 ? 0.01 : 0));
    const first = typicalSpacingS(explicitTimeAxis(t), 0, t.length);
    expect(first).toBeCloseTo(0.5, 1);
    expect(typicalSpacingS(explicitTimeAxis(t), 0, t.length)).toBe(first);
  });

  it('derives the gap threshold with the default factor 2.5', () => {
    expect(DEFAULT_GAP_FACTOR).toBe(2.5);
    expect(gapThresholdFromSpacing(60)).toBe(150);
    expect(gapThresholdFromSpacing(null)).toBeNull();
    expect(() => gapThresholdFromSpacing(1, 0.5)).toThrow(/at least 1/);
  });
});
