import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { explicitTimeAxis, uniformTimeAxis } from '../time/time-axis.js';
import { mergeSummaries, mergeSummaryList } from './merge-summaries.js';
import { summarise, SUMMARY_BLOCK_SAMPLES, type GapInterval, type SampleSummary } from './sample-summary.js';

function close(actual: number, expected: number, relative = 1e-9): void {
  expect(Math.abs(actual - expected)).toBeLessThanOrEqual(relative * Math.max(1, Math.abs(expected)));
}

function expectSummariesEqual(actual: SampleSummary, expected: SampleSummary): void {
  for (const key of ['count', 'minA', 'minTimeS', 'maxA', 'maxTimeS', 'firstTimeS', 'firstA', 'lastTimeS', 'lastA', 'gapCount', 'gapThresholdS'] as const) {
    expect(actual[key]).toBe(expected[key]);
  }
  for (const key of ['meanA', 'coveredTimeS', 'integralAs', 'integralA2s', 'gapTimeS'] as const) close(actual[key], expected[key]);
  close(actual.m2A2, expected.m2A2, 1e-7);
  expect(actual.longestGap).toEqual(expected.longestGap);
  actual.timeAboveS.forEach((s, k) => close(s, expected.timeAboveS[k]!));
}

describe('summarise', () => {
  it('integrates a rectangular pulse: 60 A for 0.5 s gives 1800 A²s and 30 A·s', () => {
    // source: trade-facts.md 6.5 example 22 (I²t of a rectangular pulse, derived)
    const rate = 1000;
    const a = new Float64Array(501).fill(60);
    const s = summarise(uniformTimeAxis(0, rate), a, 0, a.length, { gapThresholdS: null });
    close(s.integralA2s, 1800, 1e-12);
    close(s.integralAs, 30, 1e-12);
    close(s.coveredTimeS, 0.5, 1e-12);
  });

  it('gives the mean and M2 of Welford/Chan on data with a huge offset', () => {
    // source: textbook variance; with the two-pass/Chan method the offset costs no precision
    const a = Float64Array.from({ length: 10_000 }, (_, i) => 1e9 + (i % 2 === 0 ? -1 : 1));
    const s = summarise(uniformTimeAxis(0, 1), a, 0, a.length, { gapThresholdS: null });
    expect(s.meanA).toBe(1e9);
    close(s.m2A2 / s.count, 1, 1e-12);
  });

  it('reports gaps and does not integrate across them', () => {
    const t = new Float64Array([0, 1, 2, 10, 11]);
    const a = new Float64Array([1, 1, 1, 1, 1]);
    const gaps: GapInterval[] = [];
    const s = summarise(explicitTimeAxis(t), a, 0, 5, { gapThresholdS: 2.5, gapSink: gaps });
    expect(s.gapCount).toBe(1);
    expect(s.gapTimeS).toBe(8);
    expect(s.longestGap).toEqual({ startS: 2, endS: 10 });
    expect(gaps).toEqual([{ startS: 2, endS: 10 }]);
    expect(s.coveredTimeS).toBe(3);
    expect(s.integralAs).toBe(3);
  });

  it('accumulates time above thresholds by linear interpolation', () => {
    // Ramp 0 → 10 A over 10 s: above 2.5 A for 7.5 s (derived from the linear model).
    const a = new Float64Array([0, 10]);
    const s = summarise(uniformTimeAxis(0, 0.1), a, 0, 2, { gapThresholdS: null, thresholdsA: [2.5, 10, -1] });
    expect(s.timeAboveS).toEqual([7.5, 0, 10]);
  });

  it('rejects bad samples and timestamps, naming the index', () => {
    const axis = uniformTimeAxis(0, 1);
    expect(() => summarise(axis, new Float64Array([1, Number.NaN, 2]), 0, 3, { gapThresholdS: null })).toThrow(/samples\[1\]/);
    expect(() => summarise(axis, new Float64Array([1, Infinity]), 0, 2, { gapThresholdS: null })).toThrow(/samples\[1\]/);
    expect(() => summarise(axis, new Float64Array([1, 2e12]), 0, 2, { gapThresholdS: null })).toThrow(/outside/);
    expect(() => summarise(axis, new Float64Array(3), 2, 2, { gapThresholdS: null })).toThrow(/non-empty/);
    const a = new Float64Array(4);
    expect(() => summarise(explicitTimeAxis(new Float64Array([0, 1, 1, 2])), a, 0, 4, { gapThresholdS: null })).toThrow(/timestamps\[2\]/);
    expect(() => summarise(explicitTimeAxis(new Float64Array([0, 1, Number.NaN, 2])), a, 0, 4, { gapThresholdS: 5 })).toThrow(/timestamps\[2\]/);
    expect(() => summarise(explicitTimeAxis(new Float64Array([0, 1, 2, Infinity])), a, 0, 4, { gapThresholdS: 5 })).toThrow(/timestamps\[3\]/);
    expect(() => summarise(explicitTimeAxis(new Float64Array([0, 1, 2])), a, 0, 4, { gapThresholdS: 5 })).toThrow(/3 elements/);
    expect(() => summarise(axis, a, 0, 4, { gapThresholdS: -1 })).toThrow(/gapThresholdS/);
  });
});

describe('mergeSummaries', () => {
  const arbitrarySeries = fc
    .array(
      fc.record({ dt: fc.double({ min: 0.01, max: 5, noNaN: true }), a: fc.double({ min: -50, max: 80, noNaN: true }) }),
      { minLength: 2, maxLength: 3 * SUMMARY_BLOCK_SAMPLES },
    )
    .map((rows) => {
      const t = new Float64Array(rows.length);
      const a = new Float64Array(rows.length);
      let time = 1000;
      rows.forEach((r, i) => {
        time += r.dt;
        t[i] = time;
        a[i] = r.a;
      });
      return { t, a };
    });

  it('assembles the direct summary from chunk summaries cut at random boundaries (property)', () => {
    fc.assert(
      fc.property(arbitrarySeries, fc.array(fc.nat(), { maxLength: 6 }), fc.double({ min: 0.5, max: 6, noNaN: true }), ({ t, a }, cuts, gapThresholdS) => {
        const n = a.length;
        const bounds = [...new Set(cuts.map((c) => 1 + (c % (n - 1))))].sort((x, y) => x - y);
        const edges = [0, ...bounds, n];
        const options = { gapThresholdS, thresholdsA: [0, 10, 40] };
        const axis = explicitTimeAxis(t);
        const pieces = edges.slice(1).map((end, k) => summarise(axis, a, edges[k]!, end, options));
        expectSummariesEqual(mergeSummaryList(pieces), summarise(axis, a, 0, n, options));
      }),
      { numRuns: 200 },
    );
  });

  it('assembles uniform-rate chunks of 4096 samples plus two partial edge chunks', () => {
    const rate = 30;
    const axis = uniformTimeAxis(5, rate);
    const a = Float64Array.from({ length: 5 * 4096 + 77 }, (_, i) => 8 + 3 * Math.sin(i / 50) + (i % 997 === 0 ? 30 : 0));
    const options = { gapThresholdS: 2.5 / rate, thresholdsA: [10] };
    const from = 1234;
    const to = a.length - 555;
    const pieces: SampleSummary[] = [];
    const firstFull = Math.ceil(from / 4096) * 4096;
    const lastFull = Math.floor(to / 4096) * 4096;
    pieces.push(summarise(axis, a, from, firstFull, options));
    for (let c = firstFull; c < lastFull; c += 4096) pieces.push(summarise(axis, a, c, c + 4096, options));
    pieces.push(summarise(axis, a, lastFull, to, options));
    expectSummariesEqual(mergeSummaryList(pieces), summarise(axis, a, from, to, options));
  });

  it('refuses summaries out of order or made with other settings', () => {
    const axis = uniformTimeAxis(0, 1);
    const a = new Float64Array([1, 2, 3, 4]);
    const first = summarise(axis, a, 0, 2, { gapThresholdS: 2 });
    const second = summarise(axis, a, 2, 4, { gapThresholdS: 2 });
    expect(() => mergeSummaries(second, first)).toThrow(/time order/);
    expect(() => mergeSummaries(first, summarise(axis, a, 2, 4, { gapThresholdS: 3 }))).toThrow(/gap thresholds/);
    expect(() => mergeSummaries(first, summarise(axis, a, 2, 4, { gapThresholdS: 2, thresholdsA: [1] }))).toThrow(/thresholdsA/);
    expect(() => mergeSummaryList([])).toThrow(RangeError);
  });
});

describe('summaries as stored JSON', () => {
  it('survive a JSON round trip and still merge to the direct figures', () => {
    const axis = uniformTimeAxis(0, 50);
    const a = Float64Array.from({ length: 10_000 }, (_, i) => 3 + Math.sin(i / 10) * 2);
    const options = { gapThresholdS: 0.05, thresholdsA: [4] };
    const stored = [0, 4096, 8192].map((c) => JSON.parse(JSON.stringify(summarise(axis, a, c, Math.min(c + 4096, a.length), options))) as SampleSummary);
    expectSummariesEqual(mergeSummaryList(stored), summarise(axis, a, 0, a.length, options));
  });
});
