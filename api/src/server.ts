/**
 * Process entry: config -> open database -> migrate -> seed the demo if empty -> listen.
 * Everything else lives in createApp so tests never need a process.
 */
import pino from 'pino';
import { createApp } from './app.js';
import { ConfigError, loadConfig } from './config/config.js';
import { openDatabase } from './db/open.js';
import { DEMO_USERS, seedDemoIfEmpty } from '../../seeds/demo.js';

async function main() {
  const config = loadConfig();
  const logger = pino({ level: config.logLevel });
  const db = await openDatabase({ databaseFile: config.databaseFile, databaseUrl: config.databaseUrl });
  const seeded = config.seedDemo ? await seedDemoIfEmpty(db) : false;
  const app = createApp(config, db, { logger });
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
    ];
    if (config.seedDemo) {
      lines.push('', 'Demo sign-in (demo data only; change or remove before real use):');
      for (const u of DEMO_USERS) lines.push(`  ${u.role.padEnd(9)} ${u.email}  password: ${u.password}`);
    }
    console.log(lines.join('\n') + '\n');
  });

  const shutdown = (signal: string) => {
    logger.info({ signal }, 'shutting down');
    server.close(() => {
      void db.close().then(() => process.exit(0));
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
