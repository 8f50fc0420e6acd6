/**
 * The row reader must give exactly what Sequelize's own findOne gives (the reference here), for a trace
 * with every kind of column filled: JSON, dates, doubles, integers, text, nulls.
 */
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { makeTestApp, type TestApp } from '../testing/make-test-app.js';
import { testsRunOnPostgres } from '../testing/postgres-scratch-database.js';
import { SqliteRowReader } from './sqlite-row-reader.js';

describe.skipIf(testsRunOnPostgres)('SqliteRowReader', () => {
  let t: TestApp;
  beforeAll(async () => {
    t = await makeTestApp({ file: true });
  });
  afterAll(() => t.close());

  it('when a trace is read, then it equals what Sequelize findOne reads, field for field', async () => {
    const auth = await t.auth();
    const created = await request(t.app)
      .post('/api/v1/traces')
      .set(auth)
      .send({
        name: 'Walk-in cooler compressor',
        kind: 'rms',
        probe: { inputUnit: 'mV', sensitivityPerA: 10, loops: 2 },
        nominalVoltageV: 230,
        mainsHz: 50,
        startTime: '2026-03-02T08:00:00.250Z',
        sampleRateHz: 20,
        tags: ['cooler', 'night'],
        notes: 'Measured at the sub-board',
      });
    expect(created.status).toBe(201);
    const id = created.body.id as string;
    const appended = await request(t.app)
      .post(`/api/v1/traces/${id}/samples`)
      .set(auth)
      .send({ values: Array.from({ length: 5000 }, (_, i) => 40 + Math.sin(i / 10)) });
    expect(appended.status).toBe(200);

    const { Trace } = t.db.models;
    const reference = await Trace.findOne({ where: { id, organisationId: t.organisationId } });
    const reader = new SqliteRowReader(t.db);
    const read = await reader.findInOrganisation(Trace, id, t.organisationId);
    expect(read).not.toBeNull();
    expect(read!.get({ plain: true })).toEqual(reference!.get({ plain: true }));
    expect(read!.startTime).toBeInstanceOf(Date);
    expect(read!.startTime!.toISOString()).toBe('2026-03-02T08:00:00.250Z');
    expect(read!.summary).toMatchObject({ count: 5000 });
    expect(read!.isNewRecord).toBe(false);

    // An instance read this way updates like one Sequelize found.
    await read!.update({ notes: 'Moved to the main board' });
    expect((await Trace.findByPk(id))!.notes).toBe('Moved to the main board');
  });

  it('when the trace belongs to another organisation or does not exist, then nothing is read', async () => {
    const auth = await t.auth();
    const id = (await request(t.app).post('/api/v1/traces').set(auth).send({ name: 'Other', kind: 'rms' })).body.id as string;
    const reader = new SqliteRowReader(t.db);
    expect(await reader.findInOrganisation(t.db.models.Trace, id, 'another-organisation')).toBeNull();
    expect(await reader.findInOrganisation(t.db.models.Trace, 'no-such-trace', t.organisationId)).toBeNull();
  });
});
