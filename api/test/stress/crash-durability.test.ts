/**
 * Crash durability (short run for `npm test`; `npm run bench -- crash` runs the long one): the server
 * is SIGKILLed at random moments while a client appends numbered batches with Idempotency-Keys.
 */
import { describe, expect, it } from 'vitest';
import { testsRunOnPostgres } from '../../src/testing/postgres-scratch-database.js';
import { runCrashScenario } from './support/crash-harness.js';

// The child server runs on its own SQLite file; the PostgreSQL run covers the same code paths elsewhere.
describe.skipIf(testsRunOnPostgres)('crash durability', () => {
  it('when the server is killed mid-ingest and restarted, then every acknowledged and retried batch is stored exactly once', async () => {
    const seed = Number(process.env.CRASH_SEED ?? Date.now() % 1_000_000);
    const report = await runCrashScenario({ batches: 40, samplesPerBatch: 500, kills: 3, resendShare: 0.2, seed });
    const context = `seed ${seed}: ${JSON.stringify(report)}`;
    expect(report.kills, context).toBe(3);
    expect(report.acknowledged, context).toBe(40);
    expect(report.missing, context).toEqual([]);
    expect(report.duplicated, context).toEqual([]);
    expect(report.foreign, context).toBe(0);
    expect(report.integrity, context).toEqual(['ok']);
    // A kill half-way through a body always makes the client send that batch again.
    expect(report.midBodyKills, context).toBe(2);
    expect(report.retried, context).toBeGreaterThanOrEqual(report.midBodyKills);
    // Batches sent again after their answer (each checked inside the run: same answer, replayed).
    expect(report.resent, context).toBeGreaterThan(0);
    // A guard against hangs only: restarts take about 2 s each on an idle machine, far longer under load.
  }, 240_000);
});
