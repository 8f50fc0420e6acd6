// @vitest-environment node
import { describe, expect, it } from 'vitest';
import { newPage, signIn } from './support/browser.js';
import { useServerAndBrowser } from './support/harness.js';

const e2e = useServerAndBrowser();

const meWith = (secret: string) =>
  fetch(`${e2e.server.baseUrl}/api/v1/me`, { headers: { Authorization: `Bearer ${secret}` } });

describe('admin: API keys, users, audit log', () => {
  it('when an admin creates a key, then its secret is shown once, works, and stops working once revoked', async () => {
    const { context, page, pageErrors } = await newPage(e2e.browser, e2e.server.baseUrl);
    await signIn(page, 'admin', '/admin/api-keys');
    await page.getByRole('button', { name: 'New API key' }).click();
    const dialog = page.getByRole('dialog', { name: 'New API key' });
    await dialog.getByLabel('Name').fill('Bench logger (e2e)');
    await dialog.getByLabel('read').check();
    await dialog.getByRole('button', { name: 'Create key' }).click();

    const secretBox = page.getByTestId('api-key-secret');
    await secretBox.waitFor();
    const secret = await secretBox.inputValue();
    expect(secret.length).toBeGreaterThan(20);
    expect((await meWith(secret)).status).toBe(200);

    await page.getByRole('button', { name: 'I have stored it' }).click();
    await secretBox.waitFor({ state: 'detached' });
    // Shown once: nowhere on the page any more, not in the list, not in storage.
    const row = page.getByTestId('api-key-row').filter({ hasText: 'Bench logger (e2e)' });
    await row.getByText('active').waitFor();
    expect(await page.content()).not.toContain(secret);
    expect(await page.evaluate(() => JSON.stringify(sessionStorage))).not.toContain(secret);

    await row.getByRole('button', { name: 'Revoke Bench logger (e2e)' }).click();
    await page
      .getByRole('dialog', { name: /Revoke Bench logger/ })
      .getByRole('button', { name: 'Revoke key' })
      .click();
    await row.getByText('revoked').waitFor();
    expect((await meWith(secret)).status).toBe(401);
    expect(pageErrors).toEqual([]);
    await context.close();
  });

  it('when an admin invites a user and changes a role, then the list and the audit log show it', async () => {
    const { context, page } = await newPage(e2e.browser, e2e.server.baseUrl);
    await signIn(page, 'admin', '/admin/users');
    await page.getByRole('button', { name: 'Invite user' }).click();
    const dialog = page.getByRole('dialog', { name: 'Invite a user' });
    await dialog.getByLabel('Name').fill('Noor Haddad');
    await dialog.getByLabel('E-mail').fill('noor.haddad@example.test');
    await dialog.getByLabel('Role').selectOption('viewer');
    await dialog.getByRole('button', { name: 'Send invitation' }).click();
    const row = page.getByRole('row').filter({ hasText: 'noor.haddad@example.test' });
    await row.getByText('invited').waitFor();

    const viewerRow = page.getByRole('row').filter({ hasText: 'viewer@demo.headroom.test' });
    await viewerRow.getByLabel(/Role of/).selectOption('engineer');
    await page.getByRole('link', { name: 'Audit log' }).click();
    await page.getByRole('cell', { name: 'Role changed' }).first().waitFor();
    await page.getByRole('cell', { name: 'User invited' }).first().waitFor();
    await context.close();

    // The invitee follows the e-mailed link, chooses a password and is signed in with the invited role.
    const mail = await e2e.server.mailbox.waitFor((m) => m.to.includes('noor.haddad@example.test'), 10_000);
    const token = /accept-invitation\?token=([A-Za-z0-9_\-.~%]+)/.exec(mail.text)?.[1];
    expect(token).toBeTruthy();
    const invitee = await newPage(e2e.browser, e2e.server.baseUrl);
    await invitee.page.goto(`/accept-invitation?token=${token}`);
    await invitee.page.getByLabel('Your name').fill('Noor Haddad');
    await invitee.page.getByLabel('New password').fill('a long enough passphrase');
    await invitee.page.getByLabel('Repeat the password').fill('a long enough passphrase');
    await invitee.page.getByRole('button', { name: 'Join and sign in' }).click();
    await invitee.page.getByTestId('signed-in-user').filter({ hasText: 'Noor Haddad' }).waitFor();
    expect(
      await invitee.page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Upload' }).count(),
    ).toBe(0);
    await invitee.context.close();
  });
});
