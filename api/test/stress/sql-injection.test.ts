/**
 * SQL injection through every query parameter of every GET route (filters, search, sort, cursors,
 * windows; generated from `v1Routes`), through stored text, and through the search wildcards. The
 * answers must be 200 or a 400 naming the parameter, the schema and every row must be intact, and text
 * must come back exactly as it was sent (bound parameters, never spliced SQL).
 */
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { v1Routes } from '../../src/routes/v1/index.js';
import { makeTestApp, type TestApp } from '../../src/testing/make-test-app.js';
import { jsonSchemaOf } from './support/arbitraries.js';
import { fixtureBuilder } from './support/fixtures.js';
import { collectIds, stateDigest, type IdPool } from './support/fuzz-harness.js';

/** Classic payloads for SQLite and PostgreSQL: tautologies, stacked queries, unions, comments, sleeps. */
const PAYLOADS = [
  "' OR '1'='1",
  "' OR 1=1 --",
  '" OR ""="',
  "'; DROP TABLE sites; --",
  "'); DELETE FROM traces; --",
  "1; UPDATE users SET role='admin' --",
  "x' UNION SELECT id, email, passwordHash, 1, 1, 1, 1, 1 FROM users --",
  "' AND (SELECT COUNT(*) FROM sqlite_master) > 0 --",
  "'; SELECT pg_sleep(3); --",
  '1 OR 1=1',
  'createdAt; DROP TABLE traces',
  '-createdAt, (SELECT 1)',
  'name ASC, CASE WHEN (1=1) THEN 1 ELSE 1/0 END',
  '"name"; --',
  '`name`',
  '\\',
  "\\' OR 1=1 --",
  '%',
  '_',
  '%25%27',
];

describe('SQL injection', () => {
  let t: TestApp;
  let pool: IdPool;
  let headers: Record<string, string>;

  beforeAll(async () => {
    t = await makeTestApp();
    headers = await t.auth('admin');
    await fixtureBuilder(t.app, t.db, async () => headers).ensure();
    pool = await collectIds(t, 'none');
  });
  afterAll(() => t.close());

  const fill = (path: string) =>
    path.replace(/\{(\w+)\}/g, (_m, name: string) => {
      const stem = name.replace(/Id$/, '').toLowerCase();
      const table = [...pool.own.keys()].filter((k) => k.toLowerCase().includes(stem)).sort((a, b) => a.length - b.length)[0];
      return (table && pool.own.get(table)?.[0]) ?? 'missing';
    });

  const targets = v1Routes
    .filter((r) => r.spec.method === 'get' && r.spec.query)
    .flatMap((r) => Object.keys(jsonSchemaOf(r.spec.query)?.properties ?? {}).map((param) => [`GET ${r.spec.path} ?${param}=`, r, param] as const));

  it('when the targets are listed, then filters, search and sort are among them', () => {
    const params = new Set(targets.map(([, , p]) => p));
    for (const p of ['q', 'sort', 'siteId', 'cursor', 'from', 'createdFrom']) expect(params, p).toContain(p);
  });

  it.each(targets)('%s carries injections harmlessly', async (_name, route, param) => {
    const before = await stateDigest(t);
    for (const payload of PAYLOADS) {
      const res = await request(t.app).get(`/api/v1${fill(route.spec.path)}`).query({ [param]: payload }).set(headers);
      const context = `${param}=${payload}: ${res.status} ${res.text.slice(0, 300)}`;
      expect([200, 400, 404], context).toContain(res.status);
      if (res.status === 400) expect(res.body.errors?.some((e: { parameter?: string }) => e.parameter === param) ?? res.body.type === '/problems/validation', context).toBe(true);
      // The caller's own text may be echoed in a message; anything else from the database may not.
      const answer = res.text.split(JSON.stringify(payload).slice(1, -1)).join('');
      expect(answer, context).not.toMatch(/SQLITE_|syntax error|sqlite_master|pg_catalog|passwordHash|\$2[aby]\$/i);
    }
    expect(await stateDigest(t)).toEqual(before);
  });

  it('when text full of SQL is stored, then it comes back byte for byte and nothing else changes', async () => {
    for (const payload of PAYLOADS) {
      const created = await request(t.app).post('/api/v1/sites').set(headers).send({ name: payload, notes: payload, address: payload });
      expect(created.status, payload).toBe(201);
      const read = await request(t.app).get(`/api/v1/sites/${created.body.id}`).set(headers);
      expect(read.body).toMatchObject({ name: payload.trim() || payload, notes: payload, address: payload });
    }
    const tables = (await t.db.sequelize.getQueryInterface().showAllTables()) as unknown[];
    expect(tables.length).toBeGreaterThanOrEqual(10);
    expect(await t.db.models.User.count({ where: { role: 'admin' } })).toBe(1);
  });

  it('when a search holds % or _, then they match themselves, not any text', async () => {
    const names = ['Pump 100% duty', 'Pump 100 duty', 'Fan_2 start', 'Fan 2 start'];
    for (const name of names) expect((await request(t.app).post('/api/v1/traces').set(headers).send({ name, kind: 'rms' })).status).toBe(201);
    const search = async (q: string) =>
      ((await request(t.app).get('/api/v1/traces').query({ q }).set(headers)).body.items as Array<{ name: string }>).map((x) => x.name).sort();
    expect(await search('100%')).toEqual(['Pump 100% duty']);
    expect(await search('Fan_2')).toEqual(['Fan_2 start']);
    expect(await search('%')).toEqual(['Pump 100% duty']);
  });
});
