// @vitest-environment node
import { describe, expect, it } from 'vitest';
import { newPage, signIn } from './support/browser.js';
import { useServerAndBrowser } from './support/harness.js';

const e2e = useServerAndBrowser();

/**
 * An invented logger export (demo data only): 100 readings a second for 25 minutes from a 10 mV/A clamp,
 * the load off for 2 s, then a start-up peaking at 400 mV (40 A) that settles to 90 mV (9 A).
 */
function loggerCsv(): { text: string; rows: number } {
  const lines = ['Time,Clamp (mV)'];
  const start = Date.UTC(2026, 2, 1, 9, 0, 0);
  const rows = 150_000;
  for (let i = 0; i < rows; i++) {
    const s = i / 100;
    const mv = s < 2 ? 0.4 : 90 + 310 * Math.exp(-(s - 2) / 0.3);
    lines.push(`${new Date(start + i * 10).toISOString()},${mv.toFixed(2)}`);
  }
  return { text: lines.join('\n') + '\n', rows };
}

async function chooseFile(page: import('playwright-core').Page, name: string, text: string) {
  await page.setInputFiles('#csv-file', { name, mimeType: 'text/csv', buffer: Buffer.from(text) });
  await page.getByTestId('csv-preview').waitFor();
}

describe('upload', () => {
  it('when an engineer uploads a CSV export, then progress reaches 100 % and the new trace shows its figures', async () => {
    const { context, page, pageErrors } = await newPage(e2e.browser, e2e.server.baseUrl);
    await signIn(page, 'engineer', '/upload');
    const csv = loggerCsv();
    await chooseFile(page, 'walk-in-cooler-restart.csv', csv.text);

    // The mapping was guessed from the header: time column, millivolts, decimal point.
    expect(await page.getByLabel('Time column').inputValue()).toBe('1');
    expect(await page.getByLabel('Current column').inputValue()).toBe('2');
    expect(await page.getByLabel('Readings are in').inputValue()).toBe('mV');
    await page.getByLabel('Probe sensitivity (mV per A)').fill('10');
    await page.getByLabel('Clock times are at UTC offset').fill('+00:00');
    await page.getByLabel('Site').selectOption({ label: 'Millbrook Community Hall' });
    await page.getByLabel('Circuit').selectOption({ label: 'Walk-in cooler (K7) (15 A)' });

    // Record every value the progress bar takes (the page stays the same document across navigation).
    await page.evaluate(() => {
      const seen: number[] = [];
      (window as unknown as { progressSeen: number[] }).progressSeen = seen;
      new MutationObserver(() => {
        const bar = document.querySelector('[role="progressbar"]');
        const v = bar?.getAttribute('aria-valuenow');
        if (v !== null && v !== undefined && seen[seen.length - 1] !== Number(v)) seen.push(Number(v));
      }).observe(document.body, {
        subtree: true,
        childList: true,
        attributes: true,
        attributeFilter: ['aria-valuenow'],
      });
    });
    await page.getByRole('button', { name: 'Upload', exact: true }).click();
    await page.waitForURL(/\/traces\/[^/?]+$/, { timeout: 60_000 });

    const seen = await page.evaluate(() => (window as unknown as { progressSeen: number[] }).progressSeen);
    expect(seen[0]).toBeLessThan(100);
    expect(seen[seen.length - 1]).toBe(100);
    expect(seen).toEqual([...seen].sort((a, b) => a - b));

    await page.getByRole('heading', { name: 'walk-in-cooler-restart' }).waitFor();
    const figures = page.getByTestId('figures');
    await figures.getByText(csv.rows.toLocaleString('en-GB')).waitFor();
    await figures.getByText('40.00 A').waitFor(); // 400 mV through a 10 mV/A clamp
    await page.getByText('closed', { exact: true }).waitFor();
    await page.getByRole('button', { name: 'Zoom the chart to Inrush 1' }).waitFor();
    await page.locator('canvas[data-chart-name="trace"][data-drawn="true"]').waitFor();
    expect(pageErrors).toEqual([]);
    await context.close();
  });

  it('when the file has a bad line, then the server error names it and no trace is kept', async () => {
    const { context, page } = await newPage(e2e.browser, e2e.server.baseUrl);
    await signIn(page, 'engineer', '/upload');
    await chooseFile(
      page,
      'broken.csv',
      'Time,Current (A)\n2026-03-01T09:00:00Z,1.0\n2026-03-01T09:00:01Z,1.1\n2026-03-01T09:00:02Z,oops\n2026-03-01T09:00:03Z,1.2\n',
    );
    await page.getByRole('button', { name: 'Upload', exact: true }).click();
    const alert = page.getByRole('alert').filter({ hasText: 'nothing was stored' });
    await alert.waitFor();
    await alert.getByText(/Line 4/).waitFor();
    expect(new URL(page.url()).pathname).toBe('/upload');
    await page.goto('/traces?q=broken');
    await page.getByText('No trace matches these filters').waitFor();
    await context.close();
  });
});
