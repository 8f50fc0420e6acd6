import { describe, expect, it } from 'vitest';
import { findOnPeriods } from './on-periods.js';
import { DEFAULT_ON_THRESHOLD_PARAMS, resolveOnThreshold } from './on-threshold.js';

describe('resolveOnThreshold', () => {
  it('derives the levels from the running current with the documented defaults', () => {
    // 0 A off, 10 A running: on above 0 + max(0.5, 0.25 × 10) = 2.5 A, off at 1.25 A (file comment, derived)
    const a = Float64Array.from({ length: 1000 }, (_, i) => (i < 300 ? 0 : i < 320 ? 50 : 10));
    const levels = resolveOnThreshold(a);
    expect(levels.baselineA).toBe(0);
    expect(levels.runningLevelA).toBe(10);
    expect(levels.onThresholdA).toBe(2.5);
    expect(levels.offThresholdA).toBe(1.25);
    expect(levels.onThresholdSource).toBe('derived');
  });

  it('falls back to the floor when nothing runs, and honours a given threshold', () => {
    const idle = new Float64Array(100).fill(0.1);
    expect(resolveOnThreshold(idle).onThresholdA).toBeCloseTo(0.6, 12);
    const given = resolveOnThreshold(idle, { ...DEFAULT_ON_THRESHOLD_PARAMS, onThresholdA: 3 });
    expect(given.onThresholdA).toBe(3);
    expect(given.offThresholdA).toBeCloseTo(3 - 0.5 * 2.9, 12);
    expect(given.onThresholdSource).toBe('given');
  });

  it('rejects bad parameters', () => {
    expect(() => resolveOnThreshold(new Float64Array(3), { ...DEFAULT_ON_THRESHOLD_PARAMS, onFraction: 2 })).toThrow(/onFraction/);
  });
});

describe('findOnPeriods', () => {
  it('uses hysteresis and flags periods cut by the series ends', () => {
    const a = Float64Array.from([5, 5, 0, 3, 2, 3, 0, 0, 4, 4]);
    expect(findOnPeriods(a, 2.5, 1)).toEqual([
      { startIndex: 0, endIndex: 2, startsAtSeriesStart: true, endsAtSeriesEnd: false },
      { startIndex: 3, endIndex: 6 + 0, startsAtSeriesStart: false, endsAtSeriesEnd: false },
      { startIndex: 8, endIndex: 10, startsAtSeriesStart: false, endsAtSeriesEnd: true },
    ]);
  });
});
