import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DEMO_API_KEY, DEMO_API_KEY_TOKEN, DEMO_ORGANISATION, DEMO_USERS, seedDemo } from '../../../seeds/demo.js';
import { makeTestApp, type TestApp } from '../testing/make-test-app.js';

describe('the demo credentials printed at start', () => {
  let t: TestApp;
  beforeAll(async () => {
    t = await makeTestApp();
    await seedDemo(t.db);
  });
  afterAll(() => t.close());

  it('when each demo user signs in, then they get their role in the demo organisation', async () => {
    for (const u of DEMO_USERS) {
      const res = await request(t.app).post('/api/v1/auth/sign-in').send({ email: u.email, password: u.password });
      expect(res.status, u.email).toBe(200);
      expect(res.body).toMatchObject({ user: { role: u.role }, organisation: { id: DEMO_ORGANISATION.id } });
    }
  });

  it('when the demo API key is used, then it reads the demo organisation and stops working once revoked', async () => {
    expect(DEMO_API_KEY_TOKEN).toMatch(/^hrk_[0-9a-f]{16}_[A-Za-z0-9_-]{43}$/);
    const key = { Authorization: `Bearer ${DEMO_API_KEY_TOKEN}` };
    const me = await request(t.app).get('/api/v1/me').set(key);
    expect(me.body).toMatchObject({ apiKey: { id: DEMO_API_KEY.id, scopes: ['ingest', 'read'] }, organisation: { id: DEMO_ORGANISATION.id } });
    expect((await request(t.app).get('/api/v1/sites').set(key)).body.total).toBeGreaterThan(0);
    expect(await t.app.locals.services.apiKeys.isActive(DEMO_API_KEY.id)).toBe(true);
    const admin = (await request(t.app).post('/api/v1/auth/sign-in').send({ email: DEMO_USERS[0]!.email, password: DEMO_USERS[0]!.password })).body.token as string;
    await request(t.app).delete(`/api/v1/api-keys/${DEMO_API_KEY.id}`).set({ Authorization: `Bearer ${admin}` }).expect(204);
    expect(await t.app.locals.services.apiKeys.isActive(DEMO_API_KEY.id)).toBe(false);
    expect((await request(t.app).get('/api/v1/me').set(key)).status).toBe(401);
  });
});
