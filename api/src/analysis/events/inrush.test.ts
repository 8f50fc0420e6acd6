import { describe, expect, it } from 'vitest';
import { uniformTimeAxis } from '../time/time-axis.js';
import { analyseInrush, DEFAULT_INRUSH_PARAMS } from './inrush.js';
import { findOnPeriods } from './on-periods.js';
import { integrateSquares } from './series-integral.js';

/** Off for `offS`, then i(t) = Is + (Ip − Is)·e^(−t/τ) until `totalS`, sampled at `rate`. */
function exponentialStart(rate: number, offS: number, totalS: number, ip: number, is: number, tau: number): Float64Array {
  return Float64Array.from({ length: Math.round(totalS * rate) + 1 }, (_, i) => {
    const t = i / rate - offS;
    return t < 0 ? 0 : is + (ip - is) * Math.exp(-t / tau);
  });
}

/** ∫0^T (Is + (Ip − Is)e^(−t/τ))² dt in closed form (derived by integration). */
function exponentialI2t(ip: number, is: number, tau: number, T: number): number {
  const d = ip - is;
  return is * is * T + 2 * is * d * tau * (1 - Math.exp(-T / tau)) + ((d * d * tau) / 2) * (1 - Math.exp((-2 * T) / tau));
}

describe('analyseInrush', () => {
  it('settle time of an exponential surge is τ·ln((Ip − Is)/(tol·Is)): 60/10 A, τ 0.1 s, 10 % → 0.391 s', () => {
    // source: trade-facts.md 6.5 example 24 (derived)
    const rate = 1000;
    const a = exponentialStart(rate, 1, 6, 60, 10, 0.1);
    const axis = uniformTimeAxis(0, rate);
    const [period] = findOnPeriods(a, 2.5, 1.25);
    const event = analyseInrush(axis, a, period!);
    const expected = 0.1 * Math.log(50 / (0.1 * 10));
    expect(expected).toBeCloseTo(0.391, 3);
    expect(event.settled).toBe(true);
    expect(event.settleTimeS!).toBeCloseTo(expected, 4);
    expect(event.onsetTimeS).toBe(1);
    expect(event.peakA).toBe(60);
    expect(event.timeToPeakS).toBe(0);
    expect(event.steadyA).toBeCloseTo(10, 9);
    expect(event.peakToSteadyRatio!).toBeCloseTo(6, 6);
    expect(event.offTimeS).toBeNull();
    // I²t from onset to settling, against the closed-form integral (derived); trapezoid error at 1 ms ≈ 1e-4 relative.
    expect(event.i2tA2s).toBeCloseTo(exponentialI2t(60, 10, 0.1, expected), 0);
    expect(Math.abs(event.i2tA2s / exponentialI2t(60, 10, 0.1, expected) - 1)).toBeLessThan(2e-4);
  });

  it('settle time on a coarse half-cycle series (8.33 ms) is found by interpolation within a step', () => {
    const rate = 120;
    const a = exponentialStart(rate, 1, 6, 60, 10, 0.1);
    const [period] = findOnPeriods(a, 2.5, 1.25);
    const event = analyseInrush(uniformTimeAxis(0, rate), a, period!);
    expect(Math.abs(event.settleTimeS! - 0.1 * Math.log(50))).toBeLessThan(1 / rate);
  });

  it('a tighter tolerance settles later, by τ·ln(tol1/tol2)', () => {
    // derived from the same closed form
    const rate = 2000;
    const a = exponentialStart(rate, 0.5, 5, 60, 10, 0.2);
    const axis = uniformTimeAxis(0, rate);
    const [period] = findOnPeriods(a, 2.5, 1.25);
    const loose = analyseInrush(axis, a, period!, { ...DEFAULT_INRUSH_PARAMS, settleTolerance: 0.1 });
    const tight = analyseInrush(axis, a, period!, { ...DEFAULT_INRUSH_PARAMS, settleTolerance: 0.02 });
    expect(tight.settleTimeS! - loose.settleTimeS!).toBeCloseTo(0.2 * Math.log(5), 3);
  });

  it('reports the switch-off time and a peak later than the onset', () => {
    const rate = 100;
    // Ramp up over 0.2 s to 30 A, settle at 8 A, switch off at 4 s.
    const a = Float64Array.from({ length: 600 }, (_, i) => {
      const t = i / rate;
      if (t < 1 || t >= 4) return 0;
      if (t < 1.2) return 30 * ((t - 1) / 0.2 + 0.05);
      return 8 + 22 * Math.exp(-(t - 1.2) / 0.05);
    });
    const [period] = findOnPeriods(a, 2, 1);
    const event = analyseInrush(uniformTimeAxis(0, rate), a, period!);
    expect(event.offTimeS).toBe(4);
    expect(event.timeToPeakS).toBeGreaterThan(0.15);
    expect(event.steadyA).toBeCloseTo(8, 6);
  });

  it('never settling: I²t runs to the end of the peak window', () => {
    const rate = 10;
    const a = Float64Array.from({ length: 400 }, (_, i) => (i < 10 ? 0 : i % 2 === 0 ? 10 : 20));
    const [period] = findOnPeriods(a, 2, 1);
    const event = analyseInrush(uniformTimeAxis(0, rate), a, period!, { ...DEFAULT_INRUSH_PARAMS, settleTolerance: 0.05 });
    expect(event.settled).toBe(false);
    expect(event.settleTimeS).toBeNull();
    // The peak window ends 10 s (maxInrushS) after the onset at 1 s, inclusive.
    expect(event.durationS).toBeCloseTo(10, 9);
  });
});

describe('integrateSquares', () => {
  it('I²t of a rectangular pulse 60 A × 0.5 s = 1800 A²s', () => {
    // source: trade-facts.md 6.5 example 22 (derived)
    const rate = 1000;
    const a = new Float64Array(2000).fill(60);
    const axis = uniformTimeAxis(0, rate);
    expect(integrateSquares(axis, a, 100, 0.1, 600, 0.6)).toBeCloseTo(1800, 9);
    // Between samples the ends are interpolated: 60 A from 0.1005 s to 0.6005 s is still 1800 A²s.
    expect(integrateSquares(axis, a, 100, 0.1005, 600, 0.6005)).toBeCloseTo(1800, 9);
  });

  it('a motor start of 39 A RMS for 0.3 s is 456.3 A²s', () => {
    // source: trade-facts.md 6.5 example 22 (derived)
    const a = new Float64Array(301).fill(39);
    expect(integrateSquares(uniformTimeAxis(0, 1000), a, 0, 0, 300, 0.3)).toBeCloseTo(456.3, 9);
  });
});
