/**
 * The real Headroom server for browser tests: the built dashboard and the API from `createApp`, on a
 * temporary SQLite file seeded with the demo organisation, listening on 127.0.0.1 at a free port.
 */
import { mkdtempSync, rmSync } from 'node:fs';
import type { Server } from 'node:http';
import type { AddressInfo } from 'node:net';
import { tmpdir } from 'node:os';
import path from 'node:path';
import pino from 'pino';
import { createApp } from '../../../api/src/app.js';
import { testConfig } from '../../../api/src/config/config.js';
import { openDatabase, type Db } from '../../../api/src/db/open.js';
import { startFakeSmtpServer, type FakeMailbox } from '../../../api/src/mail/fake-smtp-server.js';
import { seedDemo } from '../../../seeds/demo.js';
import { distDir, ensureDashboardBuilt } from './build.js';
import { fillDemoTraces } from './demo-samples.js';

export interface TestServer {
  baseUrl: string;
  db: Db;
  /** The local fake SMTP server's inbox: invitations, password resets and reports land here. */
  mailbox: FakeMailbox;
  close(): Promise<void>;
}

export async function startServer(): Promise<TestServer> {
  await ensureDashboardBuilt();
  const dir = mkdtempSync(path.join(tmpdir(), 'headroom-e2e-'));
  const mailbox = await startFakeSmtpServer();
  const config = testConfig({
    databaseFile: path.join(dir, 'e2e.sqlite'),
    dashboardDir: distDir,
    smtpUrl: mailbox.url,
  });
  const db = await openDatabase({ databaseFile: config.databaseFile });
  await seedDemo(db);
  const app = createApp(config, db, { logger: pino({ level: 'silent' }), mailbox });
  const server: Server = await new Promise((resolve) => {
    const s = app.listen(0, '127.0.0.1', () => resolve(s));
  });
  const { port } = server.address() as AddressInfo;
  const baseUrl = `http://127.0.0.1:${port}`;
  await fillDemoTraces(baseUrl);
  return {
    baseUrl,
    db,
    mailbox,
    async close() {
      await new Promise<void>((resolve) => server.close(() => resolve()));
      server.closeAllConnections?.();
      await db.close();
      await mailbox.close();
      rmSync(dir, { recursive: true, force: true });
    },
  };
}
