/**
 * Dashboard (`npm run bench -- dashboard`): the built dashboard served by the real server (temporary
 * SQLite file, demo seed) to Debian's headless chromium on 127.0.0.1.
 *
 * 1. Initial JavaScript, gzip: the entry script and its modulepreloads from dist/index.html, and what the
 *    browser actually fetched to show the sign-in page and the trace page (each chunk gzipped at level 6,
 *    as a server would send it).
 * 2. Time until the trace chart of a 10,000,000-sample trace (a 30 kHz, 60 Hz waveform of a motor start,
 *    333 s, closed) has drawn: from navigation start to the chart's `chart-drawn:trace` performance mark,
 *    signed in already, each run in a fresh browser context (cold HTTP cache); median and p95 of RUNS runs.
 *    Also the time of one zoom step (click to the finer envelope on screen).
 * Targets (issue 7): initial JS under 300 KB gzip; chart drawn under 1.5 s.
 */
import { readFileSync } from 'node:fs';
import { cpus, loadavg } from 'node:os';
import path from 'node:path';
import { gzipSync } from 'node:zlib';
import type { Browser } from 'playwright-core';
import { distDir } from '../dashboard/e2e/support/build.js';
import { launchBrowser } from '../dashboard/e2e/support/browser.js';
import { signInToken } from '../dashboard/e2e/support/demo-samples.js';
import { startServer } from '../dashboard/e2e/support/server.js';
import { motorStartWaveform } from '../seeds/scenarios/physical-models.js';

const RUNS = Number(process.env.DASHBOARD_BENCH_RUNS ?? 7);
const SAMPLES = 10_000_000;
const RATE_HZ = 30_000;
const BATCH = 1_000_000;
const INITIAL_JS_TARGET_KB = 300;
const CHART_TARGET_S = 1.5;

const kb = (bytes: number) => bytes / 1024;
const gz = (buf: Buffer) => gzipSync(buf, { level: 6 }).length;
const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[xs.length >> 1]!;
const p95 = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.min(xs.length - 1, Math.floor(xs.length * 0.95))]!;

console.log(
  `machine: ${cpus().length} cores, load average ${loadavg()
    .map((x) => x.toFixed(1))
    .join(' ')}`,
);

const server = await startServer(); // builds dist/ first when it is stale
const browser: Browser = await launchBrowser();
try {
  // ------------------------------------------------------------ 1. initial JavaScript
  const html = readFileSync(path.join(distDir, 'index.html'), 'utf8');
  const initialFiles = [...html.matchAll(/(?:src|href)="(\/assets\/[^"]+\.js)"/g)].map((m) => m[1]!);
  const staticGzip = initialFiles.reduce((sum, f) => sum + gz(readFileSync(path.join(distDir, f))), 0);
  console.log(
    `initial JS from index.html (${initialFiles.length} file${initialFiles.length === 1 ? '' : 's'}): ${kb(staticGzip).toFixed(1)} KB gzip`,
  );

  /** JS the page fetched while loading `url` (until the selector shows), gzipped. */
  async function jsFetchedFor(url: string, ready: string, init?: string): Promise<{ files: number; gzipKb: number }> {
    const context = await browser.newContext({ baseURL: server.baseUrl, viewport: { width: 1280, height: 900 } });
    if (init) await context.addInitScript(init);
    const page = await context.newPage();
    const bodies: Promise<Buffer>[] = [];
    page.on('response', (r) => {
      if (r.url().endsWith('.js')) bodies.push(r.body());
    });
    await page.goto(url);
    await page.locator(ready).first().waitFor({ timeout: 60_000 });
    const all = await Promise.all(bodies);
    await context.close();
    return { files: all.length, gzipKb: kb(all.reduce((s, b) => s + gz(b), 0)) };
  }

  const signInJs = await jsFetchedFor('/sign-in', 'button[type="submit"]');
  console.log(`JS fetched for the sign-in page: ${signInJs.files} files, ${signInJs.gzipKb.toFixed(1)} KB gzip`);
  console.log(
    `  target < ${INITIAL_JS_TARGET_KB} KB: ${(signInJs.gzipKb / INITIAL_JS_TARGET_KB).toFixed(2)} of the target`,
  );

  // ------------------------------------------------------------ 2. the 10M-sample trace
  const token = await signInToken(server.baseUrl, 'engineer');
  const me = (await (
    await fetch(`${server.baseUrl}/api/v1/me`, { headers: { Authorization: `Bearer ${token}` } })
  ).json()) as {
    user: unknown;
    organisation: unknown;
    sessionExpiresAt: string;
  };
  const api = async (p: string, init: RequestInit = {}) => {
    const res = await fetch(`${server.baseUrl}/api/v1${p}`, {
      ...init,
      headers: { Authorization: `Bearer ${token}`, ...(init.headers ?? {}) },
    });
    if (!res.ok) throw new Error(`${init.method ?? 'GET'} ${p}: ${res.status} ${await res.text()}`);
    return res.json() as Promise<Record<string, unknown>>;
  };
  const startTime = Date.now() - 3_600_000;
  const trace = await api('/traces', {
    method: 'POST',
    headers: { 'Content-Type': 'application/json' },
    body: JSON.stringify({
      name: 'Bench: 10M-sample motor start',
      kind: 'waveform',
      sampleRateHz: RATE_HZ,
      mainsHz: 60,
      nominalVoltageV: 230,
      startTime,
    }),
  });
  const traceId = trace.id as string;
  const samples = motorStartWaveform({
    rateHz: RATE_HZ,
    mainsHz: 60,
    durationS: SAMPLES / RATE_HZ,
    startAtS: 20,
    runningRmsA: 8.4,
    startRmsA: 48,
    tauS: 0.25,
    dcOffset: 0.5,
    noiseA: 0.05,
    seed: 7,
  });
  let t0 = performance.now();
  for (let i = 0; i < SAMPLES; i += BATCH) {
    const part = samples.slice(i, Math.min(SAMPLES, i + BATCH));
    await api(`/traces/${traceId}/samples`, {
      method: 'POST',
      headers: { 'Content-Type': 'application/octet-stream' },
      body: new Blob([part]),
    });
  }
  const ingestS = (performance.now() - t0) / 1000;
  t0 = performance.now();
  await api(`/traces/${traceId}/close`, { method: 'POST' });
  console.log(
    `set-up: ${SAMPLES.toLocaleString('en')} samples stored in ${ingestS.toFixed(1)} s, closed (analysed) in ${((performance.now() - t0) / 1000).toFixed(1)} s`,
  );

  // Signed in already: the session the dashboard keeps in sessionStorage.
  const session = JSON.stringify({
    token,
    expiresAt: me.sessionExpiresAt,
    user: me.user,
    organisation: me.organisation,
  });
  const init = `sessionStorage.setItem('headroom.session', ${JSON.stringify(session)});`;

  const traceJs = await jsFetchedFor(`/traces/${traceId}`, 'canvas[data-chart-name="trace"][data-drawn="true"]', init);
  console.log(
    `JS fetched for the trace page (with Chart.js): ${traceJs.files} files, ${traceJs.gzipKb.toFixed(1)} KB gzip`,
  );

  const drawS: number[] = [];
  const seriesMs: number[] = [];
  const zoomS: number[] = [];
  for (let run = 0; run < RUNS + 1; run++) {
    const context = await browser.newContext({ baseURL: server.baseUrl, viewport: { width: 1280, height: 900 } });
    await context.addInitScript(init);
    if (process.env.DASHBOARD_BENCH_TIMELINE) {
      await context.addInitScript(() => {
        const w = window as unknown as { longTasks: string[] };
        w.longTasks = [];
        new PerformanceObserver((list) => {
          for (const e of list.getEntries())
            w.longTasks.push(`${e.startTime.toFixed(0).padStart(6)} +${e.duration.toFixed(0)} ms long task`);
        }).observe({ type: 'longtask', buffered: true });
      });
    }
    const page = await context.newPage();
    await page.goto(`/traces/${traceId}`);
    await page.locator('canvas[data-chart-name="trace"][data-drawn="true"]').waitFor({ timeout: 60_000 });
    if (process.env.DASHBOARD_BENCH_TIMELINE && run === 1) {
      const timeline = await page.evaluate(() =>
        (performance.getEntriesByType('resource') as PerformanceResourceTiming[]).map(
          (e) =>
            `${e.startTime.toFixed(0).padStart(6)} → ${e.responseEnd.toFixed(0).padStart(6)} ms  ${e.name.replace(location.origin, '')}`,
        ),
      );
      const longTasks = await page.evaluate(() => (window as unknown as { longTasks: string[] }).longTasks);
      console.log([...timeline, ...longTasks].sort().join('\n'));
    }
    const timing = await page.evaluate(() => ({
      drawnMs: performance.getEntriesByName('chart-drawn:trace')[0]?.startTime ?? NaN,
      seriesMs:
        (performance.getEntriesByType('resource') as PerformanceResourceTiming[]).find((e) =>
          e.name.includes('/series?'),
        )?.duration ?? NaN,
    }));
    // One zoom step: click "+" and wait until the finer envelope replaced the old one on screen.
    const before = await page.evaluate(() => performance.now());
    const finer = page.waitForResponse((r) => r.url().includes('/series?') && r.url().includes('from='));
    await page.getByRole('button', { name: 'Zoom in' }).click();
    await finer;
    await page.getByText('Refining…').waitFor({ state: 'detached' });
    const zoomMs =
      (await page.evaluate(
        () => new Promise<number>((resolve) => requestAnimationFrame(() => resolve(performance.now()))),
      )) - before;
    await context.close();
    if (run === 0) continue; // warm-up: the server's first reads of the new trace
    drawS.push(timing.drawnMs / 1000);
    seriesMs.push(timing.seriesMs);
    zoomS.push(zoomMs / 1000);
  }
  const drawMedian = median(drawS);
  console.log(
    `trace chart of ${SAMPLES.toLocaleString('en')} samples drawn after: median ${drawMedian.toFixed(2)} s, p95 ${p95(drawS).toFixed(2)} s (${RUNS} cold-cache runs)`,
  );
  console.log(`  target < ${CHART_TARGET_S} s: ${(drawMedian / CHART_TARGET_S).toFixed(2)} of the target`);
  console.log(`  of which the envelope request (series?points=1200): median ${median(seriesMs).toFixed(0)} ms`);
  console.log(
    `one zoom step (click to the finer envelope drawn): median ${median(zoomS).toFixed(2)} s, p95 ${p95(zoomS).toFixed(2)} s`,
  );
} finally {
  await browser.close();
  await server.close();
}
