import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DEMO_CIRCUITS, DEMO_ORGANISATION, DEMO_SITES, rawReadings, seedDemo, type StoreDemoSamples } from '../../../../seeds/demo.js';
import type { Scope } from '../../auth/scope.js';
import { mintCredentials } from '../../testing/credentials.js';
import { makeTestApp, type TestApp } from '../../testing/make-test-app.js';
import { binaryBody, pdfText } from '../../testing/pdf-response.js';

/**
 * The verdicts README "How Headroom judges a circuit" shows for the demo circuits, checked through the API on
 * the demo seed, from the nameplates alone (the seed without samples) and from the recorded traces. If the demo
 * data changes, change the README table with this test.
 */
describe('the demo circuits judged on their nameplates give the verdicts the README shows', () => {
  let t: TestApp;
  let auth: Record<string, string>;
  const [counter, cooler, bench] = DEMO_CIRCUITS;

  beforeAll(async () => {
    t = await makeTestApp();
    await seedDemo(t.db);
    auth = await mintCredentials(t.app.locals.services, DEMO_ORGANISATION.id, 'engineer');
  });
  afterAll(() => t.close());

  const check = async (id: string) => (await request(t.app).get(`/api/v1/circuits/${id}/check`).set(auth).expect(200)).body;

  it('Kitchen counter K3: over the limit — mixer 9.5 A + urn 1500 W / 120 V = 12.5 A make 22 A on a 20 A circuit', async () => {
    // source: NEC 2023 210.23 (never above the rating); 1500 W at 120 V → 12.5 A (trade-facts 6.5 #21)
    const body = await check(counter!.id);
    expect(body.verdict).toBe('over-the-limit');
    expect(body.steady.runningTotalA).toBeCloseTo(22, 9);
    expect(body.headroomA).toBeCloseTo(-2, 9);
    expect(body.reasons[0]).toMatchObject({ ruleId: 'nec-210.23-total-within-rating', citation: { edition: 2023, section: '210.23' } });
    // each alone would fit: 9.5 A and 12.5 A are within the 16 A one-appliance share, 210.23(B)(1)
    expect(body.reasons.some((r: { ruleId: string }) => r.ruleId === 'nec-210.23-cord-and-plug-share')).toBe(false);
  });

  it('Walk-in cooler K7: fine — 9.8 A continuous needs 12.25 A of a 15 A individual circuit', async () => {
    // source: NEC 210.20(A): 9.8 × 1.25 = 12.25 A ≤ 15 A; headroom 15 − 12.25 = 2.75 A; 210.22 individual circuit
    const body = await check(cooler!.id);
    expect(body.verdict).toBe('fine');
    expect(body.steady.requiredRatingA).toBeCloseTo(12.25, 9);
    expect(body.headroomA).toBeCloseTo(2.75, 9);
    expect(body.warnings).toEqual([]); // 14 AWG Cu on 15 A is within 240.4(D)
  });

  it('Bench sockets C16: tight — a 2 hp compressor start taken as 6 × 12 A = 72 A, just under the 80 A band', async () => {
    // source: NEC Table 430.248 2 hp at 230 V → 12 A; 6 × FLC start (common practice, no source);
    // IEC 60898-1 curve C no-trip edge 5 In = 80 A → 8 A to spare; headroom 16 − 8.7 = 7.3 A
    const body = await check(bench!.id);
    expect(body.verdict).toBe('tight');
    expect(body.loads[0]).toMatchObject({ startUpSource: 'motor-six-times-flc', startPeakA: 72 });
    expect(body.startHeadroomA).toBeCloseTo(8, 9);
    expect(body.headroomA).toBeCloseTo(7.3, 9);
    expect(body.reasons.map((r: { verdict: string }) => r.verdict)).toEqual(['tight']);
    expect(body.reasons[0].ruleId).toBe('thermal-band');
  });

  it('the hall\'s site report names both hall circuits with their verdicts', async () => {
    const res = await request(t.app).get(`/api/v1/sites/${DEMO_SITES[0]!.id}/report`).set(auth).buffer(true).parse(binaryBody);
    expect(res.status).toBe(200);
    const { text } = await pdfText(res.body as Buffer);
    expect(text).toContain('Kitchen counter, left (K3)');
    expect(text).toContain('Verdict: Over the limit');
    expect(text).toContain('Walk-in cooler (K7)');
    expect(text).toContain('Verdict: Fine');
    expect(text).toContain('Prepared by Test engineer');
  });
});

describe('the demo circuits judged on their recorded traces give the verdicts the README shows', () => {
  let t: TestApp;
  let auth: Record<string, string>;
  const [counter, cooler, bench] = DEMO_CIRCUITS;

  beforeAll(async () => {
    t = await makeTestApp();
    const services = t.app.locals.services;
    const scope: Scope = { organisationId: DEMO_ORGANISATION.id, actor: { kind: 'system', id: 'system' } };
    // The demo traces' samples go in through the trace service, as a logger's upload would, then each is closed.
    const store: StoreDemoSamples = async (_db, trace, startTime) => {
      const body = Buffer.from(JSON.stringify({ start: startTime.getTime(), rate: trace.sampleRateHz, values: Array.from(rawReadings(trace)) }));
      const answer = await services.traces.append(scope, trace.id, {
        contentType: 'application/json',
        contentLength: body.length,
        options: {},
        body: (async function* () {
          yield body;
        })(),
        idempotencyKey: undefined,
      });
      expect(answer.status).toBe(200);
      await services.traces.close(scope, trace.id);
    };
    await seedDemo(t.db, store);
    auth = await mintCredentials(services, DEMO_ORGANISATION.id, 'engineer');
  });
  afterAll(() => t.close());

  const check = async (id: string) => (await request(t.app).get(`/api/v1/circuits/${id}/check`).set(auth).expect(200)).body;

  it('Kitchen counter K3: still over the limit — the recorded mixer (about 8.2 A) and urn (about 12.4 A) run above 20 A together', async () => {
    // invented demo models (seeds/scenarios): mixer running 8.2 A, urn 12.4 A → about 20.6 A > 20 A (NEC 2023 210.23)
    const body = await check(counter!.id);
    expect(body.verdict).toBe('over-the-limit');
    expect(body.loads.map((l: { runningSource: string }) => l.runningSource)).toEqual(['trace', 'trace']);
    expect(body.steady.runningTotalA).toBeGreaterThan(20);
    expect(body.steady.runningTotalA).toBeLessThan(21);
    expect(body.reasons[0].ruleId).toBe('nec-210.23-total-within-rating');
  });

  it('Walk-in cooler K7: fine — about 10 A continuous needs about 12.5 A of 15 A; its 50 A starts stay below the 75 A edge', async () => {
    // source: NEC 210.20(A) (×1.25); North-American no-trip edge 5 × 15 A = 75 A (from memory); demo model LRA 50 A
    const body = await check(cooler!.id);
    expect(body.verdict).toBe('fine');
    expect(body.steady.requiredRatingA).toBeLessThan(15 * 0.9);
    expect(body.loads[0].inrushEvents.length).toBeGreaterThan(1);
    expect(body.startUps[0].stackedPeakA).toBeLessThan(75 * 0.9);
  });

  it('Bench sockets C16: fine — the recorded start, on half-cycle RMS, stays well under the 80 A edge', async () => {
    // source: IEC 60898-1 curve C no-trip edge 5 In = 80 A; the demo waveform's start is 48 A RMS with a DC offset
    const body = await check(bench!.id);
    expect(body.verdict).toBe('fine');
    expect(body.startUps[0].basis).toBe('half-cycle-rms');
    expect(body.startUps[0].stackedPeakA).toBeLessThan(80 * 0.9);
  });
});
