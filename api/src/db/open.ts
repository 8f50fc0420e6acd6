import type { Database as SqliteDatabase } from 'sqlite3';
import { Sequelize } from 'sequelize';
import { initModels, type Models } from '../models/index.js';
import { migrate } from './migrate.js';
import { SQLITE_PRAGMAS } from './sqlite-pragmas.js';

export interface Db {
  sequelize: Sequelize;
  models: Models;
  dialect: 'sqlite' | 'postgres';
  /** Runs `hook` before the connections close (e.g. to finalize prepared statements). */
  onClose(hook: () => Promise<void>): void;
  close(): Promise<void>;
}

export interface DbOptions {
  /** SQLite file path, or ':memory:'. Ignored when `databaseUrl` is set. */
  databaseFile: string;
  /** postgres://… for deployments that outgrow one machine. */
  databaseUrl?: string | undefined;
  /** Run migrations on open (default true). */
  migrate?: boolean;
}

function runSql(conn: SqliteDatabase, sql: string): Promise<void> {
  return new Promise((resolve, reject) => conn.run(sql, (err) => (err ? reject(err) : resolve())));
}

/**
 * Opens the database, applies the connection settings and (by default) runs pending migrations.
 * SQLite: WAL journal (readers never block the writer), foreign keys on, a busy timeout so concurrent
 * writers wait instead of failing, synchronous=NORMAL (durable across process crashes in WAL mode).
 */
export async function openDatabase(options: DbOptions): Promise<Db> {
  const sequelize = options.databaseUrl
    ? new Sequelize(options.databaseUrl, { logging: false, dialect: 'postgres' })
    : new Sequelize({ dialect: 'sqlite', storage: options.databaseFile, logging: false, transactionType: 'IMMEDIATE' as never });

  if (sequelize.getDialect() === 'sqlite') {
    // Sequelize's sqlite dialect opens a fresh connection per transaction and does not run connect
    // hooks, so wrap getConnection to configure every new connection once (db/sqlite-pragmas.ts).
    const manager = sequelize.connectionManager as unknown as {
      getConnection(opts?: unknown): Promise<SqliteDatabase>;
    };
    const configured = new WeakSet<SqliteDatabase>();
    const original = manager.getConnection.bind(manager);
    manager.getConnection = async (opts?: unknown) => {
      const conn = await original(opts);
      if (!configured.has(conn)) {
        configured.add(conn);
        for (const sql of SQLITE_PRAGMAS) await runSql(conn, sql);
      }
      return conn;
    };
    if (options.databaseFile !== ':memory:') await sequelize.query('PRAGMA journal_mode = WAL');
  }

  const models = initModels(sequelize);
  if (options.migrate !== false) await migrate(sequelize);
  const closeHooks: Array<() => Promise<void>> = [];
  return {
    sequelize,
    models,
    dialect: sequelize.getDialect() === 'postgres' ? 'postgres' : 'sqlite',
    onClose: (hook) => void closeHooks.push(hook),
    close: async () => {
      for (const hook of closeHooks.splice(0)) await hook();
      await sequelize.close();
    },
  };
}
