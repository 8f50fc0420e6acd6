/**
 * Pragmas every SQLite connection needs, whichever thread opens it: a busy timeout so concurrent
 * writers wait instead of failing, synchronous=NORMAL (durable across process crashes in WAL mode) and
 * foreign keys on. Kept apart from db/open.ts so the chunk writer's thread loads no Sequelize.
 */
export const SQLITE_PRAGMAS = ['PRAGMA busy_timeout = 10000', 'PRAGMA synchronous = NORMAL', 'PRAGMA foreign_keys = ON'] as const;
