import { describe, expect, it } from 'vitest';
import { ampsFromWatts, voltAmperes, wattsFromAmps } from './watts-amps.js';

describe('watts and amps', () => {
  it('gives the trade figures at 120 V', () => {
    // common practice, no source: 11.5 A at 120 V is 1380 W; 13 A is 1560 W
    expect(wattsFromAmps(11.5, 120)).toBeCloseTo(1380, 9);
    expect(wattsFromAmps(13, 120)).toBeCloseTo(1560, 9);
  });

  it('reproduces the worked examples (P = V·I·PF)', () => {
    // source: trade-facts.md 6.5 example 21 (derived from P = V·I·PF)
    expect(ampsFromWatts(1500, 120)).toBeCloseTo(12.5, 12);
    expect(ampsFromWatts(1875, 125)).toBeCloseTo(15, 12);
    expect(ampsFromWatts(3000, 230, 0.9)).toBeCloseTo(14.49, 2);
    expect(voltAmperes(12.5, 120)).toBeCloseTo(1500, 9);
  });

  it('round-trips', () => {
    expect(ampsFromWatts(wattsFromAmps(7.3, 230, 0.8), 230, 0.8)).toBeCloseTo(7.3, 12);
  });

  it('rejects bad inputs', () => {
    expect(() => wattsFromAmps(10, 0)).toThrow(/volts/);
    expect(() => wattsFromAmps(10, 120, 1.2)).toThrow(/powerFactor/);
    expect(() => ampsFromWatts(10, 120, 0)).toThrow(/powerFactor/);
    expect(() => ampsFromWatts(Number.NaN, 120)).toThrow(/watts/);
  });
});
