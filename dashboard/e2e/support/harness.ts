import type { Browser } from 'playwright-core';
import { afterAll, beforeAll } from 'vitest';
import { launchBrowser } from './browser.js';
import { startServer, type TestServer } from './server.js';

export interface E2E {
  server: TestServer;
  browser: Browser;
}

/**
 * One real server (temporary SQLite file, demo seed with samples) and one chromium per test file,
 * started before its tests and stopped after them. Read the fields inside tests, not at load time.
 */
export function useServerAndBrowser(): E2E {
  const e2e = {} as E2E;
  beforeAll(async () => {
    e2e.server = await startServer();
    e2e.browser = await launchBrowser();
  });
  afterAll(async () => {
    await e2e.browser?.close();
    await e2e.server?.close();
  });
  return e2e;
}
