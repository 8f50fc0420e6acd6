/**
 * Crash durability, long run (`npm run bench -- crash`): the server SIGKILLed 20 times at random moments
 * while a client appends 400 numbered batches of 1,000 samples with Idempotency-Keys (see
 * api/test/stress/support/crash-harness.ts). Exits non-zero when any acknowledged or retried batch is
 * missing or stored twice, or when the file fails `PRAGMA integrity_check`. `CRASH_KILLS`,
 * `CRASH_BATCHES` and `CRASH_SEED` change the run.
 */
import { loadavg } from 'node:os';
import { runCrashScenario } from '../api/test/stress/support/crash-harness.js';

const kills = Number(process.env.CRASH_KILLS ?? 20);
const batches = Number(process.env.CRASH_BATCHES ?? 400);
const seed = Number(process.env.CRASH_SEED ?? Date.now() % 1_000_000);

const report = await runCrashScenario({ batches, samplesPerBatch: 1000, kills, seed, log: (line) => process.stdout.write(`  ${line}\n`) });
const sorted = [...report.restartMs].sort((a, b) => a - b);
const median = sorted[sorted.length >> 1] ?? 0;
const ok = report.missing.length === 0 && report.duplicated.length === 0 && report.foreign === 0 && report.integrity.join() === 'ok' && report.acknowledged === batches;

console.log(`seed ${seed}, load average ${loadavg()[0]!.toFixed(1)}`);
console.log(`batches acknowledged       ${report.acknowledged} / ${batches} (${report.samplesPerBatch} samples each)`);
console.log(`SIGKILLs                   ${report.kills} (${report.midBodyKills} half-way through a body, ${report.killsInFlight} with a batch in flight)`);
console.log(`batches retried            ${report.retried} after a kill (${report.replayed} answered from the idempotency record), ${report.attempts} requests in all`);
console.log(`answers lost on purpose    ${report.resent} batches sent again with their key: first answer returned, nothing stored twice`);
console.log(`missing / stored twice     ${report.missing.length} / ${report.duplicated.length}; stray samples ${report.foreign}`);
console.log(`integrity_check            ${report.integrity.join('; ')}`);
console.log(`restart to ready           median ${(median / 1000).toFixed(1)} s, max ${((sorted[sorted.length - 1] ?? 0) / 1000).toFixed(1)} s`);
console.log(`elapsed                    ${(report.elapsedMs / 1000).toFixed(0)} s`);
console.log(ok ? 'PASS: every acknowledged batch is stored exactly once' : 'FAIL');
process.exit(ok ? 0 : 1);
