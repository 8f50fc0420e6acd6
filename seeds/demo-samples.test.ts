import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { makeTestApp, type TestApp } from '../api/src/testing/make-test-app.js';
import { DEMO_ORGANISATION, DEMO_TRACES, seedDemo } from './demo.js';
import { demoSampleStore } from './demo-samples.js';

describe('demo seed with samples', () => {
  let t: TestApp;
  beforeAll(async () => {
    t = await makeTestApp();
    await seedDemo(t.db, demoSampleStore(t.config));
  });
  afterAll(() => t.close());

  it('when the demo is seeded, then every demo trace holds its samples and is closed with its analysis', async () => {
    const scope = { organisationId: DEMO_ORGANISATION.id, actor: { kind: 'system' as const, id: 'system' as const } };
    for (const demo of DEMO_TRACES) {
      const trace = await t.app.locals.services.traces.get(scope, demo.id);
      expect(trace.sampleCount).toBe(demo.samples().length);
      expect(trace.status).toBe('closed');
      const events = await t.app.locals.services.traces.events(scope, demo.id);
      expect(events.source).toBe('stored');
      expect(events.inrushEvents.length, demo.name).toBeGreaterThan(0);
    }
    // The cooler's logger reads 10 mV per ampere: stored readings are mV, answers are amperes.
    const cooler = DEMO_TRACES.find((d) => d.probe.inputUnit === 'mV')!;
    const stats = await t.app.locals.services.traces.stats(scope, cooler.id, {}, { percentiles: true });
    const amps = cooler.samples();
    expect(stats.statistics?.maxA).toBeCloseTo(Math.max(...amps), 3);
  });
});
