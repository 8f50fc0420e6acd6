/**
 * Chunk store on SQLite through raw sqlite3 connections.
 *
 * Why not the models: every statement through the sqlite3 package is a round trip to its worker
 * thread, and a Sequelize transaction on a file database opens a fresh connection (~2.5 ms), which
 * caps ingest far below the product's targets (bench/ingest.bench.ts). So, on a file database:
 * - writes go through one connection on a thread of its own (storage/sqlite-writer.ts), one
 *   transaction at a time, BEGIN IMMEDIATE … COMMIT, with multi-row INSERTs bound as parameters;
 * - reads go through a dedicated connection of Sequelize's connection manager
 *   (`headroom-chunk-reader`), which in WAL mode sees only committed data;
 * - both use prepared statements, kept and reused (db/prepared-statements.ts): one trip to the worker
 *   thread per statement instead of three.
 * Every connection gets the same pragmas (db/sqlite-pragmas.ts). Nothing inside a write transaction
 * waits for a Sequelize query, so the two can never wait for each other's lock.
 *
 * Checkpoints: SQLite copies the WAL back into the database file (and syncs it) inside whichever
 * COMMIT passes 1,000 pages — on a busy disk that COMMIT takes 100 ms or more. The writer connection
 * turns that off and runs a PASSIVE checkpoint on a third connection after every CHECKPOINT_BYTES
 * written, beside the writes rather than inside one (a PASSIVE checkpoint never blocks the writer).
 *
 * An in-memory database has a single connection; there, writes run inside `sequelize.transaction()` so
 * they take part in Sequelize's own bookkeeping (used by tests).
 */
import type { Database as SqliteDatabase } from 'sqlite3';
import type { Sequelize } from 'sequelize';
import { PreparedStatements, type SqlParam } from '../db/prepared-statements.js';
import type { Db } from '../db/open.js';
import type { BatchCommit, ChunkData, ChunkEnvelope, ChunkStore, IdempotencyRecord, StoredChunk } from './chunk-store.js';
import { changesAccepted, type Stage, type Statement } from './sqlite-transaction.js';
import { SqliteWriter } from './sqlite-writer.js';
import { SUMMARY_COLUMNS, type ChunkSummaryRow } from './summary-rows.js';

type Param = SqlParam;

const SUMMARY_INSERT_COLUMNS = ['traceId', 'seq', 'organisationId', ...SUMMARY_COLUMNS];
const DATA_INSERT_COLUMNS = ['traceId', 'seq', 'envelope', 'times', 'samples'];
/** Bytes written to the WAL (about) between background checkpoints. */
const CHECKPOINT_BYTES = 16 * 1024 * 1024;

/** Rows per multi-row INSERT (27 parameters per summary row stays far below SQLite's 32,766). */
const ROWS_PER_INSERT = 64;

function quoted(names: readonly string[]): string {
  return names.map((n) => `"${n}"`).join(', ');
}

function insertSql(table: string, columns: readonly string[], rows: number): string {
  const tuple = `(${columns.map(() => '?').join(', ')})`;
  return `INSERT INTO ${table} (${quoted(columns)}) VALUES ${Array.from({ length: rows }, () => tuple).join(', ')}`;
}

/** Sequelize's SQLite date format, so rows written here read back like rows written by the models. */
export function sqliteDate(date: Date): string {
  return date.toISOString().replace('T', ' ').replace('Z', ' +00:00');
}

function run(conn: SqliteDatabase, sql: string, params: Param[] = []): Promise<number> {
  return new Promise((resolve, reject) => {
    conn.run(sql, params, function (this: { changes: number }, err: Error | null) {
      if (err) reject(err);
      else resolve(this.changes);
    });
  });
}

/**
 * Runs the statements in order on `conn` (serialize mode) without waiting between them; resolves
 * with each one's change count, or rejects with the first error once all have run.
 */
function pipeline(conn: SqliteDatabase, statements: Statement[]): Promise<number[]> {
  return new Promise((resolve, reject) => {
    const changes: number[] = new Array(statements.length).fill(0);
    let pending = statements.length;
    let failure: Error | null = null;
    if (pending === 0) resolve(changes);
    conn.serialize(() => {
      statements.forEach(([sql, params], k) => {
        conn.run(sql, params, function (this: { changes: number }, err: Error | null) {
          if (err) failure ??= err;
          else changes[k] = this.changes;
          if (--pending === 0) {
            if (failure) reject(failure);
            else resolve(changes);
          }
        });
      });
    });
  });
}

/** About how many bytes the stages write (blobs, and 16 bytes for any other value). */
function bytesOf(stages: Stage[]): number {
  let bytes = 0;
  for (const stage of stages) for (const [, params] of stage.statements) for (const p of params) bytes += Buffer.isBuffer(p) ? p.length : 16;
  return bytes;
}

function all<T>(conn: SqliteDatabase, sql: string, params: Param[] = []): Promise<T[]> {
  return new Promise((resolve, reject) => {
    conn.all(sql, params, (err: Error | null, rows: T[]) => (err ? reject(err) : resolve(rows)));
  });
}

interface ConnectionManager {
  getConnection(options?: { uuid?: string }): Promise<SqliteDatabase>;
}

export class SqliteChunkStore implements ChunkStore {
  private readonly inMemory: boolean;
  /** The writer thread, on a file database. */
  private readonly writer: SqliteWriter | null;
  private readonly manager: ConnectionManager;
  /** Tail of the queue of write transactions in memory. */
  private writeQueue: Promise<unknown> = Promise.resolve();
  private readonly sqlCache = new Map<string, string>();
  private bytesSinceCheckpoint = 0;
  private checkpointing = false;
  private readonly prepared = new PreparedStatements();
  private readonly sequelize: Sequelize;

  constructor(db: Pick<Db, 'sequelize' | 'onClose'>) {
    this.sequelize = db.sequelize;
    const file = (db.sequelize as unknown as { options: { storage?: string } }).options.storage ?? ':memory:';
    this.inMemory = file === ':memory:';
    this.writer = this.inMemory ? null : new SqliteWriter(file);
    this.manager = db.sequelize.connectionManager as unknown as ConnectionManager;
    db.onClose(async () => {
      await this.writer?.close();
      await this.prepared.finalizeAll();
    });
  }

  /** Rows of a read: through a kept prepared statement on a file database (the in-memory one is short-lived). */
  private async query<T>(sql: string, params: Param[]): Promise<T[]> {
    const conn = await this.reader();
    return this.inMemory ? all<T>(conn, sql, params) : this.prepared.all<T>(conn, sql, params);
  }

  private reader(): Promise<SqliteDatabase> {
    return this.manager.getConnection({ uuid: 'headroom-chunk-reader' });
  }

  /**
   * Runs the stages in one write transaction, after every earlier one has finished (runTransaction in
   * storage/sqlite-transaction.ts, on the writer thread). Returns whether it committed: false when a
   * stage's change counts are not the expected ones, and then nothing was written.
   *
   * In memory (tests), a stage's statements are queued at once on the single connection instead
   * (serialize mode), inside `sequelize.transaction()`, which rolls them all back when a stage's change
   * counts are refused.
   */
  private async transact(stages: Stage[]): Promise<boolean> {
    if (!this.writer) return this.transactInMemory(stages);
    const bytes = bytesOf(stages);
    const committed = await this.writer.transact(stages);
    if (committed) this.wrote(bytes);
    return committed;
  }

  /** The in-memory transaction: one at a time, inside `sequelize.transaction()` on its single connection. */
  private transactInMemory(stages: Stage[]): Promise<boolean> {
    const next = this.writeQueue.then(async () => {
      const refused = new Error('refused');
      try {
        await this.sequelize.transaction(async (transaction) => {
          const conn = (transaction as unknown as { connection: SqliteDatabase }).connection;
          for (const stage of stages) if (!changesAccepted(stage, await pipeline(conn, stage.statements))) throw refused;
        });
        return true;
      } catch (err) {
        if (err === refused) return false;
        throw err;
      }
    });
    this.writeQueue = next.catch(() => undefined);
    return next;
  }

  /** Counts what a transaction wrote and starts a background checkpoint once enough has gathered. */
  private wrote(bytes: number): void {
    this.bytesSinceCheckpoint += bytes;
    if (this.bytesSinceCheckpoint < CHECKPOINT_BYTES || this.checkpointing) return;
    this.checkpointing = true;
    this.bytesSinceCheckpoint = 0;
    void this.manager
      .getConnection({ uuid: 'headroom-chunk-checkpointer' })
      .then((conn) => run(conn, 'PRAGMA wal_checkpoint(PASSIVE)'))
      .catch(() => undefined) // a checkpoint that could not run is retried after the next 16 MB
      .finally(() => {
        this.checkpointing = false;
      });
  }

  private cachedInsertSql(table: string, columns: readonly string[], rows: number, upsert: boolean): string {
    const key = `${table}:${rows}:${upsert}`;
    let sql = this.sqlCache.get(key);
    if (!sql) {
      sql = insertSql(table, columns, rows);
      // The batch's first row may be the trace's last committed chunk, topped up: that one row (and no
      // other, the WHERE) replaces the stored one. A row that collides otherwise is neither inserted nor
      // updated, so the statement's change count falls short and the batch is rolled back.
      if (upsert) {
        const updated = columns.filter((c) => !['traceId', 'seq', 'organisationId'].includes(c));
        sql += ` ON CONFLICT ("traceId", "seq") DO UPDATE SET ${updated.map((c) => `"${c}" = excluded."${c}"`).join(', ')} WHERE excluded."seq" = ?`;
      }
      this.sqlCache.set(key, sql);
    }
    return sql;
  }

  /**
   * INSERT statements for chunks (two tables, up to ROWS_PER_INSERT rows each), with the number of
   * rows each must change. `replacing`: the chunk's seq that may already be stored and is replaced.
   */
  private insertChunks(traceId: string, organisationId: string, chunks: StoredChunk[], replacing: number | null = null): { statements: Statement[]; rows: number[] } {
    const statements: Statement[] = [];
    const rows: number[] = [];
    for (let start = 0; start < chunks.length; start += ROWS_PER_INSERT) {
      const group = chunks.slice(start, start + ROWS_PER_INSERT);
      const upsert = start === 0 && replacing !== null;
      const summaryParams: Param[] = [];
      const dataParams: Param[] = [];
      for (const c of group) {
        summaryParams.push(traceId, c.row.seq, organisationId);
        for (const column of SUMMARY_COLUMNS) summaryParams.push(c.row[column]);
        dataParams.push(traceId, c.row.seq, c.envelope, c.times, c.samples);
      }
      if (upsert) {
        summaryParams.push(replacing);
        dataParams.push(replacing);
      }
      statements.push([this.cachedInsertSql('trace_chunks', SUMMARY_INSERT_COLUMNS, group.length, upsert), summaryParams]);
      statements.push([this.cachedInsertSql('trace_chunk_data', DATA_INSERT_COLUMNS, group.length, upsert), dataParams]);
      rows.push(group.length, group.length);
    }
    return { statements, rows };
  }

  async insertPending(traceId: string, organisationId: string, chunks: StoredChunk[]): Promise<void> {
    if (chunks.length === 0) return;
    await this.transact([{ statements: this.insertChunks(traceId, organisationId, chunks).statements }]);
  }

  commit(batch: BatchCommit): Promise<boolean> {
    const s = batch.state;
    const c = batch.replaceLast;
    // The replaced last chunk (topped up by this batch) goes first, in the same INSERTs as the new ones.
    const chunks = c ? [c, ...batch.chunks] : batch.chunks;
    const inserts = this.insertChunks(batch.traceId, batch.organisationId, chunks, c ? c.row.seq : null);
    const stages: Stage[] = [
      {
        // The conditional UPDATE first, then the chunks: new ones at places no reader sees until
        // chunkCount is raised, and the topped-up last chunk, which readers do see, replaced in the same
        // INSERTs. A statement that fails (a disk error may end the transaction) stops the rest from
        // running (runTransaction), so nothing runs outside the transaction. Each statement is one trip
        // to the sqlite3 worker pool and back through the writer thread's event loop, so there are as
        // few as can be: the trace row, then one INSERT per table.
        statements: [
          [
            `UPDATE traces SET "sampleCount" = ?, "chunkCount" = ?, "originUs" = ?, "firstSampleUs" = ?, "lastSampleUs" = ?,
               "gapThresholdS" = ?, "summary" = ?, "updatedAt" = ?
             WHERE "id" = ? AND "organisationId" = ? AND "status" = 'open' AND "chunkCount" = ?`,
            [
              s.sampleCount, s.chunkCount, s.originUs, s.firstSampleUs, s.lastSampleUs, s.gapThresholdS,
              s.summary === null ? null : JSON.stringify(s.summary), sqliteDate(new Date()),
              batch.traceId, batch.organisationId, batch.expectedChunkCount,
            ],
          ],
          ...inserts.statements,
        ],
        expectChanges: [1, ...inserts.rows],
      },
    ];
    if (batch.idempotency) stages.push({ statements: [idempotencyInsert(batch.idempotency)] });
    return this.transact(stages);
  }

  async discardPending(traceId: string, fromSeq: number): Promise<void> {
    await this.transact([
      {
        statements: [
          ['DELETE FROM trace_chunk_data WHERE "traceId" = ? AND "seq" >= ?', [traceId, fromSeq]],
          ['DELETE FROM trace_chunks WHERE "traceId" = ? AND "seq" >= ?', [traceId, fromSeq]],
        ],
      },
    ]);
  }

  async readSummaries(traceId: string, chunkCount: number, fromUs: number, toUs: number): Promise<ChunkSummaryRow[]> {
    return this.query<ChunkSummaryRow>(
      `SELECT "seq", ${quoted(SUMMARY_COLUMNS)} FROM trace_chunks
       WHERE "traceId" = ? AND "seq" < ? AND "lastUs" >= ? AND "firstUs" <= ? ORDER BY "seq"`,
      [traceId, chunkCount, fromUs, toUs],
    );
  }

  async readData(traceId: string, fromSeq: number, toSeq: number): Promise<ChunkData[]> {
    return this.query<ChunkData>(
      'SELECT "seq", "samples", "times" FROM trace_chunk_data WHERE "traceId" = ? AND "seq" >= ? AND "seq" <= ? ORDER BY "seq"',
      [traceId, fromSeq, toSeq],
    );
  }

  async readDataOf(traceId: string, seqs: number[]): Promise<ChunkData[]> {
    if (seqs.length === 0) return [];
    return this.query<ChunkData>(
      `SELECT "seq", "samples", "times" FROM trace_chunk_data WHERE "traceId" = ? AND "seq" IN (${seqs.map(() => '?').join(', ')}) ORDER BY "seq"`,
      [traceId, ...seqs],
    );
  }

  async readEnvelopes(traceId: string, fromSeq: number, toSeq: number, withTimes: boolean): Promise<ChunkEnvelope[]> {
    return this.query<ChunkEnvelope>(
      `SELECT "seq", "envelope", ${withTimes ? '"times"' : 'NULL AS "times"'} FROM trace_chunk_data
       WHERE "traceId" = ? AND "seq" >= ? AND "seq" <= ? ORDER BY "seq"`,
      [traceId, fromSeq, toSeq],
    );
  }
}

function idempotencyInsert(r: IdempotencyRecord): Statement {
  return [
    'INSERT INTO idempotency_keys ("organisationId", "key", "operation", "fingerprint", "status", "response", "createdAt") VALUES (?, ?, ?, ?, ?, ?, ?)',
    [r.organisationId, r.key, r.operation, r.fingerprint, r.status, r.response, sqliteDate(new Date())],
  ];
}
