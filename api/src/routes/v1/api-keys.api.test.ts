import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest';
import { makeTestApp, type TestApp } from '../../testing/make-test-app.js';

/** Runs `request` with the clock moved `ms` ahead (Date only; timers run as usual). */
async function later<T>(ms: number, send: () => PromiseLike<T>): Promise<T> {
  vi.useFakeTimers({ toFake: ['Date'] });
  try {
    vi.setSystemTime(Date.now() + ms);
    return await send();
  } finally {
    vi.useRealTimers();
  }
}

describe('/api/v1/api-keys', () => {
  let t: TestApp;
  let admin: Record<string, string>;
  const bearer = (secret: string) => ({ Authorization: `Bearer ${secret}` });
  const createKey = async (body: Record<string, unknown>) => {
    const res = await request(t.app).post('/api/v1/api-keys').set(admin).send(body);
    expect(res.status).toBe(201);
    return res.body as { apiKey: { id: string; status: string }; secret: string };
  };

  beforeAll(async () => {
    t = await makeTestApp();
    admin = await t.auth('admin');
  });
  afterAll(() => t.close());

  it('when a key is created, then its secret is shown once, works, and is stored only as a hash', async () => {
    const { apiKey, secret } = await createKey({ name: 'Panel logger', scopes: ['ingest', 'read'] });
    expect(secret).toMatch(/^hrk_[0-9a-f]{16}_[A-Za-z0-9_-]{43}$/);
    expect(secret.startsWith(`hrk_${apiKey.id}_`)).toBe(true);
    expect(apiKey).toMatchObject({ name: 'Panel logger', scopes: ['ingest', 'read'], status: 'active', prefix: `hrk_${apiKey.id}_` });
    const me = await request(t.app).get('/api/v1/me').set(bearer(secret));
    expect(me.status).toBe(200);
    expect(me.body).toMatchObject({ user: null, apiKey: { id: apiKey.id, name: 'Panel logger' }, organisation: { id: t.organisationId } });

    // Neither the list nor a single read shows the secret again.
    const list = await request(t.app).get('/api/v1/api-keys').set(admin);
    expect(JSON.stringify(list.body)).not.toContain(secret.slice(-43));
    const one = await request(t.app).get(`/api/v1/api-keys/${apiKey.id}`).set(admin);
    expect(one.body.createdBy).toMatchObject({ email: expect.stringMatching(/^admin-/) });
    expect(JSON.stringify(one.body)).not.toContain(secret.slice(-43));

    // Read the table itself: no column holds the secret or the full key.
    const [rows] = await t.db.sequelize.query('SELECT * FROM api_keys WHERE id = ?', { replacements: [apiKey.id] });
    const stored = JSON.stringify(rows);
    expect(stored).not.toContain(secret);
    expect(stored).not.toContain(secret.slice(-43));
    expect((rows as Array<{ secretHash: string }>)[0]!.secretHash).toMatch(/^[0-9a-f]{64}$/);
  });

  it('when a key is revoked, then the next request with it is refused', async () => {
    const { apiKey, secret } = await createKey({ name: 'To revoke', scopes: ['read'] });
    expect((await request(t.app).get('/api/v1/sites').set(bearer(secret))).status).toBe(200);
    expect((await request(t.app).delete(`/api/v1/api-keys/${apiKey.id}`).set(admin)).status).toBe(204);
    const refused = await request(t.app).get('/api/v1/sites').set(bearer(secret));
    expect(refused.status).toBe(401);
    expect(refused.body).toMatchObject({ type: '/problems/unauthenticated', detail: expect.stringMatching(/revoked/) });
    expect((await request(t.app).get(`/api/v1/api-keys/${apiKey.id}`).set(admin)).body).toMatchObject({ status: 'revoked', revokedAt: expect.any(String) });
    // Revoked keys cannot be rotated back to life.
    expect((await request(t.app).post(`/api/v1/api-keys/${apiKey.id}/rotate`).set(admin)).status).toBe(409);
  });

  it('when a key has expired, then it is refused', async () => {
    const { secret } = await createKey({ name: 'Short-lived', scopes: ['read'], expiresAt: new Date(Date.now() + 3600_000).toISOString() });
    expect((await request(t.app).get('/api/v1/sites').set(bearer(secret))).status).toBe(200);
    // Two hours later (the clock only: a key verified a moment ago must not be trusted past its expiry).
    const refused = await later(2 * 3600_000, () => request(t.app).get('/api/v1/sites').set(bearer(secret)));
    expect(refused.status).toBe(401);
    expect(refused.body.detail).toMatch(/expired/);
  });

  it('when another server process revokes a key, then this one refuses it within five seconds', async () => {
    const { apiKey, secret } = await createKey({ name: 'Revoked elsewhere', scopes: ['read'] });
    expect((await request(t.app).get('/api/v1/sites').set(bearer(secret))).status).toBe(200);
    // Written straight to the database, as a second server on the same PostgreSQL database would.
    await t.db.models.ApiKey.update({ revokedAt: new Date() }, { where: { id: apiKey.id } });
    const refused = await later(5_001, () => request(t.app).get('/api/v1/sites').set(bearer(secret)));
    expect(refused.status).toBe(401);
    expect(refused.body.detail).toMatch(/revoked/);
  });

  it('when an expiry in the past is asked, then 400 points at it', async () => {
    const res = await request(t.app).post('/api/v1/api-keys').set(admin).send({ name: 'Past', scopes: ['read'], expiresAt: '2001-01-01T00:00:00Z' });
    expect(res.status).toBe(400);
    expect(res.body.errors).toEqual([expect.objectContaining({ pointer: '/expiresAt' })]);
    const noScopes = await request(t.app).post('/api/v1/api-keys').set(admin).send({ name: 'None', scopes: [] });
    expect(noScopes.status).toBe(400);
    const badScope = await request(t.app).post('/api/v1/api-keys').set(admin).send({ name: 'Bad', scopes: ['admin'] });
    expect(badScope.body.errors[0].pointer).toBe('/scopes/0');
  });

  it('when keys are malformed or the secret is wrong, then they are refused', async () => {
    const { secret } = await createKey({ name: 'Genuine', scopes: ['read'] });
    const wrongSecret = secret.slice(0, -4) + (secret.endsWith('AAAA') ? 'BBBB' : 'AAAA');
    const cases = [
      'hrk_', // prefix only
      'hrk_0123456789abcdef', // no secret
      secret.slice(0, -1), // truncated
      secret + 'x', // too long
      secret.replace(/^hrk_/, 'hrk-'), // wrong separator
      `hrk_ffffffffffffffff_${secret.slice(-43)}`, // unknown key id with a real secret
      wrongSecret, // right id, wrong secret
    ];
    for (const token of cases) {
      const res = await request(t.app).get('/api/v1/sites').set(bearer(token));
      expect(res.status, token).toBe(401);
      expect(res.body.type).toBe('/problems/unauthenticated');
    }
    expect((await request(t.app).get('/api/v1/sites').set(bearer(secret))).status).toBe(200);
  });

  it('when a key is rotated, then the old secret stops working and the new one works', async () => {
    const { apiKey, secret } = await createKey({ name: 'Rotating', scopes: ['ingest'] });
    const rotated = await request(t.app).post(`/api/v1/api-keys/${apiKey.id}/rotate`).set(admin);
    expect(rotated.status).toBe(200);
    expect(rotated.body.apiKey).toMatchObject({ id: apiKey.id, name: 'Rotating', scopes: ['ingest'], rotatedAt: expect.any(String) });
    expect(rotated.body.secret).not.toBe(secret);
    expect((await request(t.app).get('/api/v1/me').set(bearer(secret))).status).toBe(401);
    expect((await request(t.app).get('/api/v1/me').set(bearer(rotated.body.secret))).status).toBe(200);
    const actions = (await request(t.app).get('/api/v1/audit-events').set(admin)).body.items.map((e: { action: string }) => e.action);
    expect(actions).toEqual(expect.arrayContaining(['api-key.created', 'api-key.rotated', 'api-key.revoked']));
  });

  it('when a key is used from a new address, then the audit log says so once, and last use is recorded', async () => {
    const { apiKey, secret } = await createKey({ name: 'Roaming', scopes: ['read'] });
    for (let i = 0; i < 3; i++) await request(t.app).get('/api/v1/me').set(bearer(secret)).expect(200);
    const events = (await request(t.app).get('/api/v1/audit-events').query({ action: 'api-key.used-from-new-address' }).set(admin)).body.items;
    const mine = events.filter((e: { target: { id: string } }) => e.target.id === apiKey.id);
    expect(mine).toHaveLength(1);
    expect(mine[0].address).toMatch(/127\.0\.0\.1|::1/);
    // A second address is news again.
    await t.app.locals.services.apiKeys.verify(secret, '203.0.113.9');
    const after = (await request(t.app).get('/api/v1/audit-events').query({ action: 'api-key.used-from-new-address' }).set(admin)).body.items;
    expect(after.filter((e: { target: { id: string } }) => e.target.id === apiKey.id).map((e: { address: string }) => e.address)).toContain('203.0.113.9');
    const key = (await request(t.app).get(`/api/v1/api-keys/${apiKey.id}`).set(admin)).body;
    expect(key.lastUsedAt).not.toBeNull();
    expect(key.lastUsedFrom).toBe('203.0.113.9');
  });

  it('when the audit log is paged, then it walks newest first without repeats', async () => {
    const seen: string[] = [];
    const times: string[] = [];
    let cursor: string | null = null;
    do {
      const res: request.Response = await request(t.app)
        .get('/api/v1/audit-events')
        .query({ limit: 3, ...(cursor ? { cursor } : {}) })
        .set(admin);
      expect(res.status).toBe(200);
      seen.push(...res.body.items.map((e: { id: string }) => e.id));
      times.push(...res.body.items.map((e: { createdAt: string }) => e.createdAt));
      cursor = res.body.nextCursor;
    } while (cursor);
    expect(new Set(seen).size).toBe(seen.length);
    expect(seen.length).toBe(await t.db.models.AuditEvent.count({ where: { organisationId: t.organisationId } }));
    expect([...times].sort().reverse()).toEqual(times);
  });
});

describe('per-key rate limit', () => {
  let t: TestApp;
  beforeAll(async () => {
    t = await makeTestApp({ config: { rateLimits: { perCallerPerMinute: 3, perIpPerMinute: 1000, signInFailuresPer15Min: 10, passwordResetsPerHour: 5 } } });
  });
  afterAll(() => t.close());

  it('when one key goes over its limit, then it gets 429 with Retry-After while another key still works', async () => {
    const busy = await t.auth({ keyScopes: ['read'] });
    const other = await t.auth({ keyScopes: ['ingest', 'read'] });
    for (let i = 0; i < 3; i++) expect((await request(t.app).get('/api/v1/sites').set(busy)).status).toBe(200);
    const res = await request(t.app).get('/api/v1/sites').set(busy);
    expect(res.status).toBe(429);
    expect(res.body.type).toBe('/problems/rate-limited');
    expect(Number(res.headers['retry-after'])).toBeGreaterThan(0);
    expect(Number(res.headers['retry-after'])).toBeLessThanOrEqual(60);
    expect((await request(t.app).get('/api/v1/sites').set(other)).status).toBe(200);
  });
});

describe('per-address rate limit', () => {
  let t: TestApp;
  beforeAll(async () => {
    t = await makeTestApp({ config: { rateLimits: { perCallerPerMinute: 1000, perIpPerMinute: 2, signInFailuresPer15Min: 10, passwordResetsPerHour: 5 } } });
  });
  afterAll(() => t.close());

  it('when an address sends too many requests, then 429 even without credentials', async () => {
    await request(t.app).get('/api/v1/sites');
    await request(t.app).get('/api/v1/sites');
    const res = await request(t.app).get('/api/v1/sites');
    expect(res.status).toBe(429);
    expect(res.headers['retry-after']).toBeDefined();
  });
});
