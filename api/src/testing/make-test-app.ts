import { randomUUID } from 'node:crypto';
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import pino from 'pino';
import { createApp, type HeadroomApp } from '../app.js';
import { testConfig, type Config } from '../config/config.js';
import { openDatabase, type Db } from '../db/open.js';
import { startFakeSmtpServer, type FakeMailbox } from '../mail/fake-smtp-server.js';
import type { Role } from '../models/user.js';
import { credentialCache } from './credentials.js';
import { createScratchDatabase, TEST_DATABASE_URL } from './postgres-scratch-database.js';

export interface TestApp {
  app: HeadroomApp;
  db: Db;
  config: Config;
  /** Organisation created for the test. */
  organisationId: string;
  /** The fake SMTP server (127.0.0.1, random port) the app's mailer sends to, unless `config.smtpUrl` is given. */
  mailbox: FakeMailbox | undefined;
  /**
   * Headers that authenticate a request as a user of the test organisation with this role (default
   * engineer), or as an API key with these scopes: `request(t.app).get(url).set(await t.auth('viewer'))`.
   * The user or key is real (a session token or an `hrk_` key) and made once per role or scope set;
   * `{ fresh: true }` makes a new one (for tests that sign out, revoke or deactivate).
   */
  auth(who?: Role | { keyScopes: string[] }, options?: { fresh?: boolean }): Promise<Record<string, string>>;
  close(): Promise<void>;
}

/**
 * A fresh app on its own migrated database: in-memory by default, or a temporary file (`file: true`)
 * for tests of WAL, restarts and concurrent writers.
 */
export async function makeTestApp(options: { file?: boolean; config?: Partial<Config> } = {}): Promise<TestApp> {
  const dir = options.file ? mkdtempSync(path.join(tmpdir(), 'headroom-test-')) : undefined;
  // On a PostgreSQL test run (TEST_DATABASE_URL), every app gets its own scratch database instead.
  const scratch = TEST_DATABASE_URL ? await createScratchDatabase(TEST_DATABASE_URL) : undefined;
  const config = testConfig({
    ...(dir ? { databaseFile: path.join(dir, 'test.sqlite') } : {}),
    ...(scratch ? { databaseUrl: scratch.url } : {}),
    ...options.config,
  });
  const db = await openDatabase({ databaseFile: config.databaseFile, databaseUrl: config.databaseUrl });
  const organisationId = randomUUID();
  await db.models.Organisation.create({ id: organisationId, name: 'Test organisation' });
  const mailbox = config.smtpUrl ? undefined : await startFakeSmtpServer();
  const app = createApp(config, db, { logger: pino({ level: 'silent' }), ...(mailbox ? { mailbox } : {}) });
  const credentials = credentialCache(app.locals.services, organisationId);
  return {
    app,
    db,
    config,
    organisationId,
    mailbox,
    auth(who: Role | { keyScopes: string[] } = 'engineer', options?: { fresh?: boolean }) {
      return credentials(who, options);
    },
    async close() {
      await mailbox?.close();
      await db.close();
      await scratch?.drop();
      if (dir) rmSync(dir, { recursive: true, force: true });
    },
  };
}
