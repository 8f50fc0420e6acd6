import { describe, expect, it } from 'vitest';
import { seededRandom } from '../test-support/seeded-random.js';
import { uniformTimeAxis } from '../time/time-axis.js';
import { DEFAULT_EVENT_PARAMS, detectEvents, resolveEventParams } from './detect-events.js';

describe('detectEvents', () => {
  it('finds each switch-on, skips the period already on at the start, and echoes the parameters', () => {
    const rate = 100;
    // On at the start (8 A) until 2 s, off until 5 s, a start-up to 40 A settling to 8 A, off at 12 s, on again at 15 s.
    const a = Float64Array.from({ length: 2000 }, (_, i) => {
      const t = i / rate;
      if (t < 2) return 8;
      if (t < 5 || (t >= 12 && t < 15)) return 0;
      const since = t < 12 ? t - 5 : t - 15;
      return 8 + 32 * Math.exp(-since / 0.2);
    });
    const result = detectEvents(uniformTimeAxis(0, rate), a, { settleTolerance: 0.05 });
    expect(result.onPeriodCount).toBe(3);
    expect(result.inrushEvents.map((e) => e.onsetTimeS)).toEqual([5, 15]);
    expect(result.inrushEvents[0]!.offTimeS).toBe(12);
    expect(result.inrushEvents[0]!.peakToSteadyRatio!).toBeCloseTo(5, 3);
    expect(result.surges).toEqual([]);
    expect(result.params.settleTolerance).toBe(0.05);
    expect(result.params.maxInrushS).toBe(DEFAULT_EVENT_PARAMS.maxInrushS);
    // 0 A baseline, running level ≈ 8 A: on above 0.25 × 8 = 2 A (on-threshold.ts defaults, derived)
    expect(result.params.onThresholdA).toBeCloseTo(2, 5);
    expect(result.eventsTruncated).toBe(false);
  });

  it('caps the number of events on a chattering trace', () => {
    const random = seededRandom(5);
    const a = Float64Array.from({ length: 200_000 }, () => random() * 2);
    const result = detectEvents(uniformTimeAxis(0, 10), a, { onThresholdA: 1, hysteresisFraction: 0, maxEvents: 50 });
    expect(result.inrushEvents).toHaveLength(50);
    expect(result.eventsTruncated).toBe(true);
  });

  it('rejects bad parameters with a RangeError naming them', () => {
    expect(() => resolveEventParams({ maxInrushS: 0 })).toThrow(/maxInrushS/);
    expect(() => resolveEventParams({ firstCycles: 1.5 })).toThrow(/firstCycles/);
    expect(() => resolveEventParams({ maxEvents: -1 })).toThrow(/maxEvents/);
    expect(() => resolveEventParams({ onThresholdA: Number.NaN })).toThrow(/onThresholdA/);
  });
});
