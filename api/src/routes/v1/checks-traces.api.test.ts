import { parse } from 'csv-parse/sync';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { makeTestApp, type TestApp } from '../../testing/make-test-app.js';
import { binaryBody, pdfText } from '../../testing/pdf-response.js';
import { HeadroomCheck } from './schemas/checks.js';

const T0 = Date.UTC(2026, 0, 5, 9, 0, 0);

/**
 * An invented logger recording at 10 Hz: off for 2 s, a start at `startA` for 0.3 s, running at `runningA` for
 * 20 s, off for 5 s. Shaped so the figures the check must find can be read off by hand.
 */
function recording(startA: number, runningA: number): { t: number[]; a: number[] } {
  const levels = [...Array(20).fill(0), ...Array(3).fill(startA), ...Array(200).fill(runningA), ...Array(50).fill(0)] as number[];
  return { t: levels.map((_, i) => T0 + i * 100), a: levels };
}

describe('the headroom check on recorded traces', () => {
  let t: TestApp;
  let circuitId: string;
  let mixerId: string;

  beforeAll(async () => {
    t = await makeTestApp();
    const auth = await t.auth();
    const siteId = (await request(t.app).post('/api/v1/sites').set(auth).send({ name: 'Bakery' })).body.id;
    circuitId = (
      await request(t.app)
        .post(`/api/v1/sites/${siteId}/circuits`)
        .set(auth)
        .send({ label: 'Prep bench', nominalVoltageV: 120, mainsHz: 60, deviceRatingA: 20, deviceKind: 'na-thermal-magnetic', conductorSize: '12 AWG', conductorMaterial: 'cu' })
    ).body.id;
    mixerId = (await request(t.app).post(`/api/v1/circuits/${circuitId}/loads`).set(auth).send({ name: 'Mixer', nameplateA: 9.5, connection: 'cord-and-plug' })).body.id;
    await request(t.app).post(`/api/v1/circuits/${circuitId}/loads`).set(auth).send({ name: 'Kettle', nameplateA: 12.5, connection: 'cord-and-plug' }).expect(201);
    const trace = await request(t.app).post('/api/v1/traces').set(auth).send({ name: 'Mixer, dough batch', kind: 'rms', loadId: mixerId, sampleRateHz: 10 });
    expect(trace.status, JSON.stringify(trace.body)).toBe(201);
    const samples = await request(t.app).post(`/api/v1/traces/${trace.body.id}/samples`).set(auth).set('Content-Type', 'application/json').send(JSON.stringify(recording(30, 8)));
    expect(samples.status, JSON.stringify(samples.body)).toBe(200);
    expect((await request(t.app).post(`/api/v1/traces/${trace.body.id}/close`).set(auth)).status).toBe(200);
  });
  afterAll(() => t.close());

  it('when a load has a recorded trace, then its running current, start and duty come from the trace', async () => {
    // invented recording, read by hand: steady 8 A after a 30 A start lasting 0.3 s; the kettle (no trace) 12.5 A
    // → running sum 20.5 A > 20 A (NEC 2023 210.23): over the limit; aligned start 30 + 12.5 = 42.5 A
    const res = await request(t.app).get(`/api/v1/circuits/${circuitId}/check`).set(await t.auth());
    expect(res.status).toBe(200);
    expect(HeadroomCheck.strict().safeParse(res.body).error).toBeUndefined();
    const mixer = res.body.loads.find((l: { name: string }) => l.name === 'Mixer');
    expect(mixer).toMatchObject({ runningSource: 'trace', startUpSource: 'events' });
    expect(mixer.runningA).toBeCloseTo(8, 6);
    expect(mixer.startPeakA).toBeCloseTo(30, 6);
    expect(mixer.usedTraceIds).toHaveLength(1);
    expect(mixer.inrushEvents).toHaveLength(1);
    expect(mixer.inrushEvents[0].peakA).toBeCloseTo(30, 6);
    expect(res.body.verdict).toBe('over-the-limit');
    expect(res.body.steady.runningTotalA).toBeCloseTo(20.5, 6);
    const start = res.body.startUps.find((s: { startingLoad: string }) => s.startingLoad === 'Mixer');
    expect(start.stackedPeakA).toBeCloseTo(42.5, 6);
    expect(start.basis).toBe('sample-rms');
    expect(res.body.assumptions.join(' ')).toContain('steady current after its recorded starts');
  });

  it('when a load\'s only trace has no samples yet, then the nameplate is used and the answer says so', async () => {
    const auth = await t.auth();
    const fan = (await request(t.app).post(`/api/v1/circuits/${circuitId}/loads`).set(auth).send({ name: 'Extract fan', nameplateA: 1.2, connection: 'fastened-in-place' })).body.id;
    await request(t.app).post('/api/v1/traces').set(auth).send({ name: 'Fan, not yet recorded', kind: 'rms', loadId: fan }).expect(201);
    const res = await request(t.app).get(`/api/v1/circuits/${circuitId}/check`).set(auth);
    const load = res.body.loads.find((l: { name: string }) => l.name === 'Extract fan');
    expect(load).toMatchObject({ runningSource: 'nameplate-amps', runningA: 1.2, usedTraceIds: [] });
    expect(load.traceIds).toHaveLength(1);
    expect(res.body.assumptions.join(' ')).toContain('Extract fan: its traces hold no samples yet');
  });

  it('when the report is made, then the recorded trace is plotted and its inrush listed, in the PDF and the CSV', async () => {
    const auth = await t.auth();
    const pdf = await request(t.app).get(`/api/v1/circuits/${circuitId}/report`).set(auth).buffer(true).parse(binaryBody);
    const { text } = await pdfText(pdf.body as Buffer);
    expect(text).toContain('Recorded traces');
    expect(text).toContain('Mixer: Mixer, dough batch');
    expect(text).toContain('Recorded start-ups (inrush) and surges');
    const csv = await request(t.app).get(`/api/v1/circuits/${circuitId}/report`).query({ format: 'csv' }).set(auth);
    const rows = parse(csv.text, { columns: true }) as Record<string, string>[];
    const peak = rows.find((r) => r.record === 'inrush' && r.item === 'peakA' && r.load === 'Mixer');
    expect(Number(peak!.value)).toBeCloseTo(30, 6);
    expect(peak!.detail).toContain(new Date(T0 + 2000).toISOString());
  });
});
