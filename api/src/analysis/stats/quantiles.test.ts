import fc from 'fast-check';
import * as ss from 'simple-statistics';
import { describe, expect, it } from 'vitest';
import { seededRandom } from '../test-support/seeded-random.js';
import { exactQuantiles, medianAbove } from './quantiles.js';

const PS = [0, 0.01, 0.25, 0.5, 0.95, 0.99, 1];


function reference(values: ArrayLike<number>, ps: number[]): number[] {
  // source: simple-statistics quantile (type 7, the numpy/R default)
  return ss.quantile(Array.from(values), ps);
}

describe('exactQuantiles (type 7)', () => {
  it('matches simple-statistics on random data', () => {
    const rnd = seededRandom(1);
    for (const n of [1, 2, 3, 10, 2047, 2048, 2049, 5000, 100_000]) {
      const x = Float64Array.from({ length: n }, () => rnd() * 40 - 5);
      expect(exactQuantiles(x, PS)).toEqual(reference(x, PS));
    }
  });

  it('matches simple-statistics on adversarial data', () => {
    const rnd = seededRandom(2);
    const cases: Float64Array[] = [
      new Float64Array(5000).fill(7.25), // constant
      new Float64Array([42]), // one sample
      Float64Array.from({ length: 50_000 }, () => 1e9 + rnd()), // huge offset
      Float64Array.from({ length: 50_000 }, () => Math.round(rnd() * 200) / 5), // 0.2 A resolution, many ties
      Float64Array.from({ length: 200_000 }, (_, i) => (i % 1000 === 0 ? 1e6 : rnd() * 1e-6)), // outliers squeeze the bins
      Float64Array.from({ length: 100_000 }, (_, i) => (i < 99_000 ? 5 + rnd() * 1e-9 : rnd() * 100)), // one crowded bin
      Float64Array.from({ length: 3000 }, (_, i) => (i % 2 === 0 ? -1e12 : 1e12)), // extremes of the accepted range
      Float64Array.from({ length: 4000 }, () => (rnd() < 0.5 ? 0 : 5e-324)), // subnormal spread
    ];
    for (const x of cases) expect(exactQuantiles(x, PS)).toEqual(reference(x, PS));
  });

  it('matches simple-statistics on 1e6 samples, Float32 and Float64', () => {
    const rnd = seededRandom(3);
    const x = Float64Array.from({ length: 1_000_000 }, () => 10 + 3 * Math.sqrt(-2 * Math.log(rnd() + 1e-12)) * Math.cos(2 * Math.PI * rnd()));
    expect(exactQuantiles(x, [0.5, 0.95, 0.99])).toEqual(reference(x, [0.5, 0.95, 0.99]));
    const y = Float32Array.from(x);
    expect(exactQuantiles(y, [0.5, 0.95, 0.99])).toEqual(reference(y, [0.5, 0.95, 0.99]));
  });

  it('works on a sub-range', () => {
    const x = Float64Array.from({ length: 1000 }, (_, i) => (i * 7919) % 1000);
    expect(exactQuantiles(x, [0.5, 0.9], 100, 600)).toEqual(reference(x.subarray(100, 600), [0.5, 0.9]));
  });

  it('agrees with simple-statistics for any finite data (property)', () => {
    fc.assert(
      fc.property(
        fc.array(fc.double({ min: -1e6, max: 1e6, noNaN: true }), { minLength: 1, maxLength: 3000 }),
        fc.double({ min: 0, max: 1, noNaN: true }),
        (values, p) => {
          const x = Float64Array.from(values);
          expect(exactQuantiles(x, [p])).toEqual(reference(x, [p]));
        },
      ),
      { numRuns: 300 },
    );
  });

  it('rejects bad input with a RangeError', () => {
    expect(() => exactQuantiles(new Float64Array(0), [0.5])).toThrow(RangeError);
    expect(() => exactQuantiles(new Float64Array([1, Number.NaN]), [0.5])).toThrow(/\[1\]/);
    expect(() => exactQuantiles(new Float64Array([1, 2]), [1.5])).toThrow(/between 0 and 1/);
  });
});

describe('medianAbove', () => {
  it('is the type 7 median of the values above a level', () => {
    const x = Float64Array.from([0.1, 0.2, 5, 6, 7, 100, 0.3]);
    // source: simple-statistics median of the filtered values
    expect(medianAbove(x, 0.5)).toBe(ss.median([5, 6, 7, 100]));
    expect(medianAbove(x, 1000)).toBeNull();
  });
});
