/**
 * A chunk store that keeps the summary rows of recently read traces in memory, so that statistics
 * and envelopes of a long trace do not read thousands of rows per request.
 *
 * Why it stays true: a committed chunk never changes except the trace's last one (topped up by the
 * next batch), and every commit changes the trace's sampleCount. So rows cached for (chunkCount,
 * sampleCount) are exactly the stored rows while the trace has those counts; when they differ, the
 * rows from the old last chunk on are read again (whatever process wrote them). Reads that give no
 * sampleCount go straight to the store.
 *
 * Envelope blobs (chart envelopes of zoomed windows) are kept too, for chunks before the trace's last
 * one as the cached rows know it: those never change. The first envelope read of a trace reads all of
 * them when they are few enough, so any later window of that trace is served from memory.
 */
import type { BatchCommit, ChunkData, ChunkEnvelope, ChunkStore, StoredChunk } from './chunk-store.js';
import { compactRow, type ChunkSummaryRow } from './summary-rows.js';

/** Most summary rows kept over all traces (about 0.5 KB each: 40 MB, some 800 million samples). */
export const MAX_CACHED_ROWS = 80_000;

/** Envelope (and times) blobs kept over all traces, in bytes. */
export const MAX_CACHED_ENVELOPE_BYTES = 64 * 1024 * 1024;
/** A trace's envelopes are read whole (and kept) only up to this size. */
const MAX_TRACE_ENVELOPE_BYTES = 16 * 1024 * 1024;
/** Bytes of envelope and times per chunk, about (4,096 samples: 768 B of envelope, times up to 12 KB). */
const ENVELOPE_BYTES_PER_CHUNK = 768;

interface EnvelopeEntry {
  /** Seqs [0, stableCount) are held, each with its times blob when `withTimes`. */
  stableCount: number;
  withTimes: boolean;
  bySeq: ChunkEnvelope[];
  bytes: number;
}

function blobBytes(envelopes: readonly ChunkEnvelope[]): number {
  return envelopes.reduce((n, e) => n + e.envelope.length + (e.times?.length ?? 0), 0);
}

interface Entry {
  chunkCount: number;
  sampleCount: number;
  rows: ChunkSummaryRow[];
}

/** Index range [from, to) of the rows (time-ordered, non-overlapping) that hold a sample in [fromUs, toUs]. */
export function rowRange(rows: readonly ChunkSummaryRow[], fromUs: number, toUs: number): { from: number; to: number } {
  let lo = 0;
  let hi = rows.length;
  while (lo < hi) {
    const mid = (lo + hi) >>> 1;
    if ((rows[mid] as ChunkSummaryRow).lastUs < fromUs) lo = mid + 1;
    else hi = mid;
  }
  let a = lo;
  let b = rows.length;
  while (a < b) {
    const mid = (a + b) >>> 1;
    if ((rows[mid] as ChunkSummaryRow).firstUs <= toUs) a = mid + 1;
    else b = mid;
  }
  return { from: lo, to: Math.max(lo, a) };
}

function windowOf(rows: ChunkSummaryRow[], fromUs: number, toUs: number): ChunkSummaryRow[] {
  const { from, to } = rowRange(rows, fromUs, toUs);
  return rows.slice(from, to);
}

export class CachedChunkStore implements ChunkStore {
  private readonly entries = new Map<string, Entry>();
  private cachedRows = 0;
  private readonly envelopes = new Map<string, EnvelopeEntry>();
  private envelopeBytes = 0;

  constructor(private readonly store: ChunkStore) {}

  insertPending(traceId: string, organisationId: string, chunks: StoredChunk[]): Promise<void> {
    return this.store.insertPending(traceId, organisationId, chunks);
  }

  commit(batch: BatchCommit): Promise<boolean> {
    return this.store.commit(batch);
  }

  discardPending(traceId: string, fromSeq: number): Promise<void> {
    return this.store.discardPending(traceId, fromSeq);
  }

  readData(traceId: string, fromSeq: number, toSeq: number): Promise<ChunkData[]> {
    return this.store.readData(traceId, fromSeq, toSeq);
  }

  readDataOf(traceId: string, seqs: number[]): Promise<ChunkData[]> {
    return this.store.readDataOf(traceId, seqs);
  }

  async readEnvelopes(traceId: string, fromSeq: number, toSeq: number, withTimes: boolean): Promise<ChunkEnvelope[]> {
    // Chunks before the last one the cached rows know of never change.
    const stableCount = Math.max(0, (this.entries.get(traceId)?.chunkCount ?? 0) - 1);
    let held = this.envelopes.get(traceId);
    if (held && withTimes && !held.withTimes) {
      this.forgetEnvelopes(traceId);
      held = undefined;
    }
    if (held && held.stableCount < Math.min(stableCount, toSeq + 1)) held = await this.extendEnvelopes(traceId, held, stableCount);
    if (!held && stableCount > 0 && toSeq < stableCount + 1 && stableCount * ENVELOPE_BYTES_PER_CHUNK <= MAX_TRACE_ENVELOPE_BYTES) {
      held = await this.holdEnvelopes(traceId, stableCount, withTimes);
    }
    if (!held) return this.store.readEnvelopes(traceId, fromSeq, toSeq, withTimes);
    const out = held.bySeq.slice(fromSeq, Math.min(toSeq + 1, held.stableCount));
    if (toSeq >= held.stableCount) out.push(...(await this.store.readEnvelopes(traceId, Math.max(fromSeq, held.stableCount), toSeq, withTimes)));
    this.envelopes.delete(traceId); // most recently used last
    this.envelopes.set(traceId, held);
    return out;
  }

  /** Reads and keeps the envelopes of seqs [0, stableCount) of a trace, when they fit. */
  private async holdEnvelopes(traceId: string, stableCount: number, withTimes: boolean): Promise<EnvelopeEntry | undefined> {
    const bySeq = await this.store.readEnvelopes(traceId, 0, stableCount - 1, withTimes);
    if (bySeq.length !== stableCount || bySeq.some((e, k) => e.seq !== k)) return undefined;
    return this.keepEnvelopes(traceId, { stableCount, withTimes, bySeq, bytes: blobBytes(bySeq) });
  }

  /** Adds the chunks that have become stable since (the trace grew); forgets the trace's entry when they do not fit. */
  private async extendEnvelopes(traceId: string, held: EnvelopeEntry, stableCount: number): Promise<EnvelopeEntry | undefined> {
    const more = await this.store.readEnvelopes(traceId, held.stableCount, stableCount - 1, held.withTimes);
    this.forgetEnvelopes(traceId);
    if (more.some((e, k) => e.seq !== held.stableCount + k)) return undefined;
    const bySeq = held.bySeq.concat(more);
    return this.keepEnvelopes(traceId, { stableCount: bySeq.length, withTimes: held.withTimes, bySeq, bytes: held.bytes + blobBytes(more) });
  }

  /** Keeps the entry, room made by forgetting the least recently used; undefined when one trace's is too big. */
  private keepEnvelopes(traceId: string, entry: EnvelopeEntry): EnvelopeEntry | undefined {
    if (entry.bytes > MAX_TRACE_ENVELOPE_BYTES) return undefined;
    while (this.envelopeBytes + entry.bytes > MAX_CACHED_ENVELOPE_BYTES && this.envelopes.size > 0) this.forgetEnvelopes(this.envelopes.keys().next().value as string);
    this.envelopes.set(traceId, entry);
    this.envelopeBytes += entry.bytes;
    return entry;
  }

  private forgetEnvelopes(traceId: string): void {
    const entry = this.envelopes.get(traceId);
    if (!entry) return;
    this.envelopeBytes -= entry.bytes;
    this.envelopes.delete(traceId);
  }

  /**
   * Every summary row of the trace, as one array that stays the same object while the trace keeps
   * these counts (so callers may key their own derived structures on it).
   */
  allSummaries(traceId: string, chunkCount: number, sampleCount: number): Promise<ChunkSummaryRow[]> {
    return this.allRows(traceId, chunkCount, sampleCount);
  }

  /** With `sampleCount` (the trace's, read with chunkCount), the rows come from the cache when they can. */
  async readSummaries(traceId: string, chunkCount: number, fromUs: number, toUs: number, sampleCount?: number): Promise<ChunkSummaryRow[]> {
    if (sampleCount === undefined) return this.store.readSummaries(traceId, chunkCount, fromUs, toUs);
    return windowOf(await this.allRows(traceId, chunkCount, sampleCount), fromUs, toUs);
  }

  private async allRows(traceId: string, chunkCount: number, sampleCount: number): Promise<ChunkSummaryRow[]> {
    const entry = this.entries.get(traceId);
    if (entry && entry.chunkCount === chunkCount && entry.sampleCount === sampleCount) {
      // Most recently used last.
      this.entries.delete(traceId);
      this.entries.set(traceId, entry);
      return entry.rows;
    }
    let rows: ChunkSummaryRow[];
    if (entry && entry.chunkCount > 0 && entry.chunkCount <= chunkCount && entry.rows.length === entry.chunkCount) {
      // Rows before the old last chunk cannot have changed; read that one and everything after it.
      const keep = entry.rows.slice(0, entry.chunkCount - 1);
      const from = (entry.rows[entry.chunkCount - 1] as ChunkSummaryRow).firstUs;
      rows = keep.concat((await this.store.readSummaries(traceId, chunkCount, from, Number.POSITIVE_INFINITY)).map(compactRow));
    } else {
      rows = (await this.store.readSummaries(traceId, chunkCount, Number.NEGATIVE_INFINITY, Number.POSITIVE_INFINITY)).map(compactRow);
    }
    this.forget(traceId);
    if (rows.length === chunkCount && rows.length <= MAX_CACHED_ROWS / 4) {
      while (this.cachedRows + rows.length > MAX_CACHED_ROWS && this.entries.size > 0) this.forget(this.entries.keys().next().value as string);
      this.entries.set(traceId, { chunkCount, sampleCount, rows });
      this.cachedRows += rows.length;
    }
    return rows;
  }

  private forget(traceId: string): void {
    const entry = this.entries.get(traceId);
    if (!entry) return;
    this.cachedRows -= entry.rows.length;
    this.entries.delete(traceId);
  }
}
