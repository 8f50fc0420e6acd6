// @vitest-environment node
import { describe, expect, it } from 'vitest';
import { demoUser, newPage, signIn } from './support/browser.js';
import { useServerAndBrowser } from './support/harness.js';

const e2e = useServerAndBrowser();

const navNames = async (page: import('playwright-core').Page) =>
  (await page.getByRole('navigation', { name: 'Main' }).getByRole('link').allTextContents()).map((s) => s.trim());

describe('sign-in and roles', () => {
  it('when a signed-out user opens a deep link, then sign-in brings them back to it', async () => {
    const { context, page, pageErrors } = await newPage(e2e.browser, e2e.server.baseUrl);
    await page.goto('/sites');
    await page.waitForURL(/\/sign-in\?next=%2Fsites/);
    await signIn(page, 'engineer', page.url());
    await page.waitForURL(/\/sites$/);
    await expect(page.getByRole('heading', { name: 'Sites', level: 1 }).isVisible()).resolves.toBe(true);
    expect(pageErrors).toEqual([]);
    await context.close();
  });

  it('when the password is wrong, then the form says so and stays', async () => {
    const { context, page } = await newPage(e2e.browser, e2e.server.baseUrl);
    await page.goto('/sign-in');
    await page.getByLabel('E-mail').fill(demoUser('viewer').email);
    await page.getByLabel('Password').fill('not-the-password');
    await page.getByRole('button', { name: 'Sign in' }).click();
    await page.getByText('do not match an active account').waitFor();
    expect(new URL(page.url()).pathname).toBe('/sign-in');
    await context.close();
  });

  it('when signed in as each role, then the navigation offers only what the role may do', async () => {
    const expected = {
      admin: ['Traces', 'Upload', 'Sites & circuits', 'Admin'],
      engineer: ['Traces', 'Upload', 'Sites & circuits'],
      viewer: ['Traces', 'Sites & circuits'],
    } as const;
    for (const role of ['admin', 'engineer', 'viewer'] as const) {
      const { context, page } = await newPage(e2e.browser, e2e.server.baseUrl);
      await signIn(page, role, '/sites');
      expect(await navNames(page)).toEqual(expected[role]);
      await expect(page.getByText(demoUser(role).name).isVisible()).resolves.toBe(true);
      await context.close();
    }
  });

  it('when a viewer opens a site and the admin pages, then there are no edit controls and no admin', async () => {
    const { context, page } = await newPage(e2e.browser, e2e.server.baseUrl);
    await signIn(page, 'viewer', '/sites');
    await page.getByRole('link', { name: /Millbrook Community Hall/ }).click();
    await page.getByRole('heading', { name: 'Circuits' }).waitFor();
    for (const name of ['Edit site', 'Delete site', 'New circuit', 'New site']) {
      expect(await page.getByRole('button', { name }).count()).toBe(0);
    }
    await page.getByRole('link', { name: /Kitchen counter/ }).click();
    await page.getByTestId('verdict').first().waitFor();
    for (const name of ['Edit circuit', 'Delete circuit', 'Add load', 'Send report']) {
      expect(await page.getByRole('button', { name }).count()).toBe(0);
    }
    expect(await page.getByRole('button', { name: /^Edit / }).count()).toBe(0);
    await page.goto('/admin/api-keys');
    await page.getByText('Not available for your role').waitFor();
    expect(await page.getByRole('button', { name: 'New API key' }).count()).toBe(0);
    await page.goto('/upload');
    await page.getByText('Not available for your role').waitFor();
    await context.close();
  });

  it('when the engineer sees the same site, then the edit controls are there', async () => {
    const { context, page } = await newPage(e2e.browser, e2e.server.baseUrl);
    await signIn(page, 'engineer', '/sites');
    await page.getByRole('link', { name: /Millbrook Community Hall/ }).click();
    await page.getByRole('button', { name: 'New circuit' }).waitFor();
    expect(await page.getByRole('button', { name: 'Edit site' }).count()).toBe(1);
    await context.close();
  });

  it('when the session ends on the server, then the next request leads to sign-in and back to the same page', async () => {
    const { context, page } = await newPage(e2e.browser, e2e.server.baseUrl);
    await signIn(page, 'engineer', '/sites');
    await page.getByRole('link', { name: /Fenwick Joinery/ }).click();
    await page.getByRole('heading', { name: 'Circuits' }).waitFor();
    const sitePath = new URL(page.url()).pathname;
    // Sign out on the server behind the page's back, as an expiry would.
    const token = await page.evaluate(
      () => JSON.parse(sessionStorage.getItem('headroom.session') ?? '{}').token as string,
    );
    const res = await fetch(`${e2e.server.baseUrl}/api/v1/auth/sign-out`, {
      method: 'POST',
      headers: { Authorization: `Bearer ${token}` },
    });
    expect(res.status).toBe(204);
    await page.reload();
    await page.getByText('Your session has ended').waitFor();
    await page.getByLabel('E-mail').fill(demoUser('engineer').email);
    await page.getByLabel('Password').fill(demoUser('engineer').password);
    await page.getByRole('button', { name: 'Sign in' }).click();
    await page.waitForURL((url) => url.pathname === sitePath);
    await page.getByRole('heading', { name: 'Circuits' }).waitFor();
    await context.close();
  });

  it('when signing out, then the session is gone from the tab and the sign-in page shows', async () => {
    const { context, page } = await newPage(e2e.browser, e2e.server.baseUrl);
    await signIn(page, 'admin', '/sites');
    await page.getByRole('button', { name: 'Sign out' }).click();
    await page.waitForURL(/\/sign-in/);
    expect(await page.evaluate(() => sessionStorage.getItem('headroom.session'))).toBeNull();
    await page.goto('/sites');
    await page.waitForURL(/\/sign-in\?next=/);
    await context.close();
  });

  it('when a user forgets the password, then the e-mailed link sets a new one that signs in', async () => {
    const { context, page } = await newPage(e2e.browser, e2e.server.baseUrl);
    const viewer = demoUser('viewer');
    await page.goto('/sign-in');
    await page.getByRole('button', { name: 'Forgot your password?' }).click();
    await page.getByLabel('E-mail').fill(viewer.email);
    await page.getByRole('button', { name: 'Send reset link' }).click();
    await page.getByText('a link to choose a new password is on its way').waitFor();
    const mail = await e2e.server.mailbox.waitFor((m) => m.to.includes(viewer.email), 10_000);
    const token = /reset-password\?token=([A-Za-z0-9_\-.~%]+)/.exec(mail.text)?.[1];
    expect(token).toBeTruthy();

    await page.goto(`/reset-password?token=${token}`);
    await page.getByLabel('New password', { exact: true }).fill('a brand new passphrase');
    await page.getByLabel('Repeat the password').fill('a brand new passphrase');
    await page.getByRole('button', { name: 'Set the new password' }).click();
    await page.getByText('Your password has been changed').waitFor();
    await page.getByRole('link', { name: 'Sign in with the new password' }).click();
    await page.getByLabel('E-mail').fill(viewer.email);
    await page.getByLabel('Password').fill('a brand new passphrase');
    await page.getByRole('button', { name: 'Sign in' }).click();
    await page.getByTestId('signed-in-user').filter({ hasText: viewer.name }).waitFor();
    await context.close();
  });
});
