// @vitest-environment node
import { describe, expect, it } from 'vitest';
import { DEMO_CIRCUITS, DEMO_SITES } from '../../seeds/demo.js';
import { newPage, paintedPixels, signIn } from './support/browser.js';
import { useServerAndBrowser } from './support/harness.js';

const e2e = useServerAndBrowser();
const counter = DEMO_CIRCUITS.find((c) => c.label.startsWith('Kitchen counter'))!;
const VERDICT_LABELS = ['Fine', 'Tight', 'Dedicated circuit advised', 'Over the limit'];

describe('sites and circuits', () => {
  it('when a viewer opens a circuit from its site, then the verdict shows with its reasons, rules and cautions, and the charts draw', async () => {
    const { context, page, pageErrors } = await newPage(e2e.browser, e2e.server.baseUrl);
    await signIn(page, 'viewer', '/sites');
    await page.getByRole('link', { name: new RegExp(DEMO_SITES[0]!.name) }).click();
    await page.getByRole('link', { name: counter.label }).click();
    const verdict = page.getByTestId('verdict').first();
    await verdict.waitFor();
    expect(VERDICT_LABELS).toContain((await verdict.getByTestId('verdict-label').textContent())?.trim());
    const reasons = verdict.getByRole('list', { name: 'Reasons, worst first' }).getByRole('listitem');
    expect(await reasons.count()).toBeGreaterThanOrEqual(1);
    // Each reason names its rule and the clause it rests on (with the edition).
    await expect(reasons.first().textContent()).resolves.toMatch(/rule \S+/);
    await expect(reasons.first().textContent()).resolves.toMatch(/NFPA 70 20(20|23)|UL 489|IEC 60898-1/);
    await verdict
      .getByRole('complementary', { name: 'Safety cautions' })
      .getByText(/qualified persons/)
      .waitFor();

    await page.locator('canvas[data-chart-name="time-current"][data-drawn="true"]').waitFor();
    await page.locator('canvas[data-chart-name="stacked"][data-drawn="true"]').waitFor();
    expect(await paintedPixels(page, 'canvas[data-chart-name="time-current"]')).toBeGreaterThan(5000);
    expect(await page.getByRole('row').filter({ hasText: 'Stand mixer' }).count()).toBeGreaterThanOrEqual(1);
    expect(pageErrors).toEqual([]);
    await context.close();
  });

  it('when an engineer asks what adding a kettle would do, then a second verdict answers without storing the load', async () => {
    const { context, page } = await newPage(e2e.browser, e2e.server.baseUrl);
    await signIn(page, 'engineer', `/circuits/${counter.id}`);
    await page.getByTestId('verdict').first().waitFor();
    const form = page.getByRole('form', { name: 'What-if check' });
    await form.getByLabel('Name', { exact: true }).fill('Kettle');
    await form.getByLabel('Nameplate power (W)').fill('1800');
    await form.getByRole('button', { name: 'Check with this load' }).click();
    await page.getByRole('heading', { name: 'What if: Kettle added' }).waitFor();
    expect(await page.getByTestId('verdict').count()).toBe(2);
    await page.reload();
    await page.getByTestId('verdict').first().waitFor();
    expect(await page.getByRole('row').filter({ hasText: 'Kettle' }).count()).toBe(0);
    await context.close();
  });

  it('when an engineer downloads the reports and e-mails the PDF, then the files and the message arrive', async () => {
    const { context, page } = await newPage(e2e.browser, e2e.server.baseUrl);
    await signIn(page, 'engineer', `/circuits/${counter.id}`);
    await page.getByTestId('verdict').first().waitFor();
    for (const [button, extension] of [
      ['PDF report', '.pdf'],
      ['CSV figures', '.csv'],
    ] as const) {
      const download = page.waitForEvent('download');
      await page.getByRole('button', { name: button }).click();
      const file = await download;
      expect(file.suggestedFilename().endsWith(extension)).toBe(true);
      const stream = await file.createReadStream();
      let bytes = 0;
      for await (const chunk of stream) bytes += (chunk as Buffer).length;
      expect(bytes).toBeGreaterThan(200);
    }
    await page.getByLabel('Send the PDF report to').fill('hall-committee@example.test');
    await page.getByRole('button', { name: 'Send report' }).click();
    await page.getByText('Report sent to hall-committee@example.test').waitFor();
    const mail = await e2e.server.mailbox.waitFor((m) => m.to.includes('hall-committee@example.test'), 10_000);
    expect(mail.attachments.some((a) => a.contentType === 'application/pdf')).toBe(true);
    await context.close();
  });
});
