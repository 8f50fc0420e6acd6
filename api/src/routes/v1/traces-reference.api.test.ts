/**
 * A real recording through the whole storage path: the UCI "Individual household electric power
 * consumption" subset (CC BY 4.0, Hébrail & Bérard, UCI dataset 235) in ../shared/reference-data/,
 * Global_intensity column (ampere, one reading a minute, `?` for a missing one). Ingested once as the
 * CSV file itself and once as float32 binary runs (split at the missing minutes), its statistics must
 * equal the analysis engine run on the file directly, and the README's figures.
 */
import { existsSync, readFileSync } from 'node:fs';
import { dirname, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { computeStatistics } from '../../analysis/stats/statistics.js';
import { explicitTimeAxis } from '../../analysis/time/time-axis.js';
import { makeTestApp, type TestApp } from '../../testing/make-test-app.js';

const recording = resolve(
  dirname(fileURLToPath(import.meta.url)),
  '../../../../../shared/reference-data/uci-household-power/household_power_consumption_2006-12-16_2007-01-19.txt',
);
const present = existsSync(recording);

/** Epoch ms of a d/m/yyyy date and hh:mm:ss time, read as UTC (the file gives no zone). */
function msOf(date: string, time: string): number {
  const [d, m, y] = date.split('/').map(Number);
  const [hh, mm, ss] = time.split(':').map(Number);
  return Date.UTC(y!, m! - 1, d!, hh!, mm!, ss!);
}

function readFile() {
  const text = readFileSync(recording, 'utf8');
  const ms: number[] = [];
  const amps: number[] = [];
  for (const line of text.split('\r\n').slice(1)) {
    const f = line.split(';');
    if (line === '' || f[5] === '?') continue;
    ms.push(msOf(f[0]!, f[1]!));
    amps.push(Number(f[5]));
  }
  return { text, ms, amps };
}

describe.skipIf(!present)('the UCI household recording through trace storage', () => {
  let t: TestApp;
  let auth: Record<string, string>;
  const file = present ? readFile() : { text: '', ms: [], amps: [] };
  const ids: { csv: string; binary: string } = { csv: '', binary: '' };

  beforeAll(async () => {
    t = await makeTestApp();
    auth = await t.auth();
    for (const kind of ['csv', 'binary'] as const) {
      const res = await request(t.app).post('/api/v1/traces').set(auth).send({ name: `UCI Global_intensity (${kind})`, kind: 'rms', nominalVoltageV: 230 });
      ids[kind] = res.body.id;
    }
  });
  afterAll(() => t.close());

  it('when the CSV file is posted with its columns named, then every reading is stored and the missing ones skipped', async () => {
    const res = await request(t.app)
      .post(`/api/v1/traces/${ids.csv}/samples?dateColumn=Date&timeColumn=Time&valueColumn=Global_intensity&missing=?`)
      .set(auth)
      .set('Content-Type', 'text/csv')
      .send(file.text);
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    // source: shared/reference-data/README.md, "Check figures": 48,424 rows, 48,419 with a value, 5 missing
    expect(res.body).toMatchObject({ accepted: 48419, skipped: 5, timeFormat: 'd/m/y', csv: { delimiter: ';', decimal: '.' } });
  });

  it('when the same readings are posted as float32 binary runs between the missing minutes, then the same samples are stored', async () => {
    let start = 0;
    for (let i = 1; i <= file.ms.length; i++) {
      if (i < file.ms.length && file.ms[i]! - file.ms[i - 1]! === 60_000) continue;
      const run = Float32Array.from(file.amps.slice(start, i));
      const res = await request(t.app)
        .post(`/api/v1/traces/${ids.binary}/samples?start=${file.ms[start]}&rate=${1 / 60}`)
        .set(auth)
        .set('Content-Type', 'application/octet-stream')
        .send(Buffer.from(run.buffer));
      expect(res.status, JSON.stringify(res.body)).toBe(200);
      start = i;
    }
    const csv = await request(t.app).get(`/api/v1/traces/${ids.csv}/stats`).set(auth);
    const bin = await request(t.app).get(`/api/v1/traces/${ids.binary}/stats`).set(auth);
    expect(bin.body.statistics.count).toBe(48419);
    for (const key of ['count', 'minA', 'maxA', 'maxAt', 'minAt', 'firstAt', 'lastAt', 'gaps']) expect(bin.body.statistics[key]).toEqual(csv.body.statistics[key]);
    for (const key of ['meanA', 'rmsA', 'standardDeviationA', 'timeWeightedMeanA', 'thermalEquivalentA', 'chargeAh', 'energyKWh']) {
      expect(bin.body.statistics[key]).toBeCloseTo(csv.body.statistics[key], 9);
    }
  });

  it('when statistics are asked, then they equal the analysis engine on the file and the README figures', async () => {
    const res = await request(t.app).get(`/api/v1/traces/${ids.csv}/stats?percentiles=true`).set(auth);
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    const s = res.body.statistics;
    // source: shared/reference-data/README.md, section 1 "Check figures" (numpy), rounded as printed there
    expect(s.count).toBe(48419);
    expect(s.minA).toBeCloseTo(0.8, 6);
    expect(s.maxA).toBeCloseTo(40.4, 5);
    expect(s.meanA).toBeCloseTo(7.1481, 4);
    expect(s.rmsA).toBeCloseTo(9.1451, 4);
    expect(s.p50A).toBeCloseTo(6.0, 5);
    expect(s.p95A).toBeCloseTo(17.6, 5);
    expect(s.p99A).toBeCloseTo(25.0, 5);
    expect(new Date(s.maxAt).toISOString()).toBe('2007-01-13T22:47:00.000Z');

    // The engine on the file directly (float64 readings, times from the file): storage keeps float32,
    // so figures agree to float32 precision (about 7 significant digits).
    const origin = file.ms[0]!;
    const direct = computeStatistics(explicitTimeAxis(Float64Array.from(file.ms, (m) => (m - origin) / 1000)), Float64Array.from(file.amps), { voltageV: 230 });
    for (const key of ['meanA', 'rmsA', 'standardDeviationA', 'timeWeightedMeanA', 'thermalEquivalentA', 'chargeAh', 'energyKWh', 'p50A', 'p95A', 'p99A'] as const) {
      expect(Math.abs(s[key] - (direct[key] as number)), key).toBeLessThan(1e-6 * Math.abs(direct[key] as number));
    }
    expect(s.durationS).toBe(direct.durationS);
    expect(s.gaps.count).toBe(direct.gaps.count);
    expect(s.coveredTimeS).toBeCloseTo(direct.coveredTimeS, 6);

    // Without percentiles the answer comes from the chunk summaries and agrees with the samples' answer.
    const fast = (await request(t.app).get(`/api/v1/traces/${ids.csv}/stats`).set(auth)).body;
    expect(fast.source).toBe('summaries');
    expect(fast.statistics.p95A).toBeNull();
    for (const key of ['meanA', 'rmsA', 'timeWeightedMeanA', 'thermalEquivalentA', 'energyKWh']) expect(fast.statistics[key]).toBeCloseTo(s[key], 9);
  });

  it('when a window is asked, then it equals the engine on the same readings of the file', async () => {
    const from = Date.UTC(2006, 11, 25, 6, 0, 0);
    const to = Date.UTC(2006, 11, 26, 18, 30, 0);
    const res = await request(t.app).get(`/api/v1/traces/${ids.csv}/stats?from=${new Date(from).toISOString()}&to=${to}`).set(auth);
    const inside = file.ms.map((m, i) => [m, i] as const).filter(([m]) => m >= from && m <= to);
    const a = Float64Array.from(inside, ([, i]) => Math.fround(file.amps[i]!));
    const direct = computeStatistics(explicitTimeAxis(Float64Array.from(inside, ([m]) => (m - from) / 1000)), a, { gapThresholdS: 150 });
    expect(res.body.statistics.count).toBe(direct.count);
    for (const key of ['minA', 'maxA', 'meanA', 'rmsA', 'timeWeightedMeanA', 'thermalEquivalentA', 'chargeAh'] as const) {
      expect(res.body.statistics[key], key).toBeCloseTo(direct[key] as number, 9);
    }
  });

  it('when the trace is closed, then its analysis is stored with the file\'s percentiles', async () => {
    const res = await request(t.app).post(`/api/v1/traces/${ids.csv}/close`).set(auth);
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    expect(res.body.trace.status).toBe('closed');
    const stats = (await request(t.app).get(`/api/v1/traces/${ids.csv}/stats`).set(auth)).body;
    expect(stats.source).toBe('analysis');
    // source: shared/reference-data/README.md, "Further figures": p50 / p95 / p99 = 6.000 / 17.600 / 25.000 A
    expect(stats.statistics.p95A).toBeCloseTo(17.6, 5);
    const events = (await request(t.app).get(`/api/v1/traces/${ids.csv}/events`).set(auth)).body;
    expect(events.source).toBe('stored');
    expect(Array.isArray(events.inrushEvents)).toBe(true);
  });
});
