import { existsSync, readFileSync } from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { makeTestApp, type TestApp } from '../../testing/make-test-app.js';
import { AnalyzeResponse, AnalyzeParamsUsed, WaveformFigures } from './schemas/analyze.js';

const UCI = path.resolve(
  path.dirname(fileURLToPath(import.meta.url)),
  '../../../../../shared/reference-data/uci-household-power/household_power_consumption_2006-12-16_2007-01-19.txt',
);

/** Global_intensity readings with their times (epoch ms, the file's local clock read as UTC). */
function readUci(): { t: number[]; a: number[] } {
  const t: number[] = [];
  const a: number[] = [];
  for (const line of readFileSync(UCI, 'utf8').split('\n').slice(1)) {
    const f = line.trim().split(';');
    if (f.length < 6 || f[5] === '?') continue;
    const [d, m, y] = (f[0] as string).split('/');
    t.push(Date.parse(`${y}-${m!.padStart(2, '0')}-${d!.padStart(2, '0')}T${f[1]}Z`));
    a.push(Number(f[5]));
  }
  return { t, a };
}

describe('POST /api/v1/analyze', () => {
  let t: TestApp;
  beforeAll(async () => {
    t = await makeTestApp();
  });
  afterAll(() => t.close());

  it('when a sampled 60 Hz sine of 10 A peak is posted as a waveform, then RMS is 10/sqrt(2) and crest factor sqrt(2)', async () => {
    // source: textbook definitions (RMS of a sine = peak/√2, crest factor √2); trade-facts 6.5 example 19
    const rate = 7680;
    const values = Array.from({ length: rate }, (_, i) => 10 * Math.sin((2 * Math.PI * 60 * i) / rate));
    const res = await request(t.app)
      .post('/api/v1/analyze')
      .set(await t.auth())
      .send({ kind: 'waveform', rate, values, start: '2026-01-05T08:00:00.000Z', params: { mainsFrequencyHz: 60 } });
    expect(res.status).toBe(200);
    expect(res.body.waveform.rmsA).toBeCloseTo(10 / Math.SQRT2, 3);
    expect(res.body.waveform.crestFactor).toBeCloseTo(Math.SQRT2, 3);
    // source: IEC 61000-4-30 half-cycle refresh: one value per half cycle, less the first half cycle
    expect(res.body.rmsSeriesLength).toBeGreaterThanOrEqual(118);
    expect(res.body.rmsSeriesLength).toBeLessThanOrEqual(120);
    expect(res.body.firstAt).toBe(Date.parse('2026-01-05T08:00:00.000Z'));
    expect(res.body.params.mainsFrequencySource).toBe('given');
    // The answer is what openapi.yaml says, field for field (the SDK's types come from it).
    expect(AnalyzeResponse.safeParse(res.body).error).toBeUndefined();
    expect(WaveformFigures.safeParse(res.body.waveform).error).toBeUndefined();
    expect(AnalyzeParamsUsed.safeParse(res.body.params).error).toBeUndefined();
  });

  it('when a probe reads 10 mV/A through a x10 loop, then readings are scaled to amperes', async () => {
    // 10 mV/A and ten turns: 1 A in the conductor reads 100 mV. (common practice, no source)
    const res = await request(t.app)
      .post('/api/v1/analyze')
      .set(await t.auth())
      .send({ kind: 'rms', rate: 1, values: [500, 500, 500, 500], probe: { inputUnit: 'mV', sensitivityPerA: 10, loops: 10 } });
    expect(res.status).toBe(200);
    expect(res.body.statistics.meanA).toBeCloseTo(5, 9);
  });

  it('when a 1500 W heater is logged at 120 V for 2 h, then energy is 3.0 kWh and charge 25 A·h', async () => {
    // source: P = V·I·PF; trade-facts 6.5 example 21 (12.5 A at 120 V, 3.0 kWh, 25 A·h)
    const values = Array.from({ length: 121 }, () => 12.5);
    const res = await request(t.app)
      .post('/api/v1/analyze')
      .set(await t.auth())
      .send({ kind: 'rms', rate: 1 / 60, values, params: { nominalVoltageV: 120 } });
    expect(res.status).toBe(200);
    expect(res.body.statistics.energyKWh).toBeCloseTo(3.0, 6);
    expect(res.body.statistics.chargeAh).toBeCloseTo(25, 6);
    expect(res.body.params.powerFactor).toBe(1);
  });

  it.skipIf(!existsSync(UCI))('when the UCI household recording is posted, then its published figures come back', async () => {
    // source: shared/reference-data/README.md (UCI Individual household electric power consumption, CC BY 4.0):
    // 48,419 readings, min 0.800 A, max 40.400 A at 2007-01-13 22:47, mean 7.1481 A, p50/p95/p99 6.0/17.6/25.0 A
    const { t: times, a } = readUci();
    const res = await request(t.app).post('/api/v1/analyze').set(await t.auth()).send({ kind: 'rms', t: times, a });
    expect(res.status).toBe(200);
    const s = res.body.statistics;
    expect(s.count).toBe(48419);
    expect(s.minA).toBeCloseTo(0.8, 6);
    expect(s.maxA).toBeCloseTo(40.4, 6);
    expect(new Date(s.maxAt).toISOString()).toBe('2007-01-13T22:47:00.000Z');
    expect(s.meanA).toBeCloseTo(7.1481, 4);
    expect(s.p50A).toBeCloseTo(6.0, 6);
    expect(s.p95A).toBeCloseTo(17.6, 6);
    expect(s.p99A).toBeCloseTo(25.0, 6);
    // The five missing readings (README: 21/12 11:23-11:24, 30/12 10:08-10:09, 14/1 18:36) leave two
    // 3-minute steps (gaps at the default 2.5 x the 1-minute spacing) and one 2-minute step (not a gap).
    expect(s.gaps.count).toBe(2);
    expect(s.gaps.listed.map((g: { startAt: number }) => new Date(g.startAt).toISOString())).toEqual([
      '2006-12-21T11:22:00.000Z',
      '2006-12-30T10:07:00.000Z',
    ]);
  });

  it('when the body mixes formats or lengths, then each problem is pointed at', async () => {
    const mixed = await request(t.app)
      .post('/api/v1/analyze')
      .set(await t.auth())
      .send({ kind: 'rms', t: [0, '2026-01-01T00:00:01Z', 2000], a: [1, 2, 3] });
    expect(mixed.status).toBe(400);
    expect(mixed.body.errors).toEqual([{ detail: 'mixes epoch milliseconds and ISO 8601 strings', pointer: '/t/1' }]);

    const short = await request(t.app).post('/api/v1/analyze').set(await t.auth()).send({ kind: 'rms', t: [0, 1000], a: [1] });
    expect(short.status).toBe(400);
    expect(short.body.errors[0].pointer).toBe('/a');

    const back = await request(t.app).post('/api/v1/analyze').set(await t.auth()).send({ kind: 'rms', t: [0, 2000, 1000], a: [1, 2, 3] });
    expect(back.body.errors[0]).toEqual({ detail: 'timestamps must increase strictly', pointer: '/t/2' });

    const both = await request(t.app).post('/api/v1/analyze').set(await t.auth()).send({ kind: 'rms', t: [0], a: [1], rate: 1, values: [1] });
    expect(both.status).toBe(400);

    const nan = await request(t.app)
      .post('/api/v1/analyze')
      .set(await t.auth())
      .set('content-type', 'application/json')
      .send('{"kind":"rms","rate":1,"values":[1, NaN, 3]}');
    expect(nan.status).toBe(400);
    expect(nan.body.type).toBe('/problems/malformed-body');
  });

  it('when a waveform is shorter than a cycle, then a 400 problem says why', async () => {
    const res = await request(t.app).post('/api/v1/analyze').set(await t.auth()).send({ kind: 'waveform', rate: 1000, values: [0, 1, 0, -1], params: { mainsFrequencyHz: 50 } });
    expect(res.status).toBe(400);
    expect(res.body.detail).toMatch(/cycle/);
  });

  it('when event parameters are overridden, then the answer echoes them', async () => {
    const values = [0, 0, 30, 20, 12, 10, 10, 10, 10, 10, 10, 10];
    const res = await request(t.app)
      .post('/api/v1/analyze')
      .set(await t.auth())
      .send({ kind: 'rms', rate: 10, values, params: { events: { settleTolerance: 0.2, onThresholdA: 2 } } });
    expect(res.status).toBe(200);
    expect(res.body.params.events.settleTolerance).toBe(0.2);
    expect(res.body.params.events.onThresholdA).toBe(2);
    expect(res.body.params.events.onThresholdSource).toBe('given');
    expect(AnalyzeParamsUsed.safeParse(res.body.params).error).toBeUndefined();
    expect(res.body.eventsTruncated).toBe(false);
    expect(res.body.inrushEvents).toHaveLength(1);
    expect(res.body.inrushEvents[0].peakA).toBe(30);
    expect(res.body.inrushEvents[0].onsetAt).toBe(200);
  });
});
