/**
 * Chunk store on SQLite through the raw sqlite3 connections of Sequelize's connection manager.
 *
 * Why not the models: every statement through the sqlite3 package is a round trip to its worker
 * thread, and a Sequelize transaction on a file database opens a fresh connection (~2.5 ms), which
 * caps ingest far below the product's targets (bench/ingest.bench.ts). So, on a file database:
 * - writes go through one dedicated connection (`headroom-chunk-writer`), one transaction at a time
 *   (a promise queue), BEGIN IMMEDIATE … COMMIT, with multi-row INSERTs bound as parameters;
 * - reads go through another (`headroom-chunk-reader`), which in WAL mode sees only committed data;
 * - both use prepared statements, kept and reused (db/prepared-statements.ts): one trip to the worker
 *   thread per statement instead of three. A write transaction is a handful of trips, and each waits
 *   for the event loop, so the number of trips is what limits how many batches commit per second.
 * Both get the same pragmas as every connection (db/open.ts). Nothing inside a write transaction waits
 * for a Sequelize query, so the two can never wait for each other's lock.
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
import { SUMMARY_COLUMNS, type ChunkSummaryRow } from './summary-rows.js';

type Param = SqlParam;
type Statement = [sql: string, params: Param[]];
/** Statements run together, and an optional check of their change counts (false: roll back). */
interface Stage {
  statements: Statement[];
  check?: (changes: number[]) => boolean;
}

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

/** Runs each stage's statements with `runStatements`; false as soon as a stage's check refuses its change counts. */
async function runStages(stages: Stage[], runStatements: (statements: Statement[]) => Promise<number[]>): Promise<boolean> {
  for (const stage of stages) {
    const changes = await runStatements(stage.statements);
    if (stage.check && !stage.check(changes)) return false;
  }
  return true;
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
  private readonly manager: ConnectionManager;
  /** Tail of the queue of write transactions on the writer connection. */
  private writeQueue: Promise<unknown> = Promise.resolve();
  private readonly sqlCache = new Map<string, string>();
  private writerReady = false;
  private bytesSinceCheckpoint = 0;
  private checkpointing = false;
  private readonly prepared = new PreparedStatements();
  private readonly sequelize: Sequelize;

  constructor(db: Pick<Db, 'sequelize' | 'onClose'>) {
    this.sequelize = db.sequelize;
    this.inMemory = (db.sequelize as unknown as { options: { storage?: string } }).options.storage === ':memory:';
    this.manager = db.sequelize.connectionManager as unknown as ConnectionManager;
    db.onClose(() => this.prepared.finalizeAll());
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
   * Runs the stages in one write transaction, after every earlier transaction has finished: BEGIN
   * IMMEDIATE (the statement that waits for the write lock), then each stage's statements one after the
   * other, then COMMIT — or ROLLBACK when a statement fails or a stage's check refuses its change
   * counts. Returns whether it committed. No statement runs after one that failed.
   *
   * In memory (tests), a stage's statements are queued at once on the single connection instead
   * (serialize mode); there a stage holds one statement that matters and, after it, only statements
   * harmless on their own (inserts of new chunks at places no reader sees).
   */
  private transact(stages: Stage[]): Promise<boolean> {
    const next = this.writeQueue.then(async () => {
      if (this.inMemory) {
        const refused = new Error('refused');
        try {
          await this.sequelize.transaction(async (transaction) => {
            const conn = (transaction as unknown as { connection: SqliteDatabase }).connection;
            if (!(await runStages(stages, (statements) => pipeline(conn, statements)))) throw refused;
          });
          return true;
        } catch (err) {
          if (err === refused) return false;
          throw err;
        }
      }
      const conn = await this.manager.getConnection({ uuid: 'headroom-chunk-writer' });
      if (!this.writerReady) {
        await run(conn, 'PRAGMA wal_autocheckpoint = 0');
        this.writerReady = true;
      }
      const oneByOne = async (statements: Statement[]): Promise<number[]> => {
        const changes: number[] = [];
        for (const [sql, params] of statements) changes.push(await this.prepared.run(conn, sql, params));
        return changes;
      };
      await this.prepared.run(conn, 'BEGIN IMMEDIATE');
      let committed = false;
      try {
        if (await runStages(stages, oneByOne)) {
          await this.prepared.run(conn, 'COMMIT');
          committed = true;
        }
      } finally {
        if (!committed) await this.prepared.run(conn, 'ROLLBACK').catch(() => undefined);
      }
      if (committed) this.wrote(stages);
      return committed;
    });
    this.writeQueue = next.catch(() => undefined);
    return next;
  }

  /** Counts what a transaction wrote and starts a background checkpoint once enough has gathered. */
  private wrote(stages: Stage[]): void {
    for (const stage of stages) {
      for (const [, params] of stage.statements) for (const p of params) this.bytesSinceCheckpoint += Buffer.isBuffer(p) ? p.length : 16;
    }
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

  private cachedInsertSql(table: string, columns: readonly string[], rows: number): string {
    const key = `${table}:${rows}`;
    let sql = this.sqlCache.get(key);
    if (!sql) {
      sql = insertSql(table, columns, rows);
      this.sqlCache.set(key, sql);
    }
    return sql;
  }

  /** INSERT statements for chunks (two tables, up to ROWS_PER_INSERT rows each). */
  private insertChunks(traceId: string, organisationId: string, chunks: StoredChunk[]): Statement[] {
    const statements: Statement[] = [];
    for (let start = 0; start < chunks.length; start += ROWS_PER_INSERT) {
      const group = chunks.slice(start, start + ROWS_PER_INSERT);
      const summaryParams: Param[] = [];
      const dataParams: Param[] = [];
      for (const c of group) {
        summaryParams.push(traceId, c.row.seq, organisationId);
        for (const column of SUMMARY_COLUMNS) summaryParams.push(c.row[column]);
        dataParams.push(traceId, c.row.seq, c.envelope, c.times, c.samples);
      }
      statements.push([this.cachedInsertSql('trace_chunks', SUMMARY_INSERT_COLUMNS, group.length), summaryParams]);
      statements.push([this.cachedInsertSql('trace_chunk_data', DATA_INSERT_COLUMNS, group.length), dataParams]);
    }
    return statements;
  }

  async insertPending(traceId: string, organisationId: string, chunks: StoredChunk[]): Promise<void> {
    if (chunks.length === 0) return;
    await this.transact([{ statements: this.insertChunks(traceId, organisationId, chunks) }]);
  }

  commit(batch: BatchCommit): Promise<boolean> {
    const s = batch.state;
    const stages: Stage[] = [
      {
        // The conditional UPDATE first, then the new chunks (places no reader sees until chunkCount is
        // raised): should SQLite abandon the transaction on a disk error, whatever runs after it here
        // outside the transaction is such a chunk, which nothing reads.
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
          ...this.insertChunks(batch.traceId, batch.organisationId, batch.chunks),
        ],
        check: (changes) => changes[0] === 1,
      },
    ];
    const c = batch.replaceLast;
    if (c) {
      stages.push({
        statements: [[`UPDATE trace_chunks SET ${SUMMARY_COLUMNS.map((n) => `"${n}" = ?`).join(', ')} WHERE "traceId" = ? AND "seq" = ?`, [...SUMMARY_COLUMNS.map((n) => c.row[n]), batch.traceId, c.row.seq]]],
      });
      stages.push({
        statements: [['UPDATE trace_chunk_data SET "envelope" = ?, "times" = ?, "samples" = ? WHERE "traceId" = ? AND "seq" = ?', [c.envelope, c.times, c.samples, batch.traceId, c.row.seq]]],
      });
    }
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
