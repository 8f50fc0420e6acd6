import { existsSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import sqlite3 from 'sqlite3';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { makeTestApp, type TestApp } from '../testing/make-test-app.js';
import { testsRunOnPostgres } from '../testing/postgres-scratch-database.js';
import { backupDatabase, integrityCheck, restoreBackup } from './backup.js';

/**
 * Raw SQL on a database file. (Sequelize models belong to one instance per process — the test app's —
 * so copies are read without them.)
 */
function sql<T>(file: string, statement: string, params: unknown[] = []): Promise<T[]> {
  return new Promise((resolve, reject) => {
    const db = new sqlite3.Database(file, sqlite3.OPEN_READWRITE, (openErr) => {
      if (openErr) return reject(openErr);
      db.all(statement, params, (err, rows) => db.close(() => (err ? reject(err) : resolve(rows as T[]))));
    });
  });
}

const siteNames = async (file: string) => (await sql<{ name: string }>(file, 'SELECT name FROM sites')).map((r) => r.name);

// Online backup is a SQLite feature; PostgreSQL deployments use pg_dump.
describe.skipIf(testsRunOnPostgres)('SQLite online backup and restore', () => {
  let t: TestApp;
  let dir: string;
  beforeAll(async () => {
    t = await makeTestApp({ file: true });
    dir = mkdtempSync(path.join(tmpdir(), 'headroom-backup-'));
    for (let i = 0; i < 5; i++) await request(t.app).post('/api/v1/sites').set(await t.auth()).send({ name: `Before backup ${i}` }).expect(201);
  });
  afterAll(async () => {
    await t.close();
    rmSync(dir, { recursive: true, force: true });
  });

  it('when a backup is taken while sites are being written, then it is a sound snapshot with no gap', async () => {
    let writing = true;
    let written = 0;
    const writer = (async () => {
      while (writing) {
        await request(t.app).post('/api/v1/sites').set(await t.auth()).send({ name: `During backup ${written}` }).expect(201);
        written += 1;
      }
    })();
    const target = path.join(dir, 'during-writes.sqlite');
    const { bytes } = await backupDatabase(t.config.databaseFile, target);
    writing = false;
    await writer;

    expect(bytes).toBeGreaterThan(0);
    expect(await integrityCheck(target)).toEqual(['ok']);
    const names = await siteNames(target);
    for (let i = 0; i < 5; i++) expect(names).toContain(`Before backup ${i}`);
    // Writes are sequential, so a consistent snapshot holds a prefix of them: 0..k-1, nothing skipped.
    const during = names.filter((n) => n.startsWith('During backup ')).map((n) => Number(n.slice('During backup '.length)));
    expect(during.sort((a, b) => a - b)).toEqual(Array.from({ length: during.length }, (_, i) => i));
    expect(during.length).toBeLessThanOrEqual(written);
  });

  it('when a backup is restored over a database, then it holds the backup and the old database is kept aside', async () => {
    const backup = path.join(dir, 'to-restore.sqlite');
    await backupDatabase(t.config.databaseFile, backup);
    const expected = (await siteNames(backup)).sort();

    // A database already in place, with a row that is not in the backup.
    const databaseFile = path.join(dir, 'restored', 'headroom.sqlite');
    await backupDatabase(t.config.databaseFile, databaseFile);
    await sql(databaseFile, 'PRAGMA journal_mode = WAL');
    await sql(databaseFile, `INSERT INTO sites (id, organisationId, name, createdAt, updatedAt) VALUES ('old-only', ?, 'Only in the old database', '2024-01-01', '2024-01-01')`, [t.organisationId]);

    await restoreBackup(backup, databaseFile);

    expect(await integrityCheck(databaseFile)).toEqual(['ok']);
    expect((await siteNames(databaseFile)).sort()).toEqual(expected);
    expect(existsSync(`${databaseFile}.before-restore`)).toBe(true);
    expect(await siteNames(`${databaseFile}.before-restore`)).toContain('Only in the old database');
  });

  it('when the target exists, then the backup refuses to overwrite it', async () => {
    const existing = path.join(dir, 'existing.sqlite');
    writeFileSync(existing, 'keep me');
    await expect(backupDatabase(t.config.databaseFile, existing)).rejects.toThrow(/exists already/);
  });

  it('when the backup file is damaged, then restore refuses and the database is untouched', async () => {
    const damaged = path.join(dir, 'damaged.sqlite');
    writeFileSync(damaged, Buffer.alloc(8192, 7));
    const victim = path.join(dir, 'victim.sqlite');
    await backupDatabase(t.config.databaseFile, victim);
    const before = (await siteNames(victim)).sort();
    await expect(restoreBackup(damaged, victim)).rejects.toThrow();
    expect(await integrityCheck(victim)).toEqual(['ok']);
    expect((await siteNames(victim)).sort()).toEqual(before);
  });
});
