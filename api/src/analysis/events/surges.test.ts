import { describe, expect, it } from 'vitest';
import { uniformTimeAxis } from '../time/time-axis.js';
import { DEFAULT_SURGE_PARAMS, findSurges } from './surges.js';

describe('findSurges', () => {
  const rate = 1000;
  const axis = uniformTimeAxis(0, rate);
  // 10 A running; a 20 A surge from 3.000 s to 3.300 s; a one-sample 40 A glitch at 5 s.
  const a = Float64Array.from({ length: 8000 }, (_, i) => (i >= 3000 && i <= 3300 ? 20 : i === 5000 ? 40 : 10));

  it('finds a rectangular surge with its duration, peak, excess and I²t', () => {
    const surges = findSurges(axis, a, 0, a.length, 10);
    expect(surges).toHaveLength(1);
    const [s] = surges;
    // Level 12.5 A (25 % above 10 A); the edges are interpolated over one 1 ms step each (derived).
    expect(s!.levelA).toBe(12.5);
    expect(s!.startS).toBeCloseTo(2.999 + 0.25 / 1000, 12);
    expect(s!.endS).toBeCloseTo(3.3 + 0.75 / 1000, 12);
    expect(s!.durationS).toBeCloseTo(0.3 + 1.5 / 1000, 12);
    expect(s!.peakA).toBe(20);
    expect(s!.excessA).toBe(10);
    // 20² × 0.3 s = 120 A²s (I²t of a rectangular pulse, derived) plus two interpolated edges, each a
    // 0.75 ms trapezoid from 12.5 A to 20 A: (12.5² + 20²)/2 × 0.00075 A²s (derived)
    expect(s!.i2tA2s).toBeCloseTo(120 + 2 * ((12.5 ** 2 + 20 ** 2) / 2) * 0.00075, 9);
  });

  it('ignores excursions shorter than the minimum and reports them when it is lowered', () => {
    const short = findSurges(axis, a, 0, a.length, 10, { ...DEFAULT_SURGE_PARAMS, surgeMinDurationS: 0.001 });
    expect(short).toHaveLength(2);
    expect(short[1]!.peakA).toBe(40);
  });

  it('uses the absolute floor for small running currents', () => {
    const small = Float64Array.from({ length: 100 }, (_, i) => (i >= 40 && i < 70 ? 2.2 : 1));
    expect(findSurges(uniformTimeAxis(0, 100), small, 0, 100, 1)).toHaveLength(1);
    expect(findSurges(uniformTimeAxis(0, 100), small, 0, 100, 1, { ...DEFAULT_SURGE_PARAMS, surgeFloorA: 1.5 })).toHaveLength(0);
  });

  it('rejects bad parameters', () => {
    expect(() => findSurges(axis, a, 0, 10, 10, { ...DEFAULT_SURGE_PARAMS, surgeFloorA: -1 })).toThrow(/surgeFloorA/);
  });
});
