/**
 * The chunk store's writer thread on a database file: transactions commit whole or not at all, in the
 * order they were asked for, blobs arrive bit for bit, and a failed statement is reported with SQLite's
 * own error and leaves the writer usable.
 */
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import sqlite3 from 'sqlite3';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { SqliteWriter } from './sqlite-writer.js';

describe('SqliteWriter', () => {
  let dir: string;
  let file: string;
  let writer: SqliteWriter;
  beforeAll(async () => {
    dir = mkdtempSync(path.join(tmpdir(), 'headroom-writer-'));
    file = path.join(dir, 'writer.sqlite');
    writer = new SqliteWriter(file);
    await writer.transact([{ statements: [['CREATE TABLE items (k INTEGER PRIMARY KEY, label TEXT, data BLOB)', []]] }]);
  });
  afterAll(async () => {
    await writer.close();
    rmSync(dir, { recursive: true, force: true });
  });

  /** Rows as another connection sees them (what the chunk store's reader sees). */
  async function rows(): Promise<Array<{ k: number; label: string; data: Buffer | null }>> {
    const conn = await new Promise<sqlite3.Database>((resolve, reject) => {
      const db = new sqlite3.Database(file, (err) => (err ? reject(err) : resolve(db)));
    });
    try {
      return await new Promise((resolve, reject) => conn.all('SELECT k, label, data FROM items ORDER BY k', (err, r) => (err ? reject(err) : resolve(r as never))));
    } finally {
      await new Promise((resolve) => conn.close(resolve));
    }
  }

  it('when transactions are asked for at once, then they commit in that order, with their blobs bit for bit', async () => {
    // A slice of a larger buffer (non-zero offset) as well as whole buffers.
    const big = Buffer.from(Float32Array.from({ length: 4096 }, (_, i) => Math.sin(i) * 1e3).buffer);
    const slice = Buffer.from('..headroom..').subarray(2, 10);
    const results = await Promise.all(
      Array.from({ length: 20 }, (_, k) =>
        writer.transact([
          {
            statements: [
              ['INSERT INTO items (k, label, data) VALUES (?, ?, ?)', [k, `item ${k}`, k % 2 === 0 ? big : slice]],
              // Each transaction sees the one before it: the label of k - 1 is there to be updated.
              ['UPDATE items SET label = label || ? WHERE k = ?', [' seen', k - 1]],
            ],
            expectChanges: [1, k === 0 ? 0 : 1],
          },
        ]),
      ),
    );
    expect(results).toEqual(Array(20).fill(true));
    const stored = await rows();
    expect(stored.map((r) => r.label)).toEqual(Array.from({ length: 20 }, (_, k) => (k < 19 ? `item ${k} seen` : `item ${k}`)));
    for (const r of stored) expect(r.data!.equals(r.k % 2 === 0 ? big : slice)).toBe(true);
  });

  it('when a stage changes other counts than it expects, then nothing of the transaction is kept', async () => {
    const before = await rows();
    const committed = await writer.transact([
      { statements: [['INSERT INTO items (k, label) VALUES (?, ?)', [100, 'kept?']]], expectChanges: [1] },
      { statements: [['UPDATE items SET label = ? WHERE k = ?', ['nobody', 12345]]], expectChanges: [1] },
    ]);
    expect(committed).toBe(false);
    expect(await rows()).toEqual(before);
  });

  it('when a statement fails, then the error is SQLite\'s, nothing is kept, and the next transaction commits', async () => {
    const before = await rows();
    const failed = writer.transact([{ statements: [['INSERT INTO items (k, label) VALUES (?, ?)', [200, 'first']], ['INSERT INTO items (k, label) VALUES (?, ?)', [0, 'duplicate']]] }]);
    await expect(failed).rejects.toMatchObject({ code: 'SQLITE_CONSTRAINT', message: expect.stringContaining('UNIQUE constraint failed: items.k') });
    expect(await rows()).toEqual(before);
    expect(await writer.transact([{ statements: [['INSERT INTO items (k, label) VALUES (?, ?)', [300, 'after']]], expectChanges: [1] }])).toBe(true);
    expect((await rows()).at(-1)).toMatchObject({ k: 300, label: 'after' });
  });

  it('when it is closed, then a later write starts a new thread', async () => {
    await writer.close();
    expect(await writer.transact([{ statements: [['INSERT INTO items (k, label) VALUES (?, ?)', [400, 'reopened']]], expectChanges: [1] }])).toBe(true);
    expect((await rows()).at(-1)).toMatchObject({ k: 400, label: 'reopened' });
  });
});
