import { randomUUID } from 'node:crypto';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Trace } from '../../models/trace.js';
import { makeTestApp, type TestApp } from '../../testing/make-test-app.js';

const counter = { label: 'Counter', nominalVoltageV: 120, mainsHz: 60, deviceRatingA: 20, deviceKind: 'na-thermal-magnetic', conductorSize: '12 AWG', conductorMaterial: 'cu' };
// Trace rows are written directly: these tests are about the links, not the samples.
const clamp: Trace['probe'] = { inputUnit: 'A', sensitivityPerA: 1, loops: 1 };
const mixer = { name: 'Stand mixer', nameplateA: 9.5, connection: 'cord-and-plug', motorHp: 0.5, lockedRotorCode: 'j' };

describe('/api/v1 loads', () => {
  let t: TestApp;
  let circuitId: string;
  beforeAll(async () => {
    t = await makeTestApp();
    const site = await request(t.app).post('/api/v1/sites').set(await t.auth()).send({ name: 'Hall' });
    circuitId = (await request(t.app).post(`/api/v1/sites/${site.body.id}/circuits`).set(await t.auth()).send(counter)).body.id;
  });
  afterAll(() => t.close());

  it('when a load is added, then it is listed on its circuit with its defaults and counted', async () => {
    const res = await request(t.app).post(`/api/v1/circuits/${circuitId}/loads`).set(await t.auth()).send(mixer);
    expect(res.status).toBe(201);
    expect(res.body).toMatchObject({ ...mixer, lockedRotorCode: 'J', circuitId, continuous: false, nameplateW: null, traceIds: [] });
    const list = await request(t.app).get(`/api/v1/circuits/${circuitId}/loads`).set(await t.auth());
    expect(list.body.items.map((l: { id: string }) => l.id)).toContain(res.body.id);
    const circuit = await request(t.app).get(`/api/v1/circuits/${circuitId}`).set(await t.auth());
    expect(circuit.body.loadCount).toBe(list.body.total);
  });

  it('when a load has no running figure and no trace, then 400 points at nameplateA and nothing is stored', async () => {
    const before = await t.db.models.Load.count();
    const res = await request(t.app).post(`/api/v1/circuits/${circuitId}/loads`).set(await t.auth()).send({ name: 'Mystery', connection: 'cord-and-plug' });
    expect(res.status).toBe(400);
    expect(res.body.errors.map((e: { pointer: string }) => e.pointer)).toEqual(['/nameplateA']);
    expect(await t.db.models.Load.count()).toBe(before);
  });

  it('when fields are out of range or inconsistent, then each is named', async () => {
    const bad = await request(t.app)
      .post(`/api/v1/circuits/${circuitId}/loads`).set(await t.auth())
      .send({ name: '', nameplateA: -1, powerFactor: 1.2, connection: 'wired', lockedRotorCode: 'I', colour: 'red' });
    expect(bad.status).toBe(400);
    expect(bad.body.errors.map((e: { pointer: string }) => e.pointer).sort()).toEqual(
      ['/colour', '/connection', '/lockedRotorCode', '/name', '/nameplateA', '/powerFactor'],
    );
    const inconsistent = await request(t.app)
      .post(`/api/v1/circuits/${circuitId}/loads`).set(await t.auth())
      .send({ name: 'Pump', nameplateW: 800, connection: 'fastened-in-place', lockedRotorCode: 'G', startDurationS: 0.5 });
    expect(inconsistent.status).toBe(400);
    expect(inconsistent.body.errors.map((e: { pointer: string }) => e.pointer).sort()).toEqual(['/lockedRotorCode', '/startDurationS']);
  });

  it('when a motor has no nameplate amps and its horsepower is not in Table 430.248, then 400 on motorHp', async () => {
    // source: NEC Table 430.248 lists 1/6 … 10 hp; 0.4 hp is not a row
    const res = await request(t.app).post(`/api/v1/circuits/${circuitId}/loads`).set(await t.auth()).send({ name: 'Fan', motorHp: 0.4, connection: 'fastened-in-place' });
    expect(res.status).toBe(400);
    expect(res.body.errors[0].pointer).toBe('/motorHp');
    const ok = await request(t.app).post(`/api/v1/circuits/${circuitId}/loads`).set(await t.auth()).send({ name: 'Fan', motorHp: 0.4, nameplateA: 5, connection: 'fastened-in-place' });
    expect(ok.status).toBe(201);
  });

  it('when a load is patched, then the merged load is judged and stored', async () => {
    const { body: urn } = await request(t.app).post(`/api/v1/circuits/${circuitId}/loads`).set(await t.auth()).send({ name: 'Urn', nameplateW: 1500, connection: 'cord-and-plug' });
    const clearing = await request(t.app).patch(`/api/v1/loads/${urn.id}`).set(await t.auth()).send({ nameplateW: null });
    expect(clearing.status).toBe(400);
    const upd = await request(t.app).patch(`/api/v1/loads/${urn.id}`).set(await t.auth()).send({ nameplateA: 12.5, nameplateW: null, continuous: true });
    expect(upd.status).toBe(200);
    expect(upd.body).toMatchObject({ nameplateA: 12.5, nameplateW: null, continuous: true, name: 'Urn' });
    expect((await request(t.app).get(`/api/v1/loads/${urn.id}`).set(await t.auth())).body).toEqual(upd.body);
  });

  it('when traces are linked, then the load lists them, and deleting the load keeps the traces', async () => {
    const traceIds = [randomUUID(), randomUUID()];
    for (const id of traceIds) {
      await t.db.models.Trace.create({ id, organisationId: t.organisationId, siteId: null, circuitId, loadId: null, name: 'rec', kind: 'rms', probe: clamp, nominalVoltageV: 120, mainsHz: 60, startTime: null, sampleRateHz: 1, notes: null });
    }
    const { body: load } = await request(t.app).post(`/api/v1/circuits/${circuitId}/loads`).set(await t.auth()).send({ name: 'Recorded', connection: 'cord-and-plug', traceIds });
    expect(load.traceIds.sort()).toEqual([...traceIds].sort());
    // a linked trace follows its load's circuit and site
    const linked = await t.db.models.Trace.findByPk(traceIds[0]!);
    expect(linked).toMatchObject({ loadId: load.id, circuitId });
    expect(linked?.siteId).toBe((await request(t.app).get(`/api/v1/circuits/${circuitId}`).set(await t.auth())).body.siteId);
    const unlink = await request(t.app).patch(`/api/v1/loads/${load.id}`).set(await t.auth()).send({ traceIds: [traceIds[0]] });
    expect(unlink.body.traceIds).toEqual([traceIds[0]]);
    expect((await t.db.models.Trace.findByPk(traceIds[1]!))?.loadId).toBeNull();
    expect((await request(t.app).delete(`/api/v1/loads/${load.id}`).set(await t.auth())).status).toBe(204);
    expect((await request(t.app).get(`/api/v1/loads/${load.id}`).set(await t.auth())).status).toBe(404);
    expect((await t.db.models.Trace.findByPk(traceIds[0]!))?.loadId).toBeNull();
  });

  it('when a linked trace does not exist, then 400 points at it and the load is not stored', async () => {
    const before = await t.db.models.Load.count();
    const res = await request(t.app).post(`/api/v1/circuits/${circuitId}/loads`).set(await t.auth()).send({ ...mixer, traceIds: ['no-such-trace'] });
    expect(res.status).toBe(400);
    expect(res.body.errors).toEqual([{ pointer: '/traceIds/0', detail: expect.stringContaining('no-such-trace') }]);
    expect(await t.db.models.Load.count()).toBe(before);
  });

  it('when the circuit, load or trace belongs to another organisation, then 404 (or 400 for a trace) and nothing leaks', async () => {
    const m = t.db.models;
    const otherOrg = randomUUID();
    await m.Organisation.create({ id: otherOrg, name: 'Other' });
    const site = await m.Site.create({ id: randomUUID(), organisationId: otherOrg, name: 'Theirs', address: null, clientContact: null, notes: null });
    const circuit = await m.Circuit.create({ id: randomUUID(), organisationId: otherOrg, siteId: site.id, ...counter, deviceKind: 'na-thermal-magnetic', conductorMaterial: 'cu', feedsOtherOutlets: true, necEdition: 2023, notes: null });
    const load = await m.Load.create({ id: randomUUID(), organisationId: otherOrg, circuitId: circuit.id, name: 'Their kettle', nameplateA: 12, nameplateW: null, powerFactor: null, connection: 'cord-and-plug', continuous: false, motorHp: null, lockedRotorCode: null, notes: null });
    const trace = await m.Trace.create({ id: randomUUID(), organisationId: otherOrg, siteId: null, circuitId: null, loadId: null, name: 'theirs', kind: 'rms', probe: clamp, nominalVoltageV: null, mainsHz: null, startTime: null, sampleRateHz: 1, notes: null });
    const auth = await t.auth();
    expect((await request(t.app).get(`/api/v1/circuits/${circuit.id}/loads`).set(auth)).status).toBe(404);
    expect((await request(t.app).post(`/api/v1/circuits/${circuit.id}/loads`).set(auth).send(mixer)).status).toBe(404);
    expect((await request(t.app).get(`/api/v1/loads/${load.id}`).set(auth)).status).toBe(404);
    expect((await request(t.app).patch(`/api/v1/loads/${load.id}`).set(auth).send({ name: 'Mine now' })).status).toBe(404);
    expect((await request(t.app).delete(`/api/v1/loads/${load.id}`).set(auth)).status).toBe(404);
    const link = await request(t.app).post(`/api/v1/circuits/${circuitId}/loads`).set(auth).send({ ...mixer, traceIds: [trace.id] });
    expect(link.status).toBe(400);
    expect((await m.Load.findByPk(load.id))?.name).toBe('Their kettle');
    expect((await m.Trace.findByPk(trace.id))?.loadId).toBeNull();
  });

  it('when a viewer writes, then 403; when a viewer reads, then 200', async () => {
    const viewer = await t.auth('viewer');
    const write = await request(t.app).post(`/api/v1/circuits/${circuitId}/loads`).set(viewer).send(mixer);
    const read = await request(t.app).get(`/api/v1/circuits/${circuitId}/loads`).set(viewer);
    expect(read.status).toBe(200);
    expect(write.status).toBe(403);
    const ingestKey = await t.auth({ keyScopes: ['ingest'] });
    expect((await request(t.app).get(`/api/v1/circuits/${circuitId}/loads`).set(ingestKey)).status).toBe(403);
  });
});
