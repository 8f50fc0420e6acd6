/**
 * The chunk store: where a trace's samples live. Two implementations share this interface:
 * `SqliteChunkStore` (prepared statements on dedicated sqlite3 connections, for the ingest rates the
 * product needs) and `SequelizeChunkStore` (models only, any dialect; used on PostgreSQL).
 *
 * Visibility rule: a trace's committed chunks are seq 0 … chunkCount − 1 (chunkCount is a column of
 * `traces`). A large batch is written as "pending" chunks (seq ≥ chunkCount) in short transactions
 * while its body streams in, and becomes visible in one final transaction that raises chunkCount, so a
 * reader never sees half a batch and a slow upload never holds the database's write lock. A failed
 * batch deletes its pending chunks; pending chunks left by a crash are deleted by the trace's next batch.
 */
import type { SampleSummary } from '../analysis/stats/sample-summary.js';
import type { ChunkSummaryRow } from './summary-rows.js';

/** A chunk ready to be written: its summary row and its blobs. */
export interface StoredChunk {
  row: ChunkSummaryRow;
  envelope: Buffer;
  times: Buffer | null;
  samples: Buffer;
}

/** The storage columns of a trace (see models/trace.ts). */
export interface TraceStorageState {
  sampleCount: number;
  chunkCount: number;
  originUs: number | null;
  firstSampleUs: number | null;
  lastSampleUs: number | null;
  gapThresholdS: number | null;
  /** Mergeable summary of every committed sample (raw units), null when there is none. */
  summary: SampleSummary | null;
}

/** The answer to store with an Idempotency-Key, in the same transaction as the work it describes. */
export interface IdempotencyRecord {
  organisationId: string;
  key: string;
  operation: string;
  fingerprint: string;
  status: number;
  response: string;
}

/** Everything the final transaction of a batch writes. */
export interface BatchCommit {
  traceId: string;
  organisationId: string;
  /** chunkCount the batch was built on; the commit fails when the trace no longer has it. */
  expectedChunkCount: number;
  /** Replaces the trace's last committed chunk (seq expectedChunkCount − 1), topped up with new samples. */
  replaceLast: StoredChunk | null;
  /** Chunks not yet written as pending (seq continues after the pending ones). */
  chunks: StoredChunk[];
  state: TraceStorageState;
  idempotency: IdempotencyRecord | null;
}

/** Blobs of one chunk as read back. */
export interface ChunkData {
  seq: number;
  samples: Buffer;
  times: Buffer | null;
}

/** The envelope blob of one chunk (and its times blob, when asked for). */
export interface ChunkEnvelope {
  seq: number;
  envelope: Buffer;
  times: Buffer | null;
}

export interface ChunkStore {
  /** Writes chunks of a batch that are not yet visible (seq ≥ the trace's chunkCount). */
  insertPending(traceId: string, organisationId: string, chunks: StoredChunk[]): Promise<void>;
  /**
   * One transaction: replace the last chunk, insert the remaining chunks, update the trace's storage
   * state (only while it is open and still has expectedChunkCount chunks) and store the idempotency
   * record. Returns false, writing nothing, when the trace changed, was closed or deleted meanwhile.
   */
  commit(batch: BatchCommit): Promise<boolean>;
  /** Deletes chunks with seq ≥ fromSeq (a failed or abandoned batch). */
  discardPending(traceId: string, fromSeq: number): Promise<void>;
  /**
   * Summary rows of committed chunks (seq < chunkCount) that hold a sample in [fromUs, toUs], in order.
   * `sampleCount`, the trace's read together with chunkCount, lets a caching store answer from memory.
   */
  readSummaries(traceId: string, chunkCount: number, fromUs: number, toUs: number, sampleCount?: number): Promise<ChunkSummaryRow[]>;
  /** Samples and times of chunks seq ∈ [fromSeq, toSeq], in order. */
  readData(traceId: string, fromSeq: number, toSeq: number): Promise<ChunkData[]>;
  /** Samples and times of the chunks `seqs` (a few: a window's two edge chunks), in order, in one query. */
  readDataOf(traceId: string, seqs: number[]): Promise<ChunkData[]>;
  /** Envelope blobs of chunks seq ∈ [fromSeq, toSeq], in order, with their times blobs when asked. */
  readEnvelopes(traceId: string, fromSeq: number, toSeq: number, withTimes: boolean): Promise<ChunkEnvelope[]>;
}
