/**
 * Secrets never reach the log, and every answer carries the security headers.
 *
 * The log test runs the whole life of every credential through an app whose pino logger writes every
 * level (trace and up) into memory: sign-in, session use, sign-out, API keys (made, used, rotated,
 * revoked), invitations and password resets (tokens from the e-mailed links), failures and malformed
 * bodies carrying passwords. Then it searches the captured log for each secret and for the parts of an
 * API key. Source for the headers: OWASP Secure Headers Project and REST Security Cheat Sheet.
 */
import bcrypt from 'bcryptjs';
import pino from 'pino';
import { Writable } from 'node:stream';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createApp, type HeadroomApp } from '../../src/app.js';
import type { ReceivedMail } from '../../src/mail/fake-smtp-server.js';
import { makeTestApp, type TestApp } from '../../src/testing/make-test-app.js';

function tokenFrom(mail: ReceivedMail): string {
  const link = /https?:\/\/\S+/.exec(mail.text)?.[0] ?? '';
  return new URL(link).searchParams.get('token') ?? '';
}

describe('secrets and the log', () => {
  let t: TestApp;
  let app: HeadroomApp;
  const lines: string[] = [];
  const secrets = new Map<string, string>();
  const keep = (what: string, value: string | undefined) => {
    expect(value, what).toBeTruthy();
    secrets.set(what, value!);
  };

  beforeAll(async () => {
    t = await makeTestApp();
    const sink = new Writable({
      write(chunk: Buffer, _enc, done) {
        lines.push(chunk.toString('utf8'));
        done();
      },
    });
    // Same database and mailbox as the test app, but a logger that keeps everything.
    app = createApp(t.config, t.db, { logger: pino({ level: 'trace' }, sink), ...(t.mailbox ? { mailbox: t.mailbox } : {}) });
  });
  afterAll(() => t.close());

  it('when every kind of credential is made, used and ended, then none of them appears in the log', async () => {
    const password = 'Tr0ub4dor&3-log-probe';
    keep('password', password);
    await t.db.models.User.create({ id: crypto.randomUUID(), organisationId: t.organisationId, email: 'admin.logprobe@example.test', name: 'Log probe', role: 'admin', passwordHash: await bcrypt.hash(password, 4) });

    // Sessions: a failed sign-in, a good one, use, a token in the query string, sign-out.
    await request(app).post('/api/v1/auth/sign-in').send({ email: 'admin.logprobe@example.test', password: `${password}-wrong` }).expect(401);
    keep('wrong password', `${password}-wrong`);
    const signIn = await request(app).post('/api/v1/auth/sign-in').send({ email: 'admin.logprobe@example.test', password }).expect(200);
    keep('session token', signIn.body.token);
    const session = { Authorization: `Bearer ${signIn.body.token}` };
    await request(app).get('/api/v1/me').set(session).expect(200);
    await request(app).get(`/api/v1/sites?access_token=${signIn.body.token}`).set(session).expect((r) => expect(r.status).toBeLessThan(500));
    // A malformed body that carries a password: the parser's message quotes the body.
    await request(app).post('/api/v1/auth/sign-in').set('Content-Type', 'application/json').send(`{"email":"admin.logprobe@example.test","password":"${password}-malformed`).expect(400);
    keep('password in a malformed body', `${password}-malformed`);

    // API keys: made, used, rotated (old one refused), revoked.
    const made = await request(app).post('/api/v1/api-keys').set(session).send({ name: 'Logger probe', scopes: ['ingest', 'read'] }).expect(201);
    keep('API key secret', made.body.secret);
    await request(app).get('/api/v1/sites').set({ Authorization: `Bearer ${made.body.secret}` }).expect(200);
    const rotated = await request(app).post(`/api/v1/api-keys/${made.body.apiKey.id}/rotate`).set(session).expect(200);
    keep('rotated API key secret', rotated.body.secret);
    await request(app).get('/api/v1/sites').set({ Authorization: `Bearer ${made.body.secret}` }).expect(401);
    await request(app).get('/api/v1/sites').set({ Authorization: `Bearer ${rotated.body.secret}` }).expect(200);
    await request(app).delete(`/api/v1/api-keys/${made.body.apiKey.id}`).set(session).expect(204);
    await request(app).get('/api/v1/sites').set({ Authorization: `Bearer ${rotated.body.secret}` }).expect(401);

    // Invitations and password resets: the tokens from the mails, and the passwords they set.
    await request(app).post('/api/v1/users').set(session).send({ email: 'new.engineer@example.test', name: 'New engineer', role: 'engineer' }).expect(201);
    const invitation = await t.mailbox!.waitFor((m) => m.to.includes('new.engineer@example.test'));
    keep('invitation token', tokenFrom(invitation));
    keep('invited password', 'chosen-by-invitee-9271');
    await request(app).post('/api/v1/auth/invitations/accept').send({ token: secrets.get('invitation token'), name: 'New engineer', password: secrets.get('invited password') }).expect(200);
    await request(app).post('/api/v1/auth/password-reset').send({ email: 'admin.logprobe@example.test' }).expect(202);
    const reset = await t.mailbox!.waitFor((m) => m.to.includes('admin.logprobe@example.test') && /token=/.test(m.text));
    keep('reset token', tokenFrom(reset));
    keep('new password', 'after-reset-password-5512');
    await request(app).post('/api/v1/auth/password-reset/complete').send({ token: secrets.get('reset token'), password: secrets.get('new password') }).expect(204);
    await request(app).post('/api/v1/auth/password-reset/complete').send({ token: secrets.get('reset token'), password: 'again-again-again' }).expect((r) => expect(r.status).toBeGreaterThanOrEqual(400));
    await request(app).post('/api/v1/auth/sign-out').set(session).expect((r) => expect(r.status).toBeLessThan(500));

    const log = lines.join('');
    // The log is not empty, so searching it means something: every request left a line.
    expect(lines.length).toBeGreaterThan(15);
    expect(log).toContain('/api/v1/auth/sign-in');
    for (const [what, secret] of secrets) {
      expect(log.includes(secret), `${what} is in the log`).toBe(false);
      // API keys are `hrk_<key id>_<secret part>`: the secret part alone must not show either.
      const secretPart = secret.startsWith('hrk_') ? secret.split('_').slice(2).join('_') : undefined;
      if (secretPart) expect(log.includes(secretPart), `${what} (secret part) is in the log`).toBe(false);
    }
    expect(log).not.toMatch(/authorization|cookie/i);
    expect(log).not.toMatch(/\$2[aby]\$\d\d\$/); // no password hash either
  });
});

describe('security headers', () => {
  let t: TestApp;
  beforeAll(async () => {
    t = await makeTestApp();
  });
  afterAll(() => t.close());

  const pages: Array<[string, (t: TestApp) => Promise<request.Response>]> = [
    ['an API answer', async (t) => request(t.app).get('/api/v1/sites').set(await t.auth())],
    ['an API error', async (t) => request(t.app).get('/api/v1/sites/unknown').set(await t.auth())],
    ['a refusal', async (t) => request(t.app).get('/api/v1/sites')],
    ['sign-in', async (t) => request(t.app).post('/api/v1/auth/sign-in').send({ email: 'nobody@example.test', password: 'x' })],
    ['the health check', async (t) => request(t.app).get('/healthz')],
    ['the API docs', async (t) => request(t.app).get('/api/docs/')],
    ['an unknown path', async (t) => request(t.app).get('/no/such/page')],
  ];

  it.each(pages)('when %s is served, then it carries the security headers', async (_name, get) => {
    const res = await get(t);
    const h = res.headers;
    expect(h['x-content-type-options']).toBe('nosniff');
    expect(h['content-security-policy']).toMatch(/default-src 'self'/);
    expect(h['content-security-policy']).toMatch(/frame-ancestors 'self'|frame-ancestors 'none'/);
    expect(h['content-security-policy']).toMatch(/object-src 'none'/);
    expect(h['x-frame-options']).toMatch(/^(SAMEORIGIN|DENY)$/);
    expect(h['referrer-policy']).toBe('no-referrer');
    expect(h['strict-transport-security']).toMatch(/max-age=\d+/);
    expect(h['cross-origin-opener-policy']).toBe('same-origin');
    expect(h['x-powered-by']).toBeUndefined();
    expect(h['access-control-allow-origin']).toBeUndefined();
  });

  it.each(pages.filter(([name]) => !/docs|health|unknown path/.test(name)))('when %s is served, then no cache keeps it', async (_name, get) => {
    // Sessions, API key secrets and private data travel in these answers (OWASP REST Security).
    const res = await get(t);
    expect(res.headers['cache-control']).toMatch(/no-store/);
  });
});
