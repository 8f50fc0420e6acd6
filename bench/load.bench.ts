/**
 * Load (`npm run bench -- load`): the real server in a child process on a temporary SQLite file, driven
 * by autocannon over 127.0.0.1 only, for a bounded time (LOAD_SECONDS, default 15 s per run).
 *
 * - Integrators: each connection has its own API key and trace, and appends JSON batches of 1,000
 *   samples (`{"t": [...], "a": [...]}`) with an Idempotency-Key.
 * - Engineers: each connection has its own read key and asks for statistics of random windows, chart
 *   envelopes and the trace list of a trace of 1,000,000 samples.
 *
 * Run 1 (LOAD_INTEGRATORS + LOAD_ENGINEERS connections) prints throughput, p50/p99 latency and the
 * answers by status: anything but 2xx and 429 (the per-key rate limit, by design) fails the bench.
 * Run 2 doubles the connections: the server may shed load with 429 or 503 (with Retry-After) but must
 * answer nothing else, stay up, and keep every batch it acknowledged (checked sample by sample).
 *
 * All clients come from 127.0.0.1, so the per-address limit is raised for the bench (in production they
 * come from many addresses); the per-key limit keeps its default.
 */
import autocannon from 'autocannon';
import { mkdtempSync, rmSync } from 'node:fs';
import { cpus, loadavg, tmpdir } from 'node:os';
import path from 'node:path';
import { openDatabase } from '../api/src/db/open.js';
import { testConfig } from '../api/src/config/config.js';
import { createServices } from '../api/src/services/index.js';
import { ServerProcess, freePort } from '../api/test/stress/support/server-process.js';

const SECONDS = Number(process.env.LOAD_SECONDS ?? 15);
const INTEGRATORS = Number(process.env.LOAD_INTEGRATORS ?? 16);
const ENGINEERS = Number(process.env.LOAD_ENGINEERS ?? 8);
const BATCH = 1000;
const START_MS = Date.parse('2026-03-02T08:00:00Z');
const READ_TRACE_SAMPLES = 1_000_000;

interface Slot {
  key: string;
  traceId: string;
  nextBatch: number;
  acknowledged: number[];
}

/** Keys made in the file before the server starts: an ingest key per integrator slot, a read key per engineer. */
async function prepare(databaseFile: string, integrators: number, engineers: number) {
  const db = await openDatabase({ databaseFile });
  try {
    const organisationId = crypto.randomUUID();
    await db.models.Organisation.create({ id: organisationId, name: 'Load bench' });
    const services = createServices(db, testConfig({ databaseFile }));
    const system = { organisationId, actor: { kind: 'system' as const, id: 'system' as const } };
    const ingest: string[] = [];
    for (let i = 0; i < integrators; i++) ingest.push((await services.apiKeys.create(system, { name: `integrator ${i}`, scopes: ['ingest', 'read'] })).secret);
    const read: string[] = [];
    for (let i = 0; i < engineers; i++) read.push((await services.apiKeys.create(system, { name: `engineer ${i}`, scopes: ['read'] })).secret);
    return { ingest, read };
  } finally {
    await db.close();
  }
}

async function api(base: string, key: string, method: string, url: string, body?: unknown, contentType = 'application/json') {
  const res = await fetch(`${base}${url}`, {
    method,
    headers: { Authorization: `Bearer ${key}`, ...(body !== undefined ? { 'Content-Type': contentType } : {}) },
    ...(body !== undefined ? { body: body instanceof Uint8Array ? (body as BodyInit) : JSON.stringify(body) } : {}),
  });
  const text = await res.text();
  if (!res.ok) throw new Error(`${method} ${url}: ${res.status} ${text}`);
  return text ? (JSON.parse(text) as Record<string, unknown>) : {};
}

function batchOf(seq: number) {
  const t = Array.from({ length: BATCH }, (_, i) => START_MS + (seq * BATCH + i) * 50);
  const a = t.map((_, i) => 5 + ((seq * 7 + i) % 97) / 10);
  return { t, a };
}

type Result = autocannon.Result;

interface RunFigures {
  writers: Result;
  readers: Result;
  slots: Slot[];
}

async function run(base: string, keys: { ingest: string[]; read: string[] }, integrators: number, engineers: number, readTraceId: string): Promise<RunFigures> {
  const slots: Slot[] = [];
  for (let i = 0; i < integrators; i++) {
    const trace = await api(base, keys.ingest[i]!, 'POST', '/traces', { name: `Integrator ${i} feed`, kind: 'rms' });
    slots.push({ key: keys.ingest[i]!, traceId: trace.id as string, nextBatch: 0, acknowledged: [] });
  }
  let nextSlot = 0;
  let nextReader = 0;
  const readTraceEndMs = START_MS + READ_TRACE_SAMPLES * 10;
  // One slot (key + trace) per connection; the next batch is set when the previous one is answered,
  // so a timed-out request is sent again as it was (same batch, same Idempotency-Key).
  const request = (slot: Slot) => ({
    method: 'POST' as const,
    path: `/api/v1/traces/${slot.traceId}/samples`,
    headers: { Authorization: `Bearer ${slot.key}`, 'Content-Type': 'application/json', 'Idempotency-Key': `${slot.traceId}-${slot.nextBatch}` },
    body: JSON.stringify(batchOf(slot.nextBatch)),
  });
  const writers = autocannon({
    url: base,
    connections: integrators,
    duration: SECONDS,
    timeout: 30,
    setupClient: (client) => {
      const slot = slots[nextSlot++ % slots.length]!;
      client.setRequests([request(slot)]);
      client.on('response', (status: number) => {
        if (status === 200) {
          slot.acknowledged.push(slot.nextBatch);
          slot.nextBatch += 1;
          client.setRequests([request(slot)]);
        }
      });
    },
  });
  const readers = autocannon({
    url: base,
    connections: engineers,
    duration: SECONDS,
    timeout: 30,
    requests: [
      {
        method: 'GET',
        setupRequest: (req, ctx) => {
          const context = ctx as Record<string, unknown>;
          context.key ??= keys.read[nextReader++ % keys.read.length];
          const roll = Math.random();
          const from = START_MS + Math.floor(Math.random() * READ_TRACE_SAMPLES * 9);
          const to = Math.min(readTraceEndMs, from + Math.floor(Math.random() * READ_TRACE_SAMPLES * 10));
          const url =
            roll < 0.45
              ? `/api/v1/traces/${readTraceId}/stats?from=${from}&to=${to}`
              : roll < 0.9
                ? `/api/v1/traces/${readTraceId}/series?from=${from}&to=${to}&points=600`
                : '/api/v1/traces?limit=50';
          return { ...req, path: url, headers: { Authorization: `Bearer ${context.key as string}` } };
        },
      },
    ],
  });
  const [w, r] = await Promise.all([writers, readers]);
  return { writers: w, readers: r, slots };
}

/**
 * Every acknowledged batch of every slot is stored exactly once, sample for sample. The batch that was on
 * its way when the run stopped may be stored (a client would send it again and get the first answer);
 * nothing else may be.
 */
async function verifySlots(base: string, slots: Slot[]): Promise<{ batches: number; samples: number; problems: string[] }> {
  const problems: string[] = [];
  let batches = 0;
  let samples = 0;
  for (const slot of slots) {
    const { t, a } = (await api(base, slot.key, 'GET', `/traces/${slot.traceId}/samples?format=json`)) as unknown as { t: number[]; a: number[] };
    const stored = new Map<number, number>();
    for (let i = 0; i < t.length; i++) {
      if (stored.has(t[i]!)) problems.push(`trace ${slot.traceId}: time ${t[i]} stored twice`);
      stored.set(t[i]!, a[i]!);
    }
    const allowed = new Set([...slot.acknowledged, slot.nextBatch]);
    for (const time of stored.keys()) {
      const seq = Math.floor((time - START_MS) / 50 / BATCH);
      if (!allowed.has(seq)) {
        problems.push(`trace ${slot.traceId}: a sample of batch ${seq}, never acknowledged nor in flight`);
        break;
      }
    }
    for (const seq of allowed) {
      const { t: bt, a: ba } = batchOf(seq);
      const present = bt.filter((time, i) => stored.get(time) === ba[i]).length;
      const inFlight = seq === slot.nextBatch;
      if (inFlight ? present !== 0 && present !== BATCH : present !== BATCH) problems.push(`trace ${slot.traceId}: batch ${seq} has ${present} of ${BATCH} samples`);
    }
    batches += slot.acknowledged.length;
    samples += t.length;
  }
  return { batches, samples, problems: problems.slice(0, 10) };
}

function statuses(r: Result): Record<string, number> {
  const out: Record<string, number> = {};
  for (const [code, stat] of Object.entries(r.statusCodeStats ?? {})) out[code] = stat.count ?? 0;
  if (r.errors) out.errors = r.errors;
  if (r.timeouts) out.timeouts = r.timeouts;
  return out;
}

function line(label: string, r: Result, perRequest = 1): string {
  const ok = r['2xx'];
  const rate = ok / (r.duration || SECONDS);
  return `${label.padEnd(26)} ${rate.toFixed(0).padStart(6)} ok/s${perRequest > 1 ? ` (${((rate * perRequest) / 1e6).toFixed(2)} M samples/s)` : ''}  p50 ${String(r.latency.p50).padStart(5)} ms  p99 ${String(r.latency.p99).padStart(5)} ms  ${JSON.stringify(statuses(r))}`;
}

const dir = mkdtempSync(path.join(tmpdir(), 'headroom-load-'));
const databaseFile = path.join(dir, 'load.sqlite');
let failed = false;
const server = new ServerProcess(databaseFile, await freePort(), { RATE_LIMIT_IP_PER_MINUTE: '100000000', LOG_LEVEL: 'error' });
try {
  console.log(`${cpus().length} cores, load average ${loadavg()[0]!.toFixed(1)}; ${SECONDS} s per run; batches of ${BATCH} samples as JSON`);
  const keys = await prepare(databaseFile, INTEGRATORS * 2, ENGINEERS * 2);
  await server.start();
  const base = `http://127.0.0.1:${server.port}`;
  const v1 = `${base}/api/v1`;

  // The trace engineers read: 1,000,000 samples at 100 Hz, sent as float32 at a start and rate.
  const readTrace = await api(v1, keys.ingest[0]!, 'POST', '/traces', { name: 'Engineers read this', kind: 'rms', startTime: START_MS, sampleRateHz: 100 });
  const values = new Float32Array(READ_TRACE_SAMPLES).map((_, i) => 8 + Math.sin(i / 500) * 3 + (i % 6000 < 30 ? 40 : 0));
  for (let offset = 0; offset < READ_TRACE_SAMPLES; offset += 250_000) {
    const part = values.subarray(offset, offset + 250_000);
    await api(v1, keys.ingest[0]!, 'POST', `/traces/${readTrace.id as string}/samples?valueType=float32&rate=100&start=${START_MS + offset * 10}`, new Uint8Array(part.buffer, part.byteOffset, part.byteLength), 'application/octet-stream');
  }

  for (const [name, factor] of [
    ['Run 1', 1],
    ['Run 2 (twice the connections)', 2],
  ] as const) {
    const integrators = INTEGRATORS * factor;
    const engineers = ENGINEERS * factor;
    const keysForRun = { ingest: keys.ingest.slice(0, integrators), read: keys.read.slice(0, engineers) };
    const figures = await run(v1, keysForRun, integrators, engineers, readTrace.id as string);
    const alive = server.running && (await fetch(`${base}/readyz`).then((r) => r.ok, () => false));
    const check = await verifySlots(v1, figures.slots);
    console.log(`\n${name}: ${integrators} integrators appending, ${engineers} engineers reading`);
    console.log(line('appends (1,000 samples)', figures.writers, BATCH));
    console.log(line('reads (stats/series/list)', figures.readers));
    console.log(`acknowledged batches       ${check.batches} (${check.samples.toLocaleString('en')} samples), every one stored exactly once: ${check.problems.length === 0 ? 'yes' : 'NO'}`);
    console.log(`server after the run       ${alive ? 'up, /readyz ok' : 'DOWN'}`);
    for (const p of check.problems) console.log(`  ${p}`);
    const allowed = factor === 1 ? ['2xx', '429'] : ['2xx', '429', '503'];
    const codes = [figures.writers, figures.readers].flatMap((r) => Object.entries(statuses(r)));
    const bad = codes.filter(([code, count]) => count > 0 && !(code.startsWith('2') || allowed.includes(code)));
    if (bad.length > 0 || !alive || check.problems.length > 0) {
      failed = true;
      console.log(`FAIL: ${bad.length ? `answers outside ${allowed.join('/')}: ${JSON.stringify(Object.fromEntries(bad))}` : ''}${!alive ? ' server down' : ''}${check.problems.length ? ' acknowledged batches lost or doubled' : ''}`);
    }
  }
  if (!failed) console.log('\nPASS');
} finally {
  await server.kill('SIGTERM');
  rmSync(dir, { recursive: true, force: true });
}
process.exit(failed ? 1 : 0);
