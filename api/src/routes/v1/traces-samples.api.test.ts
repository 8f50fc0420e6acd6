import { randomUUID } from 'node:crypto';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { mintCredentials } from '../../testing/credentials.js';
import { makeTestApp, type TestApp } from '../../testing/make-test-app.js';

const T0 = 1_700_000_000_000; // 2023-11-14T22:13:20Z

describe('POST /api/v1/traces/{id}/samples', () => {
  let t: TestApp;
  let auth: Record<string, string>;
  beforeAll(async () => {
    t = await makeTestApp({ config: { sampleBodyLimit: '64kb' } });
    auth = await t.auth();
  });
  afterAll(() => t.close());

  async function newTrace(extra: Record<string, unknown> = {}): Promise<string> {
    const res = await request(t.app).post('/api/v1/traces').set(auth).send({ name: 'Samples', kind: 'rms', ...extra });
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    return res.body.id as string;
  }

  function post(id: string, type: string, body: string | Buffer, query = '') {
    return request(t.app).post(`/api/v1/traces/${id}/samples${query}`).set(auth).set('Content-Type', type).send(body);
  }

  async function exported(id: string, format: 'csv' | 'json' = 'json') {
    const res = await request(t.app).get(`/api/v1/traces/${id}/samples?format=${format}`).set(auth).buffer(true).parse((r, cb) => {
      let text = '';
      r.on('data', (c: Buffer) => (text += c.toString()));
      r.on('end', () => cb(null, text));
    });
    expect(res.status).toBe(200);
    return res.body as string;
  }

  async function storedCount(id: string) {
    const res = await request(t.app).get(`/api/v1/traces/${id}`).set(auth);
    const chunks = await t.db.models.TraceChunk.count({ where: { traceId: id } });
    return { samples: res.body.sampleCount as number, chunks };
  }

  describe('round trips: what goes in comes out bit for bit', () => {
    it('when JSON t/a with microsecond timestamps and float32 values is sent, then the export returns them exactly', async () => {
      const id = await newTrace();
      const t = Array.from({ length: 1500 }, (_, i) => T0 + i * 33.333 + (i % 7) * 0.001);
      const a = t.map((_, i) => Math.fround(Math.sin(i) * 1e3 + 1e-3 * i));
      const res = await post(id, 'application/json', JSON.stringify({ t, a }));
      expect(res.status, JSON.stringify(res.body)).toBe(200);
      expect(res.body).toMatchObject({ accepted: 1500, firstTime: t[0], lastTime: t[1499], timeFormat: 'epoch-ms' });
      const back = JSON.parse(await exported(id, 'json'));
      expect(back.t).toEqual(t.map((x) => Math.round(x * 1000) / 1000));
      expect(Float32Array.from(back.a)).toEqual(Float32Array.from(a));
      const csv = (await exported(id, 'csv')).trim().split('\n');
      expect(csv[0]).toBe('time_ms,reading_A');
      expect(csv.slice(1).map((l) => Number(l.split(',')[0]))).toEqual(back.t);
      expect(Float32Array.from(csv.slice(1).map((l) => Number(l.split(',')[1])))).toEqual(Float32Array.from(a));
    });

    it('when an export is sent back into a new trace, then the second export is identical', async () => {
      const id = await newTrace();
      await post(id, 'application/x-ndjson', Array.from({ length: 500 }, (_, i) => JSON.stringify({ t: T0 + i * 1000, a: Math.fround(i / 3) })).join('\n'));
      const csv = await exported(id, 'csv');
      const copy = await newTrace();
      const res = await post(copy, 'text/csv', csv);
      expect(res.status, JSON.stringify(res.body)).toBe(200);
      expect(res.body.csv).toEqual({ columns: { time: 'time_ms', date: null, value: 'reading_A' }, delimiter: ',', decimal: '.', unit: 'A' });
      expect(await exported(copy, 'csv')).toBe(csv);
    });

    it('when float32 binary is streamed at a rate, then every bit and implicit time comes back, and the next batch continues the run', async () => {
      const id = await newTrace({ kind: 'waveform', sampleRateHz: 10_000 });
      const values = Float32Array.from({ length: 10_000 }, (_, i) => Math.fround(Math.sin(i / 10) * 17.3));
      const first = Buffer.from(values.buffer, 0, 6000 * 4);
      const rest = Buffer.from(values.buffer, 6000 * 4);
      expect((await post(id, 'application/octet-stream', first, `?start=${T0}`)).status).toBe(200);
      const second = await request(t.app).post(`/api/v1/traces/${id}/samples`).set(auth).set('Content-Type', 'application/octet-stream').set('Sample-Rate', '10000').send(rest);
      expect(second.status, JSON.stringify(second.body)).toBe(200);
      expect(second.body).toMatchObject({ accepted: 4000, firstTime: T0 + 600, sampleCount: 10_000 });
      const back = JSON.parse(await exported(id, 'json'));
      expect(Float32Array.from(back.a)).toEqual(values);
      back.t.forEach((ms: number, i: number) => expect(ms).toBeCloseTo(T0 + i / 10, 6));
      const rows = await t.db.models.TraceChunk.findAll({ where: { traceId: id }, order: [['seq', 'ASC']] });
      expect(rows.map((r) => [r.encoding, r.count])).toEqual([['uniform', 4096], ['uniform', 1904], ['uniform', 4000]]);
    });

    it('when float64 binary or start/rate/values JSON is sent, then the values are stored as float32', async () => {
      const id = await newTrace({ sampleRateHz: 2, startTime: new Date(T0).toISOString() });
      const f64 = Float64Array.of(0.1, 0.2, 0.3);
      expect((await post(id, 'application/octet-stream', Buffer.from(f64.buffer), '?valueType=float64')).status).toBe(200);
      const res = await post(id, 'application/json', JSON.stringify({ values: [0.4, 0.5] }));
      expect(res.body).toMatchObject({ firstTime: T0 + 1500, lastTime: T0 + 2000, sampleCount: 5 });
      const back = JSON.parse(await exported(id, 'json'));
      expect(back).toEqual({ t: [T0, T0 + 500, T0 + 1000, T0 + 1500, T0 + 2000], a: [0.1, 0.2, 0.3, 0.4, 0.5].map((x) => Number(Math.fround(x).toPrecision(7))) });
    });

    it('when a CSV uses semicolons, a decimal comma, local date-times and a unit in its header, then it is read as such', async () => {
      const id = await newTrace();
      const csv = 'Datum;Zeit;Strom (mA)\r\n16.12.2006;17:24:00;1250,5\r\n16.12.2006;17:25:00;?\r\n16.12.2006;17:26:00;980,25\r\n';
      const res = await post(id, 'text/csv', csv, '?dateColumn=Datum&timeColumn=Zeit&utcOffset=%2B01:00&missing=?');
      expect(res.status, JSON.stringify(res.body)).toBe(200);
      expect(res.body).toMatchObject({ accepted: 2, skipped: 1, timeFormat: 'd/m/y', csv: { delimiter: ';', decimal: ',', unit: 'mA' } });
      // The probe reads amperes: 1250.5 mA is stored as 1.2505 A. 17:24 at +01:00 is 16:24 UTC.
      const back = JSON.parse(await exported(id, 'json'));
      expect(back.t).toEqual([Date.UTC(2006, 11, 16, 16, 24), Date.UTC(2006, 11, 16, 16, 26)]);
      expect(back.a).toEqual([Number(Math.fround(1.2505).toPrecision(7)), Number(Math.fround(0.98025).toPrecision(7))]);
    });

    it('when readings at a rate follow samples at explicit times, then they start one period after the last one', async () => {
      const id = await newTrace();
      await post(id, 'application/json', JSON.stringify({ t: [T0, T0 + 100], a: [1, 2] }));
      const res = await post(id, 'application/json', JSON.stringify({ rate: 20, values: [3, 4] }));
      expect(res.body).toMatchObject({ firstTime: T0 + 150, lastTime: T0 + 200, sampleCount: 4 });
      const none = await post(await newTrace(), 'application/json', JSON.stringify({ rate: 20, values: [3, 4] }));
      expect(none.status).toBe(400);
      expect(none.body.errors[0].pointer).toBe('/start');
    });

    it('when a JSON batch gives seconds from the trace start, then they are placed after its startTime', async () => {
      const id = await newTrace({ startTime: T0 });
      const res = await post(id, 'application/json', JSON.stringify({ t: [0, 0.5, 1.25], a: [1, 2, 3] }));
      expect(res.body).toMatchObject({ firstTime: T0, lastTime: T0 + 1250, timeFormat: 'seconds' });
    });
  });

  describe('bad input: a problem that says where, and nothing stored', () => {
    let id: string;
    let before: { samples: number; chunks: number };
    beforeAll(async () => {
      id = await newTrace({ kind: 'rms' });
      expect((await post(id, 'application/json', JSON.stringify({ t: [T0, T0 + 1000], a: [1, 2] }))).status).toBe(200);
      before = await storedCount(id);
    });

    const cases: Array<[string, string, string | Buffer, string, number, string, Record<string, unknown>?]> = [
      ['malformed JSON', 'application/json', '{"t": [1700000010000,\n 1700000011000], "a": [1 2]}', '', 400, '/problems/malformed-body', { line: 2, column: 26 }],
      ['NaN in JSON', 'application/json', '{"t": [1700000010000], "a": [NaN]}', '', 400, '/problems/malformed-body', { line: 1, column: 30 }],
      ['Infinity from a huge JSON number', 'application/json', '{"t": [1700000010000], "a": [1e999]}', '', 400, '/problems/validation', { pointer: '/a/0' }],
      ['null among the values', 'application/json', '{"t": [1700000010000, 1700000011000], "a": [1, null]}', '', 400, '/problems/validation', { pointer: '/a/1' }],
      ['length mismatch of t and a', 'application/json', '{"t": [1700000010000, 1700000011000], "a": [1]}', '', 400, '/problems/validation', { pointer: '/t' }],
      ['timestamps not increasing', 'application/json', '{"t": [1700000012000, 1700000011000], "a": [1, 2]}', '', 400, '/problems/validation', { pointer: '/t/1' }],
      ['mixed timestamp formats', 'application/json', '{"t": [1700000010000, "2023-11-14T22:13:40Z"], "a": [1, 2]}', '', 400, '/problems/validation', { pointer: '/t/1' }],
      ['unknown member', 'application/json', '{"t": [1700000010000], "a": [1], "unit": "A"}', '', 400, '/problems/validation', { pointer: '/unit' }],
      ['malformed NDJSON line', 'application/x-ndjson', '{"t": 1700000010000, "a": 1}\n{"t": 1700000011000, "a": }\n', '', 400, '/problems/malformed-body', { line: 2 }],
      ['NDJSON timestamps not increasing', 'application/x-ndjson', '{"t": 1700000010000, "a": 1}\n{"t": 1700000010000, "a": 2}\n', '', 400, '/problems/validation', { line: 2 }],
      ['a word in a CSV reading', 'text/csv', 'time,current\n1700000010000,1.5\n1700000011000,abc\n', '', 400, '/problems/validation', { line: 3, column: 15 }],
      ['NaN in a CSV reading', 'text/csv', 'time,current\n1700000010000,NaN\n', '', 400, '/problems/validation', { line: 2 }],
      ['an empty CSV reading', 'text/csv', 'time,current\n1700000010000,\n', '', 400, '/problems/validation', { line: 2 }],
      ['CSV rows out of order', 'text/csv', 'time,current\n1700000011000,1\n1700000010500,2\n', '', 400, '/problems/validation', { line: 3 }],
      ['CSV mixed timestamp formats', 'text/csv', 'time,current\n1700000010000,1\n2023-11-14T22:13:40Z,2\n', '', 400, '/problems/validation', { line: 3 }],
      ['a CSV column that does not exist', 'text/csv', 'time,current\n1700000010000,1\n', '?valueColumn=amps', 400, '/problems/validation', { parameter: 'valueColumn' }],
      ['binary NaN', 'application/octet-stream', Buffer.from(Float32Array.of(1, Number.NaN).buffer), `?start=${T0 + 10_000}&rate=1`, 400, '/problems/validation', { pointer: '/1' }],
      ['binary length not a multiple of 4', 'application/octet-stream', Buffer.alloc(10), `?start=${T0 + 10_000}&rate=1`, 400, '/problems/validation', {}],
      ['binary without a rate', 'application/octet-stream', Buffer.alloc(8), `?start=${T0 + 10_000}`, 400, '/problems/validation', { parameter: 'rate' }],
      // Times past what whole microseconds hold exactly (2^53 − 1 µs after 1970: 2255-06-05; ECMA-262 Number.MAX_SAFE_INTEGER).
      ['epoch-ms times past 2255', 'application/json', '{"t": [1700000010000, 1e17], "a": [1, 2]}', '', 400, '/problems/validation', { pointer: '/t/1' }],
      ['an ISO 8601 time past 2255', 'application/json', '{"t": ["2300-01-01T00:00:00Z"], "a": [1]}', '', 400, '/problems/validation', { pointer: '/t/0' }],
      ['a JSON start past 2255', 'application/json', '{"start": 1e300, "rate": 1, "values": [1, 2]}', '', 400, '/problems/validation', { pointer: '/start' }],
      ['a CSV time past 2255', 'text/csv', 'time,current\n1700000010000,1\n1e17,2\n', '', 400, '/problems/validation', { line: 3 }],
      ['an NDJSON time past 2255', 'application/x-ndjson', '{"t": 1700000010000, "a": 1}\n{"t": 1e17, "a": 2}\n', '', 400, '/problems/validation', { line: 2 }],
      ['a start parameter past 2255', 'application/octet-stream', Buffer.alloc(8), '?start=1e17&rate=1', 400, '/problems/validation', { parameter: 'start' }],
      ['a rate so low the second reading falls past any date', 'application/octet-stream', Buffer.alloc(8), `?start=${T0 + 10_000}&rate=8e-323`, 400, '/problems/validation', { pointer: '' }],
      ['a JSON rate so low the readings run past 2255', 'application/json', `{"start": ${T0 + 10_000}, "rate": 1e-300, "values": [1, 2]}`, '', 400, '/problems/validation', { pointer: '' }],
      ['an unsupported content type', 'text/plain', '1,2,3', '', 415, '/problems/unsupported-media-type'],
      ['a body over the limit', 'application/octet-stream', Buffer.alloc(80 * 1024), `?start=${T0 + 10_000}&rate=1`, 413, '/problems/too-large'],
      ['a batch overlapping stored samples', 'application/json', '{"t": [1700000000500, 1700000003000], "a": [1, 2]}', '', 409, '/problems/conflict'],
    ];

    it.each(cases)('when the body has %s, then the answer is a problem and nothing is stored', async (_what, type, body, query, status, problemType, locator) => {
      const res = await post(id, type, body, query);
      expect(res.status, JSON.stringify(res.body)).toBe(status);
      expect(res.headers['content-type']).toMatch(/application\/problem\+json/);
      expect(res.body.type).toBe(problemType);
      if (locator && Object.keys(locator).length > 0) expect(res.body.errors?.[0]).toMatchObject(locator);
      expect(await storedCount(id)).toEqual(before);
    });

    it('when a batch overlaps, then the problem names the overlapping time range', async () => {
      const res = await post(id, 'application/json', JSON.stringify({ t: [T0 + 500, T0 + 3000], a: [1, 2] }));
      expect(res.body.overlap).toEqual({ fromMs: T0 + 500, toMs: T0 + 1000 });
      expect(res.body.detail).toMatch(/2023-11-14T22:13:20.500Z to 2023-11-14T22:13:21.000Z/);
    });

    it('when the trace does not exist, then 404', async () => {
      const res = await post('no-such-trace', 'application/json', JSON.stringify({ t: [T0], a: [1] }));
      expect(res.status).toBe(404);
      expect(res.body.type).toBe('/problems/not-found');
    });

    it('when a large binary batch fails after pending chunks were written, then they are removed', async () => {
      const big = await newTrace({ sampleRateHz: 1000 });
      // 12,000 samples (three flush groups in tests? no: one 4 MB group holds them) with a NaN at the end.
      const values = new Float32Array(16_000).fill(1);
      values[15_999] = Number.NaN;
      const res = await post(big, 'application/octet-stream', Buffer.from(values.buffer), `?start=${T0}`);
      expect(res.status).toBe(400);
      expect(res.body.errors[0]).toMatchObject({ pointer: '/15999' });
      expect(await storedCount(big)).toEqual({ samples: 0, chunks: 0 });
    });

    it('when samples go to a closed trace, then 409', async () => {
      const closed = await newTrace();
      await post(closed, 'application/json', JSON.stringify({ t: [T0, T0 + 1000, T0 + 2000], a: [0, 5, 0] }));
      expect((await request(t.app).post(`/api/v1/traces/${closed}/close`).set(auth)).status).toBe(200);
      const res = await post(closed, 'application/json', JSON.stringify({ t: [T0 + 3000], a: [1] }));
      expect(res.status).toBe(409);
      expect(res.body.detail).toMatch(/closed/);
      expect((await storedCount(closed)).samples).toBe(3);
    });
  });

  // The service keeps each trace as its last batch left it, so the next batch need not read the row
  // (services/traces-ingest.ts, recentTraces). These check that nothing it keeps outlives a change.
  describe('a trace kept between batches never outlives a change to it', () => {
    const batch = (from: number) => JSON.stringify({ t: [T0 + from, T0 + from + 1000], a: [1, 2] });

    /** A new trace that has taken one batch (two samples), so the service keeps it. */
    async function traceAfterOneBatch(): Promise<string> {
      const id = await newTrace();
      expect((await post(id, 'application/json', batch(0))).status).toBe(200);
      return id;
    }

    it('when the trace is closed after a batch, then the next batch gets the closed-trace answer', async () => {
      const id = await traceAfterOneBatch();
      expect((await request(t.app).post(`/api/v1/traces/${id}/close`).set(auth)).status).toBe(200);
      const res = await post(id, 'application/json', batch(5000));
      expect(res.status).toBe(409);
      expect(res.body.detail).toMatch(/is closed: it takes no more samples/);
    });

    it('when the trace is deleted after a batch, then the next batch gets 404', async () => {
      const id = await traceAfterOneBatch();
      expect((await request(t.app).delete(`/api/v1/traces/${id}`).set(auth)).status).toBe(204);
      expect((await post(id, 'application/json', batch(5000))).status).toBe(404);
    });

    it('when the start time is changed after a batch, then seconds from the start are read from the new one', async () => {
      const id = await traceAfterOneBatch();
      const startTime = T0 + 60_000;
      expect((await request(t.app).patch(`/api/v1/traces/${id}`).set(auth).send({ startTime })).status).toBe(200);
      const res = await post(id, 'application/json', JSON.stringify({ t: [0.5, 1.5], a: [3, 4] }));
      expect(res.status, JSON.stringify(res.body)).toBe(200);
      expect(res.body).toMatchObject({ timeFormat: 'seconds', firstTime: startTime + 500, lastTime: startTime + 1500, sampleCount: 4 });
    });

    it('when the row is changed behind the service, then the next batch is refused with nothing stored and the one after reads the row', async () => {
      const id = await traceAfterOneBatch();
      await t.db.models.Trace.update({ status: 'closed' }, { where: { id } });
      const refused = await post(id, 'application/json', batch(5000));
      expect(refused.status).toBe(409);
      expect(refused.body.detail).toMatch(/closed, deleted or changed by another batch/);
      expect((await storedCount(id)).samples).toBe(2);
      const next = await post(id, 'application/json', batch(9000));
      expect(next.status).toBe(409);
      expect(next.body.detail).toMatch(/is closed: it takes no more samples/);
    });

    it('when another organisation posts to a trace kept from a batch, then 404 and nothing stored', async () => {
      const id = await traceAfterOneBatch();
      const other = randomUUID();
      await t.db.models.Organisation.create({ id: other, name: 'Another contractor' });
      const outsider = await mintCredentials(t.app.locals.services, other, 'engineer');
      const res = await request(t.app).post(`/api/v1/traces/${id}/samples`).set(outsider).set('Content-Type', 'application/json').send(batch(5000));
      expect(res.status).toBe(404);
      expect((await storedCount(id)).samples).toBe(2);
    });
  });

  describe('Idempotency-Key', () => {
    it('when a batch is retried with the same key, then the first answer comes back and nothing is stored twice', async () => {
      const id = await newTrace();
      const body = JSON.stringify({ t: [T0, T0 + 1000], a: [3, 4] });
      const first = await post(id, 'application/json', body).set('Idempotency-Key', 'batch-1');
      const again = await post(id, 'application/json', body).set('Idempotency-Key', 'batch-1');
      expect(again.status).toBe(200);
      expect(again.body).toEqual(first.body);
      expect(again.headers['idempotent-replayed']).toBe('true');
      expect(first.headers['idempotent-replayed']).toBeUndefined();
      expect((await storedCount(id)).samples).toBe(2);
      const reused = await post(id, 'application/json', JSON.stringify({ t: [T0 + 5000], a: [1] })).set('Idempotency-Key', 'batch-1');
      expect(reused.status).toBe(409);
      expect(reused.body.detail).toMatch(/different request/);
      expect((await storedCount(id)).samples).toBe(2);
    });

    it('when one key comes at once with batches for two traces, then one is stored and the other is refused as a different request, storing nothing', async () => {
      // The two race to record the key; the loser's transaction is rolled back and it gets the refusal a
      // reused key gets, not an error.
      const [one, two] = [await newTrace(), await newTrace()];
      const body = JSON.stringify({ t: [T0, T0 + 1000], a: [3, 4] });
      const answers = await Promise.all([one, two].map((id) => post(id, 'application/json', body).set('Idempotency-Key', 'shared-key')));
      expect(answers.map((r) => r.status).sort()).toEqual([200, 409]);
      expect(answers.find((r) => r.status === 409)!.body.detail).toMatch(/different request/);
      const stored = [(await storedCount(one)).samples, (await storedCount(two)).samples];
      expect(stored.sort()).toEqual([0, 2]);
    });

    it('when a failed batch is retried with its key, then it is tried again (failures are not remembered)', async () => {
      const id = await newTrace();
      expect((await post(id, 'application/json', '{"t": [1700000000000], "a": [NaN]}').set('Idempotency-Key', 'retry-me')).status).toBe(400);
      const fixed = await post(id, 'application/json', '{"t": [1700000000000], "a": [1]}').set('Idempotency-Key', 'retry-me');
      expect(fixed.status).toBe(200);
    });

    it('when a trace creation or a close is retried with its key, then one trace exists and is closed once', async () => {
      const body = { name: 'Once', kind: 'rms' };
      const a = await request(t.app).post('/api/v1/traces').set(auth).set('Idempotency-Key', 'create-1').send(body);
      const b = await request(t.app).post('/api/v1/traces').set(auth).set('Idempotency-Key', 'create-1').send(body);
      expect(b.body.id).toBe(a.body.id);
      expect(await t.db.models.Trace.count({ where: { name: 'Once' } })).toBe(1);
      await post(a.body.id, 'application/json', JSON.stringify({ t: [T0, T0 + 1000], a: [1, 2] }));
      const c1 = await request(t.app).post(`/api/v1/traces/${a.body.id}/close`).set(auth).set('Idempotency-Key', 'close-1');
      const c2 = await request(t.app).post(`/api/v1/traces/${a.body.id}/close`).set(auth).set('Idempotency-Key', 'close-1');
      expect(c1.status).toBe(200);
      expect(c2.status).toBe(200);
      expect(c2.body).toEqual(c1.body);
      expect((await request(t.app).post(`/api/v1/traces/${a.body.id}/close`).set(auth)).status).toBe(409);
    });
  });
});
