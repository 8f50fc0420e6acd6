import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { makeTestApp, type TestApp } from '../testing/make-test-app.js';

describe('CORS off by default, and body limits', () => {
  let t: TestApp;
  beforeAll(async () => {
    t = await makeTestApp();
  });
  afterAll(() => t.close());

  it('when a browser from another origin calls, then no CORS header allows it', async () => {
    const res = await request(t.app).get('/api/v1/sites').set(await t.auth()).set('Origin', 'https://elsewhere.example');
    expect(res.status).toBe(200);
    expect(res.headers['access-control-allow-origin']).toBeUndefined();
    const preflight = await request(t.app).options('/api/v1/sites').set('Origin', 'https://elsewhere.example').set('Access-Control-Request-Method', 'POST');
    expect(preflight.headers['access-control-allow-origin']).toBeUndefined();
  });

  it('when an account request body is over 16 kB, then 413 as a problem', async () => {
    const res = await request(t.app).post('/api/v1/auth/sign-in').send({ email: 'a@example.test', password: 'x'.repeat(20_000) });
    expect(res.status).toBe(413);
    expect(res.body.type).toBe('/problems/too-large');
  });

  it('when a password is over 72 bytes, then it is refused rather than cut', async () => {
    const res = await request(t.app).post('/api/v1/auth/password-reset/complete').send({ token: 'x', password: 'é'.repeat(40) });
    expect(res.status).toBe(400);
    expect(res.body.errors).toEqual([expect.objectContaining({ pointer: '/password', detail: expect.stringMatching(/72 bytes/) })]);
  });

  it('when responses are sent, then helmet headers are on', async () => {
    const res = await request(t.app).get('/api/v1/me').set(await t.auth());
    expect(res.headers['x-content-type-options']).toBe('nosniff');
    expect(res.headers['content-security-policy']).toContain("default-src 'self'");
    expect(res.headers['x-powered-by']).toBeUndefined();
  });
});

describe('CORS with an allow-list', () => {
  let t: TestApp;
  const allowed = 'https://dashboard.example.test';
  beforeAll(async () => {
    t = await makeTestApp({ config: { corsOrigins: [allowed] } });
  });
  afterAll(() => t.close());

  it('when a listed origin sends a preflight, then it is allowed with the bearer header', async () => {
    const res = await request(t.app)
      .options('/api/v1/sites')
      .set('Origin', allowed)
      .set('Access-Control-Request-Method', 'POST')
      .set('Access-Control-Request-Headers', 'authorization,content-type');
    expect(res.status).toBe(204);
    expect(res.headers['access-control-allow-origin']).toBe(allowed);
    expect(res.headers['access-control-allow-headers']).toMatch(/authorization/i);
    expect(res.headers['access-control-allow-credentials']).toBeUndefined();
  });

  it('when a listed origin reads, then Retry-After and the request id are exposed; other origins get nothing', async () => {
    const ok = await request(t.app).get('/api/v1/sites').set(await t.auth()).set('Origin', allowed);
    expect(ok.headers['access-control-allow-origin']).toBe(allowed);
    expect(ok.headers['access-control-expose-headers']).toMatch(/Retry-After/);
    const other = await request(t.app).get('/api/v1/sites').set(await t.auth()).set('Origin', 'https://elsewhere.example');
    expect(other.headers['access-control-allow-origin']).toBeUndefined();
  });
});

describe('client addresses behind a reverse proxy', () => {
  let t: TestApp;
  beforeAll(async () => {
    t = await makeTestApp({ config: { trustProxy: 'loopback', rateLimits: { perCallerPerMinute: 1000, perIpPerMinute: 2, signInFailuresPer15Min: 10, passwordResetsPerHour: 5 } } });
  });
  afterAll(() => t.close());

  it('when TRUST_PROXY names the proxy, then each forwarded client has its own limit', async () => {
    const from = (ip: string) => request(t.app).get('/api/v1/sites').set('X-Forwarded-For', ip);
    await from('198.51.100.7');
    await from('198.51.100.7');
    expect((await from('198.51.100.7')).status).toBe(429);
    expect((await from('198.51.100.8')).status).toBe(401);
  });
});
