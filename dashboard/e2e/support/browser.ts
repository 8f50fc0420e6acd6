/**
 * Debian's chromium driven by playwright-core (never a downloaded browser). CHROMIUM_PATH overrides the
 * executable.
 */
import { chromium, type Browser, type BrowserContext, type Page } from 'playwright-core';
import { DEMO_USERS } from '../../../seeds/demo.js';

export const CHROMIUM_FLAGS = [
  '--no-sandbox',
  '--disable-background-networking',
  '--disable-component-update',
  '--disable-sync',
  '--disable-gpu',
  // Headless chromium otherwise starts the address bar's suggestion popup (a WebUI page in a renderer
  // of its own) in every new window, i.e. for every browser context: 0.35-0.6 s of CPU competing with
  // the page under test on a 2-core machine. A headless page has no address bar. (Chromium merges this
  // list with Playwright's own --disable-features.)
  '--disable-features=WebUIOmniboxPopup',
];

export function launchBrowser(): Promise<Browser> {
  return chromium.launch({
    executablePath: process.env.CHROMIUM_PATH ?? '/usr/bin/chromium',
    args: CHROMIUM_FLAGS,
    headless: true,
  });
}

/** A fresh context (its own sessionStorage) at a laptop-sized viewport, with the page's errors collected. */
export async function newPage(
  browser: Browser,
  baseUrl: string,
  viewport = { width: 1280, height: 900 },
): Promise<{ context: BrowserContext; page: Page; pageErrors: string[] }> {
  const context = await browser.newContext({
    baseURL: baseUrl,
    viewport,
    timezoneId: 'Europe/London',
    locale: 'en-GB',
  });
  const page = await context.newPage();
  const pageErrors: string[] = [];
  page.on('pageerror', (err) => pageErrors.push(err.message));
  return { context, page, pageErrors };
}

export type DemoRole = 'admin' | 'engineer' | 'viewer';

export function demoUser(role: DemoRole) {
  const user = DEMO_USERS.find((u) => u.role === role);
  if (!user) throw new Error(`no demo ${role}`);
  return user;
}

/** Signs in through the sign-in form and waits for the app shell. */
export async function signIn(page: Page, role: DemoRole, path = '/'): Promise<void> {
  const user = demoUser(role);
  await page.goto(path);
  await page.getByLabel('E-mail').fill(user.email);
  await page.getByLabel('Password').fill(user.password);
  await page.getByRole('button', { name: 'Sign in' }).click();
  await page.getByTestId('signed-in-user').filter({ hasText: user.name }).waitFor();
}

/** Count of canvas pixels that are not fully transparent: more than a few means the chart drew. */
export async function paintedPixels(page: Page, selector: string): Promise<number> {
  return page
    .locator(selector)
    .first()
    .evaluate((el) => {
      const canvas = el as HTMLCanvasElement;
      const ctx = canvas.getContext('2d');
      if (!ctx) return 0;
      const { data } = ctx.getImageData(0, 0, canvas.width, canvas.height);
      let painted = 0;
      for (let i = 3; i < data.length; i += 4) if (data[i]! > 0) painted++;
      return painted;
    });
}
