/**
 * Online backup and restore of the SQLite database.
 *
 *   npm run backup                      copy to data/backups/headroom-<UTC time>.sqlite
 *   npm run backup -- <file>            copy to <file>
 *   npm run restore -- <backup file>    replace DATABASE_FILE with a backup (stop the server first)
 *
 * The backup is `VACUUM INTO`: it reads the database inside one read transaction, so the copy is a
 * consistent snapshot even while the server keeps writing (WAL readers never block the writer), and it
 * is compacted. It is written to a temporary name, checked with `PRAGMA integrity_check`, synced to disk
 * and only then renamed into place, so a backup file that exists is a complete one.
 */
import { closeSync, copyFileSync, existsSync, fsyncSync, mkdirSync, openSync, renameSync, rmSync, statSync } from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import sqlite3 from 'sqlite3';
import { ConfigError, loadConfig } from '../config/config.js';

function open(file: string, mode: number): Promise<sqlite3.Database> {
  return new Promise((resolve, reject) => {
    const db = new sqlite3.Database(file, mode, (err) => (err ? reject(err) : resolve(db)));
  });
}

function run(db: sqlite3.Database, sql: string, params: unknown[] = []): Promise<void> {
  return new Promise((resolve, reject) => db.run(sql, params, (err) => (err ? reject(err) : resolve())));
}

function all<T>(db: sqlite3.Database, sql: string): Promise<T[]> {
  return new Promise((resolve, reject) => db.all(sql, (err, rows) => (err ? reject(err) : resolve(rows as T[]))));
}

function close(db: sqlite3.Database): Promise<void> {
  return new Promise((resolve, reject) => db.close((err) => (err ? reject(err) : resolve())));
}

function fsyncFile(file: string): void {
  const fd = openSync(file, 'r');
  try {
    fsyncSync(fd);
  } finally {
    closeSync(fd);
  }
}

/** Runs `PRAGMA integrity_check` on a database file; resolves to its messages (`['ok']` when sound). */
export async function integrityCheck(file: string): Promise<string[]> {
  const db = await open(file, sqlite3.OPEN_READONLY);
  try {
    const rows = await all<{ integrity_check: string }>(db, 'PRAGMA integrity_check');
    return rows.map((r) => r.integrity_check);
  } finally {
    await close(db);
  }
}

/**
 * Copies the live database at `sourceFile` to `targetFile` as a consistent snapshot. Refuses to
 * overwrite an existing file. Resolves to the target's size in bytes.
 */
export async function backupDatabase(sourceFile: string, targetFile: string): Promise<{ bytes: number }> {
  if (!existsSync(sourceFile)) throw new Error(`No database at ${sourceFile}`);
  if (existsSync(targetFile)) throw new Error(`${targetFile} exists already; choose another name`);
  mkdirSync(path.dirname(targetFile), { recursive: true });
  const partial = `${targetFile}.partial-${process.pid}`;
  rmSync(partial, { force: true });
  const db = await open(sourceFile, sqlite3.OPEN_READWRITE);
  try {
    // The server may hold the write lock for a moment; wait for it rather than fail.
    await run(db, 'PRAGMA busy_timeout = 10000');
    await run(db, 'VACUUM INTO ?', [partial]);
  } finally {
    await close(db);
  }
  try {
    const problems = await integrityCheck(partial);
    if (problems.join() !== 'ok') throw new Error(`The copy failed its integrity check: ${problems.slice(0, 5).join('; ')}`);
    fsyncFile(partial);
    renameSync(partial, targetFile);
    fsyncFile(path.dirname(targetFile));
  } catch (err) {
    rmSync(partial, { force: true });
    throw err;
  }
  return { bytes: statSync(targetFile).size };
}

/**
 * Puts a backup in place of the database at `databaseFile` (the server must be stopped). The backup is
 * checked first, then copied beside the target, synced and renamed over it. The replaced database and its
 * WAL are kept as `<databaseFile>.before-restore` (+ `-wal`), which SQLite opens as one database again.
 */
export async function restoreBackup(backupFile: string, databaseFile: string): Promise<void> {
  const problems = await integrityCheck(backupFile);
  if (problems.join() !== 'ok') throw new Error(`${backupFile} failed its integrity check: ${problems.slice(0, 5).join('; ')}`);
  mkdirSync(path.dirname(databaseFile), { recursive: true });
  const incoming = `${databaseFile}.restoring-${process.pid}`;
  copyFileSync(backupFile, incoming);
  fsyncFile(incoming);
  // The old WAL must not stay beside the restored file: SQLite would replay it onto the backup.
  for (const suffix of ['', '-wal', '-shm']) rmSync(`${databaseFile}.before-restore${suffix}`, { force: true });
  for (const suffix of ['', '-wal', '-shm']) {
    if (existsSync(`${databaseFile}${suffix}`)) renameSync(`${databaseFile}${suffix}`, `${databaseFile}.before-restore${suffix}`);
  }
  renameSync(incoming, databaseFile);
  fsyncFile(path.dirname(databaseFile));
}

function timestampName(): string {
  return `headroom-${new Date().toISOString().replace(/[-:]/g, '').replace(/\.\d+Z$/, 'Z')}.sqlite`;
}

async function main(argv: string[]): Promise<void> {
  const config = loadConfig();
  if (config.databaseUrl) {
    throw new ConfigError('DATABASE_URL is set: back up PostgreSQL with pg_dump (README "Backup and restore").');
  }
  const source = path.resolve(config.databaseFile);
  if (argv[0] === '--restore') {
    const backup = argv[1];
    if (!backup) throw new ConfigError('Usage: npm run restore -- <backup file>');
    await restoreBackup(path.resolve(backup), source);
    console.log(`Restored ${backup} to ${source} (the previous database is kept as ${source}.before-restore)`);
    return;
  }
  const target = path.resolve(argv[0] ?? path.join(path.dirname(source), 'backups', timestampName()));
  const started = performance.now();
  const { bytes } = await backupDatabase(source, target);
  const ms = performance.now() - started;
  console.log(`Backed up ${source} to ${target} (${(bytes / 1e6).toFixed(1)} MB in ${ms.toFixed(0)} ms, integrity ok)`);
}

if (process.argv[1] && path.resolve(process.argv[1]) === fileURLToPath(import.meta.url)) {
  main(process.argv.slice(2)).catch((err: unknown) => {
    console.error(err instanceof Error ? err.message : err);
    process.exit(1);
  });
}
