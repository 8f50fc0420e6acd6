import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { planCsv, readCsvBatches } from '../src/cli/csv-source.js';
import { createHeadroom, HeadroomConflictError, HeadroomNotFoundError, HeadroomValidationError, type Headroom } from '../src/index.js';
import type { AppendProgress } from '../src/resources/traces.js';
import { startApiServer, type ApiServer } from './api-server.js';
import { startFlakyProxy, type ProxyAction } from './flaky-proxy.js';
import { UCI_FILE, UCI_PRESENT } from './reference-data.js';

let api: ApiServer;
let headroom: Headroom;

beforeAll(async () => {
  api = await startApiServer();
  headroom = createHeadroom({ baseUrl: api.baseUrl, token: await api.token('engineer'), retry: { initialDelayMs: 10, maxDelayMs: 50 } });
});
afterAll(() => api.close());

/** The UCI household currents with their minute times (the five missing readings left out). */
async function uciSamples(): Promise<{ t: number[]; a: number[] }> {
  const options = { currentColumn: 'Global_intensity', missing: ['', '?'], batchSize: 100_000 };
  const plan = await planCsv(UCI_FILE, options);
  const t: number[] = [];
  const a: number[] = [];
  for await (const batch of readCsvBatches(UCI_FILE, plan, options)) {
    t.push(...batch.t);
    a.push(...batch.a);
  }
  return { t, a };
}

/** A deterministic test waveform: a 50 Hz sine of 10 A peak at 10 kHz with a slow ramp, as float32. */
function waveform(count: number): Float32Array {
  const values = new Float32Array(count);
  for (let i = 0; i < count; i++) values[i] = 10 * Math.sin((2 * Math.PI * 50 * i) / 10_000) + i * 1e-6;
  return values;
}

describe('traces through the SDK', () => {
  it('when a trace is created, found, changed, closed and deleted, then each answer is the stored state', async () => {
    const site = await headroom.sites.create({ name: 'Quay Road joinery' });
    const trace = await headroom.traces.create({ name: 'Planer start, morning', kind: 'rms', siteId: site.id, tags: ['planer'] });
    expect(trace).toMatchObject({ name: 'Planer start, morning', status: 'open', sampleCount: 0, siteId: site.id });
    expect(await headroom.traces.get(trace.id)).toEqual(trace);
    const renamed = await headroom.traces.update(trace.id, { name: 'Planer start, 08:10', notes: 'cold machine' });
    expect(renamed).toMatchObject({ name: 'Planer start, 08:10', notes: 'cold machine' });
    const listed = await headroom.traces.list({ siteId: site.id }).toArray();
    expect(listed.map((t) => t.id)).toEqual([trace.id]);

    // An idle 0.2 A, a 1 s start-up at 30 A, then a steady 8 A running current, one reading every 0.1 s.
    const start = Date.UTC(2026, 2, 2, 8, 10);
    const a = Array.from({ length: 300 }, (_, i) => (i < 50 ? 0.2 : i < 60 ? 30 : 8));
    const t = a.map((_, i) => start + i * 100);
    const answer = await headroom.traces.append(trace.id, { t, a });
    expect(answer).toMatchObject({ accepted: 300, sampleCount: 300, firstSampleTime: start, lastSampleTime: start + 29_900 });

    const stats = await headroom.traces.stats(trace.id, { from: start + 6_000, to: start + 29_900 });
    // common practice, no source: a constant 8 A window has min = max = mean = 8 A
    expect(stats.statistics).toMatchObject({ count: 240, minA: 8, maxA: 8 });
    const series = await headroom.traces.series(trace.id, { points: 30 });
    expect(series.t.length).toBeLessThanOrEqual(30);
    expect(Math.max(...series.max.map((v) => v ?? 0))).toBe(30);

    const closed = await headroom.traces.close(trace.id);
    expect(closed.trace.status).toBe('closed');
    const events = await headroom.traces.events(trace.id);
    expect(events.inrushEvents.length).toBe(1);
    expect(events.inrushEvents[0]).toMatchObject({ peakA: 30 });
    await expect(headroom.traces.append(trace.id, { t: [start + 60_000], a: [1] })).rejects.toBeInstanceOf(HeadroomConflictError);

    await headroom.traces.delete(trace.id);
    await expect(headroom.traces.get(trace.id)).rejects.toBeInstanceOf(HeadroomNotFoundError);
  });

  it('when 2,000,000 waveform samples are appended, then they arrive complete and in order, batch by batch', async () => {
    const count = 2_000_000;
    const values = waveform(count);
    const start = Date.UTC(2026, 2, 2, 9, 0);
    const trace = await headroom.traces.create({ name: 'Compressor start, waveform', kind: 'waveform', sampleRateHz: 10_000, mainsHz: 50, startTime: start });
    const progress: AppendProgress[] = [];
    const answer = await headroom.traces.append(trace.id, { values, rate: 10_000 }, { onBatch: (p) => progress.push(p) });
    // 2,000,000 / 262,144 samples per batch = 7.6, so 8 binary requests
    expect(progress.map((p) => p.batches)).toEqual([1, 2, 3, 4, 5, 6, 7, 8]);
    expect(progress.at(-1)).toMatchObject({ sentSamples: count, totalSamples: count });
    expect(answer).toMatchObject({ sampleCount: count, firstSampleTime: start, lastSampleTime: start + ((count - 1) / 10_000) * 1000 });

    const exported = (await headroom.traces.export(trace.id, { format: 'json' })) as { t: number[]; a: number[] };
    expect(exported.a.length).toBe(count);
    // The export prints each float32 in its shortest form: read back as float32 it is the same value.
    let mismatches = 0;
    for (let i = 0; i < count; i++) if (Math.fround(exported.a[i]!) !== values[i]) mismatches += 1;
    expect(mismatches).toBe(0);
    expect(exported.t[0]).toBe(start);
    expect(exported.t[count - 1]).toBeCloseTo(start + 199_999.9, 3);
    expect((await headroom.traces.get(trace.id)).sampleCount).toBe(count);
  });

  it.skipIf(!UCI_PRESENT)('when the UCI household recording is appended as timed JSON, then its statistics are the published figures', async () => {
    const { t, a } = await uciSamples();
    const trace = await headroom.traces.create({ name: 'Household supply, Sceaux (UCI)', kind: 'rms' });
    await headroom.traces.append(trace.id, { t, a }, { batchSize: 10_000 });
    const { statistics } = await headroom.traces.stats(trace.id, { percentiles: 'true' });
    // source: shared/reference-data/README.md (UCI household power subset, Global_intensity):
    // 48,419 readings, min 0.800 A, max 40.400 A at 2007-01-13 22:47, mean 7.1481 A, p50/p95/p99 6.0/17.6/25.0 A
    expect(statistics).toMatchObject({ count: 48_419, maxAt: Date.UTC(2007, 0, 13, 22, 47) });
    expect(statistics?.minA).toBeCloseTo(0.8, 5);
    expect(statistics?.maxA).toBeCloseTo(40.4, 5);
    expect(statistics?.meanA).toBeCloseTo(7.1481, 4);
    expect(statistics?.p50A).toBeCloseTo(6.0, 5);
    expect(statistics?.p95A).toBeCloseTo(17.6, 5);
    expect(statistics?.p99A).toBeCloseTo(25.0, 5);
  });

  it('when a CSV file is imported, then one trace holds its rows and the upload reports its bytes', async () => {
    const csv = 'time,current (A)\n' + Array.from({ length: 2000 }, (_, i) => `${1_772_438_400_000 + i * 50},${(5 + (i % 7) * 0.5).toFixed(1)}`).join('\n') + '\n';
    const seen: number[] = [];
    const result = await headroom.traces.importCsv(new Blob([csv]), { name: 'Kettle, counter socket', kind: 'rms' }, { onProgress: (p) => seen.push(p.loadedBytes) });
    expect(result.trace).toMatchObject({ name: 'Kettle, counter socket', sampleCount: 2000 });
    expect(result.import).toMatchObject({ accepted: 2000, timeFormat: 'epoch-ms' });
    expect(seen.length).toBeGreaterThan(1);
    expect(Math.max(...seen)).toBeGreaterThan(csv.length);
    const exported = await headroom.traces.export(result.trace.id, { format: 'csv' });
    expect(typeof exported === 'string' && exported.split('\n').filter(Boolean).length).toBe(2001);
  });

  it('when an import has a bad line, then HeadroomValidationError names the line and no trace is kept', async () => {
    const before = (await headroom.traces.list().toArray()).length;
    const error = await headroom.traces.importCsv('time,amps\n1772438400000,1\n1772438400050,abc\n', { name: 'Broken' }).catch((e: unknown) => e);
    expect(error).toBeInstanceOf(HeadroomValidationError);
    expect((error as HeadroomValidationError).fieldErrors[0]).toMatchObject({ line: 3 });
    expect((await headroom.traces.list().toArray()).length).toBe(before);
  });
});

describe('retries through a misbehaving connection', () => {
  it('when batches are dropped after storing, dropped before sending, or answered 429 and 503, then every sample is stored exactly once', async () => {
    // Request 0 creates the trace; then each append batch meets one kind of trouble once before it passes.
    const trouble = new Map<number, ProxyAction>([
      [0, 'drop-after'],
      [2, 'drop-after'],
      [5, '503'],
      [7, '429'],
      [9, 'drop-before'],
      [11, 'drop-after'],
    ]);
    const proxy = await startFlakyProxy(api.baseUrl, ({ index }) => trouble.get(index) ?? 'pass');
    try {
      const flaky = createHeadroom({ baseUrl: proxy.baseUrl, token: await api.token('engineer'), retry: { maxRetries: 3, initialDelayMs: 5, maxDelayMs: 20 } });
      const count = 300_000;
      const values = waveform(count);
      const before = (await headroom.traces.list({ q: 'Flaky line' }).toArray()).length;
      const trace = await flaky.traces.create({ name: 'Flaky line, waveform', kind: 'waveform', sampleRateHz: 10_000, startTime: Date.UTC(2026, 2, 3) });
      const answer = await flaky.traces.append(trace.id, { values, rate: 10_000 }, { batchSize: 50_000 });
      expect(answer.sampleCount).toBe(count);

      // The create was dropped after the API stored it: the retry got the same trace back, not a second one.
      expect((await headroom.traces.list({ q: 'Flaky line' }).toArray()).length).toBe(before + 1);
      const exported = (await headroom.traces.export(trace.id, { format: 'json' })) as { a: number[] };
      expect(exported.a.length).toBe(count);
      expect(exported.a.every((v, i) => Math.fround(v) === values[i])).toBe(true);

      // Each retry carried the key of the attempt it repeated; six batches, twelve requests in all.
      const appends = proxy.records.filter((r) => r.url.includes('/samples'));
      expect(appends).toHaveLength(6 + 5);
      const keys = appends.map((r) => r.idempotencyKey);
      expect(new Set(keys).size).toBe(6);
      for (const [index, action] of trouble) {
        if (index === 0) continue;
        expect(proxy.records[index]!.action).toBe(action);
        expect(proxy.records[index + 1]!.idempotencyKey).toBe(proxy.records[index]!.idempotencyKey);
      }
    } finally {
      await proxy.close();
    }
  });
});
