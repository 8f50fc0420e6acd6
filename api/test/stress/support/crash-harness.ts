/**
 * Crash durability: the real server in a child process on a temporary SQLite file, a client appending
 * numbered batches of samples with Idempotency-Keys (retrying every failure with the same key), and the
 * server SIGKILLed at random moments and started again. Afterwards the stored samples are read back:
 * every acknowledged batch must be there exactly once, every retried batch exactly once, and the file
 * must pass `PRAGMA integrity_check`.
 *
 * Used by api/test/stress/crash-durability.test.ts (short) and bench/crash.bench.ts (long).
 */
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { integrityCheck } from '../../../src/db/backup.js';
import { openDatabase } from '../../../src/db/open.js';
import { testConfig } from '../../../src/config/config.js';
import { createServices } from '../../../src/services/index.js';
import { ServerProcess, freePort, sleep } from './server-process.js';

export interface CrashScenario {
  /** Batches the client appends. */
  batches: number;
  samplesPerBatch: number;
  /**
   * SIGKILLs during the run. Each lands while a randomly chosen batch is on its way, at a random moment
   * within the typical round trip of a batch: before the server has read it, while it writes, or after
   * it committed but before the answer left.
   */
  kills: number;
  /** Seed for the kill timing, so a failing run can be replayed. */
  seed: number;
  /** Share of acknowledged batches sent a second time with the same key (a lost answer); default 0.1. */
  resendShare?: number;
  log?: (line: string) => void;
}

export interface CrashReport {
  batches: number;
  samplesPerBatch: number;
  kills: number;
  /** Kills that landed while a batch was waiting for its answer. */
  killsInFlight: number;
  /** Kills half-way through sending a batch body (each one forces a retry). */
  midBodyKills: number;
  acknowledged: number;
  /** Batches that needed more than one attempt. */
  retried: number;
  /** Retries after a kill answered from the idempotency record (`Idempotent-Replayed: true`). */
  replayed: number;
  /** Acknowledged batches sent again with their key and answered with the first answer. */
  resent: number;
  attempts: number;
  /** Batches found 0, 2 or more times (must be empty). */
  missing: number[];
  duplicated: number[];
  /** Samples that belong to no batch or have the wrong value (must be 0). */
  foreign: number;
  integrity: string[];
  restartMs: number[];
  elapsedMs: number;
}

/** Small deterministic generator (mulberry32) for kill timing. */
function random(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

/** Organisation and API key made in the file before the server starts (the server has no demo data). */
async function prepareDatabase(databaseFile: string): Promise<string> {
  const db = await openDatabase({ databaseFile });
  try {
    const organisationId = crypto.randomUUID();
    await db.models.Organisation.create({ id: organisationId, name: 'Crash test' });
    const services = createServices(db, testConfig({ databaseFile }));
    const { secret } = await services.apiKeys.create({ organisationId, actor: { kind: 'system', id: 'system' } }, { name: 'crash client', scopes: ['ingest', 'read'] });
    return secret;
  } finally {
    await db.close();
  }
}

/** Sample times of batch k: consecutive 10 ms steps, so batch k follows batch k-1. Values carry k. */
function batchBody(k: number, n: number, start: number) {
  const t = Array.from({ length: n }, (_, i) => start + (k * n + i) * 10);
  const a = Array.from({ length: n }, (_, i) => k + i / (2 * n));
  return { t, a };
}

export async function runCrashScenario(s: CrashScenario): Promise<CrashReport> {
  const log = s.log ?? (() => {});
  const dir = mkdtempSync(path.join(tmpdir(), 'headroom-crash-'));
  const databaseFile = path.join(dir, 'crash.sqlite');
  const began = performance.now();
  const server = new ServerProcess(databaseFile, await freePort());
  const rand = random(s.seed);
  const restartMs: number[] = [];
  try {
    const secret = await prepareDatabase(databaseFile);
    restartMs.push(await server.start());
    const base = `http://127.0.0.1:${server.port}/api/v1`;
    const auth = { Authorization: `Bearer ${secret}` };

    /** Sends a request until it gets an answer that is not a failure of the server being down. */
    async function persist(url: string, init: RequestInit | ((attempt: number) => RequestInit)): Promise<{ res: Response; attempts: number }> {
      for (let attempt = 1; attempt <= 2000; attempt++) {
        try {
          const res = await fetch(url, { ...(typeof init === 'function' ? init(attempt) : init), signal: AbortSignal.timeout(30_000) });
          if (res.status < 500 && res.status !== 429) return { res, attempts: attempt };
          await res.arrayBuffer();
        } catch {
          // Connection refused or reset: the server is down; retry with the same key.
        }
        await sleep(20);
      }
      throw new Error(`No answer from ${url}\n${server.output}`);
    }

    const created = await persist(`${base}/traces`, {
      method: 'POST',
      headers: { ...auth, 'Content-Type': 'application/json', 'Idempotency-Key': 'crash-trace' },
      body: JSON.stringify({ name: 'Crash durability', kind: 'rms' }),
    });
    if (created.res.status !== 201 && created.res.status !== 200) throw new Error(`create trace: ${created.res.status} ${await created.res.text()}`);
    const traceId = ((await created.res.json()) as { id: string }).id;
    const start = Date.parse('2026-03-02T08:00:00Z');

    // Kill points: distinct random batches.
    const killAt = new Set<number>();
    while (killAt.size < Math.min(s.kills, s.batches - 1)) killAt.add(1 + Math.floor(rand() * (s.batches - 1)));
    let kills = 0;
    let killsInFlight = 0;
    let midBodyKills = 0;
    let inFlight = false;
    let typicalRoundTripMs = 50;
    let killing: Promise<void> = Promise.resolve();
    const killNow = async () => {
      if (inFlight) killsInFlight += 1;
      await server.kill('SIGKILL');
      kills += 1;
      log(`kill ${kills}/${s.kills}${inFlight ? ' (batch in flight)' : ''}`);
      restartMs.push(await server.start());
    };

    let acknowledged = 0;
    let resent = 0;
    let retried = 0;
    let replayed = 0;
    let attempts = 0;
    for (let k = 0; k < s.batches; k++) {
      await killing;
      const body = JSON.stringify(batchBody(k, s.samplesPerBatch, start));
      // Every other kill lands half-way through sending a batch (the server holds half a body, which it
      // must not keep); the others at a random moment of a typical round trip (while the server writes,
      // or after it committed and before the answer left).
      const mode = !killAt.has(k) ? 'none' : kills % 2 === 0 ? 'mid-body' : 'random';
      if (mode === 'mid-body') midBodyKills += 1;
      let killed: () => void = () => {};
      const killDone = new Promise<void>((resolve) => (killed = resolve));
      // Late in the round trip, where the server has often committed but not yet answered.
      if (mode === 'random') killing = sleep((0.5 + 0.6 * rand()) * typicalRoundTripMs).then(killNow);
      const init = (attempt: number): RequestInit => {
        const headers = { ...auth, 'Content-Type': 'application/json', 'Idempotency-Key': `crash-batch-${k}` };
        if (mode !== 'mid-body' || attempt > 1) return { method: 'POST', headers, body };
        const half = Math.floor(body.length / 2);
        const stream = new ReadableStream<Uint8Array>({
          start(controller) {
            controller.enqueue(new TextEncoder().encode(body.slice(0, half)));
            // The first half is on its way: kill the server before the rest is sent.
            killing = sleep(20).then(killNow).then(() => killed());
          },
          async pull(controller) {
            await killDone;
            controller.enqueue(new TextEncoder().encode(body.slice(half)));
            controller.close();
          },
        });
        return { method: 'POST', headers, body: stream, duplex: 'half' } as RequestInit;
      };
      inFlight = true;
      const sent = performance.now();
      const { res, attempts: n } = await persist(`${base}/traces/${traceId}/samples`, init);
      inFlight = false;
      if (n === 1) typicalRoundTripMs = 0.8 * typicalRoundTripMs + 0.2 * (performance.now() - sent);
      attempts += n;
      if (n > 1) retried += 1;
      if (res.headers.get('idempotent-replayed') === 'true') replayed += 1;
      const text = await res.text();
      if (res.status !== 200) throw new Error(`batch ${k}: ${res.status} ${text}`);
      acknowledged += 1;
      // An answer lost on the way (a dropped connection, a client that timed out): the client sends the
      // batch again with its key, and must get the first answer back without a second copy stored.
      if (rand() < (s.resendShare ?? 0.1)) {
        const again = await persist(`${base}/traces/${traceId}/samples`, init(2));
        const againText = await again.res.text();
        if (again.res.status !== 200 || again.res.headers.get('idempotent-replayed') !== 'true' || againText !== text) {
          throw new Error(`batch ${k} sent again: ${again.res.status} replayed=${again.res.headers.get('idempotent-replayed')} ${againText}`);
        }
        resent += 1;
      }
    }
    await killing;

    // Read everything back through the API, then check the file itself with the server stopped.
    const exported = await persist(`${base}/traces/${traceId}/samples?format=json`, { headers: auth });
    const { t, a } = (await exported.res.json()) as { t: number[]; a: number[] };
    await server.kill('SIGTERM');
    const seen = new Map<number, number>();
    let foreign = 0;
    for (let i = 0; i < t.length; i++) {
      const index = Math.round((t[i]! - start) / 10);
      const k = Math.floor(index / s.samplesPerBatch);
      const expected = k + (index % s.samplesPerBatch) / (2 * s.samplesPerBatch);
      if (index < 0 || k >= s.batches || Math.abs(a[i]! - expected) > 1e-9) foreign += 1;
      else seen.set(index, (seen.get(index) ?? 0) + 1);
    }
    const missing: number[] = [];
    const duplicated: number[] = [];
    for (let k = 0; k < s.batches; k++) {
      let count = 0;
      let twice = false;
      for (let i = 0; i < s.samplesPerBatch; i++) {
        const c = seen.get(k * s.samplesPerBatch + i) ?? 0;
        if (c > 0) count += 1;
        if (c > 1) twice = true;
      }
      if (count < s.samplesPerBatch) missing.push(k);
      if (twice) duplicated.push(k);
    }
    return {
      batches: s.batches,
      samplesPerBatch: s.samplesPerBatch,
      kills,
      killsInFlight,
      midBodyKills,
      acknowledged,
      retried,
      replayed,
      resent,
      attempts,
      missing,
      duplicated,
      foreign,
      integrity: await integrityCheck(databaseFile),
      restartMs,
      elapsedMs: performance.now() - began,
    };
  } finally {
    await server.kill('SIGKILL');
    rmSync(dir, { recursive: true, force: true });
  }
}
