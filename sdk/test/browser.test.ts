import path from 'node:path';
import { build } from 'esbuild';
import { chromium, type Browser } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startApiServer, type ApiServer } from './api-server.js';

// Debian's chromium (never a downloaded browser), with the flags DEVELOPERS.md lists.
const CHROMIUM = process.env.CHROMIUM_PATH ?? '/usr/bin/chromium';
const FLAGS = ['--no-sandbox', '--disable-background-networking', '--disable-component-update', '--disable-sync', '--disable-gpu'];

let api: ApiServer;
let browser: Browser;
let bundle: string;

beforeAll(async () => {
  api = await startApiServer();
  // The SDK as a browser would load it: bundled for the browser platform, exposed as `Headroom`.
  const result = await build({ entryPoints: [path.resolve(__dirname, '../src/index.ts')], bundle: true, platform: 'browser', format: 'iife', globalName: 'Headroom', write: false, logLevel: 'silent' });
  bundle = `${result.outputFiles[0]!.text}\nglobalThis.Headroom = Headroom;`;
  browser = await chromium.launch({ executablePath: CHROMIUM, args: FLAGS, headless: true });
});
afterAll(async () => {
  await browser?.close();
  await api.close();
});

describe('the SDK in a browser', () => {
  it('when a CSV is imported from a page, then the upload goes through XMLHttpRequest with byte progress and the trace is stored', async () => {
    const page = await browser.newPage();
    try {
      // A page of the API's own origin, as the dashboard is (CORS stays off).
      await page.goto(`${api.baseUrl}/healthz`);
      await page.evaluate(bundle);
      const token = await api.token('engineer');
      const rows = 20_000;
      const outcome = await page.evaluate(
        async ({ token, rows }) => {
          const sdk = (globalThis as unknown as { Headroom: typeof import('../src/index.js') }).Headroom;
          const headroom = sdk.createHeadroom({ baseUrl: location.origin, token });
          let csv = 'time,current (A)\n';
          for (let i = 0; i < rows; i++) csv += `${1772438400000 + i * 100},${(4 + (i % 10) / 10).toFixed(1)}\n`;
          const file = new File([csv], 'kettle.csv', { type: 'text/csv' });
          const seen: { loaded: number; total: number }[] = [];
          let usedXhr = false;
          const open = XMLHttpRequest.prototype.open;
          XMLHttpRequest.prototype.open = function (this: XMLHttpRequest, ...args: Parameters<typeof open>) {
            usedXhr = true;
            return open.apply(this, args);
          } as typeof open;
          const result = await headroom.traces.importCsv(file, { name: 'Kettle from the browser', kind: 'rms' }, { onProgress: (p) => seen.push({ loaded: p.loadedBytes, total: p.totalBytes }) });
          const stats = await headroom.traces.stats(result.trace.id);
          let notFound = '';
          await headroom.traces.get('no-such-trace').catch((e: unknown) => (notFound = e instanceof sdk.HeadroomNotFoundError ? e.problem.type : 'wrong class'));
          return { sampleCount: result.trace.sampleCount, count: stats.statistics?.count, seen, usedXhr, notFound, size: file.size };
        },
        { token, rows },
      );
      expect(outcome.usedXhr).toBe(true);
      expect(outcome.sampleCount).toBe(rows);
      expect(outcome.count).toBe(rows);
      expect(outcome.seen.at(-1)!.loaded).toBe(outcome.seen.at(-1)!.total);
      expect(outcome.seen.at(-1)!.total).toBeGreaterThan(outcome.size);
      expect(outcome.notFound).toBe('/problems/not-found');
    } finally {
      await page.close();
    }
  });
});
