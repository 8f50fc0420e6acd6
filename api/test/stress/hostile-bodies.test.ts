/**
 * Regressions found by the fuzzer, pinned down: U+0000 in any part of a request (PostgreSQL cannot
 * store it; on SQLite it cut an inlined literal short and answered 500), JSON nested a hundred
 * thousand levels deep (a path copied per level made the NUL check quadratic: a hang), and an e-mail
 * address the mail server refuses (a local part over 64 characters answered 503 "try again later").
 */
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { makeTestApp, type TestApp } from '../../src/testing/make-test-app.js';
import { fixtureBuilder } from './support/fixtures.js';
import { stateDigest } from './support/fuzz-harness.js';

describe('hostile bodies', () => {
  let t: TestApp;
  let headers: Record<string, string>;
  beforeAll(async () => {
    t = await makeTestApp();
    headers = await t.auth('engineer');
  });
  afterAll(() => t.close());

  it('when U+0000 is in a path, query or body string or key, then 400 names where, and nothing is stored', async () => {
    const before = await stateDigest(t);
    const inPath = await request(t.app).get('/api/v1/sites/a%00b').set(headers);
    expect(inPath.status).toBe(400);
    expect(inPath.body.errors).toEqual([expect.objectContaining({ parameter: 'siteId' })]);
    const inQuery = await request(t.app).get('/api/v1/traces').query({ q: 'pump\u0000' }).set(headers);
    expect(inQuery.status).toBe(400);
    expect(inQuery.body.errors).toEqual([expect.objectContaining({ parameter: 'q' })]);
    const inBody = await request(t.app).post('/api/v1/sites').set(headers).send({ name: 'Hall\u0000', notes: 'ok', address: 'x\u0000y' });
    expect(inBody.status).toBe(400);
    expect(inBody.body.errors.map((e: { pointer: string }) => e.pointer).sort()).toEqual(['/address', '/name']);
    const inKey = await request(t.app).post('/api/v1/sites').set(headers).send({ name: 'Hall', ['no\u0000tes']: 'x' });
    expect(inKey.status).toBe(400);
    expect(await stateDigest(t)).toEqual(before);
  });

  it('when a JSON body nests 100,000 levels deep, then it is refused with 400 within the deadline', async () => {
    const depth = 100_000;
    const body = `{"name":"Deep","notes":${'['.repeat(depth)}${']'.repeat(depth)}}`;
    const res = await request(t.app).post('/api/v1/sites').set(headers).set('Content-Type', 'application/json').send(body).timeout({ response: 10_000 });
    expect(res.status).toBe(400);
    expect(res.body.errors[0].pointer).toBe('/notes');
  });

  it('when a report is e-mailed to an address with a local part over 64 characters, then 400 names the field', async () => {
    const fixtures = fixtureBuilder(t.app, t.db, () => t.auth('engineer'));
    await fixtures.ensure();
    const to = `${'r'.repeat(65)}@example.test`;
    const res = await request(t.app).post(`/api/v1/circuits/${fixtures.ids.circuitId}/report/email`).set(headers).send({ to });
    expect(res.status, res.text).toBe(400);
    expect(res.body.errors[0].pointer).toBe('/to');
    const invite = await request(t.app).post('/api/v1/users').set(await t.auth('admin')).send({ email: to, name: 'Long address', role: 'viewer' });
    expect(invite.status, invite.text).toBe(400);
  });
});
