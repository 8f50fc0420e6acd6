/**
 * One write transaction of the SQLite chunk store, as plain data: statements with their parameters,
 * in stages, each stage with the change counts it must produce. Plain data, because the transaction
 * runs on the chunk writer's own thread (storage/sqlite-writer.ts) on a file database; `pack` and
 * `unpack` carry it there. The thread loads this module, so it imports no Node-only paths or app code.
 */
import type { Database as SqliteDatabase } from 'sqlite3';
import type { PreparedStatements, SqlParam } from '../db/prepared-statements.js';

export type Statement = [sql: string, params: SqlParam[]];

/** Statements run together; `expectChanges[k]`: the rows statement k must change, or the transaction rolls back. */
export interface Stage {
  statements: Statement[];
  expectChanges?: number[];
}

/** Whether a stage's change counts are the ones it expects. */
export function changesAccepted(stage: Stage, changes: number[]): boolean {
  return (stage.expectChanges ?? []).every((n, k) => changes[k] === n);
}

/**
 * Runs the stages in one transaction on `conn` through kept prepared statements: BEGIN IMMEDIATE (the
 * statement that waits for the write lock), each stage's statements one after the other, then COMMIT —
 * or ROLLBACK when a statement fails or a stage's change counts are not the expected ones. Resolves with
 * whether it committed; rejects with the first statement error. No statement runs after one that failed.
 */
export async function runTransaction(conn: SqliteDatabase, prepared: PreparedStatements, stages: Stage[]): Promise<boolean> {
  await prepared.run(conn, 'BEGIN IMMEDIATE');
  let committed = false;
  try {
    for (const stage of stages) {
      const changes: number[] = [];
      for (const [sql, params] of stage.statements) changes.push(await prepared.run(conn, sql, params));
      if (!changesAccepted(stage, changes)) return false;
    }
    await prepared.run(conn, 'COMMIT');
    committed = true;
    return true;
  } finally {
    if (!committed) await prepared.run(conn, 'ROLLBACK').catch(() => undefined);
  }
}

/** A parameter as sent to the thread: a blob is a place in the request's `blobs` buffer. */
export type WireParam = Exclude<SqlParam, Buffer> | { blobAt: number; length: number };
export interface WireStage {
  statements: Array<[sql: string, params: WireParam[]]>;
  expectChanges?: number[];
}

/** The stages with their blobs copied into one transferable buffer of at least their size, from `buffer(size)`. */
export function pack(stages: Stage[], buffer: (size: number) => ArrayBuffer): { stages: WireStage[]; blobs: ArrayBuffer } {
  let size = 0;
  for (const stage of stages) for (const [, params] of stage.statements) for (const p of params) if (Buffer.isBuffer(p)) size += p.length;
  const blobs = buffer(size);
  const bytes = new Uint8Array(blobs);
  let at = 0;
  const wire = stages.map((stage) => ({
    ...stage,
    statements: stage.statements.map(([sql, params]): [string, WireParam[]] => [
      sql,
      params.map((p) => {
        if (!Buffer.isBuffer(p)) return p;
        bytes.set(p, at);
        at += p.length;
        return { blobAt: at - p.length, length: p.length };
      }),
    ]),
  }));
  return { stages: wire, blobs };
}

/** The stages as the thread runs them: blobs are views of the request's buffer (no copy). */
export function unpack(stages: WireStage[], blobs: ArrayBuffer): Stage[] {
  return stages.map((stage) => ({
    ...stage,
    statements: stage.statements.map(([sql, params]): Statement => [sql, params.map((p) => (p !== null && typeof p === 'object' ? Buffer.from(blobs, p.blobAt, p.length) : p))]),
  }));
}

