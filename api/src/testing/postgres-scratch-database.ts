import { randomUUID } from 'node:crypto';
import { Sequelize } from 'sequelize';

/**
 * When set (by `scripts/postgres/run-api-tests.sh`), every test app runs on PostgreSQL: this URL names a
 * database in a throwaway cluster, used only to create and drop one scratch database per test app, so
 * test files never see each other's rows.
 */
export const TEST_DATABASE_URL = process.env.TEST_DATABASE_URL || undefined;

/** True when this test run is on PostgreSQL; SQLite-only checks (pragmas, the WAL file) skip then. */
export const testsRunOnPostgres = TEST_DATABASE_URL !== undefined;

let admin: Sequelize | undefined;

function adminConnection(adminUrl: string): Sequelize {
  admin ??= new Sequelize(adminUrl, { dialect: 'postgres', logging: false, pool: { max: 2, idle: 1000 } });
  return admin;
}

export interface ScratchDatabase {
  url: string;
  drop(): Promise<void>;
}

/** Creates an empty database next to the one `adminUrl` names; `drop()` removes it with its connections. */
export async function createScratchDatabase(adminUrl: string): Promise<ScratchDatabase> {
  const name = `headroom_t_${randomUUID().replaceAll('-', '').slice(0, 20)}`;
  const conn = adminConnection(adminUrl);
  await conn.query(`CREATE DATABASE "${name}"`);
  const url = new URL(adminUrl);
  url.pathname = `/${name}`;
  return {
    url: url.toString(),
    async drop() {
      await conn.query(`DROP DATABASE IF EXISTS "${name}" WITH (FORCE)`);
    },
  };
}
