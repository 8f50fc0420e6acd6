import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { makeTestApp, type TestApp } from './testing/make-test-app.js';
import { testsRunOnPostgres } from './testing/postgres-scratch-database.js';

describe('the app on a temporary SQLite file', () => {
  let t: TestApp;
  beforeAll(async () => {
    t = await makeTestApp({ file: true });
  });
  afterAll(() => t.close());

  it.skipIf(testsRunOnPostgres)('when the database was opened, then it is migrated and in WAL mode', async () => {
    const [rows] = await t.db.sequelize.query('PRAGMA journal_mode');
    expect((rows as Array<{ journal_mode: string }>)[0]?.journal_mode).toBe('wal');
    const [migrations] = await t.db.sequelize.query('SELECT name FROM schema_migrations');
    expect((migrations as Array<{ name: string }>).map((m) => m.name)).toContain('0001-create-core-tables');
  });

  it('when /healthz is asked, then it answers ok', async () => {
    const res = await request(t.app).get('/healthz');
    expect(res.status).toBe(200);
    expect(res.body).toEqual({ status: 'ok' });
  });

  it('when /readyz is asked, then the database answers', async () => {
    const res = await request(t.app).get('/readyz');
    expect(res.status).toBe(200);
    expect(res.body).toEqual({ status: 'ready' });
  });

  it('when an unknown API route is asked, then a 404 problem names the route', async () => {
    const res = await request(t.app).get('/api/v1/no-such-thing');
    expect(res.status).toBe(404);
    expect(res.headers['content-type']).toMatch(/application\/problem\+json/);
    expect(res.body).toMatchObject({ type: '/problems/not-found', status: 404, instance: '/api/v1/no-such-thing' });
    expect(res.body.requestId).toEqual(res.headers['x-request-id']);
  });

  it('when a JSON body is malformed, then a 400 problem says so without a stack trace', async () => {
    const res = await request(t.app).post('/api/v1/sites').set('content-type', 'application/json').send('{"name": ');
    expect(res.status).toBe(400);
    expect(res.body.type).toBe('/problems/malformed-body');
    expect(JSON.stringify(res.body)).not.toMatch(/at .*\.(js|ts):\d+/);
  });

  it('when the docs are asked, then Swagger UI and the document are served', async () => {
    const ui = await request(t.app).get('/api/docs/');
    expect(ui.status).toBe(200);
    expect(ui.text).toContain('swagger-ui');
    const doc = await request(t.app).get('/api/openapi.json');
    expect(doc.body.openapi).toBe('3.1.0');
    expect(Object.keys(doc.body.paths)).toContain('/sites');
  });

  it('when a caller sends a request id, then it is echoed', async () => {
    const res = await request(t.app).get('/healthz').set('x-request-id', 'probe-42');
    expect(res.headers['x-request-id']).toBe('probe-42');
  });
});
