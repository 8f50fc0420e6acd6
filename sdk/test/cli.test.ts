import { execFile } from 'node:child_process';
import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { promisify } from 'node:util';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { runCli } from '../src/cli/program.js';
import { createHeadroom, type Headroom } from '../src/index.js';
import { startApiServer, type ApiServer } from './api-server.js';
import { startFlakyProxy } from './flaky-proxy.js';
import { UCI_FILE, UCI_PRESENT } from './reference-data.js';

const sdkDir = path.resolve(__dirname, '..');
const workDir = mkdtempSync(path.join(tmpdir(), 'headroom-cli-'));
const UCI_OPTIONS = ['--current-column', 'Global_intensity', '--missing', '?'];

let api: ApiServer;
let key: string;
let headroom: Headroom;

beforeAll(async () => {
  api = await startApiServer();
  key = await api.token({ keyScopes: ['ingest', 'read'] });
  headroom = createHeadroom({ baseUrl: api.baseUrl, token: await api.token('engineer') });
});
afterAll(() => api.close());

/** Runs `headroom …` in this process with HEADROOM_URL and HEADROOM_KEY set; returns its exit code and output. */
async function cli(args: string[], options: { env?: Record<string, string | undefined>; signal?: AbortSignal; tty?: boolean } = {}) {
  let stdout = '';
  let stderr = '';
  const io = {
    stdout: { write: (s: string) => (stdout += s) },
    stderr: { write: (s: string) => (stderr += s), isTTY: options.tty ?? false, columns: 100 },
    env: { HEADROOM_URL: api.baseUrl, HEADROOM_KEY: key, ...options.env },
  };
  const code = await runCli(args, io, options.signal);
  return { code, stdout, stderr, json: () => JSON.parse(stdout) as Record<string, unknown> };
}

describe('headroom push and stats, end to end', () => {
  it.skipIf(!UCI_PRESENT)('when the UCI household CSV is pushed to a new trace, then stats give the published figures', async () => {
    const push = await cli(['push', UCI_FILE, '--new', '--name', 'Household supply (UCI)', ...UCI_OPTIONS, '--json']);
    expect(push.stderr).toMatch(/created trace .*resume with: headroom push/);
    expect(push.code).toBe(0);
    // source: shared/reference-data/README.md: 48,419 readings with a value, 5 missing
    expect(push.json()).toMatchObject({ sent: 48_419, missing: 5, alreadyStored: 0, sampleCount: 48_419, batches: 1, status: 'open' });
    const traceId = push.json().traceId as string;

    const stats = await cli(['stats', traceId, '--percentiles', '--json']);
    expect(stats.code).toBe(0);
    const figures = (stats.json() as { statistics: Record<string, number> }).statistics;
    // source: shared/reference-data/README.md: min 0.800 A, max 40.400 A, mean 7.1481 A, p95 17.6 A
    expect(figures.count).toBe(48_419);
    expect(figures.minA).toBeCloseTo(0.8, 5);
    expect(figures.maxA).toBeCloseTo(40.4, 5);
    expect(figures.meanA).toBeCloseTo(7.1481, 4);
    expect(figures.p95A).toBeCloseTo(17.6, 5);

    const text = await cli(['stats', traceId, '--from', '2007-01-13T22:00:00Z', '--to', '2007-01-13T23:59:00Z']);
    expect(text.code).toBe(0);
    expect(text.stdout).toMatch(/max\s+40\.4 A at 2007-01-13T22:47:00\.000Z/);
    expect(text.stdout).toMatch(/samples\s+120\n/);

    const list = await cli(['traces', 'list']);
    expect(list.stdout).toContain(traceId);
    expect(list.stdout).toMatch(/Household supply \(UCI\)\s+rms\s+open\s+48,419/);
  });

  it.skipIf(!UCI_PRESENT)('when a push is interrupted, then a second push with --trace resumes after the last stored sample', async () => {
    const controller = new AbortController();
    // Ctrl-C lands while the third batch is on its way: that batch is not stored (all or nothing).
    const proxy = await startFlakyProxy(api.baseUrl, ({ url }) => {
      if (url.includes('/samples') && ++appends === 3) controller.abort(new DOMException('Interrupted', 'AbortError'));
      return 'pass';
    });
    let appends = 0;
    try {
      const first = await cli(['push', UCI_FILE, '--new', '--name', 'Interrupted push', ...UCI_OPTIONS, '--batch', '5000'], { env: { HEADROOM_URL: proxy.baseUrl }, signal: controller.signal });
      expect(first.code).toBe(130);
      const traceId = /--trace (\S+)/.exec(first.stderr)?.[1] ?? '';
      expect(first.stderr).toMatch(/interrupted after [\d,]+ samples; resume with: headroom push .* --trace /);
      const stored = (await headroom.traces.get(traceId)).sampleCount;
      expect(stored).toBeGreaterThanOrEqual(10_000);
      expect(stored).toBeLessThan(48_419);

      const second = await cli(['push', UCI_FILE, '--trace', traceId, ...UCI_OPTIONS, '--json']);
      expect(second.code).toBe(0);
      expect(second.stderr).toMatch(/continuing after them/);
      // The aborted batch may still have been stored after the resume looked; the push then moves on
      // after it, so every reading is stored once either way.
      const resumed = second.json() as { alreadyStored: number; sent: number; sampleCount: number };
      expect(resumed.sampleCount).toBe(48_419);
      expect(resumed.alreadyStored).toBeGreaterThanOrEqual(stored);
      expect(resumed.alreadyStored + resumed.sent).toBe(48_419);
      const exported = (await headroom.traces.export(traceId, { format: 'json' })) as { t: number[] };
      expect(new Set(exported.t).size).toBe(48_419);
    } finally {
      await proxy.close();
    }
  });

  it.skipIf(!UCI_PRESENT)('when the push runs in a terminal, then a progress bar counts the file\'s bytes to 100 %', async () => {
    const shown = await cli(['push', UCI_FILE, '--new', '--name', 'With a bar', ...UCI_OPTIONS, '--batch', '20000'], { tty: true });
    expect(shown.code).toBe(0);
    expect(shown.stderr).toMatch(/push \|.*\| 100% \| 3\.1 of 3\.1 MB \| 48,419 samples/);
    const hidden = await cli(['push', UCI_FILE, '--new', '--name', 'Without a bar', ...UCI_OPTIONS, '--no-progress'], { tty: true });
    expect(hidden.stderr).not.toMatch(/push \|/);
  });

  it('when a float32 waveform file is pushed and closed, then the trace holds every value and its events', async () => {
    const file = path.join(workDir, 'compressor.f32');
    // 1 s at 5 kHz: off for 0.2 s, then a 60 Hz current of 40 A peak settling to 12 A peak
    const rate = 5000;
    const values = new Float32Array(rate);
    for (let i = 0; i < rate; i++) {
      const s = i / rate;
      const peak = s < 0.2 ? 0 : 12 + 28 * Math.exp(-(s - 0.2) / 0.05);
      values[i] = peak * Math.sin(2 * Math.PI * 60 * s);
    }
    writeFileSync(file, values);
    const push = await cli(['push', file, '--new', '--name', 'Compressor start', '--kind', 'waveform', '--rate', String(rate), '--start', '2026-03-02T10:00:00Z', '--mains', '60', '--batch', '2000', '--close', '--json']);
    expect(push.code).toBe(0);
    expect(push.json()).toMatchObject({ sent: rate, batches: 3, sampleCount: rate, status: 'closed', firstSampleTime: Date.UTC(2026, 2, 2, 10) });
    const events = await cli(['events', push.json().traceId as string]);
    expect(events.code).toBe(0);
    expect(events.stdout).toMatch(/^1 start-up event/);
    expect(events.stdout).toMatch(/\n2026-03-02T10:00:00\.(19|20)\d+Z /);
  });

  it('when a circuit is checked, then the verdict comes with its reasons and the safety cautions', async () => {
    const site = await headroom.sites.create({ name: 'CLI check site' });
    const circuit = await headroom.circuits.create(site.id, { label: 'Counter', nominalVoltageV: 120, mainsHz: 60, deviceRatingA: 20, deviceKind: 'na-thermal-magnetic' });
    await headroom.loads.create(circuit.id, { name: 'Commercial kettle', nameplateA: 17, connection: 'cord-and-plug' });
    const check = await cli(['check', circuit.id]);
    expect(check.code).toBe(0);
    // source: NEC 2023 210.23(B)(1): one cord-and-plug load at most 80 % of 20 A = 16 A (api checks test)
    expect(check.stdout).toMatch(/^Counter: Dedicated circuit advised/);
    expect(check.stdout).toContain('210.23(B)(1)');
    expect(check.stdout).toMatch(/cautions:\n {2}- .*qualified/i);
  });
});

describe('errors and exit codes', () => {
  it('when the key is wrong, then exit 1 with the API\'s message', async () => {
    const result = await cli(['traces', 'list'], { env: { HEADROOM_KEY: 'hrk_not_a_key' } });
    expect(result.code).toBe(1);
    expect(result.stderr).toMatch(/^headroom: Authentication required \(401\): /);
  });

  it('when the trace does not exist, then exit 1 and the not-found message', async () => {
    const result = await cli(['stats', 'no-such-trace']);
    expect(result.code).toBe(1);
    expect(result.stderr).toMatch(/Not found \(404\)/);
  });

  it('when nothing listens at the URL, then exit 3 and a hint', async () => {
    const result = await cli(['traces', 'list'], { env: { HEADROOM_URL: 'http://127.0.0.1:9' } });
    expect(result.code).toBe(3);
    expect(result.stderr).toMatch(/cannot reach the API: .*after 3 attempts\n {2}\(check HEADROOM_URL or --url\)/);
  }, 20_000);

  it('when the file has a bad row, then exit 2 with its line, and nothing of that batch is sent', async () => {
    const file = path.join(workDir, 'bad.csv');
    writeFileSync(file, 'time,amps\n2026-03-02T08:00:00Z,1\n2026-03-02T08:00:01Z,lots\n');
    const result = await cli(['push', file, '--new', '--name', 'Bad file']);
    expect(result.code).toBe(2);
    expect(result.stderr).toMatch(/line 3: current "lots" in column "amps" is not a number/);
  });

  it('when options are missing or unknown, then exit 2 with usage help', async () => {
    const file = path.join(workDir, 'usage.csv');
    writeFileSync(file, 'time,amps\n2026-03-02T08:00:00Z,1\n');
    expect((await cli(['push', file])).stderr).toMatch(/--trace ID, or --new --name NAME/);
    const unknown = await cli(['stats']);
    expect(unknown.code).toBe(2);
    expect(unknown.stderr).toMatch(/missing required argument 'trace-id'/);
    expect((await cli(['traces', 'list'], { env: { HEADROOM_KEY: undefined } })).stderr).toMatch(/no API key: set HEADROOM_KEY/);
  });
});

describe('the installed command', () => {
  it('when `headroom` runs as a process through its bin, then it talks to the API with HEADROOM_URL and HEADROOM_KEY', async () => {
    const bin = JSON.parse(readFileSync(path.join(sdkDir, 'package.json'), 'utf8')).bin.headroom as string;
    const run = promisify(execFile);
    const { stdout } = await run(process.execPath, [path.join(sdkDir, bin), 'traces', 'list', '--json', '--limit', '3'], {
      env: { ...process.env, HEADROOM_URL: api.baseUrl, HEADROOM_KEY: key },
    });
    expect(Array.isArray(JSON.parse(stdout))).toBe(true);
    const failed = await run(process.execPath, [path.join(sdkDir, bin), 'stats', 'missing'], { env: { ...process.env, HEADROOM_URL: api.baseUrl, HEADROOM_KEY: key } }).catch((e: { code: number; stderr: string }) => e);
    expect(failed).toMatchObject({ code: 1 });
    expect((failed as { stderr: string }).stderr).toMatch(/Not found \(404\)/);
  });
});
