import { describe, expect, it } from 'vitest';
import type { Scope } from '../auth/scope.js';
import { dutyProfileFromSeries, figuresFromTraces, type RecordedInrush, type TraceReader } from './trace-figures.js';

const scope: Scope = { organisationId: 'org', actor: { kind: 'system', id: 'system' } };

/** An in-memory trace store answering the reader contract with fixed figures (invented). */
function reader(
  traces: Record<
    string,
    {
      kind: 'rms' | 'waveform';
      sampleCount: number;
      p50A: number | null;
      rmsA: number;
      events: RecordedInrush[];
      mean: Array<number | null>;
      rmsMean?: Array<number | null>;
    }
  >,
): TraceReader {
  const of = (id: string) => traces[id]!;
  return {
    async get(_s, id) {
      return {
        id,
        name: `trace ${id}`,
        kind: of(id).kind,
        sampleCount: of(id).sampleCount,
        sampleRateHz: of(id).kind === 'rms' ? 2 : 5000,
      };
    },
    async stats(_s, id, _w, options) {
      const t = of(id);
      return {
        statistics: {
          p50A: options?.percentiles ? (t.p50A ?? 0) : t.kind === 'rms' ? t.p50A : null,
          rmsA: t.rmsA,
          maxA: 0,
          durationS: 10,
        },
      };
    },
    async events(_s, id) {
      return { inrushEvents: of(id).events, surges: [] };
    },
    async series(_s, id) {
      const t = of(id);
      return {
        t: t.mean.map((_, i) => 1_000_000 + i * 500),
        mean: t.mean,
        max: t.mean,
        rms: t.rmsMean ? { mean: t.rmsMean, max: t.rmsMean } : null,
      };
    },
  };
}

const start = (peakA: number, steadyA: number, durationS: number): RecordedInrush => ({
  onsetAt: 0,
  peakA,
  steadyA,
  timeToPeakS: 0.05,
  settleTimeS: durationS,
  durationS,
  i2tA2s: peakA * peakA * 0.1,
});

describe('figuresFromTraces', () => {
  it('when starts are recorded, then running is the highest steady current and each start becomes an event on the logger basis', async () => {
    // invented recording; expected values read off the events by hand: steady 8.2 and 8.6 A → 8.6 A
    const r = reader({
      a: {
        kind: 'rms',
        sampleCount: 100,
        p50A: 3,
        rmsA: 5,
        events: [start(31, 8.2, 0.8), start(29, 8.6, 0.7)],
        mean: [0, 8, 8, 0],
      },
    });
    const f = (await figuresFromTraces(r, scope, 'Mixer', ['a']))!;
    expect(f.runningA).toBe(8.6);
    expect(f.startUp).toMatchObject({ kind: 'events', basis: 'sample-rms' });
    expect(f.startUp?.kind === 'events' && f.startUp.events.map((e) => e.peakA)).toEqual([31, 29]);
    expect(f.inrushEvents.map((e) => e.traceId)).toEqual(['a', 'a']);
    expect(Array.from(f.duty!.timesS)).toEqual([0, 0.5, 1, 1.5]);
  });

  it('when no start is recorded, then an rms trace gives its median (asking for percentiles when needed) and a waveform its RMS', async () => {
    const rms = reader({ a: { kind: 'rms', sampleCount: 100, p50A: null, rmsA: 5, events: [], mean: [4, 4] } });
    expect((await figuresFromTraces(rms, scope, 'Heater', ['a']))!.runningA).toBe(0); // p50 from the percentile call
    const wave = reader({
      w: {
        kind: 'waveform',
        sampleCount: 5000,
        p50A: null,
        rmsA: 7.07,
        events: [],
        mean: [0, 0, 0],
        rmsMean: [7, 7.1, null],
      },
    });
    const f = (await figuresFromTraces(wave, scope, 'Pump', ['w']))!;
    expect(f.runningA).toBe(7.07);
    expect(f.startUp).toBeNull();
    // the waveform's duty is its half-cycle RMS series, never the mean of instantaneous values
    expect(Array.from(f.duty!.currentA)).toEqual([7, 7.1]);
  });

  it('when a start settled within one logger interval, then it is taken to last that interval', async () => {
    // invented: a heater reading 13.1 A for one 0.5 s reading (2 Hz logger) then 12.4 A; no measured length
    const quick: RecordedInrush = {
      onsetAt: 0,
      peakA: 13.1,
      steadyA: 12.4,
      timeToPeakS: 0,
      settleTimeS: 0,
      durationS: 0,
      i2tA2s: 0,
    };
    const r = reader({ h: { kind: 'rms', sampleCount: 100, p50A: 12.4, rmsA: 12.4, events: [quick], mean: [12, 12] } });
    const f = (await figuresFromTraces(r, scope, 'Urn', ['h']))!;
    expect(f.startUp).toEqual({
      kind: 'events',
      basis: 'sample-rms',
      events: [{ peakA: 13.1, timeToPeakS: 0, durationS: 0.5 }],
    });
  });

  it('when no linked trace has samples, then null (the nameplate is used)', async () => {
    const r = reader({ e: { kind: 'rms', sampleCount: 0, p50A: null, rmsA: 0, events: [], mean: [] } });
    expect(await figuresFromTraces(r, scope, 'Urn', ['e'])).toBeNull();
  });

  it('when a series has gaps, then the buckets without samples are skipped', () => {
    const profile = dutyProfileFromSeries(
      { t: [0, 1000, 2000, 3000], mean: [1, null, 3, 4], max: [], rms: null },
      'rms',
    )!;
    expect(Array.from(profile.timesS)).toEqual([0, 2, 3]);
    expect(Array.from(profile.currentA)).toEqual([1, 3, 4]);
    expect(dutyProfileFromSeries({ t: [0], mean: [1], max: [], rms: null }, 'rms')).toBeNull();
  });
});
