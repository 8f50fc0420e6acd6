/**
 * Process entry: config -> open database -> migrate -> seed the demo if empty -> listen.
 * Everything else lives in createApp so tests never need a process.
 */
import pino from 'pino';
import { createApp } from './app.js';
import { ConfigError, loadConfig } from './config/config.js';
import { openDatabase } from './db/open.js';
import { startFakeSmtpServer } from './mail/fake-smtp-server.js';
import { DEMO_API_KEY, DEMO_API_KEY_TOKEN, DEMO_USERS, seedDemoIfEmpty } from '../../seeds/demo.js';
import { demoSampleStore } from '../../seeds/demo-samples.js';

async function main() {
  const config = loadConfig();
  const logger = pino({ level: config.logLevel });
  const db = await openDatabase({ databaseFile: config.databaseFile, databaseUrl: config.databaseUrl });
  // The demo traces get their samples stored and are closed (analysed) as they are seeded.
  const seeded = config.seedDemo ? await seedDemoIfEmpty(db, demoSampleStore(config)) : false;
  // Without SMTP_URL, mail goes to a local fake SMTP server and can be read at GET /api/v1/dev/mailbox.
  const mailbox = config.smtpUrl ? undefined : await startFakeSmtpServer();
  const app = createApp(config, db, { ...(mailbox ? { mailbox } : {}), logger });
  const demoKeyActive = config.seedDemo && (await app.locals.services.apiKeys.isActive(DEMO_API_KEY.id));
  const server = app.listen(config.port, config.host, () => {
    const address = server.address();
    const port = typeof address === 'object' && address ? address.port : config.port;
    const base = `http://${config.host === '0.0.0.0' ? 'localhost' : config.host}:${port}`;
    const lines = [
      '',
      `Headroom is running on ${base}`,
      `  dashboard   ${base}/`,
      `  API docs    ${base}/api/docs`,
      `  OpenAPI     ${base}/api/openapi.json`,
      `  database    ${config.databaseUrl ? 'PostgreSQL (DATABASE_URL)' : config.databaseFile}${seeded ? ' (demo data seeded)' : ''}`,
      `  mail        ${mailbox ? `local fake SMTP server ${mailbox.url} (read it at GET /api/v1/dev/mailbox as an admin; set SMTP_URL for real mail)` : 'the SMTP server of SMTP_URL'}`,
    ];
    if (config.seedDemo) {
      lines.push('', 'Demo sign-in (demo data only; change or remove before real use):');
      for (const u of DEMO_USERS) lines.push(`  ${u.role.padEnd(9)} ${u.email}  password: ${u.password}`);
      if (demoKeyActive) lines.push(`  Demo API key (ingest, read): ${DEMO_API_KEY_TOKEN}`);
    }
    console.log(lines.join('\n') + '\n');
  });

  const shutdown = (signal: string) => {
    logger.info({ signal }, 'shutting down');
    server.close(() => {
      void Promise.all([db.close(), mailbox?.close()]).then(() => process.exit(0));
    });
    setTimeout(() => process.exit(0), 5000).unref();
  };
  process.on('SIGINT', () => shutdown('SIGINT'));
  process.on('SIGTERM', () => shutdown('SIGTERM'));
}

main().catch((err: unknown) => {
  if (err instanceof ConfigError) console.error(err.message);
  else console.error(err);
  process.exit(1);
});
