/**
 * Screenshots of the main pages for the README: `npm run screenshots -w dashboard`. Runs the real server
 * on a temporary database with the demo seed (as the browser tests do) and saves PNGs to docs/screenshots/.
 */
import { mkdirSync } from 'node:fs';
import path from 'node:path';
import type { Page } from 'playwright-core';
import { DEMO_CIRCUITS, DEMO_SITES, DEMO_TRACES } from '../../seeds/demo.js';
import { dashboardDir } from './support/build.js';
import { launchBrowser, newPage, signIn } from './support/browser.js';
import { startServer } from './support/server.js';

const outDir = path.resolve(dashboardDir, '../docs/screenshots');

async function settle(page: Page) {
  await page.waitForLoadState('networkidle');
  // Let fonts and charts finish their first paint.
  await page.evaluate(() => document.fonts.ready);
  await page.waitForTimeout(300);
}

async function shoot(page: Page, name: string, fullPage = true) {
  await settle(page);
  await page.screenshot({ path: path.join(outDir, `${name}.png`), fullPage });
  console.log(`saved docs/screenshots/${name}.png`);
}

const server = await startServer();
const browser = await launchBrowser();
try {
  mkdirSync(outDir, { recursive: true });
  const signedOut = await newPage(browser, server.baseUrl);
  await signedOut.page.goto('/sign-in');
  await shoot(signedOut.page, 'sign-in', false);
  await signedOut.context.close();

  const { page } = await newPage(browser, server.baseUrl);
  await signIn(page, 'admin', '/traces');
  await shoot(page, 'traces');

  const mixer = DEMO_TRACES[0]!;
  await page.goto(`/traces/${mixer.id}`);
  await page.locator('canvas[data-drawn="true"]').first().waitFor();
  await shoot(page, 'trace');

  await page.getByRole('button', { name: /Zoom the chart to Inrush 1/ }).click();
  await page.waitForURL(/event=/);
  await page.locator('canvas[data-drawn="true"]').first().waitFor();
  await shoot(page, 'trace-zoomed-inrush', false);

  const compressor = DEMO_TRACES.find((t) => t.kind === 'waveform')!;
  await page.goto(`/traces/${compressor.id}`);
  await page.locator('canvas[data-drawn="true"]').first().waitFor();
  await shoot(page, 'trace-waveform', false);

  await page.goto(`/sites/${DEMO_SITES[0]!.id}`);
  await shoot(page, 'site');

  await page.goto(`/circuits/${DEMO_CIRCUITS[0]!.id}`);
  await page.getByTestId('verdict').first().waitFor();
  await page.locator('canvas[data-chart-name="time-current"][data-drawn="true"]').waitFor();
  await shoot(page, 'circuit');

  await page.goto('/upload');
  await page.setInputFiles('#csv-file', {
    name: 'cooler-logger.csv',
    mimeType: 'text/csv',
    buffer: Buffer.from(
      'Time;Clamp (mV)\n2026-03-01 14:00:00,0;3,1\n2026-03-01 14:00:00,5;96,4\n2026-03-01 14:00:01,0;501,7\n2026-03-01 14:00:01,5;131,0\n',
    ),
  });
  await page.getByTestId('csv-preview').waitFor();
  await shoot(page, 'upload');

  await page.goto('/admin/api-keys');
  await shoot(page, 'admin-api-keys', false);

  const tablet = await newPage(browser, server.baseUrl, { width: 820, height: 1180 });
  await signIn(tablet.page, 'viewer', `/circuits/${DEMO_CIRCUITS[1]!.id}`);
  await tablet.page.getByTestId('verdict').first().waitFor();
  await shoot(tablet.page, 'circuit-tablet-viewer', false);
} finally {
  await browser.close();
  await server.close();
}
