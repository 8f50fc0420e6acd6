import { randomUUID } from 'node:crypto';
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import pino from 'pino';
import { createApp, type HeadroomApp } from '../app.js';
import { testConfig, type Config } from '../config/config.js';
import { openDatabase, type Db } from '../db/open.js';
import type { Role } from '../models/user.js';

export interface TestApp {
  app: HeadroomApp;
  db: Db;
  config: Config;
  /** Organisation created for the test. */
  organisationId: string;
  /**
   * Headers that authenticate a request as a user of the test organisation with this role (default
   * engineer), or as an API key with these scopes: `request(t.app).get(url).set(await t.auth('viewer'))`.
   */
  auth(who?: Role | { keyScopes: string[] }): Promise<Record<string, string>>;
  close(): Promise<void>;
}

/**
 * A fresh app on its own migrated database: in-memory by default, or a temporary file (`file: true`)
 * for tests of WAL, restarts and concurrent writers.
 */
export async function makeTestApp(options: { file?: boolean; config?: Partial<Config> } = {}): Promise<TestApp> {
  const dir = options.file ? mkdtempSync(path.join(tmpdir(), 'headroom-test-')) : undefined;
  const config = testConfig({ ...(dir ? { databaseFile: path.join(dir, 'test.sqlite') } : {}), ...options.config });
  const db = await openDatabase({ databaseFile: config.databaseFile });
  const organisationId = randomUUID();
  await db.models.Organisation.create({ id: organisationId, name: 'Test organisation' });
  const app = createApp(config, db, { logger: pino({ level: 'silent' }) });
  return {
    app,
    db,
    config,
    organisationId,
    // Walking skeleton: authentication is a placeholder that acts for the first organisation, so no
    // header is needed yet. The accounts work makes this mint a real session token or API key.
    async auth(_who: Role | { keyScopes: string[] } = 'engineer') {
      return {};
    },
    async close() {
      await db.close();
      if (dir) rmSync(dir, { recursive: true, force: true });
    },
  };
}
