import fc from 'fast-check';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { openDatabase, type Db } from '../db/open.js';
import { storedTrace } from '../services/traces-view.js';
import { CachedChunkStore } from './cached-chunk-store.js';
import { envelope } from './envelope.js';
import { SqliteChunkStore } from './sqlite-chunk-store.js';
import { appendExplicit, makeTrace } from './test-support.js';

describe('CachedChunkStore envelopes', () => {
  let db: Db;
  beforeAll(async () => {
    db = await openDatabase({ databaseFile: ':memory:' });
  });
  afterAll(() => db.close());

  it('when a trace grows (its last chunk topped up, new chunks added) between chart reads, then every envelope equals the uncached one', async () => {
    // The reference is the same store without the cache, read after every batch.
    await fc.assert(
      fc.asyncProperty(
        fc.array(fc.integer({ min: 1, max: 9000 }), { minLength: 2, maxLength: 8 }),
        fc.array(fc.tuple(fc.double({ min: 0, max: 1, noNaN: true }), fc.double({ min: 0, max: 1, noNaN: true }), fc.integer({ min: 2, max: 300 })), { minLength: 1, maxLength: 4 }),
        async (batches, windows) => {
          const plain = new SqliteChunkStore(db);
          const cached = new CachedChunkStore(plain);
          const trace = await makeTrace(db);
          let t = 1_700_000_000_000_000;
          let i = 0;
          for (const size of batches) {
            const timesUs = new Float64Array(size);
            const values = new Float32Array(size);
            for (let k = 0; k < size; k++, i++) {
              t += 1000 + (i % 7) * 10;
              timesUs[k] = t;
              values[k] = Math.fround(5 + Math.sin(i / 50) * 4 + (i % 13) / 10);
            }
            await appendExplicit(cached, trace, values, timesUs);
            const stored = storedTrace(trace);
            const first = trace.firstSampleUs as number;
            const span = (trace.lastSampleUs as number) - first;
            // The whole range too, at the stored-envelope level (about 100 samples a bucket).
            for (const [a, b, points] of [...windows, [0, 1, Math.max(2, Math.ceil(i / 100))] as const]) {
              const fromUs = first + Math.min(a, b) * span;
              const toUs = first + Math.max(a, b) * span;
              const expected = await envelope(plain, stored, fromUs, toUs, points);
              // A random window may fall between two samples; the whole range never does.
              if (a === 0 && b === 1) expect(expected.sampleCount).toBe(i);
              expect(await envelope(cached, stored, fromUs, toUs, points)).toEqual(expected);
            }
          }
        },
      ),
      { numRuns: 25 },
    );
  });
});
