import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { makeTestApp, type TestApp } from '../../testing/make-test-app.js';

describe('/api/v1/sites', () => {
  let t: TestApp;
  beforeAll(async () => {
    t = await makeTestApp();
  });
  afterAll(() => t.close());

  it('when a site is created, then it can be read back and listed', async () => {
    const created = await request(t.app).post('/api/v1/sites').set(await t.auth()).send({ name: 'Elm Court flats', address: '3 Elm Court' });
    expect(created.status).toBe(201);
    expect(created.body).toMatchObject({ name: 'Elm Court flats', address: '3 Elm Court', circuitCount: 0 });
    const got = await request(t.app).get(`/api/v1/sites/${created.body.id}`).set(await t.auth());
    expect(got.body).toEqual(created.body);
    const list = await request(t.app).get('/api/v1/sites').set(await t.auth());
    expect(list.body.items.map((s: { id: string }) => s.id)).toContain(created.body.id);
    expect(list.body.total).toBe(1);
  });

  it('when fields are invalid, then a 400 problem points at each field', async () => {
    const res = await request(t.app).post('/api/v1/sites').set(await t.auth()).send({ name: '', address: 5, colour: 'red' });
    expect(res.status).toBe(400);
    expect(res.body.type).toBe('/problems/validation');
    const pointers = res.body.errors.map((e: { pointer: string }) => e.pointer).sort();
    expect(pointers).toEqual(['/address', '/colour', '/name']);
    expect(await t.db.models.Site.count()).toBe(1);
  });

  it('when a site is updated, then the change is stored', async () => {
    const { body: site } = await request(t.app).post('/api/v1/sites').set(await t.auth()).send({ name: 'Old name' });
    const res = await request(t.app).patch(`/api/v1/sites/${site.id}`).set(await t.auth()).send({ name: 'New name', notes: 'gate code 1234' });
    expect(res.status).toBe(200);
    const again = await request(t.app).get(`/api/v1/sites/${site.id}`).set(await t.auth());
    expect(again.body).toMatchObject({ name: 'New name', notes: 'gate code 1234' });
  });

  it('when a site is deleted, then it is gone and its circuits with it', async () => {
    const { body: site } = await request(t.app).post('/api/v1/sites').set(await t.auth()).send({ name: 'To remove' });
    await request(t.app)
      .post(`/api/v1/sites/${site.id}/circuits`).set(await t.auth())
      .send({ label: 'C1', nominalVoltageV: 230, mainsHz: 50, deviceRatingA: 16, deviceKind: 'iec-b' })
      .expect(201);
    const del = await request(t.app).delete(`/api/v1/sites/${site.id}`).set(await t.auth());
    expect(del.status).toBe(204);
    expect((await request(t.app).get(`/api/v1/sites/${site.id}`).set(await t.auth())).status).toBe(404);
    expect(await t.db.models.Circuit.count({ where: { siteId: site.id } })).toBe(0);
  });

  it('when pages are asked, then the cursor walks every site exactly once', async () => {
    for (let i = 0; i < 5; i++) await request(t.app).post('/api/v1/sites').set(await t.auth()).send({ name: `Page ${i}` });
    const seen: string[] = [];
    let cursor: string | null = null;
    do {
      const res: request.Response = await request(t.app)
        .get('/api/v1/sites').set(await t.auth())
        .query({ limit: 2, ...(cursor ? { cursor } : {}) });
      expect(res.status).toBe(200);
      seen.push(...res.body.items.map((s: { id: string }) => s.id));
      cursor = res.body.nextCursor;
    } while (cursor);
    expect(new Set(seen).size).toBe(seen.length);
    expect(seen.length).toBe(await t.db.models.Site.count());
  });

  it('when a bad cursor or limit is given, then a 400 problem names the parameter', async () => {
    const res = await request(t.app).get('/api/v1/sites').set(await t.auth()).query({ limit: 0, cursor: 'nonsense' });
    expect(res.status).toBe(400);
    expect(res.body.errors[0].parameter).toBe('limit');
    const res2 = await request(t.app).get('/api/v1/sites').set(await t.auth()).query({ cursor: 'nonsense' });
    expect(res2.status).toBe(400);
    expect(res2.body.errors[0].parameter).toBe('cursor');
  });
});
