import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { makeTestApp, type TestApp } from '../../testing/make-test-app.js';

const kitchen = { label: 'Kitchen counter', nominalVoltageV: 120, mainsHz: 60, deviceRatingA: 20, deviceKind: 'na-thermal-magnetic', conductorSize: '12 AWG', conductorMaterial: 'cu' };

describe('/api/v1/circuits', () => {
  let t: TestApp;
  let siteId: string;
  beforeAll(async () => {
    t = await makeTestApp();
    siteId = (await request(t.app).post('/api/v1/sites').set(await t.auth()).send({ name: 'Test site' })).body.id;
  });
  afterAll(() => t.close());

  it('when a circuit is added to a site, then it is listed under the site with its defaults', async () => {
    const res = await request(t.app).post(`/api/v1/sites/${siteId}/circuits`).set(await t.auth()).send(kitchen);
    expect(res.status).toBe(201);
    expect(res.body).toMatchObject({ ...kitchen, siteId, feedsOtherOutlets: true, necEdition: 2023, loadCount: 0 });
    const list = await request(t.app).get('/api/v1/circuits').set(await t.auth()).query({ siteId });
    expect(list.body.items).toHaveLength(1);
    const site = await request(t.app).get(`/api/v1/sites/${siteId}`).set(await t.auth());
    expect(site.body.circuitCount).toBe(1);
  });

  it('when the site does not exist, then 404 and nothing is stored', async () => {
    const before = await t.db.models.Circuit.count();
    const res = await request(t.app).post('/api/v1/sites/no-such-site/circuits').set(await t.auth()).send(kitchen);
    expect(res.status).toBe(404);
    expect(await t.db.models.Circuit.count()).toBe(before);
  });

  it('when fields are invalid, then each is named', async () => {
    const res = await request(t.app)
      .post(`/api/v1/sites/${siteId}/circuits`).set(await t.auth())
      .send({ ...kitchen, deviceRatingA: -5, mainsHz: 55, deviceKind: 'magic' });
    expect(res.status).toBe(400);
    const pointers = res.body.errors.map((e: { pointer: string }) => e.pointer).sort();
    expect(pointers).toEqual(['/deviceKind', '/deviceRatingA', '/mainsHz']);
  });

  it('when a circuit is updated and deleted, then the state follows', async () => {
    const { body: c } = await request(t.app).post(`/api/v1/sites/${siteId}/circuits`).set(await t.auth()).send(kitchen);
    const upd = await request(t.app).patch(`/api/v1/circuits/${c.id}`).set(await t.auth()).send({ deviceRatingA: 15, necEdition: 2020 });
    expect(upd.body).toMatchObject({ deviceRatingA: 15, necEdition: 2020 });
    expect((await request(t.app).get(`/api/v1/circuits/${c.id}`).set(await t.auth())).body.deviceRatingA).toBe(15);
    expect((await request(t.app).delete(`/api/v1/circuits/${c.id}`).set(await t.auth())).status).toBe(204);
    expect((await request(t.app).get(`/api/v1/circuits/${c.id}`).set(await t.auth())).status).toBe(404);
  });
});
