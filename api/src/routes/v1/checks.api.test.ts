import { randomUUID } from 'node:crypto';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { makeTestApp, type TestApp } from '../../testing/make-test-app.js';
import { HeadroomCheck } from './schemas/checks.js';

const kitchen20 = { label: 'Counter', nominalVoltageV: 120, mainsHz: 60, deviceRatingA: 20, deviceKind: 'na-thermal-magnetic', conductorSize: '12 AWG', conductorMaterial: 'cu' };
const toaster = { name: 'Toaster oven', nameplateA: 9, connection: 'cord-and-plug' };

interface Reason { verdict: string; ruleId: string; citation: { code: string; edition: number | string; section: string }; message: string }

describe('/api/v1/circuits/{circuitId}/check', () => {
  let t: TestApp;
  let siteId: string;

  async function circuitWith(circuit: object, loads: object[]): Promise<string> {
    const auth = await t.auth();
    const { body } = await request(t.app).post(`/api/v1/sites/${siteId}/circuits`).set(auth).send(circuit).expect(201);
    for (const load of loads) await request(t.app).post(`/api/v1/circuits/${body.id}/loads`).set(auth).send(load).expect(201);
    return body.id as string;
  }

  beforeAll(async () => {
    t = await makeTestApp();
    siteId = (await request(t.app).post('/api/v1/sites').set(await t.auth()).send({ name: 'Check site' })).body.id;
  });
  afterAll(() => t.close());

  it('when a 13 A motor starting at 30 A for 0.3 s joins a 9 A load on a 20 A circuit, then over the limit on the 22 A running sum, not on the start', async () => {
    // source: worked stacking example, trade-facts 6.2 #26 (invented loads), computed by hand:
    // running sum 9 + 13 = 22 A > 20 A rating (NEC 210.23: a branch circuit never carries more than its rating);
    // headroom 20 − 22 = −2 A; aligned start 30 + 9 = 39 A = 1.95 × In, far below the 5 × In (100 A) no-trip edge
    // of the North-American profile (from memory), margin 100 − 39 = 61 A.
    const circuitId = await circuitWith(kitchen20, [toaster]);
    const vacuum = { name: 'Shop vacuum', nameplateA: 13, connection: 'cord-and-plug', startPeakA: 30, startDurationS: 0.3 };
    const res = await request(t.app).post(`/api/v1/circuits/${circuitId}/check`).set(await t.auth('viewer')).send({ extraLoads: [vacuum] });
    expect(res.status).toBe(200);
    expect(HeadroomCheck.strict().safeParse(res.body).error).toBeUndefined();
    expect(res.body.verdict).toBe('over-the-limit');
    expect(res.body.verdictLabel).toBe('Over the limit');
    const first = res.body.reasons[0] as Reason;
    expect(first).toMatchObject({ verdict: 'over-the-limit', ruleId: 'nec-210.23-total-within-rating', citation: { code: 'NFPA 70', edition: 2023, section: '210.23' } });
    expect(res.body.summary).toContain('22 A');
    const overReasons = (res.body.reasons as Reason[]).filter((r) => r.verdict === 'over-the-limit').map((r) => r.ruleId);
    expect(overReasons).toEqual(['nec-210.23-total-within-rating']);
    expect((res.body.reasons as Reason[]).some((r) => r.ruleId === 'instantaneous-band')).toBe(false);
    expect(res.body.steady.runningTotalA).toBeCloseTo(22, 9);
    expect(res.body.headroomA).toBeCloseTo(-2, 9);
    const vacuumStart = res.body.startUps.find((s: { startingLoad: string }) => s.startingLoad === 'Shop vacuum (what-if)');
    expect(vacuumStart).toMatchObject({ othersRunningA: 9, loadPeakA: 30, stackedPeakA: 39, startUpSource: 'events' });
    expect(vacuumStart.instantaneous).toMatchObject({ outcome: 'will-not-trip', noTripA: 100 });
    expect(vacuumStart.instantaneous.multipleOfRating).toBeCloseTo(1.95, 9);
    expect(res.body.startHeadroomA).toBeCloseTo(61, 9);
    expect(res.body.loads.map((l: { name: string; whatIf: boolean }) => [l.name, l.whatIf])).toEqual([['Toaster oven', false], ['Shop vacuum (what-if)', true]]);
    // the what-if stored nothing
    expect((await request(t.app).get(`/api/v1/circuits/${circuitId}/loads`).set(await t.auth())).body.total).toBe(1);
  });

  it('when the 9 A load is alone, then fine with 11 A of headroom and every caution', async () => {
    // derived: 20 − 9 = 11 A; 9 A is below 90 % of every limit (16 A cord-and-plug share, 20 A rating)
    const circuitId = await circuitWith(kitchen20, [toaster]);
    const res = await request(t.app).get(`/api/v1/circuits/${circuitId}/check`).set(await t.auth());
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({ verdict: 'fine', reasons: [], headroomA: 11 });
    expect(res.body.cautions.map((c: { id: string }) => c.id)).toEqual(
      expect.arrayContaining(['qualified-persons', 'local-codes', 'measurement-category', 'maker-curve']),
    );
    expect(res.body.cautions.find((c: { id: string }) => c.id === 'local-codes').text).toContain('2023');
  });

  it('when one plug-in appliance draws 17 A on a 20 A shared circuit, then a dedicated circuit is advised citing the edition\'s clause', async () => {
    // source: NEC 2023 210.23(B)(1) / 2020 210.23(A)(1): one cord-and-plug load ≤ 80 % of 20 A = 16 A (trade-facts 6.2 #4)
    const circuit2023 = await circuitWith(kitchen20, [{ name: 'Commercial kettle', nameplateA: 17, connection: 'cord-and-plug' }]);
    const res2023 = await request(t.app).get(`/api/v1/circuits/${circuit2023}/check`).set(await t.auth());
    expect(res2023.body.verdict).toBe('dedicated-circuit-advised');
    expect(res2023.body.reasons[0]).toMatchObject({ ruleId: 'nec-210.23-cord-and-plug-share', citation: { edition: 2023, section: '210.23(B)(1)' } });
    const circuit2020 = await circuitWith({ ...kitchen20, necEdition: 2020 }, [{ name: 'Commercial kettle', nameplateA: 17, connection: 'cord-and-plug' }]);
    const res2020 = await request(t.app).get(`/api/v1/circuits/${circuit2020}/check`).set(await t.auth());
    expect(res2020.body.reasons[0]).toMatchObject({ citation: { edition: 2020, section: '210.23(A)(1)' } });
  });

  it('when fastened-in-place equipment totals 11 A on a 20 A circuit that also feeds receptacles, then a dedicated circuit is advised (210.23(B)(2))', async () => {
    // source: trade-facts 6.2 #5 (jadelearning.com 210.23 article): water cooler 3 A + ice machine 8 A = 11 A > 10 A (50 %)
    const circuitId = await circuitWith(kitchen20, [
      { name: 'Water cooler', nameplateA: 3, connection: 'fastened-in-place' },
      { name: 'Ice machine', nameplateA: 8, connection: 'fastened-in-place' },
    ]);
    const res = await request(t.app).get(`/api/v1/circuits/${circuitId}/check`).set(await t.auth());
    expect(res.body.verdict).toBe('dedicated-circuit-advised');
    expect(res.body.steady.fastenedInPlaceA).toBe(11);
    expect(res.body.reasons.map((r: Reason) => r.citation.section)).toContain('210.23(B)(2)');
  });

  it('when a 17 A continuous load is on a 20 A circuit, then over the limit by 210.20(A) (21.25 A needed)', async () => {
    // source: trade-facts 6.2 #8: 17 A continuous → 17 × 1.25 = 21.25 A > 20 A device (NEC 210.20(A))
    const circuitId = await circuitWith({ ...kitchen20, feedsOtherOutlets: false }, [{ name: 'Heat-trace cable', nameplateA: 17, connection: 'fastened-in-place', continuous: true }]);
    const res = await request(t.app).get(`/api/v1/circuits/${circuitId}/check`).set(await t.auth());
    expect(res.body.verdict).toBe('over-the-limit');
    expect(res.body.reasons[0]).toMatchObject({ ruleId: 'nec-210.20-continuous-load-device', citation: { section: '210.20(A)' } });
    expect(res.body.steady.requiredRatingA).toBeCloseTo(21.25, 9);
    expect(res.body.headroomA).toBeCloseTo(-1.25, 9);
  });

  it('when a 1/2 hp motor is known only by horsepower and code letter, then Table 430.248 and 430.7(B) give its figures', async () => {
    // source: NEC Table 430.248: 1/2 hp at 115 V → 9.8 A; Table 430.7(B) code J 7.1–7.99 kVA/hp →
    // LRA top of band 7.99 × 0.5 × 1000 / 115 = 34.74 A (trade-facts 6.3 #14: 30.9–34.7 A)
    const circuitId = await circuitWith({ ...kitchen20, nominalVoltageV: 115, deviceRatingA: 15, conductorSize: '14 AWG' }, [
      { name: 'Dough sheeter', motorHp: 0.5, lockedRotorCode: 'J', connection: 'cord-and-plug' },
    ]);
    const res = await request(t.app).get(`/api/v1/circuits/${circuitId}/check`).set(await t.auth());
    expect(res.status).toBe(200);
    const [load] = res.body.loads;
    expect(load).toMatchObject({ runningA: 9.8, runningSource: 'motor-table-430.248', startUpSource: 'motor-code-letter' });
    expect(load.startPeakA).toBeCloseTo((7.99 * 0.5 * 1000) / 115, 6);
    expect(res.body.assumptions.join(' ')).toContain('Table 430.248');
  });

  it('when a start reaches the C16 instantaneous band, then a dedicated circuit is advised; past 10 In, over the limit', async () => {
    // source: IEC 60898-1 curve C: no instantaneous trip at 5 In (80 A on C16), trip at 10 In (160 A) (trade-facts 6.1 #1)
    const circuitId = await circuitWith(
      { label: 'Bench', nominalVoltageV: 230, mainsHz: 50, deviceRatingA: 16, deviceKind: 'iec-c', conductorSize: '2.5 mm2', conductorMaterial: 'cu' },
      [{ name: 'Bench lamp', nameplateA: 0.5, connection: 'cord-and-plug' }],
    );
    const saw = { name: 'Table saw', nameplateA: 8, connection: 'cord-and-plug', startPeakA: 100, startDurationS: 0.1 };
    const inBand = await request(t.app).post(`/api/v1/circuits/${circuitId}/check`).set(await t.auth()).send({ extraLoads: [saw] });
    expect(inBand.body.verdict).toBe('dedicated-circuit-advised');
    expect(inBand.body.reasons[0]).toMatchObject({ ruleId: 'instantaneous-band', citation: { code: 'IEC 60898-1' } });
    const sawStart = inBand.body.startUps.find((s: { startingLoad: string }) => s.startingLoad.startsWith('Table saw'));
    expect(sawStart.stackedPeakA).toBeCloseTo(100.5, 9);
    expect(sawStart.instantaneous).toMatchObject({ outcome: 'may-trip', noTripA: 80, tripA: 160 });
    const beyond = await request(t.app).post(`/api/v1/circuits/${circuitId}/check`).set(await t.auth()).send({ extraLoads: [{ ...saw, startPeakA: 170 }] });
    expect(beyond.body.verdict).toBe('over-the-limit');
    expect(beyond.body.reasons[0].ruleId).toBe('instantaneous-band');
  });

  it('when a what-if load is invalid, then 400 points into extraLoads', async () => {
    const circuitId = await circuitWith(kitchen20, [toaster]);
    const res = await request(t.app)
      .post(`/api/v1/circuits/${circuitId}/check`).set(await t.auth())
      .send({ extraLoads: [{ name: 'Nothing known', connection: 'cord-and-plug' }, { name: 'Bad', nameplateA: 3, connection: 'glued' }] });
    expect(res.status).toBe(400);
    expect(res.body.errors.map((e: { pointer: string }) => e.pointer)).toEqual(['/extraLoads/1/connection']);
    const second = await request(t.app).post(`/api/v1/circuits/${circuitId}/check`).set(await t.auth()).send({ extraLoads: [{ name: 'Nothing known', connection: 'cord-and-plug' }] });
    expect(second.body.errors.map((e: { pointer: string }) => e.pointer)).toEqual(['/extraLoads/0/nameplateA']);
    const params = await request(t.app).get(`/api/v1/circuits/${circuitId}/check`).set(await t.auth()).query({ tightFraction: 2 });
    expect(params.status).toBe(400);
    expect(params.body.errors[0].parameter).toBe('tightFraction');
  });

  it('when the device is outside every trip model, then 409 says why', async () => {
    // source: IEC 60898-1 scope In ≤ 125 A (trade-facts 1.1)
    const circuitId = await circuitWith({ label: 'Feeder', nominalVoltageV: 230, mainsHz: 50, deviceRatingA: 160, deviceKind: 'iec-c' }, [{ name: 'Sub-board', nameplateA: 90, connection: 'fastened-in-place' }]);
    const res = await request(t.app).get(`/api/v1/circuits/${circuitId}/check`).set(await t.auth());
    expect(res.status).toBe(409);
    expect(res.body.detail).toContain('125');
  });

  it('when the circuit belongs to another organisation, then 404; when an ingest key asks, then 403', async () => {
    const m = t.db.models;
    const otherOrg = randomUUID();
    await m.Organisation.create({ id: otherOrg, name: 'Other' });
    const site = await m.Site.create({ id: randomUUID(), organisationId: otherOrg, name: 'Theirs', address: null, clientContact: null, notes: null });
    const theirs = await m.Circuit.create({ id: randomUUID(), organisationId: otherOrg, siteId: site.id, ...kitchen20, deviceKind: 'na-thermal-magnetic', conductorMaterial: 'cu', feedsOtherOutlets: true, necEdition: 2023, notes: null });
    expect((await request(t.app).get(`/api/v1/circuits/${theirs.id}/check`).set(await t.auth())).status).toBe(404);
    expect((await request(t.app).post(`/api/v1/circuits/${theirs.id}/check`).set(await t.auth()).send({ extraLoads: [] })).status).toBe(404);
    const mine = await circuitWith(kitchen20, [toaster]);
    expect((await request(t.app).get(`/api/v1/circuits/${mine}/check`).set(await t.auth({ keyScopes: ['ingest'] }))).status).toBe(403);
    expect((await request(t.app).get(`/api/v1/circuits/${mine}/check`).set(await t.auth({ keyScopes: ['read'] }))).status).toBe(200);
  });
});
