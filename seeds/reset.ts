/** `npm run seed`: resets the demo organisation in the configured database (other organisations are kept). */
import { loadConfig } from '../api/src/config/config.js';
import { openDatabase } from '../api/src/db/open.js';
import { resetDemo } from './demo.js';
import { demoSampleStore } from './demo-samples.js';

const config = loadConfig();
const db = await openDatabase({ databaseFile: config.databaseFile, databaseUrl: config.databaseUrl });
await resetDemo(db, demoSampleStore(config));
await db.close();
console.log(`Demo data reset in ${config.databaseUrl ? 'the PostgreSQL database' : config.databaseFile}`);
