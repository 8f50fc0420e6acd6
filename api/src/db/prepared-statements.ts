/**
 * Prepared SQLite statements kept per connection and reused.
 *
 * Why: `Database#run(sql, params)` of the sqlite3 package prepares, runs and finalizes a new statement,
 * three trips to its worker thread, each of which waits for the event loop on the way back; on a busy
 * server one trip costs about half a millisecond. A statement prepared once costs one trip per use.
 *
 * Runs of different statements on one connection are not ordered by the sqlite3 package (only calls
 * made through the Database are, in serialize mode): callers await each run before the next.
 * SQLite refuses to close a connection with statements still open, so `finalizeAll()` must run first
 * (db/open.ts does, through `Db.onClose`).
 */
import type { Database as SqliteDatabase, Statement as SqliteStatement } from 'sqlite3';

export type SqlParam = string | number | null | Buffer;

export class PreparedStatements {
  private readonly byConnection = new Map<SqliteDatabase, Map<string, SqliteStatement>>();

  private statement(conn: SqliteDatabase, sql: string): SqliteStatement {
    let statements = this.byConnection.get(conn);
    if (!statements) {
      statements = new Map();
      this.byConnection.set(conn, statements);
    }
    let statement = statements.get(sql);
    if (!statement) {
      const cache = statements;
      // A statement that fails to prepare reports the error to every run queued on it; drop it so the
      // next call prepares afresh.
      statement = conn.prepare(sql, (err: Error | null) => {
        if (err) cache.delete(sql);
      });
      statements.set(sql, statement);
    }
    return statement;
  }

  /** Runs a statement; resolves with the number of rows it changed. */
  run(conn: SqliteDatabase, sql: string, params: SqlParam[] = []): Promise<number> {
    return new Promise((resolve, reject) => {
      this.statement(conn, sql).run(params, function (this: { changes: number }, err: Error | null) {
        if (err) reject(err);
        else resolve(this.changes);
      });
    });
  }

  /** Runs a query; resolves with its rows. */
  all<T>(conn: SqliteDatabase, sql: string, params: SqlParam[] = []): Promise<T[]> {
    return new Promise((resolve, reject) => {
      this.statement(conn, sql).all(params, (err: Error | null, rows: T[]) => (err ? reject(err) : resolve(rows)));
    });
  }

  /** Finalizes every statement (before the connections close). */
  async finalizeAll(): Promise<void> {
    const statements = [...this.byConnection.values()].flatMap((m) => [...m.values()]);
    this.byConnection.clear();
    await Promise.all(statements.map((s) => new Promise<void>((resolve) => s.finalize(() => resolve()))));
  }
}
