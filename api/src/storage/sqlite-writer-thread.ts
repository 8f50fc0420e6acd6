/**
 * The chunk writer's thread (started by storage/sqlite-writer.ts): one SQLite connection to the
 * database file that runs the chunk store's write transactions, one at a time, in the order they
 * arrive. On its own thread each statement's trip to the sqlite3 worker pool comes straight back,
 * instead of waiting behind the request parsing on the main thread's event loop.
 *
 * Bundled with esbuild when the first write comes; it holds the transaction runner and needs only the
 * sqlite3 package: no Sequelize, no models, no app.
 */
import { parentPort, workerData } from 'node:worker_threads';
import sqlite3 from 'sqlite3';
import { PreparedStatements } from '../db/prepared-statements.js';
import { SQLITE_PRAGMAS } from '../db/sqlite-pragmas.js';
import { runTransaction, unpack } from './sqlite-transaction.js';
import type { WriterReply, WriterRequest } from './sqlite-writer.js';

const port = parentPort;
if (!port) throw new Error('sqlite-writer-thread.ts runs only as a worker thread');
const { file } = workerData as { file: string };

function exec(conn: sqlite3.Database, sql: string): Promise<void> {
  return new Promise((resolve, reject) => conn.exec(sql, (err) => (err ? reject(err) : resolve())));
}

async function open(): Promise<sqlite3.Database> {
  const conn = await new Promise<sqlite3.Database>((resolve, reject) => {
    const db = new sqlite3.Database(file, (err) => (err ? reject(err) : resolve(db)));
  });
  for (const pragma of SQLITE_PRAGMAS) await exec(conn, pragma);
  // SQLite would copy the WAL back inside whichever COMMIT passes 1,000 pages; the store runs
  // checkpoints beside the writes instead (storage/sqlite-chunk-store.ts).
  await exec(conn, 'PRAGMA wal_autocheckpoint = 0');
  return conn;
}

const prepared = new PreparedStatements();
const connection = open();
let queue: Promise<unknown> = Promise.resolve();

async function handle(request: WriterRequest): Promise<WriterReply> {
  try {
    const conn = await connection;
    if (request.kind === 'close') {
      await prepared.finalizeAll();
      await new Promise<void>((resolve, reject) => conn.close((err) => (err ? reject(err) : resolve())));
      return { id: request.id, committed: false };
    }
    // The blobs go back with the answer (see storage/sqlite-writer.ts).
    return { id: request.id, committed: await runTransaction(conn, prepared, unpack(request.stages, request.blobs)), blobs: request.blobs };
  } catch (err) {
    const e = err as Error & { code?: string; errno?: number };
    const blobs = request.kind === 'transact' ? request.blobs : undefined;
    return { id: request.id, error: { name: e.name, message: e.message, code: e.code, errno: e.errno }, ...(blobs ? { blobs } : {}) };
  }
}

port.on('message', (request: WriterRequest) => {
  queue = queue.then(async () => {
    const reply = await handle(request);
    port.postMessage(reply, reply.blobs ? [reply.blobs] : []);
  });
});
