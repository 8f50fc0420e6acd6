// @vitest-environment node
import { describe, expect, it } from 'vitest';
import { DEMO_TRACES } from '../../seeds/demo.js';
import { newPage, paintedPixels, signIn } from './support/browser.js';
import { useServerAndBrowser } from './support/harness.js';

const e2e = useServerAndBrowser();
const mixer = DEMO_TRACES.find((t) => t.name.startsWith('Stand mixer'))!;

describe('traces', () => {
  it('when an engineer opens a seeded trace from the list, then the chart has drawn and the inrush table has rows', async () => {
    const { context, page, pageErrors } = await newPage(e2e.browser, e2e.server.baseUrl);
    await signIn(page, 'engineer', '/traces');
    const table = page.getByTestId('traces-table');
    await table.waitFor();
    expect(await table.locator('tbody tr').count()).toBe(DEMO_TRACES.length);
    await page.getByRole('link', { name: mixer.name }).click();
    await page.waitForURL(new RegExp(`/traces/${mixer.id}$`));

    const canvas = page.locator('canvas[data-chart-name="trace"]');
    await canvas.and(page.locator('[data-drawn="true"]')).waitFor();
    expect(await paintedPixels(page, 'canvas[data-chart-name="trace"]')).toBeGreaterThan(5000);
    expect(await page.getByTestId('event-row').count()).toBeGreaterThanOrEqual(2);
    await page.getByRole('button', { name: 'Zoom the chart to Inrush 1' }).waitFor();
    await page.getByText('Rating 20 A').first().waitFor();
    await page.getByTestId('figures').getByText('4,800').waitFor();
    expect(pageErrors).toEqual([]);
    await context.close();
  });

  it('when an event is chosen in the table, then the chart zooms to it and a finer envelope is fetched', async () => {
    const { context, page } = await newPage(e2e.browser, e2e.server.baseUrl);
    await signIn(page, 'viewer', `/traces/${mixer.id}`);
    await page.locator('canvas[data-chart-name="trace"][data-drawn="true"]').waitFor();
    const finer = page.waitForResponse(
      (r) => r.url().includes('/series?') && r.url().includes('from=') && r.status() === 200,
    );
    await page.getByRole('button', { name: 'Zoom the chart to Inrush 1' }).click();
    const response = await finer;
    const body = (await response.json()) as { fromTime: number; toTime: number; sampleCount: number };
    expect(body.sampleCount).toBeLessThan(4800);
    expect(body.toTime - body.fromTime).toBeLessThan(10_000);
    const url = new URL(page.url());
    expect(url.searchParams.get('event')).toBe('inrush-0');
    expect(Number(url.searchParams.get('to')) - Number(url.searchParams.get('from'))).toBeLessThan(10_000);
    await page.getByText('For the zoomed window').waitFor();
    await page.getByRole('button', { name: 'Reset zoom' }).click();
    await page.waitForURL((u) => !u.searchParams.has('from'));
    await page.getByText('For the whole trace').waitFor();
    await context.close();
  });

  it('when the user drags across the chart, then it zooms to the dragged span', async () => {
    const { context, page } = await newPage(e2e.browser, e2e.server.baseUrl);
    await signIn(page, 'engineer', `/traces/${mixer.id}`);
    const canvas = page.locator('canvas[data-chart-name="trace"][data-drawn="true"]');
    await canvas.waitFor();
    const box = (await canvas.boundingBox())!;
    await page.mouse.move(box.x + box.width * 0.4, box.y + box.height * 0.5);
    await page.mouse.down();
    await page.mouse.move(box.x + box.width * 0.5, box.y + box.height * 0.5, { steps: 8 });
    await page.mouse.up();
    await page.waitForURL((u) => u.searchParams.has('from'));
    const url = new URL(page.url());
    const span = Number(url.searchParams.get('to')) - Number(url.searchParams.get('from'));
    // A tenth of the plot area of a 240 s trace: well under a minute, well over a second.
    expect(span).toBeGreaterThan(1000);
    expect(span).toBeLessThan(60_000);
    await context.close();
  });

  it('when a viewer opens a trace, then there is no edit, close or delete control', async () => {
    const { context, page } = await newPage(e2e.browser, e2e.server.baseUrl);
    await signIn(page, 'viewer', `/traces/${mixer.id}`);
    await page.getByRole('button', { name: 'Download CSV' }).waitFor();
    for (const name of ['Edit', 'Delete', 'Close trace'])
      expect(await page.getByRole('button', { name, exact: true }).count()).toBe(0);
    await page.goto('/traces');
    await page.getByTestId('traces-table').waitFor();
    expect(await page.getByRole('link', { name: 'Upload a CSV' }).count()).toBe(0);
    await context.close();
  });
});
