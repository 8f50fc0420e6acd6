/**
 * The SQLite chunk store's writer on a database file: write transactions run on a thread of their own
 * (storage/sqlite-writer-thread.ts), one at a time, in the order they are asked for.
 *
 * Why a thread: a transaction is a handful of statements, and with the sqlite3 package each statement
 * is a trip to its worker pool whose answer waits for the event loop. On the main thread that loop is
 * busy parsing request bodies, so under concurrent uploads each trip waited about a millisecond and
 * the one writer was busy all the time committing (measured with `npm run bench -- ingest`). On its own
 * thread the answers come straight back; the main thread only posts the statements and gets one reply.
 *
 * The thread's code is bundled with esbuild when the first write comes (a worker does not take the
 * server's `--import tsx`, and loading tsx in it would cost about 25 MB); the bundle needs only the
 * sqlite3 package. `close()` stops the thread. While no transaction is pending, the thread does not
 * keep the process alive.
 *
 * Memory: the blobs of a transaction (up to about 1 MB while a large upload streams) are copied into
 * one ArrayBuffer that moves to the thread and comes back with the answer, to be used again for a later
 * transaction. Blobs moved to the thread for good piled up there, as the thread allocates so little that
 * it rarely collects garbage (a 100M-sample upload then peaked at 280–331 MB of RSS).
 */
import { build, stop } from 'esbuild';
import { fileURLToPath } from 'node:url';
import { Worker } from 'node:worker_threads';
import { pack, type Stage, type WireStage } from './sqlite-transaction.js';

export type WriterRequest = { id: number; kind: 'transact'; stages: WireStage[]; blobs: ArrayBuffer } | { id: number; kind: 'close' };
export type WriterReply =
  | { id: number; committed: boolean; blobs?: ArrayBuffer }
  | { id: number; error: { name: string; message: string; code?: string | undefined; errno?: number | undefined }; blobs?: ArrayBuffer };

/** Transfer buffers kept for reuse: how many, and the largest kept. */
const SPARE_BUFFERS = 4;
const SPARE_BUFFER_MAX_BYTES = 16 * 1024 * 1024;

const THREAD_FILE = fileURLToPath(new URL('./sqlite-writer-thread.ts', import.meta.url));
let threadCode: Promise<string> | undefined;

/** The thread as one CommonJS script whose `require` (of sqlite3) resolves from the thread's own file. */
function bundledThread(): Promise<string> {
  threadCode ??= build({ entryPoints: [THREAD_FILE], bundle: true, platform: 'node', format: 'cjs', target: 'node20', external: ['sqlite3'], write: false, logLevel: 'silent' })
    .then((result) => `(function (require) {\n${result.outputFiles[0]!.text}\n})(require('node:module').createRequire(${JSON.stringify(THREAD_FILE)}));`)
    .finally(() => stop()) // esbuild's helper process is not needed again
    .catch((err: unknown) => {
      threadCode = undefined; // tried again on the next write
      throw err;
    });
  return threadCode;
}

interface Pending {
  resolve: (committed: boolean) => void;
  reject: (err: Error) => void;
}

export class SqliteWriter {
  private worker: Promise<Worker> | undefined;
  private running: Worker | undefined;
  private nextId = 1;
  private readonly pending = new Map<number, Pending>();
  /** Transfer buffers back from the thread, ready for the next transactions. */
  private readonly spare: ArrayBuffer[] = [];

  constructor(private readonly file: string) {}

  /** Runs the stages in one transaction (runTransaction in storage/sqlite-transaction.ts); resolves with whether it committed. */
  transact(stages: Stage[]): Promise<boolean> {
    const { stages: wire, blobs } = pack(stages, (size) => this.transferBuffer(size));
    return this.request({ id: this.nextId++, kind: 'transact', stages: wire, blobs }, [blobs]);
  }

  /** Lets every transaction asked for finish, closes the thread's connection and stops the thread. */
  async close(): Promise<void> {
    const started = this.worker;
    if (!started) return;
    await this.request({ id: this.nextId++, kind: 'close' }).catch(() => undefined);
    const worker = await started;
    this.running = undefined;
    this.worker = undefined;
    await worker.terminate();
  }

  /** A kept transfer buffer of at least `size` bytes, or a new one. */
  private transferBuffer(size: number): ArrayBuffer {
    const k = this.spare.findIndex((b) => b.byteLength >= size);
    return k >= 0 ? (this.spare.splice(k, 1)[0] as ArrayBuffer) : new ArrayBuffer(Math.max(size, 64 * 1024));
  }

  /** Keeps a buffer back from the thread, unless it is too large; with too many kept, the smallest goes. */
  private keep(buffer: ArrayBuffer | undefined): void {
    if (!buffer || buffer.byteLength > SPARE_BUFFER_MAX_BYTES) return;
    this.spare.push(buffer);
    if (this.spare.length > SPARE_BUFFERS) this.spare.sort((a, b) => b.byteLength - a.byteLength).pop();
  }

  private async request(request: WriterRequest, transfer: ArrayBuffer[] = []): Promise<boolean> {
    // Requests wait for the same start, so they reach the thread in the order they were made. A start
    // that failed is tried again by the next request.
    this.worker ??= this.start().catch((err: unknown) => {
      this.worker = undefined;
      throw err;
    });
    const worker = await this.worker;
    return new Promise<boolean>((resolve, reject) => {
      if (this.pending.size === 0) worker.ref();
      this.pending.set(request.id, { resolve, reject });
      worker.postMessage(request, transfer);
    });
  }

  private async start(): Promise<Worker> {
    const worker = new Worker(await bundledThread(), { eval: true, workerData: { file: this.file } });
    worker.unref();
    worker.on('message', (reply: WriterReply) => {
      this.keep(reply.blobs);
      const waiting = this.pending.get(reply.id);
      if (!waiting) return;
      this.pending.delete(reply.id);
      if (this.pending.size === 0) worker.unref();
      if ('error' in reply) waiting.reject(Object.assign(new Error(reply.error.message), reply.error));
      else waiting.resolve(reply.committed);
    });
    // A thread that fails or stops fails what it was asked; the next write starts a new one. SQLite
    // rolls back a transaction whose connection went away, so nothing is half-written.
    const stopped = (err: Error) => {
      if (this.running !== worker) return;
      this.running = undefined;
      this.worker = undefined;
      for (const waiting of this.pending.values()) waiting.reject(err);
      this.pending.clear();
    };
    this.running = worker;
    worker.on('error', stopped);
    worker.on('exit', (code) => stopped(new Error(`The chunk writer thread stopped (exit code ${code})`)));
    return worker;
  }
}
