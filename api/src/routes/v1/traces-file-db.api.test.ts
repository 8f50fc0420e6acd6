/**
 * Trace storage on a database file (WAL): the dedicated writer and reader connections of the SQLite
 * chunk store, concurrent batches to several traces with other writes between them, and pending
 * chunks left behind by a process that stopped half-way through a batch.
 */
import pino from 'pino';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createApp } from '../../app.js';
import { makeTestApp, type TestApp } from '../../testing/make-test-app.js';
import { testsRunOnPostgres } from '../../testing/postgres-scratch-database.js';

const T0 = 1_700_000_000_000;

describe.skipIf(testsRunOnPostgres)('trace storage on a SQLite file', () => {
  let t: TestApp;
  let auth: Record<string, string>;
  beforeAll(async () => {
    t = await makeTestApp({ file: true });
    auth = await t.auth();
  });
  afterAll(() => t.close());

  it('when batches for several traces and other writes arrive at once, then every one is stored whole', async () => {
    const ids: string[] = [];
    for (let k = 0; k < 4; k++) ids.push((await request(t.app).post('/api/v1/traces').set(auth).send({ name: `Parallel ${k}`, kind: 'rms', sampleRateHz: 100 })).body.id);
    const batches = ids.flatMap((id, k) =>
      Array.from({ length: 5 }, (_, b) => ({ id, k, b, values: Float32Array.from({ length: 10_000 }, (_, i) => k * 100 + b + i / 1e4) })),
    );
    // Batches of one trace must stay in order; traces and site writes interleave freely.
    const perTrace = ids.map((id) =>
      (async () => {
        for (const batch of batches.filter((x) => x.id === id)) {
          const res = await request(t.app)
            .post(`/api/v1/traces/${id}/samples?rate=100${batch.b === 0 ? `&start=${T0}` : ''}`)
            .set(auth)
            .set('Content-Type', 'application/octet-stream')
            .send(Buffer.from(batch.values.buffer));
          expect(res.status, JSON.stringify(res.body)).toBe(200);
        }
      })(),
    );
    const sites = Array.from({ length: 5 }, (_, i) => request(t.app).post('/api/v1/sites').set(auth).send({ name: `Site ${i}` }));
    await Promise.all([...perTrace, ...sites]);
    for (const [k, id] of ids.entries()) {
      const stats = (await request(t.app).get(`/api/v1/traces/${id}/stats`).set(auth)).body.statistics;
      expect(stats.count).toBe(50_000);
      expect(stats.minA).toBeCloseTo(k * 100, 4);
      expect(stats.durationS).toBeCloseTo(499.99, 6);
      expect(stats.gaps.count).toBe(0);
    }
    expect(await t.db.models.Site.count()).toBe(5);
  });

  it('when one import is sent twice at once with the same Idempotency-Key, then one trace is kept and both get its answer', async () => {
    // Both uploads store their samples; the writer thread refuses the second one's idempotency record
    // (SQLite's UNIQUE constraint), which must turn into the first one's answer, not an error.
    const before = await t.db.models.Trace.count();
    const csv = 'time,current\n1700000000000,1\n1700000001000,2\n1700000002000,3\n';
    const send = () =>
      request(t.app)
        .post('/api/v1/traces/import')
        .set(auth)
        .set('Idempotency-Key', 'import-once')
        .field('name', 'Imported once')
        .attach('file', Buffer.from(csv), { filename: 'once.csv', contentType: 'text/csv' });
    const [a, b] = await Promise.all([send(), send()]);
    expect([a.status, b.status], JSON.stringify([a.body, b.body])).toEqual([201, 201]);
    expect(a.body.trace.id).toBe(b.body.trace.id);
    expect(await t.db.models.Trace.count()).toBe(before + 1);
    const stats = (await request(t.app).get(`/api/v1/traces/${a.body.trace.id}/stats`).set(auth)).body.statistics;
    expect(stats.count).toBe(3);
  });

  it('when chunks of an interrupted batch were left behind, then the next batch clears them and is stored', async () => {
    const { body: trace } = await request(t.app).post('/api/v1/traces').set(auth).send({ name: 'Interrupted', kind: 'rms' });
    await request(t.app).post(`/api/v1/traces/${trace.id}/samples`).set(auth).send({ t: [T0, T0 + 1000], a: [1, 2] });
    const row = await t.db.models.TraceChunk.findOne({ where: { traceId: trace.id, seq: 0 }, raw: true });
    const data = await t.db.models.TraceChunkData.findOne({ where: { traceId: trace.id, seq: 0 }, raw: true });
    // What a process stopped mid-batch leaves: chunks beyond the trace's committed count.
    await t.db.models.TraceChunk.create({ ...row!, seq: 1, count: 1 });
    await t.db.models.TraceChunkData.create({ ...data!, seq: 1 });
    // A new process (a new app on the same database file) sends the next batch.
    const restarted = createApp(t.config, t.db, { logger: pino({ level: 'silent' }) });
    const res = await request(restarted)
      .post(`/api/v1/traces/${trace.id}/samples?start=${T0 + 5000}&rate=1`)
      .set(auth)
      .set('Content-Type', 'application/octet-stream')
      .send(Buffer.from(new Float32Array(5000).fill(3).buffer));
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    const stats = (await request(t.app).get(`/api/v1/traces/${trace.id}/stats`).set(auth)).body.statistics;
    expect(stats.count).toBe(5002);
    expect(await t.db.models.TraceChunk.count({ where: { traceId: trace.id } })).toBe(3);
  });
});
