import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { makeTestApp, type TestApp } from '../../testing/make-test-app.js';

const circuit = { label: 'Counter', nominalVoltageV: 120, mainsHz: 60, deviceRatingA: 20, deviceKind: 'na-thermal-magnetic', conductorMaterial: 'cu' };

describe('circuit warnings through the API', () => {
  let t: TestApp;
  let siteId: string;
  beforeAll(async () => {
    t = await makeTestApp();
    siteId = (await request(t.app).post('/api/v1/sites').set(await t.auth()).send({ name: 'Hall' })).body.id;
  });
  afterAll(() => t.close());

  it('when 14 AWG copper is on a 20 A breaker, then the circuit is saved with a 240.4(D) warning', async () => {
    // source: NEC 240.4(D): 14 AWG Cu may be protected at no more than 15 A
    const res = await request(t.app).post(`/api/v1/sites/${siteId}/circuits`).set(await t.auth()).send({ ...circuit, conductorSize: '14 AWG' });
    expect(res.status).toBe(201);
    expect(res.body.warnings).toEqual([
      expect.objectContaining({ ruleId: 'nec-240.4-small-conductor', pointer: '/conductorSize', citation: expect.objectContaining({ section: '240.4(D)' }) }),
    ]);
    const got = await request(t.app).get(`/api/v1/circuits/${res.body.id}`).set(await t.auth());
    expect(got.body.warnings).toHaveLength(1);
  });

  it('when 12 AWG copper is on a 20 A breaker, then no warning; patching to 14 AWG brings it', async () => {
    // source: NEC 240.4(D): 12 AWG Cu → 20 A
    const res = await request(t.app).post(`/api/v1/sites/${siteId}/circuits`).set(await t.auth()).send({ ...circuit, conductorSize: '12 AWG' });
    expect(res.body.warnings).toEqual([]);
    const upd = await request(t.app).patch(`/api/v1/circuits/${res.body.id}`).set(await t.auth()).send({ conductorSize: '14 AWG' });
    expect(upd.body.warnings.map((w: { ruleId: string }) => w.ruleId)).toEqual(['nec-240.4-small-conductor']);
    const list = await request(t.app).get('/api/v1/circuits').set(await t.auth()).query({ siteId });
    expect(list.body.items.every((c: { warnings: unknown[] }) => Array.isArray(c.warnings))).toBe(true);
  });
});
