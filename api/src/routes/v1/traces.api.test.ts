import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { makeTestApp, type TestApp } from '../../testing/make-test-app.js';

describe('/api/v1/traces (smoke)', () => {
  let t: TestApp;
  beforeAll(async () => {
    t = await makeTestApp();
  });
  afterAll(() => t.close());

  it('when samples are appended as JSON, then they are stored and exported', async () => {
    const auth = await t.auth();
    const created = await request(t.app).post('/api/v1/traces').set(auth).send({ name: 'Smoke', kind: 'rms' });
    expect(created.status, JSON.stringify(created.body)).toBe(201);
    const id = created.body.id;
    const t0 = 1_700_000_000_000;
    const times = Array.from({ length: 5000 }, (_, i) => t0 + i * 100);
    const values = times.map((_, i) => Math.fround(5 + Math.sin(i / 10)));
    const res = await request(t.app).post(`/api/v1/traces/${id}/samples`).set(auth).send({ t: times, a: values });
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    expect(res.body.accepted).toBe(5000);
    const got = await request(t.app).get(`/api/v1/traces/${id}`).set(auth);
    expect(got.body.sampleCount).toBe(5000);
    expect(got.body.summary.count).toBe(5000);
    const exported = await request(t.app).get(`/api/v1/traces/${id}/samples?format=json`).set(auth);
    expect(exported.status).toBe(200);
    const body = JSON.parse(exported.text);
    expect(body.t).toEqual(times);
    expect(Array.from(Float32Array.from(body.a))).toEqual(values);
    const more = await request(t.app).post(`/api/v1/traces/${id}/samples`).set(auth).send({ t: [t0 + 500_000, t0 + 500_100], a: [1, 2] });
    expect(more.status, JSON.stringify(more.body)).toBe(200);
    const stats = await request(t.app).get(`/api/v1/traces/${id}/stats`).set(auth);
    expect(stats.status, JSON.stringify(stats.body)).toBe(200);
    expect(stats.body.statistics.count).toBe(5002);
    const series = await request(t.app).get(`/api/v1/traces/${id}/series?points=100`).set(auth);
    expect(series.status, JSON.stringify(series.body)).toBe(200);
    expect(series.body.t.length).toBeLessThanOrEqual(100);
    const closed = await request(t.app).post(`/api/v1/traces/${id}/close`).set(auth);
    expect(closed.status, JSON.stringify(closed.body)).toBe(200);
    const events = await request(t.app).get(`/api/v1/traces/${id}/events`).set(auth);
    expect(events.status, JSON.stringify(events.body)).toBe(200);
  });
});
