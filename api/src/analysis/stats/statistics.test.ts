import fc from 'fast-check';
import * as ss from 'simple-statistics';
import { describe, expect, it } from 'vitest';
import { seededRandom } from '../test-support/seeded-random.js';
import { explicitTimeAxis, uniformTimeAxis } from '../time/time-axis.js';
import { mergeSummaryList } from './merge-summaries.js';
import { summarise } from './sample-summary.js';
import { computeStatistics, PERCENTILES_NEED_SAMPLES, statisticsFromSummary } from './statistics.js';

function relativeClose(actual: number | null, expected: number, relative = 1e-9): void {
  expect(actual).not.toBeNull();
  expect(Math.abs((actual as number) - expected)).toBeLessThanOrEqual(relative * Math.max(1e-300, Math.abs(expected)) + 1e-300);
}


describe('computeStatistics against simple-statistics', () => {
  const rnd = seededRandom(7);
  const cases: Array<[string, Float64Array]> = [
    ['random', Float64Array.from({ length: 10_000 }, () => rnd() * 30)],
    ['constant', new Float64Array(4097).fill(12.5)],
    ['one sample', new Float64Array([3.3])],
    ['huge offset', Float64Array.from({ length: 20_000 }, () => 1e9 + rnd())],
    ['negative and positive', Float64Array.from({ length: 9000 }, () => rnd() * 200 - 100)],
    ['1e6 samples', Float64Array.from({ length: 1_000_000 }, () => 5 + 10 * rnd() * rnd())],
    // Each 4,096-sample block starts with a far outlier: the worst case for shifted sums (see valuesPass).
    ['outlier at every block start', Float64Array.from({ length: 3 * 4096 }, (_, i) => (i % 4096 === 0 ? 1e9 : 1 + rnd() * 1e-3))],
    ['huge offset, tiny spread', Float64Array.from({ length: 50_000 }, () => 1e11 + rnd() * 1e-2)],
  ];
  for (const [name, x] of cases) {
    it(`agrees on ${name}`, () => {
      const s = computeStatistics(uniformTimeAxis(0, 10), x);
      const values = Array.from(x);
      // source: simple-statistics mean, standardDeviation (population), rootMeanSquare, min, max, quantile (type 7)
      relativeClose(s.meanA, ss.mean(values), 1e-12);
      const sd = ss.standardDeviation(values);
      expect(Math.abs(s.standardDeviationA - sd)).toBeLessThanOrEqual(1e-9 * Math.max(1, sd) + 1e-12 * Math.abs(ss.mean(values)));
      relativeClose(s.rmsA, ss.rootMeanSquare(values), 1e-12);
      expect(s.minA).toBe(ss.min(values));
      expect(s.maxA).toBe(ss.max(values));
      expect([s.p50A, s.p95A, s.p99A]).toEqual(ss.quantile(values, [0.5, 0.95, 0.99]));
      expect(s.count).toBe(x.length);
    });
  }
});

describe('computeStatistics, analytic checks', () => {
  it('thermal-equivalent current of 20 A for 10 s then 5 A for 30 s is 10.897 A', () => {
    // source: trade-facts.md 6.5 example 23: √((400·10 + 25·30)/40) = 10.897 A (derived)
    const rate = 1000;
    const a = Float64Array.from({ length: 40 * rate + 1 }, (_, i) => (i <= 10 * rate ? 20 : 5));
    const s = computeStatistics(uniformTimeAxis(0, rate), a);
    // The trapezoid blurs the step over one 1 ms interval: error ≈ 0.001/40 of the difference.
    expect(s.thermalEquivalentA).toBeCloseTo(10.897, 3);
    expect(s.timeWeightedMeanA).toBeCloseTo((20 * 10 + 5 * 30) / 40, 3);
  });

  it('energy of a constant 1500 W load at 120 V for 2 h is 3.0 kWh and 25 A·h', () => {
    // source: trade-facts.md 6.5 example 21 (P = V·I·PF): 1500 W / 120 V = 12.5 A; 2 h → 3.0 kWh, 25 A·h
    const a = new Float64Array(7201).fill(12.5); // one reading per second for 2 h
    const s = computeStatistics(uniformTimeAxis(0, 1), a, { voltageV: 120 });
    relativeClose(s.energyKWh, 3.0, 1e-12);
    relativeClose(s.chargeAh, 25, 1e-12);
    expect(s.powerFactor).toBe(1);
    const withPf = computeStatistics(uniformTimeAxis(0, 1), a, { voltageV: 120, powerFactor: 0.8 });
    relativeClose(withPf.energyKWh, 2.4, 1e-12);
  });

  it('duty cycle and time above thresholds on a square wave', () => {
    // Square wave 0/10 A, 50 % on, sampled 1000/s; interpolated edges are 1 ms wide (derived).
    const rate = 1000;
    const a = Float64Array.from({ length: 10 * rate + 1 }, (_, i) => (Math.floor(i / rate) % 2 === 0 ? 10 : 0));
    const s = computeStatistics(uniformTimeAxis(0, rate), a, { onThresholdA: 5, thresholdsA: [5, 20] });
    expect(s.dutyCycle).toBeCloseTo(0.5, 3);
    expect(s.timeAbove[0]!.timeS).toBeCloseTo(5, 2);
    expect(s.timeAbove[1]!.timeS).toBe(0);
    // source: textbook — RMS of a 0/10 square wave at 50 % duty is 10/√2
    expect(s.rmsA).toBeCloseTo(10 / Math.SQRT2, 2);
  });

  it('reports gaps from irregular timestamps and never integrates them', () => {
    const t = Float64Array.from([0, 1, 2.1, 3, 4, 30, 31, 32]);
    const a = new Float64Array(8).fill(2);
    const s = computeStatistics(explicitTimeAxis(t), a);
    expect(s.gaps.count).toBe(1);
    expect(s.gaps.listed).toEqual([{ startS: 4, endS: 30 }]);
    expect(s.coveredTimeS).toBeCloseTo(6, 12);
    expect(s.durationS).toBe(32);
    expect(s.chargeAh).toBeCloseTo((2 * 6) / 3600, 12);
  });

  it('handles a single sample without NaN', () => {
    const s = computeStatistics(uniformTimeAxis(0, 1), new Float64Array([4]));
    expect(s.timeWeightedMeanA).toBeNull();
    expect(s.durationS).toBe(0);
    expect(s.p99A).toBe(4);
    expect(JSON.stringify(s)).not.toMatch(/NaN|Infinity/);
  });

  it('works on a window given by indexes', () => {
    const a = Float64Array.from({ length: 1000 }, (_, i) => i);
    const s = computeStatistics(uniformTimeAxis(0, 1), a, { from: 100, to: 200 });
    expect(s.minA).toBe(100);
    expect(s.maxTimeS).toBe(199);
    expect(s.meanA).toBe(149.5);
  });

  it('rejects bad options', () => {
    const a = new Float64Array([1, 2]);
    expect(() => computeStatistics(uniformTimeAxis(0, 1), a, { voltageV: 0 })).toThrow(/voltageV/);
    expect(() => computeStatistics(uniformTimeAxis(0, 1), a, { powerFactor: 2 })).toThrow(/powerFactor/);
    expect(() => computeStatistics(uniformTimeAxis(0, 1), a, { thresholdsA: [Number.NaN] })).toThrow(/thresholdsA\[0\]/);
  });
});

describe('statisticsFromSummary', () => {
  it('equals the direct figures except percentiles', () => {
    const rnd = seededRandom(11);
    const t = new Float64Array(20_000);
    let time = 0;
    for (let i = 0; i < t.length; i++) t[i] = time += rnd() < 0.001 ? 60 : 0.5 + rnd();
    const a = Float64Array.from(t, () => rnd() * 15);
    const axis = explicitTimeAxis(t);
    const direct = computeStatistics(axis, a, { gapThresholdS: 10, onThresholdA: 3, thresholdsA: [3], voltageV: 230 });
    const options = { gapThresholdS: 10, thresholdsA: [3] };
    const pieces = [0, 4096, 8192, 12288, 16384].map((c) => summarise(axis, a, c, Math.min(c + 4096, a.length), options));
    const assembled = statisticsFromSummary(mergeSummaryList(pieces), { onThresholdA: 3, voltageV: 230 });
    for (const key of ['count', 'minA', 'maxA', 'minTimeS', 'maxTimeS', 'durationS'] as const) expect(assembled[key]).toBe(direct[key]);
    for (const key of ['meanA', 'rmsA', 'standardDeviationA', 'timeWeightedMeanA', 'thermalEquivalentA', 'chargeAh', 'energyKWh', 'dutyCycle', 'coveredTimeS'] as const) {
      relativeClose(assembled[key], direct[key] as number, 1e-9);
    }
    expect(assembled.gaps.count).toBe(direct.gaps.count);
    expect(assembled.p95A).toBeNull();
    expect(assembled.quantileMethod).toBe(PERCENTILES_NEED_SAMPLES);
  });
});

describe('statistics properties', () => {
  const series = fc
    .array(fc.record({ dt: fc.double({ min: 1e-3, max: 100, noNaN: true }), a: fc.double({ min: -1e6, max: 1e6, noNaN: true }) }), { minLength: 1, maxLength: 400 })
    .map((rows) => {
      let time = 0;
      // Subnormal currents would underflow when scaled; real readings never come near them.
      return { t: Float64Array.from(rows, (r) => (time += r.dt)), a: Float64Array.from(rows, (r) => (Math.abs(r.a) < 1e-9 ? 0 : r.a)) };
    });

  it('min <= mean <= max, time-weighted mean too; no NaN for finite input', () => {
    fc.assert(
      fc.property(series, ({ t, a }) => {
        const s = computeStatistics(explicitTimeAxis(t), a, { onThresholdA: 0, thresholdsA: [1], voltageV: 120 });
        expect(s.minA).toBeLessThanOrEqual(s.meanA);
        expect(s.meanA).toBeLessThanOrEqual(s.maxA);
        if (s.timeWeightedMeanA !== null) {
          expect(s.minA).toBeLessThanOrEqual(s.timeWeightedMeanA);
          expect(s.timeWeightedMeanA).toBeLessThanOrEqual(s.maxA);
        }
        expect(s.p50A! >= s.minA && s.p99A! <= s.maxA).toBe(true);
        expect(JSON.stringify(s)).not.toMatch(/NaN|Infinity/);
      }),
      { numRuns: 300 },
    );
  });

  it('scaling the current by k > 0 scales every amp figure by k and charge by k', () => {
    fc.assert(
      fc.property(series, fc.double({ min: 0.01, max: 100, noNaN: true }), ({ t, a }, k) => {
        const axis = explicitTimeAxis(t);
        const base = computeStatistics(axis, a);
        const scaled = computeStatistics(axis, a.map((v) => v * k));
        for (const key of ['meanA', 'minA', 'maxA', 'rmsA', 'p50A', 'p95A', 'p99A', 'standardDeviationA'] as const) {
          const expected = (base[key] as number) * k;
          expect(Math.abs((scaled[key] as number) - expected)).toBeLessThanOrEqual(1e-9 * Math.max(1, Math.abs(expected), k * base.maxA - k * base.minA));
        }
        // Scaling keeps the readings' order, but two that differ in the last bit may become equal (the
        // minimum's time is then the first of them): the base minimum is still a minimum once scaled.
        const scaledValues = a.map((v) => v * k);
        expect(scaledValues[t.indexOf(base.minTimeS as number)]).toBe(scaled.minA);
        expect(scaled.minTimeS).toBe(t[scaledValues.indexOf(scaled.minA)]);
      }),
      { numRuns: 200 },
    );
  });

  it('shifting time changes no amplitude figure', () => {
    fc.assert(
      fc.property(series, fc.double({ min: -1e6, max: 1e9, noNaN: true }), ({ t, a }, shift) => {
        const base = computeStatistics(explicitTimeAxis(t), a, { onThresholdA: 0 });
        const moved = computeStatistics(explicitTimeAxis(t.map((x) => x + shift)), a, { onThresholdA: 0 });
        for (const key of ['count', 'meanA', 'minA', 'maxA', 'rmsA', 'p50A', 'p95A', 'p99A', 'standardDeviationA'] as const) expect(moved[key]).toBe(base[key]);
      }),
      { numRuns: 200 },
    );
  });

  it('rejects any non-finite input with a RangeError', () => {
    fc.assert(
      fc.property(series, fc.constantFrom(Number.NaN, Infinity, -Infinity), fc.nat(), ({ t, a }, bad, where) => {
        const broken = a.slice();
        broken[where % broken.length] = bad;
        expect(() => computeStatistics(explicitTimeAxis(t), broken)).toThrow(RangeError);
        const brokenTimes = t.slice();
        brokenTimes[where % brokenTimes.length] = bad;
        if (t.length > 1) expect(() => computeStatistics(explicitTimeAxis(brokenTimes), a)).toThrow(RangeError);
      }),
      { numRuns: 200 },
    );
  });
});
