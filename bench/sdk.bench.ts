/**
 * SDK and CLI throughput (`npm run bench -- sdk`), against the real API on 127.0.0.1 over a temporary
 * SQLite file: `traces.append` of a uniform series (binary float32 batches) and of timed readings (JSON
 * `{t,a}` batches), each next to the same batches sent with bare `fetch` (the ratio is the SDK's own cost:
 * batching, encoding, retry wrapper, progress stream); the CLI's CSV reader on the UCI household file
 * alone, and `headroom push` of that file end to end. Medians of RUNS runs.
 */
import { readFileSync } from 'node:fs';
import type { Server } from 'node:http';
import type { AddressInfo } from 'node:net';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { makeTestApp } from '../api/src/testing/make-test-app.js';
import { planCsv, readCsvBatches } from '../sdk/src/cli/csv-source.js';
import { runCli } from '../sdk/src/cli/program.js';
import { createHeadroom } from '../sdk/src/index.js';
import { sampleBatches, type Samples } from '../sdk/src/samples.js';

const RUNS = Number(process.env.SDK_BENCH_RUNS ?? 3);
const UNIFORM = 2_000_000;
const TIMED = 500_000;
const here = path.dirname(fileURLToPath(import.meta.url));
const UCI_FILE = path.resolve(here, '../../shared/reference-data/uci-household-power/household_power_consumption_2006-12-16_2007-01-19.txt');

const t = await makeTestApp({ file: true });
const server: Server = await new Promise((resolve) => {
  const s = t.app.listen(0, '127.0.0.1', () => resolve(s));
});
const baseUrl = `http://127.0.0.1:${(server.address() as AddressInfo).port}`;
const token = ((await t.auth('engineer')).Authorization ?? '').replace('Bearer ', '');
const headroom = createHeadroom({ baseUrl, token });

const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[xs.length >> 1] ?? NaN;
const rate = (count: number, ms: number) => `${(count / (ms / 1000) / 1e6).toFixed(2)} M samples/s`;

async function timed(run: () => Promise<void>): Promise<number> {
  const times: number[] = [];
  for (let i = 0; i < RUNS; i++) {
    const start = performance.now();
    await run();
    times.push(performance.now() - start);
  }
  return median(times);
}

async function newTrace(kind: 'rms' | 'waveform') {
  return headroom.traces.create({ name: `bench ${kind}`, kind, sampleRateHz: kind === 'waveform' ? 10_000 : null, startTime: Date.UTC(2026, 0, 1) });
}

/** The same batches as the SDK sends, with bare fetch: no retry wrapper, no progress stream. */
async function bareAppend(traceId: string, samples: Samples) {
  for (const batch of sampleBatches(samples)) {
    const query = new URLSearchParams(Object.entries(batch.query).map(([k, v]): [string, string] => [k, String(v)]));
    const response = await fetch(`${baseUrl}/api/v1/traces/${traceId}/samples?${query}`, { method: 'POST', headers: { Authorization: `Bearer ${token}`, 'Content-Type': batch.contentType }, body: batch.body as BodyInit });
    if (!response.ok) throw new Error(`bare append: ${response.status} ${await response.text()}`);
    await response.arrayBuffer();
  }
}

const values = new Float32Array(UNIFORM);
for (let i = 0; i < UNIFORM; i++) values[i] = 10 * Math.sin((2 * Math.PI * 50 * i) / 10_000);
const times = Array.from({ length: TIMED }, (_, i) => Date.UTC(2026, 0, 1) + i * 100);
const amps = Array.from({ length: TIMED }, (_, i) => 5 + (i % 10) / 10);

const sdkBinary = await timed(async () => void (await headroom.traces.append((await newTrace('waveform')).id, { values, rate: 10_000 })));
const bareBinary = await timed(async () => bareAppend((await newTrace('waveform')).id, { values, rate: 10_000 }));
const sdkJson = await timed(async () => void (await headroom.traces.append((await newTrace('rms')).id, { t: times, a: amps })));
const bareJson = await timed(async () => bareAppend((await newTrace('rms')).id, { t: times, a: amps }));

const csvRows = 48_419; // readings with a value in the UCI subset (shared/reference-data/README.md)
const csvRead = await timed(async () => {
  const options = { currentColumn: 'Global_intensity', missing: ['', '?'] };
  const plan = await planCsv(UCI_FILE, options);
  for await (const batch of readCsvBatches(UCI_FILE, plan, options)) void batch;
});
const quiet = { write: () => true };
const push = await timed(async () => {
  const code = await runCli(['push', UCI_FILE, '--new', '--name', 'bench push', '--current-column', 'Global_intensity', '--missing', '?', '--json'], { stdout: quiet, stderr: quiet, env: { HEADROOM_URL: baseUrl, HEADROOM_KEY: token } });
  if (code !== 0) throw new Error(`push exited ${code}`);
});

console.log(`node ${process.version}, median of ${RUNS} runs, API on 127.0.0.1 over a temporary SQLite file`);
console.log(`append, uniform ${UNIFORM.toLocaleString('en')} samples (binary float32, 262,144 per batch)`);
console.log(`  SDK traces.append          ${rate(UNIFORM, sdkBinary)} (${sdkBinary.toFixed(0)} ms)`);
console.log(`  bare fetch, same batches   ${rate(UNIFORM, bareBinary)} (${bareBinary.toFixed(0)} ms)`);
console.log(`  → SDK / bare time          ${(sdkBinary / bareBinary).toFixed(2)}`);
console.log(`append, timed ${TIMED.toLocaleString('en')} readings (JSON {t,a}, 50,000 per batch)`);
console.log(`  SDK traces.append          ${rate(TIMED, sdkJson)} (${sdkJson.toFixed(0)} ms)`);
console.log(`  bare fetch, same batches   ${rate(TIMED, bareJson)} (${bareJson.toFixed(0)} ms)`);
console.log(`  → SDK / bare time          ${(sdkJson / bareJson).toFixed(2)}`);
console.log(`CLI on the UCI household file (${(readFileSync(UCI_FILE).length / 1e6).toFixed(1)} MB, ${csvRows.toLocaleString('en')} readings)`);
console.log(`  CSV reader alone           ${(csvRows / (csvRead / 1000) / 1e3).toFixed(0)} k rows/s (${csvRead.toFixed(0)} ms)`);
console.log(`  headroom push, end to end  ${(csvRows / (push / 1000) / 1e3).toFixed(0)} k rows/s (${push.toFixed(0)} ms)`);
console.log(`  → push / reader time       ${(push / csvRead).toFixed(2)}`);

server.closeAllConnections();
server.close();
await t.close();
