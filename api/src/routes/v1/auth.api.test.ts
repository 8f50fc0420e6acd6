import bcrypt from 'bcryptjs';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { hashSecret } from '../../auth/secrets.js';
import type { ReceivedMail } from '../../mail/fake-smtp-server.js';
import { makeTestApp, type TestApp } from '../../testing/make-test-app.js';

/** The token in the first link of a mail whose path is `pagePath`. */
function tokenFrom(mail: ReceivedMail, pagePath: string): string {
  const link = /https?:\/\/\S+/.exec(mail.text)?.[0];
  expect(link).toBeDefined();
  const url = new URL(link!);
  expect(url.pathname).toBe(pagePath);
  return url.searchParams.get('token')!;
}

describe('/api/v1/auth, /me and /users', () => {
  let t: TestApp;
  const password = 'correct horse battery';

  async function userWithPassword(email: string, role: 'admin' | 'engineer' | 'viewer' = 'engineer') {
    return t.db.models.User.create({ id: crypto.randomUUID(), organisationId: t.organisationId, email, name: email.split('@')[0]!, role, passwordHash: await bcrypt.hash(password, 4) });
  }
  const signIn = (email: string, pw = password) => request(t.app).post('/api/v1/auth/sign-in').send({ email, password: pw });

  beforeAll(async () => {
    t = await makeTestApp({ config: { publicUrl: 'https://headroom.example.test/app' } });
  });
  afterAll(() => t.close());

  it('when the right password is given, then a session token works for /me until sign-out', async () => {
    await userWithPassword('ines@example.test', 'viewer');
    const res = await signIn('Ines@Example.test');
    expect(res.status).toBe(200);
    expect(res.body.token).toMatch(/^hrs_/);
    expect(res.body.user).toMatchObject({ email: 'ines@example.test', role: 'viewer' });
    // Fixed 12 h session.
    expect(Date.parse(res.body.expiresAt) - Date.now()).toBeGreaterThan(11.9 * 3600_000);
    const bearer = { Authorization: `Bearer ${res.body.token}` };
    const me = await request(t.app).get('/api/v1/me').set(bearer);
    expect(me.status).toBe(200);
    expect(me.body).toMatchObject({ user: { email: 'ines@example.test', role: 'viewer' }, organisation: { id: t.organisationId }, apiKey: null });
    expect(me.body.permissions).toContain('read');
    expect(me.body.permissions).not.toContain('write');
    expect((await request(t.app).post('/api/v1/auth/sign-out').set(bearer)).status).toBe(204);
    const after = await request(t.app).get('/api/v1/me').set(bearer);
    expect(after.status).toBe(401);
    expect(after.body.detail).toMatch(/revoked/);
    expect(after.headers['www-authenticate']).toMatch(/^Bearer realm="headroom", error="invalid_token"/);
  });

  it('when the password or e-mail is wrong, then both get the same 401 and known accounts log the failure', async () => {
    await userWithPassword('wrongpw@example.test');
    const wrongPassword = await signIn('wrongpw@example.test', 'not the password');
    const unknown = await signIn('nobody@example.test', 'not the password');
    expect(wrongPassword.status).toBe(401);
    expect(unknown.status).toBe(401);
    expect(unknown.body.detail).toBe(wrongPassword.body.detail);
    const failures = await t.db.models.AuditEvent.findAll({ where: { action: 'sign-in.failed', organisationId: t.organisationId } });
    expect(failures.map((f) => f.actorLabel)).toContain('wrongpw@example.test');
    // The password is never stored or logged in the audit details.
    expect(JSON.stringify(failures.map((f) => f.toJSON()))).not.toContain('not the password');
  });

  it('when no token or a malformed header is sent, then protected routes answer 401 and public ones work', async () => {
    expect((await request(t.app).get('/api/v1/me')).status).toBe(401);
    expect((await request(t.app).get('/api/v1/me').set('Authorization', 'Basic abc')).status).toBe(401);
    expect((await request(t.app).get('/api/v1/me').set('Authorization', 'Bearer')).status).toBe(401);
    expect((await request(t.app).get('/api/v1/me').set('Authorization', 'Bearer hrs_made-up')).status).toBe(401);
    // A token in the query string is not accepted (it would end up in logs).
    const { token } = (await signIn((await userWithPassword('query@example.test')).email)).body;
    expect((await request(t.app).get('/api/v1/me').query({ access_token: token })).status).toBe(401);
    expect((await request(t.app).post('/api/v1/auth/password-reset').send({ email: 'x@example.test' })).status).toBe(202);
  });

  it('when an admin invites someone, then the e-mailed link sets their password and signs them in, once', async () => {
    const admin = await t.auth('admin');
    const invited = await request(t.app).post('/api/v1/users').set(admin).send({ email: 'noor@example.test', name: 'Noor', role: 'engineer' });
    expect(invited.status).toBe(201);
    expect(invited.body).toMatchObject({ email: 'noor@example.test', role: 'engineer', status: 'invited' });
    // Mail really went over SMTP to the fake server.
    const mail = await t.mailbox!.waitFor((m) => m.to.includes('noor@example.test'));
    expect(mail.subject).toMatch(/invited/i);
    const token = tokenFrom(mail, '/app/accept-invitation');
    // Not signed in before accepting (no password yet).
    expect((await signIn('noor@example.test', 'anything at all')).status).toBe(401);
    const accepted = await request(t.app).post('/api/v1/auth/invitations/accept').send({ token, name: 'Noor Haddad', password: 'a fine new password' });
    expect(accepted.status).toBe(200);
    expect(accepted.body.user).toMatchObject({ email: 'noor@example.test', name: 'Noor Haddad', role: 'engineer' });
    const me = await request(t.app).get('/api/v1/me').set({ Authorization: `Bearer ${accepted.body.token}` });
    expect(me.body.user.name).toBe('Noor Haddad');
    expect((await signIn('noor@example.test', 'a fine new password')).status).toBe(200);
    const again = await request(t.app).post('/api/v1/auth/invitations/accept').send({ token, name: 'Mallory', password: 'another password' });
    expect(again.status).toBe(400);
    expect(again.body.errors[0]).toMatchObject({ pointer: '/token' });
    // The token is stored only as a hash.
    const [rows] = await t.db.sequelize.query('SELECT * FROM one_time_tokens');
    expect(JSON.stringify(rows)).not.toContain(token);
    const events = (await request(t.app).get('/api/v1/audit-events').set(admin)).body.items.map((e: { action: string }) => e.action);
    expect(events).toEqual(expect.arrayContaining(['user.invited', 'invitation.accepted']));
  });

  it('when a password reset is asked, then the link sets a new password and ends every session', async () => {
    await userWithPassword('olu@example.test');
    const { token: oldSession } = (await signIn('olu@example.test')).body;
    expect((await request(t.app).post('/api/v1/auth/password-reset').send({ email: 'OLU@example.test' })).status).toBe(202);
    const mail = await t.mailbox!.waitFor((m) => m.to.includes('olu@example.test') && /reset/i.test(m.subject));
    const token = tokenFrom(mail, '/app/reset-password');
    const tooShort = await request(t.app).post('/api/v1/auth/password-reset/complete').send({ token, password: 'short' });
    expect(tooShort.status).toBe(400);
    expect(tooShort.body.errors[0].pointer).toBe('/password');
    expect((await request(t.app).post('/api/v1/auth/password-reset/complete').send({ token, password: 'my brand new password' })).status).toBe(204);
    expect((await request(t.app).get('/api/v1/me').set({ Authorization: `Bearer ${oldSession}` })).status).toBe(401);
    expect((await signIn('olu@example.test')).status).toBe(401);
    expect((await signIn('olu@example.test', 'my brand new password')).status).toBe(200);
    expect((await request(t.app).post('/api/v1/auth/password-reset/complete').send({ token, password: 'yet another password' })).status).toBe(400);
  });

  it('when a reset link has expired, then it is refused', async () => {
    const user = await userWithPassword('late@example.test');
    await request(t.app).post('/api/v1/auth/password-reset').send({ email: 'late@example.test' }).expect(202);
    const token = tokenFrom(await t.mailbox!.waitFor((m) => m.to.includes('late@example.test')), '/app/reset-password');
    await t.db.models.OneTimeToken.update({ expiresAt: new Date(Date.now() - 1000) }, { where: { userId: user.id } });
    const res = await request(t.app).post('/api/v1/auth/password-reset/complete').send({ token, password: 'too late for this one' });
    expect(res.status).toBe(400);
    expect(res.body.detail).toMatch(/expired/);
  });

  it('when an unknown address asks for a reset, then the answer is the same and no mail is sent', async () => {
    const before = t.mailbox!.messages().length;
    expect((await request(t.app).post('/api/v1/auth/password-reset').send({ email: 'ghost@example.test' })).status).toBe(202);
    await request(t.app).post('/api/v1/auth/password-reset').send({ email: 'wrongpw@example.test' }).expect(202);
    await t.mailbox!.waitFor((m) => m.to.includes('wrongpw@example.test'));
    expect(t.mailbox!.messages().slice(before).some((m) => m.to.includes('ghost@example.test'))).toBe(false);
  });

  it('when a user is deactivated, then their session stops working at once and sign-in is refused', async () => {
    const admin = await t.auth('admin');
    const user = await userWithPassword('temp@example.test');
    const session = { Authorization: `Bearer ${(await signIn('temp@example.test')).body.token}` };
    expect((await request(t.app).get('/api/v1/sites').set(session)).status).toBe(200);
    const res = await request(t.app).patch(`/api/v1/users/${user.id}`).set(admin).send({ active: false });
    expect(res.status).toBe(200);
    expect(res.body.status).toBe('deactivated');
    const refused = await request(t.app).get('/api/v1/sites').set(session);
    expect(refused.status).toBe(401);
    expect((await signIn('temp@example.test')).status).toBe(401);
    // Reactivation does not bring the ended session back.
    await request(t.app).patch(`/api/v1/users/${user.id}`).set(admin).send({ active: true }).expect(200);
    expect((await request(t.app).get('/api/v1/sites').set(session)).status).toBe(401);
    expect((await signIn('temp@example.test')).status).toBe(200);
  });

  it('when a session is past its expiry, then it is refused', async () => {
    await userWithPassword('expiring@example.test');
    const { token } = (await signIn('expiring@example.test')).body;
    const session = { Authorization: `Bearer ${token}` };
    expect((await request(t.app).get('/api/v1/me').set(session)).status).toBe(200);
    await t.db.models.Session.update({ expiresAt: new Date(Date.now() - 1000) }, { where: { tokenHash: hashSecret(token) } });
    const res = await request(t.app).get('/api/v1/me').set(session);
    expect(res.status).toBe(401);
    expect(res.body.detail).toMatch(/expired/);
  });

  it('when the role changes, then the next request uses the new role', async () => {
    const admin = await t.auth('admin');
    const user = await userWithPassword('promote@example.test', 'viewer');
    const session = { Authorization: `Bearer ${(await signIn('promote@example.test')).body.token}` };
    expect((await request(t.app).post('/api/v1/sites').set(session).send({ name: 'Nope' })).status).toBe(403);
    await request(t.app).patch(`/api/v1/users/${user.id}`).set(admin).send({ role: 'engineer' }).expect(200);
    expect((await request(t.app).post('/api/v1/sites').set(session).send({ name: 'Now allowed' })).status).toBe(201);
    const events = (await request(t.app).get('/api/v1/audit-events').query({ action: 'user.role-changed' }).set(admin)).body.items;
    expect(events[0]).toMatchObject({ target: { id: user.id }, details: { from: 'viewer', to: 'engineer' } });
  });

  it('when the last admin would be demoted or deactivated, then 409 and nothing changes', async () => {
    // The cached admin is the organisation's only admin.
    const admin = await t.auth('admin');
    expect(await t.db.models.User.count({ where: { organisationId: t.organisationId, role: 'admin' } })).toBe(1);
    const me = (await request(t.app).get('/api/v1/me').set(admin)).body.user;
    const res = await request(t.app).patch(`/api/v1/users/${me.id}`).set(admin).send({ role: 'viewer' });
    expect(res.status).toBe(409);
    expect((await request(t.app).patch(`/api/v1/users/${me.id}`).set(admin).send({ active: false })).status).toBe(409);
    expect((await request(t.app).get(`/api/v1/users/${me.id}`).set(admin)).body).toMatchObject({ role: 'admin', status: 'active' });
  });

  it('when an address already has an account, then inviting it again is a conflict', async () => {
    const admin = await t.auth('admin');
    await userWithPassword('taken@example.test');
    const res = await request(t.app).post('/api/v1/users').set(admin).send({ email: 'taken@example.test', name: 'Dup', role: 'viewer' });
    expect(res.status).toBe(409);
  });
});

describe('sign-in throttling', () => {
  let t: TestApp;
  beforeAll(async () => {
    t = await makeTestApp();
  });
  afterAll(() => t.close());

  it('when an address fails to sign in too often, then 429 with Retry-After as a problem, even with the right password', async () => {
    const limit = t.config.rateLimits.signInFailuresPer15Min;
    expect(limit).toBe(10);
    await t.db.models.User.create({ id: crypto.randomUUID(), organisationId: t.organisationId, email: 'brute@example.test', name: 'B', role: 'viewer', passwordHash: await bcrypt.hash('the real password', 4) });
    for (let i = 0; i < limit; i++) {
      const res = await request(t.app).post('/api/v1/auth/sign-in').send({ email: 'brute@example.test', password: `guess ${i}` });
      expect(res.status).toBe(401);
    }
    const blocked = await request(t.app).post('/api/v1/auth/sign-in').send({ email: 'brute@example.test', password: 'the real password' });
    expect(blocked.status).toBe(429);
    expect(blocked.headers['content-type']).toMatch(/application\/problem\+json/);
    expect(blocked.body.type).toBe('/problems/rate-limited');
    const retryAfter = Number(blocked.headers['retry-after']);
    expect(retryAfter).toBeGreaterThan(0);
    expect(retryAfter).toBeLessThanOrEqual(15 * 60);
    // Other routes from the same address are not blocked by the sign-in limit.
    expect((await request(t.app).get('/api/v1/sites').set(await t.auth())).status).toBe(200);
  });

  it('when password resets are asked too often from one address, then 429', async () => {
    const limit = t.config.rateLimits.passwordResetsPerHour;
    for (let i = 0; i < limit; i++) await request(t.app).post('/api/v1/auth/password-reset').send({ email: `r${i}@example.test` }).expect(202);
    const res = await request(t.app).post('/api/v1/auth/password-reset').send({ email: 'one-more@example.test' });
    expect(res.status).toBe(429);
    expect(res.headers['retry-after']).toBeDefined();
  });
});

describe('invitations when the mail server refuses', () => {
  let t: TestApp;
  beforeAll(async () => {
    // Port 9 (discard) on 127.0.0.1: nothing answers SMTP there.
    t = await makeTestApp({ config: { smtpUrl: 'smtp://127.0.0.1:9' } });
  });
  afterAll(() => t.close());

  it('when the invitation cannot be sent, then 503 and no user is kept', async () => {
    const res = await request(t.app).post('/api/v1/users').set(await t.auth('admin')).send({ email: 'unlucky@example.test', name: 'Unlucky', role: 'viewer' });
    expect(res.status).toBe(503);
    expect(res.body.type).toBe('/problems/unavailable');
    expect(await t.db.models.User.count({ where: { email: 'unlucky@example.test' } })).toBe(0);
    expect(await t.db.models.OneTimeToken.count()).toBe(0);
  });

  it('when no fake server runs, then the dev mailbox is 404', async () => {
    expect((await request(t.app).get('/api/v1/dev/mailbox').set(await t.auth('admin'))).status).toBe(404);
  });
});
