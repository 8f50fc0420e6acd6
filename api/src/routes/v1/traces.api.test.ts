import { randomUUID } from 'node:crypto';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { CloseResponse, EventsResponse, SeriesResponse, StatsResponse } from './schemas/traces.js';
import { Statistics } from './schemas/statistics.js';
import { makeTestApp, type TestApp } from '../../testing/make-test-app.js';

const T0 = 1_700_000_000_000;

describe('/api/v1/traces', () => {
  let t: TestApp;
  let auth: Record<string, string>;
  beforeAll(async () => {
    t = await makeTestApp();
    auth = await t.auth();
  });
  afterAll(() => t.close());

  const create = (body: Record<string, unknown>) => request(t.app).post('/api/v1/traces').set(auth).send({ kind: 'rms', ...body });
  const append = (id: string, body: unknown) => request(t.app).post(`/api/v1/traces/${id}/samples`).set(auth).send(body as object);

  describe('metadata', () => {
    it('when a trace is created on a circuit, then it takes the circuit\'s site, voltage and frequency', async () => {
      const site = await request(t.app).post('/api/v1/sites').set(auth).send({ name: 'Linden Road bakery' });
      const circuit = await request(t.app)
        .post(`/api/v1/sites/${site.body.id}/circuits`)
        .set(auth)
        .send({ label: 'Oven line', nominalVoltageV: 230, mainsHz: 50, deviceRatingA: 16, deviceKind: 'iec-c' });
      const res = await create({ name: 'Proofer', circuitId: circuit.body.id, probe: { inputUnit: 'mV', sensitivityPerA: 10, loops: 1 }, tags: ['bakery'] });
      expect(res.status, JSON.stringify(res.body)).toBe(201);
      expect(res.body).toMatchObject({ siteId: site.body.id, circuitId: circuit.body.id, nominalVoltageV: 230, mainsHz: 50, status: 'open', sampleCount: 0, summary: null });
      const got = await request(t.app).get(`/api/v1/traces/${res.body.id}`).set(auth);
      expect(got.body).toEqual(res.body);
    });

    it('when fields are invalid, then a 400 problem points at each', async () => {
      const res = await create({ name: '', kind: 'waveform', circuitId: 'nope', colour: 'red' });
      expect(res.status).toBe(400);
      expect(res.body.errors.map((e: { pointer: string }) => e.pointer).sort()).toEqual(['/colour', '/name']);
      const rate = await create({ name: 'Fast', kind: 'waveform', sampleRateHz: 500 });
      expect(rate.body.errors).toEqual([{ detail: 'a waveform trace needs its sample rate, at least 1000 Hz', pointer: '/sampleRateHz' }]);
      const link = await create({ name: 'Lost', circuitId: randomUUID() });
      expect(link.body.errors).toEqual([{ detail: 'no such circuit in your organisation', pointer: '/circuitId' }]);
    });

    it('when traces are listed, then filters, text search, sort and the cursor work together', async () => {
      const names = ['Kettle', 'Blender', 'Freezer', 'Compressor'];
      for (const name of names) await create({ name, notes: name === 'Freezer' ? 'walk-in unit' : null, kind: name === 'Compressor' ? 'waveform' : 'rms', sampleRateHz: name === 'Compressor' ? 2000 : null });
      const waveforms = await request(t.app).get('/api/v1/traces?kind=waveform').set(auth);
      expect(waveforms.body.items.map((x: { name: string }) => x.name)).toEqual(['Compressor']);
      const byNote = await request(t.app).get('/api/v1/traces?q=WALK-in').set(auth);
      expect(byNote.body.items.map((x: { name: string }) => x.name)).toEqual(['Freezer']);
      const seen: string[] = [];
      let cursor: string | null = null;
      do {
        const page: request.Response = await request(t.app).get('/api/v1/traces').set(auth).query({ sort: 'name', limit: 2, ...(cursor ? { cursor } : {}) });
        expect(page.status).toBe(200);
        seen.push(...page.body.items.map((x: { name: string }) => x.name));
        cursor = page.body.nextCursor;
      } while (cursor);
      const sorted = [...seen].sort((a, b) => a.localeCompare(b));
      expect(seen).toEqual(sorted);
      expect(seen).toEqual(expect.arrayContaining(names));
      const newest = await request(t.app).get('/api/v1/traces?limit=1').set(auth);
      expect(newest.body.items[0].name).toBe('Compressor');
      const bad = await request(t.app).get('/api/v1/traces?cursor=bogus').set(auth);
      expect(bad.status).toBe(400);
    });

    it('when a trace is updated and deleted, then the change is stored and the samples go with it', async () => {
      const { body: trace } = await create({ name: 'Old' });
      await append(trace.id, { t: [T0, T0 + 1000], a: [1, 2] });
      const res = await request(t.app).patch(`/api/v1/traces/${trace.id}`).set(auth).send({ name: 'New', probe: { inputUnit: 'A', sensitivityPerA: 1, loops: 10 } });
      expect(res.status).toBe(200);
      // A ×10 loop divides the readings by ten.
      expect(res.body.summary.maxA).toBeCloseTo(0.2, 12);
      expect((await request(t.app).delete(`/api/v1/traces/${trace.id}`).set(auth)).status).toBe(204);
      expect((await request(t.app).get(`/api/v1/traces/${trace.id}`).set(auth)).status).toBe(404);
      expect(await t.db.models.TraceChunk.count({ where: { traceId: trace.id } })).toBe(0);
      expect(await t.db.models.TraceChunkData.count({ where: { traceId: trace.id } })).toBe(0);
    });
  });

  describe('who may do what', () => {
    it('when a viewer or a read key acts, then they read but do not ingest; an ingest key appends but does not delete', async () => {
      const { body: trace } = await create({ name: 'Permissions' });
      const viewer = await t.auth('viewer');
      expect((await request(t.app).get(`/api/v1/traces/${trace.id}`).set(viewer)).status).toBe(200);
      const refused = await request(t.app).post(`/api/v1/traces/${trace.id}/samples`).set(viewer).send({ t: [T0], a: [1] });
      expect(refused.status).toBe(403);
      const readKey = await t.auth({ keyScopes: ['read'] });
      expect((await request(t.app).post('/api/v1/traces').set(readKey).send({ name: 'x', kind: 'rms' })).status).toBe(403);
      const ingestKey = await t.auth({ keyScopes: ['ingest'] });
      expect((await request(t.app).post(`/api/v1/traces/${trace.id}/samples`).set(ingestKey).send({ t: [T0], a: [1] })).status).toBe(200);
      expect((await request(t.app).delete(`/api/v1/traces/${trace.id}`).set(ingestKey)).status).toBe(403);
      expect((await request(t.app).get(`/api/v1/traces/${trace.id}/stats`)).status).toBe(401);
    });

    it('when another organisation\'s trace is asked for, then it is not found', async () => {
      // Models are bound to one database per process, so the other organisation lives in this one.
      const org = await t.db.models.Organisation.create({ id: randomUUID(), name: 'Other' });
      const theirs = await t.db.models.Trace.create({
        id: randomUUID(), organisationId: org.id, siteId: null, circuitId: null, loadId: null, name: 'Theirs', kind: 'rms',
        probe: { inputUnit: 'A', sensitivityPerA: 1, loops: 1 }, nominalVoltageV: null, mainsHz: null, startTime: null, sampleRateHz: null, notes: null,
      });
      for (const path of ['', '/stats', '/series', '/events', '/samples']) {
        expect((await request(t.app).get(`/api/v1/traces/${theirs.id}${path}`).set(auth)).status).toBe(404);
      }
      expect((await append(theirs.id, { t: [T0], a: [1] })).status).toBe(404);
      expect((await request(t.app).post(`/api/v1/traces/${theirs.id}/close`).set(auth)).status).toBe(404);
      expect((await request(t.app).delete(`/api/v1/traces/${theirs.id}`).set(auth)).status).toBe(404);
      expect((await request(t.app).get('/api/v1/traces?q=Theirs').set(auth)).body.total).toBe(0);
      expect(await t.db.models.Trace.count({ where: { id: theirs.id } })).toBe(1);
    });
  });

  describe('queries', () => {
    it('when a window with a gap is charted, then the running total of `count` places each exported sample in a bucket that holds it, `t` is the bucket\'s middle, and the gap is an empty bucket', async () => {
      // common practice, no source: a chart envelope keeps every sample between its bucket's min and max
      // and shows a gap in the recording as a break, never as a line across it.
      const { body: trace } = await create({ name: 'Walk-in cooler' });
      // Synthetic: 12,000 readings 10 ms apart (times with microseconds), 5 s missing after the 6,000th.
      const times = Array.from({ length: 12_000 }, (_, i) => T0 + i * 10 + (i >= 6000 ? 5000 : 0) + (i % 3) * 0.001);
      const amps = times.map((_, i) => Math.fround(6 + 4 * Math.sin(i / 37) + (i % 11) * 0.01));
      expect((await append(trace.id, { t: times, a: amps })).status).toBe(200);
      const from = times[1000] as number;
      const to = times[11_000] as number;
      const series = (await request(t.app).get(`/api/v1/traces/${trace.id}/series?points=40&from=${from}&to=${to}`).set(auth)).body;
      const exported = (await request(t.app).get(`/api/v1/traces/${trace.id}/samples?format=json&from=${from}&to=${to}`).set(auth)).body;
      expect(series.level).toBe('blocks');
      expect(exported.t).toHaveLength(10_001);
      expect(series.count.reduce((a: number, b: number) => a + b, 0)).toBe(10_001);
      expect(series.count.filter((c: number) => c === 0)).toHaveLength(1);
      let i = 0;
      for (let k = 0; k < series.count.length; k++) {
        const c = series.count[k] as number;
        if (c === 0) {
          expect([series.min[k], series.max[k], series.mean[k]]).toEqual([null, null, null]);
          expect([exported.t[i - 1], exported.t[i]]).toEqual([times[5999], times[6000]]);
          expect(series.t[k]).toBeCloseTo((exported.t[i - 1] + exported.t[i]) / 2, 3);
          continue;
        }
        // The export writes each float32 in its shortest decimal; the envelope's min and max are the same float32s.
        const inBucket = exported.a.slice(i, i + c) as number[];
        expect(Math.fround(Math.min(...inBucket))).toBe(series.min[k]);
        expect(Math.fround(Math.max(...inBucket))).toBe(series.max[k]);
        expect(series.t[k]).toBeCloseTo((exported.t[i] + exported.t[i + c - 1]) / 2, 3);
        i += c;
      }
      expect(Object.keys(series).sort()).toEqual(['count', 'fromTime', 'level', 'max', 'mean', 'min', 'points', 'rms', 'sampleCount', 't', 'toTime', 'traceId']);
    });

    it('when an open waveform is read, then its envelope keeps to the points asked and carries the half-cycle RMS series; closing stores its events', async () => {
      const rate = 5000;
      const { body: trace } = await create({ name: 'Motor start', kind: 'waveform', sampleRateHz: rate, mainsHz: 50 });
      // Synthetic: 0.2 s off, then a 50 Hz current of 40 A RMS decaying to 8 A RMS (behaviour check, not a numeric reference).
      const n = 3 * rate;
      const values = Float32Array.from({ length: n }, (_, i) => {
        const s = i / rate;
        if (s < 0.2) return 0;
        const rms = 8 + 32 * Math.exp(-(s - 0.2) / 0.15);
        return Math.SQRT2 * rms * Math.sin(2 * Math.PI * 50 * s);
      });
      const up = await request(t.app).post(`/api/v1/traces/${trace.id}/samples?start=${T0}`).set(auth).set('Content-Type', 'application/octet-stream').send(Buffer.from(values.buffer));
      expect(up.status, JSON.stringify(up.body)).toBe(200);
      for (const points of [1, 7, 300, 20000]) {
        const series = await request(t.app).get(`/api/v1/traces/${trace.id}/series?points=${points}`).set(auth);
        expect(series.status, JSON.stringify(series.body)).toBe(200);
        expect(series.body.t.length).toBeLessThanOrEqual(points);
        expect(series.body.count.reduce((a: number, b: number) => a + b, 0)).toBe(n);
        expect(Math.max(...series.body.max)).toBeCloseTo(Math.max(...values), 5);
      }
      const series = (await request(t.app).get(`/api/v1/traces/${trace.id}/series?points=60`).set(auth)).body;
      expect(series.rms.source).toBe('computed');
      expect(Math.max(...series.rms.max.filter((x: number | null) => x !== null))).toBeGreaterThan(30);
      expect(series.rms.mean.at(-1)).toBeCloseTo(8, 0);
      const window = (await request(t.app).get(`/api/v1/traces/${trace.id}/series?points=50&from=${T0 + 1000}&to=${T0 + 1100}`).set(auth)).body;
      expect(window.sampleCount).toBe(501);
      expect(window.level).toBe('samples');

      const closed = await request(t.app).post(`/api/v1/traces/${trace.id}/close`).set(auth);
      expect(closed.status, JSON.stringify(closed.body)).toBe(200);
      expect(closed.body.analysis.inrushEvents).toHaveLength(1);
      expect(closed.body.analysis.inrushEvents[0].onsetAt).toBeCloseTo(T0 + 200, -1);
      const stored = (await request(t.app).get(`/api/v1/traces/${trace.id}/series?points=60`).set(auth)).body;
      expect(stored.rms.source).toBe('analysis');
      const events = (await request(t.app).get(`/api/v1/traces/${trace.id}/events`).set(auth)).body;
      expect(events).toMatchObject({ source: 'stored', onPeriodCount: 1 });
      const recomputed = (await request(t.app).get(`/api/v1/traces/${trace.id}/events?settleTolerance=0.5`).set(auth)).body;
      expect(recomputed.source).toBe('computed');
      expect(recomputed.params.events.settleTolerance).toBe(0.5);
      expect(recomputed.inrushEvents[0].settleTimeS).toBeLessThan(events.inrushEvents[0].settleTimeS);

      // The answers are what openapi.yaml (and so the SDK's types) say, statistics field for field.
      const stats = (await request(t.app).get(`/api/v1/traces/${trace.id}/stats?from=${T0 + 500}&percentiles=true`).set(auth)).body;
      for (const [schema, body] of [[CloseResponse, closed.body], [EventsResponse, events], [EventsResponse, recomputed], [SeriesResponse, stored], [StatsResponse, stats]] as const) {
        expect(schema.safeParse(body).error).toBeUndefined();
      }
      for (const statistics of [closed.body.analysis.statistics, stats.statistics, closed.body.trace.summary]) {
        expect(Statistics.strict().safeParse(statistics).error).toBeUndefined();
      }
    });

    it('when the window is empty or reversed, then the answer says so', async () => {
      const { body: trace } = await create({ name: 'Window' });
      await append(trace.id, { t: [T0, T0 + 1000], a: [1, 2] });
      const empty = await request(t.app).get(`/api/v1/traces/${trace.id}/stats?from=${T0 + 200}&to=${T0 + 300}`).set(auth);
      expect(empty.body.statistics).toBeNull();
      const reversed = await request(t.app).get(`/api/v1/traces/${trace.id}/stats?from=${T0 + 300}&to=${T0}`).set(auth);
      expect(reversed.status).toBe(400);
      expect(reversed.body.errors[0].parameter).toBe('to');
      const badTime = await request(t.app).get(`/api/v1/traces/${trace.id}/series?from=yesterday`).set(auth);
      expect(badTime.body.errors[0].parameter).toBe('from');
      const exportWindow = await request(t.app).get(`/api/v1/traces/${trace.id}/samples?from=${T0 + 500}`).set(auth);
      expect(exportWindow.text).toBe(`time_ms,reading_A\n${T0 + 1000},2\n`);
    });
  });

  describe('POST /traces/import', () => {
    it('when a CSV file is uploaded with its mapping, then a trace is created and filled in one step', async () => {
      const csv = 'when;amps\n2024-03-01 08:00:00;1,5\n2024-03-01 08:00:01;12,25\n2024-03-01 08:00:02;2\n';
      const res = await request(t.app)
        .post('/api/v1/traces/import')
        .set(auth)
        .field('name', 'Logger export')
        .field('timeColumn', 'when')
        .field('tags', 'logger, march')
        .attach('file', Buffer.from(csv), { filename: 'export.csv', contentType: 'text/csv' });
      expect(res.status, JSON.stringify(res.body)).toBe(201);
      expect(res.body.trace).toMatchObject({ name: 'Logger export', sampleCount: 3, tags: ['logger', 'march'], firstSampleTime: Date.UTC(2024, 2, 1, 8) });
      expect(res.body.import).toMatchObject({ accepted: 3, csv: { delimiter: ';', decimal: ',', columns: { time: 'when', value: 'amps' } } });
      expect(res.body.trace.summary.maxA).toBe(12.25);
    });

    it('when the file has errors, then they are named by line and no trace is kept', async () => {
      const before = await t.db.models.Trace.count();
      const csv = 'time,current\n1700000000000,1\n1700000001000,x\n1700000002000,3\n1700000003000,\n';
      const res = await request(t.app)
        .post('/api/v1/traces/import')
        .set(auth)
        .field('name', 'Broken')
        .attach('file', Buffer.from(csv), { filename: 'broken.csv', contentType: 'text/csv' });
      expect(res.status).toBe(400);
      expect(res.body.errors.map((e: { line: number }) => e.line)).toEqual([3, 5]);
      expect(await t.db.models.Trace.count()).toBe(before);
    });

    it('when the form is not multipart or has no file, then the problem says what to send', async () => {
      expect((await request(t.app).post('/api/v1/traces/import').set(auth).send({ name: 'x' })).status).toBe(415);
      const noFile = await request(t.app).post('/api/v1/traces/import').set(auth).field('name', 'No file');
      expect(noFile.status).toBe(400);
      expect(noFile.body.errors[0].pointer).toBe('/file');
      const badField = await request(t.app).post('/api/v1/traces/import').set(auth).field('kind', 'sawtooth').attach('file', Buffer.from('t,a\n'), 'x.csv');
      expect(badField.status).toBe(400);
      expect(badField.body.errors.map((e: { pointer: string }) => e.pointer).sort()).toEqual(['/kind', '/name']);
    });
  });
});
