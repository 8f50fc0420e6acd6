import fc from 'fast-check';
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { summarise } from '../analysis/stats/sample-summary.js';
import { explicitTimeAxis, uniformTimeAxis } from '../analysis/time/time-axis.js';
import { openDatabase, type Db } from '../db/open.js';
import type { ChunkStore } from './chunk-store.js';
import { envelope } from './envelope.js';
import { SequelizeChunkStore } from './sequelize-chunk-store.js';
import { SqliteChunkStore } from './sqlite-chunk-store.js';
import { appendExplicit, makeTrace, summaryDifferences, writerFor } from './test-support.js';
import { windowSummary } from './window-summary.js';
import { CHUNK_SAMPLES } from './chunk-codec.js';
import { CachedChunkStore } from './cached-chunk-store.js';
import { storedTrace } from '../services/traces-view.js';

/** A series with irregular steps and a few long gaps, split into batches; times in integer µs. */
const seriesArb = fc.record({
  n: fc.integer({ min: 1, max: 12_000 }),
  seed: fc.integer({ min: 1, max: 2 ** 30 }),
  batches: fc.array(fc.integer({ min: 1, max: 5000 }), { minLength: 1, maxLength: 6 }),
  window: fc.tuple(fc.double({ min: -0.1, max: 1.1, noNaN: true }), fc.double({ min: -0.1, max: 1.1, noNaN: true })),
});

function makeSeries(n: number, seed: number) {
  let s = seed;
  const rand = () => {
    s = (s * 1103515245 + 12345) % 2147483648;
    return s / 2147483648;
  };
  const timesUs = new Float64Array(n);
  const values = new Float32Array(n);
  let t = 1_700_000_000_000_000;
  for (let i = 0; i < n; i++) {
    // 50 ms ± 20 %, and now and then a gap of a few seconds.
    t += rand() < 0.002 ? 5_000_000 : Math.round(50_000 * (0.8 + 0.4 * rand()));
    timesUs[i] = t;
    values[i] = Math.fround(8 + 6 * Math.sin(i / 40) + (rand() - 0.5));
  }
  return { timesUs, values };
}

describe.each([
  ['sqlite', (db: Db) => new SqliteChunkStore(db), ':memory:'],
  // On a database file the writes run on the writer thread (storage/sqlite-writer.ts).
  ['sqlite file', (db: Db) => new SqliteChunkStore(db), 'file'],
  ['sequelize', (db: Db) => new SequelizeChunkStore(db), ':memory:'],
  ['cached sqlite', (db: Db) => new CachedChunkStore(new SqliteChunkStore(db)), ':memory:'],
] as const)('window statistics from chunk summaries (%s store)', (_name, makeStore, where) => {
  let db: Db;
  let store: ChunkStore;
  let dir: string | undefined;
  beforeAll(async () => {
    dir = where === 'file' ? mkdtempSync(path.join(tmpdir(), 'headroom-window-summary-')) : undefined;
    db = await openDatabase({ databaseFile: dir ? path.join(dir, 'test.sqlite') : ':memory:' });
    store = makeStore(db);
  });
  afterAll(async () => {
    await db.close();
    if (dir) rmSync(dir, { recursive: true, force: true });
  });

  it('when any window is asked, then the assembled summary equals the direct computation, and the envelope bounds every sample', async () => {
    // source: the merge is exact by construction (Chan et al. 1983); the reference is the analysis engine's direct summarise.
    await fc.assert(
      fc.asyncProperty(seriesArb, async ({ n, seed, batches, window }) => {
        const trace = await makeTrace(db);
        const { timesUs, values } = makeSeries(n, seed);
        let at = 0;
        for (const size of [...batches, n]) {
          if (at >= n) break;
          const end = Math.min(n, at + size);
          await appendExplicit(store, trace, values.subarray(at, end), timesUs.subarray(at, end));
          at = end;
          // Read between batches, so a caching store sees the trace grow and its last chunk topped up.
          expect((await windowSummary(store, storedTrace(trace), -Infinity, Infinity))?.count).toBe(end);
        }
        expect(trace.sampleCount).toBe(n);
        const origin = trace.originUs as number;
        const span = (timesUs[n - 1] as number) - (timesUs[0] as number);
        const [a, b] = window[0] <= window[1] ? window : [window[1], window[0]];
        const fromUs = Math.round((timesUs[0] as number) + a * span);
        const toUs = Math.round((timesUs[0] as number) + b * span);

        const from = timesUs.findIndex((t) => t >= fromUs);
        let to = n;
        while (to > 0 && (timesUs[to - 1] as number) > toUs) to--;
        const actual = await windowSummary(store, storedTrace(trace), fromUs, toUs);
        if (from < 0 || from >= to) {
          expect(actual).toBeNull();
          return;
        }
        const timesS = Float64Array.from(timesUs, (t) => (t - origin) / 1e6);
        const expected = summarise(explicitTimeAxis(timesS), values, from, to, { gapThresholdS: trace.gapThresholdS });
        expect(actual).not.toBeNull();
        expect(summaryDifferences(actual!, expected)).toEqual([]);

        const points = 1 + (seed % 300);
        const env = await envelope(store, storedTrace(trace), fromUs, toUs, points);
        expect(env.buckets.count.length).toBeLessThanOrEqual(points);
        expect(env.sampleCount).toBe(to - from);
        expect(env.buckets.count.reduce((x, y) => x + y, 0)).toBe(to - from);
        // Every sample lies in its bucket's [min, max] (buckets hold consecutive samples in order).
        let i = from;
        for (let k = 0; k < env.buckets.count.length; k++) {
          const c = env.buckets.count[k] as number;
          for (let j = 0; j < c; j++, i++) {
            expect(values[i]).toBeGreaterThanOrEqual(env.buckets.min[k] as number);
            expect(values[i]).toBeLessThanOrEqual(env.buckets.max[k] as number);
            expect(timesUs[i]).toBeGreaterThanOrEqual(env.buckets.startUs[k] as number);
            expect(timesUs[i]).toBeLessThanOrEqual(env.buckets.endUs[k] as number);
          }
        }
      }),
      { numRuns: 25 },
    );
  });

  it('when a window read by 64-sample blocks starts in a chunk with a gap, then the envelope breaks at the gap there too', async () => {
    // common practice, no source: a chart envelope shows a gap in the recording as a break (an empty
    // bucket spanning it), never as a line across it; the edge chunks of a window are read from their
    // samples in block-sized pieces that must still end at a gap.
    const trace = await makeTrace(db);
    const n = 3 * CHUNK_SAMPLES;
    const t0 = 1_700_000_000_000_000;
    const timesUs = Float64Array.from({ length: n }, (_, i) => t0 + i * 1000 + (i > 5000 ? 1_000_000 : 0)); // 1 ms apart, 1 s missing after 5000
    const values = Float32Array.from({ length: n }, (_, i) => Math.fround(5 + Math.sin(i / 50)));
    await appendExplicit(store, trace, values, timesUs);
    const from = 4500; // in the second chunk (4,096-8,191), before the gap
    const to = 12_000; // in the third
    const env = await envelope(store, storedTrace(trace), timesUs[from] as number, timesUs[to - 1] as number, 50);
    expect(env.level).toBe('blocks');
    expect(env.sampleCount).toBe(to - from);
    const gap = env.buckets.count.indexOf(0);
    expect(gap).toBeGreaterThan(0);
    expect([env.buckets.startUs[gap], env.buckets.endUs[gap], env.buckets.min[gap]]).toEqual([timesUs[5000], timesUs[5001], null]);
    expect(env.buckets.endUs[gap - 1]).toBe(timesUs[5000]);
    expect(env.buckets.startUs[gap + 1]).toBe(timesUs[5001]);
    expect(env.buckets.count.reduce((x, y) => x + y, 0)).toBe(to - from);
  });

  it.each([
    ['blocks', 100],
    ['chunks', 12],
  ] as const)('when a gap lies inside a chunk in the middle of the window (read by %s), then the envelope breaks at the gap there too', async (level, points) => {
    // common practice, no source: as above; here the gap falls inside a stored 64-sample block (after
    // sample 2 of the block 64·156..64·157) of a chunk wholly inside the window, whose stored block
    // envelope or summary spans the gap and cannot end a bucket there.
    const trace = await makeTrace(db);
    const n = 12 * CHUNK_SAMPLES;
    const at = 64 * 156 + 2; // 9,986: in chunk 2 (samples 8,192–12,287)
    const t0 = 1_700_000_000_000_000;
    const timesUs = Float64Array.from({ length: n }, (_, i) => t0 + i * 1000 + (i > at ? 3_000_000 : 0)); // 1 ms apart, 3 s missing
    const values = Float32Array.from({ length: n }, (_, i) => Math.fround(5 + Math.sin(i / 50) + (i === at ? 4 : 0) + (i === at + 1 ? -4 : 0)));
    await appendExplicit(store, trace, values, timesUs);
    const from = 100;
    const to = n - 100;
    const env = await envelope(store, storedTrace(trace), timesUs[from] as number, timesUs[to - 1] as number, points);
    expect(env.level).toBe(level);
    expect(env.buckets.count.length).toBeLessThanOrEqual(points);
    expect(env.buckets.count.reduce((x, y) => x + y, 0)).toBe(to - from);
    const gap = env.buckets.count.indexOf(0);
    expect(gap).toBeGreaterThan(0);
    expect(env.buckets.count.lastIndexOf(0)).toBe(gap);
    expect([env.buckets.startUs[gap], env.buckets.endUs[gap], env.buckets.min[gap]]).toEqual([timesUs[at], timesUs[at + 1], null]);
    expect(env.buckets.endUs[gap - 1]).toBe(timesUs[at]);
    expect(env.buckets.startUs[gap + 1]).toBe(timesUs[at + 1]);
    // The spike just before the gap stays in the bucket it ends; the dip just after starts the next.
    expect(env.buckets.max[gap - 1]).toBe(values[at]);
    expect(env.buckets.min[gap + 1]).toBe(values[at + 1]);
  });

  it('when a uniform run arrives in batches, then small batches top up the last chunk, large ones start their own, and statistics equal the direct computation', async () => {
    const trace = await makeTrace(db, 1000);
    const n = 3 * CHUNK_SAMPLES + 123;
    const values = Float32Array.from({ length: n }, (_, i) => Math.fround(10 * Math.sin((2 * Math.PI * 50 * i) / 1000)));
    const startUs = 1_700_000_000_000_000;
    for (const [a, b] of [[0, 1000], [1000, 1001], [1001, 9000], [9000, n]] as const) {
      const writer = await writerFor(store, trace);
      await writer.pushUniform(values.subarray(a, b), a === 0 ? { startUs } : 'continue', 1000);
      await writer.finish();
    }
    await trace.reload();
    expect(trace.chunkCount).toBe(4);
    const rows = await store.readSummaries(trace.id, trace.chunkCount, -Infinity, Infinity);
    // 1000; +1 fits the room left; 7999 and 3411 do not fit theirs and start fresh chunks.
    expect(rows.map((r) => r.count)).toEqual([1001, CHUNK_SAMPLES, 7999 - CHUNK_SAMPLES, 3411]);
    const stored = storedTrace(trace);
    const actual = await windowSummary(store, stored, startUs + 1500, startUs + 11_000_000);
    const from = 2; // 1.5 ms after the start: samples at 2 ms and later
    const to = 11001;
    const expected = summarise(uniformTimeAxis(0, 1000), values, from, to, { gapThresholdS: 2.5 / 1000 });
    expect(summaryDifferences(actual!, expected)).toEqual([]);
  });

  it('when single readings arrive one batch each, then they share chunks and the gap threshold follows their spacing', async () => {
    const trace = await makeTrace(db);
    const t0 = 1_700_000_000_000_000;
    for (let i = 0; i < 10; i++) {
      await appendExplicit(store, trace, Float32Array.of(i), Float64Array.of(t0 + i * 1_000_000 + (i === 9 ? 10_000_000 : 0)));
    }
    expect(trace.chunkCount).toBe(1);
    expect(trace.gapThresholdS).toBe(2.5); // common practice, no source: 2.5 × the 1 s spacing (analysis DEFAULT_GAP_FACTOR)
    const summary = await windowSummary(store, storedTrace(trace), -Infinity, Infinity);
    expect(summary?.count).toBe(10);
    expect(summary?.gapCount).toBe(1);
  });
});
