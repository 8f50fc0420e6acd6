import { describe, expect, it } from 'vitest';
import { aggregationCyclesFor, iecWindowLengths } from './iec-windows.js';

describe('IEC 61000-4-30 window lengths', () => {
  it('50 Hz: 20 ms window refreshed every 10 ms; 10 cycles = 200 ms', () => {
    // source: IEC 61000-4-30 (trade-facts.md 4.2 and 6.5 example 20)
    const w = iecWindowLengths(50);
    expect(w.windowS).toBeCloseTo(0.02, 15);
    expect(w.stepS).toBeCloseTo(0.01, 15);
    expect(w.aggregationCycles).toBe(10);
    expect(w.aggregationS).toBeCloseTo(0.2, 15);
  });

  it('60 Hz: 16.667 ms window refreshed every 8.333 ms; 12 cycles = 200 ms', () => {
    // source: IEC 61000-4-30 (trade-facts.md 4.2 and 6.5 example 20)
    const w = iecWindowLengths(60);
    expect(w.windowS * 1000).toBeCloseTo(16.667, 3);
    expect(w.stepS * 1000).toBeCloseTo(8.333, 3);
    expect(w.aggregationCycles).toBe(12);
    expect(w.aggregationS).toBeCloseTo(0.2, 15);
  });

  it('60 Hz at 7680 samples/s: 128-sample window, 64-sample step', () => {
    // source: trade-facts.md 6.5 example 20 (derived)
    const w = iecWindowLengths(60, 7680);
    expect(w.windowSamples).toBe(128);
    expect(w.stepSamples).toBe(64);
  });

  it('classifies 50 and 60 Hz systems and rejects other frequencies', () => {
    expect(aggregationCyclesFor(49.9)).toBe(10);
    expect(aggregationCyclesFor(60.1)).toBe(12);
    expect(() => iecWindowLengths(400)).toThrow(RangeError);
    expect(() => iecWindowLengths(60, 0)).toThrow(/sampleRateHz/);
  });
});
