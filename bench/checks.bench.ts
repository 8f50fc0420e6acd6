/**
 * Headroom checks and reports (`npm run bench -- checks`): the demo organisation seeded with its recorded
 * traces on a temporary SQLite file, then, in-process through the services (no HTTP):
 * - the check of each demo circuit (its loads' traces read through trace storage: events, envelope);
 * - a what-if check of the counter circuit with three hypothetical loads (nameplates only);
 * - the circuit PDF and CSV of the counter circuit, and the site PDF of the hall.
 * Prints the median and p90 wall time of each over BENCH_RUNS runs (default 20) and the report sizes.
 */
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { performance } from 'node:perf_hooks';
import { testConfig } from '../api/src/config/config.js';
import { openDatabase } from '../api/src/db/open.js';
import { createServices } from '../api/src/services/index.js';
import { DEMO_CIRCUITS, DEMO_ORGANISATION, DEMO_SITES, rawReadings, seedDemo, type StoreDemoSamples } from '../seeds/demo.js';

const RUNS = Number(process.env.BENCH_RUNS ?? 20);

function quantile(sorted: number[], q: number): number {
  return sorted[Math.min(sorted.length - 1, Math.floor(q * sorted.length))]!;
}

async function time(label: string, run: () => Promise<unknown>): Promise<unknown> {
  let last: unknown;
  last = await run(); // warm-up: caches, JIT
  const ms: number[] = [];
  for (let i = 0; i < RUNS; i++) {
    const t0 = performance.now();
    last = await run();
    ms.push(performance.now() - t0);
  }
  ms.sort((a, b) => a - b);
  console.log(`${label.padEnd(46)} median ${quantile(ms, 0.5).toFixed(1).padStart(7)} ms   p90 ${quantile(ms, 0.9).toFixed(1).padStart(7)} ms`);
  return last;
}

const dir = mkdtempSync(path.join(tmpdir(), 'headroom-bench-checks-'));
try {
  const databaseFile = path.join(dir, 'bench.sqlite');
  const db = await openDatabase({ databaseFile });
  const services = createServices(db, testConfig({ databaseFile }));
  const scope = { organisationId: DEMO_ORGANISATION.id, actor: { kind: 'system' as const, id: 'system' as const } };
  const store: StoreDemoSamples = async (_db, trace, startTime) => {
    const body = Buffer.from(JSON.stringify({ start: startTime.getTime(), rate: trace.sampleRateHz, values: Array.from(rawReadings(trace)) }));
    await services.traces.append(scope, trace.id, {
      contentType: 'application/json',
      contentLength: body.length,
      options: {},
      body: (async function* () {
        yield body;
      })(),
      idempotencyKey: undefined,
    });
    await services.traces.close(scope, trace.id);
  };
  await seedDemo(db, store);
  console.log(`demo seeded with samples; ${RUNS} runs each\n`);

  for (const circuit of DEMO_CIRCUITS) {
    await time(`check ${circuit.label}`, () => services.checks.check(scope, circuit.id));
  }
  const counter = DEMO_CIRCUITS[0]!;
  const extraLoads = [
    { name: 'Kettle', nameplateW: 1800, connection: 'cord-and-plug' as const, continuous: false },
    { name: 'Blender', nameplateA: 8, startPeakA: 30, startDurationS: 0.2, connection: 'cord-and-plug' as const, continuous: false },
    { name: 'Fan', motorHp: 0.25, connection: 'fastened-in-place' as const, continuous: false },
  ];
  await time('what-if check, counter + 3 nameplate loads', () => services.checks.check(scope, counter.id, { extraLoads }));
  const pdf = (await time('circuit PDF (counter)', () => services.reports.circuitReport(scope, counter.id, 'pdf'))) as { body: Buffer };
  const csv = (await time('circuit CSV (counter)', () => services.reports.circuitReport(scope, counter.id, 'csv'))) as { body: Buffer };
  const site = (await time('site PDF (hall, 2 circuits)', () => services.reports.siteReport(scope, DEMO_SITES[0]!.id, 'pdf'))) as { body: Buffer };
  console.log(`\nsizes: circuit PDF ${(pdf.body.length / 1024).toFixed(1)} KiB, circuit CSV ${(csv.body.length / 1024).toFixed(1)} KiB, site PDF ${(site.body.length / 1024).toFixed(1)} KiB`);
  await db.close();
} finally {
  rmSync(dir, { recursive: true, force: true });
}
