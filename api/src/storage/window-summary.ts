/**
 * The mergeable summary of any window of a trace, assembled from the stored summaries of the chunks
 * inside it plus the summaries of the two partial edge chunks, computed from their samples. The
 * result equals the analysis engine's summary of the window's samples computed directly (up to
 * floating-point rounding; tested in window-summary.test.ts): whatever the window's length, it reads
 * the small summary rows and at most two chunks of samples.
 */
import { mergeSummaryList } from '../analysis/stats/merge-summaries.js';
import { summarise, type SampleSummary } from '../analysis/stats/sample-summary.js';
import { CachedChunkStore, rowRange } from './cached-chunk-store.js';
import { chunkAxis, chunkInside, decodeChunk, indexRangeInWindow, readEdgeData } from './chunk-reader.js';
import { SummaryTree } from './summary-tree.js';
import type { ChunkData, ChunkStore } from './chunk-store.js';
import { summaryOfRow, type ChunkSummaryRow } from './summary-rows.js';

/** Storage facts of a trace a window query needs. */
export interface StoredTrace {
  traceId: string;
  chunkCount: number;
  sampleCount: number;
  originUs: number | null;
  gapThresholdS: number | null;
}

/** Trees of cached row arrays (an array stays the same object while its trace is unchanged). */
const trees = new WeakMap<ChunkSummaryRow[], SummaryTree>();

/** Summary (raw units) of the samples in [fromUs, toUs], or null when the window holds none. */
export async function windowSummary(store: ChunkStore, trace: StoredTrace, fromUs: number, toUs: number): Promise<SampleSummary | null> {
  if (trace.chunkCount === 0 || trace.originUs === null) return null;
  if (!(store instanceof CachedChunkStore)) {
    return summariseRows(store, trace, await store.readSummaries(trace.traceId, trace.chunkCount, fromUs, toUs), fromUs, toUs);
  }
  const rows = await store.allSummaries(trace.traceId, trace.chunkCount, trace.sampleCount);
  const { from, to } = rowRange(rows, fromUs, toUs);
  if (from >= to) return null;
  let tree = trees.get(rows);
  if (!tree || tree.gapThresholdS !== trace.gapThresholdS) {
    tree = new SummaryTree(rows, trace.gapThresholdS);
    trees.set(rows, tree);
  }
  // Whole chunks from the tree; the first and last chunk from their samples when partly outside.
  const first = rows[from] as ChunkSummaryRow;
  const last = rows[to - 1] as ChunkSummaryRow;
  const partFirst = !chunkInside(first, fromUs, toUs);
  const partLast = to - 1 > from && !chunkInside(last, fromUs, toUs);
  const edges = [...(partFirst ? [first] : []), ...(partLast ? [last] : [])];
  const data = await readEdgeData(store, trace.traceId, edges);
  const head = partFirst ? partialSummary(trace, first, data.get(first.seq) as ChunkData, fromUs, toUs) : null;
  const tail = partLast ? partialSummary(trace, last, data.get(last.seq) as ChunkData, fromUs, toUs) : null;
  const middle = tree.query(from + (partFirst ? 1 : 0), to - (partLast ? 1 : 0));
  const pieces = [head, middle, tail].filter((p): p is SampleSummary => p !== null);
  return pieces.length === 0 ? null : mergeSummaryList(pieces);
}

/** Summary of the samples of one chunk that lie in the window, from its samples; null when none do. */
function partialSummary(trace: StoredTrace, row: ChunkSummaryRow, data: ChunkData, fromUs: number, toUs: number): SampleSummary | null {
  const chunk = decodeChunk(row, data);
  const { from, to } = indexRangeInWindow(chunk, fromUs, toUs);
  return from < to ? summarise(chunkAxis(chunk, trace.originUs as number), chunk.values, from, to, { gapThresholdS: trace.gapThresholdS }) : null;
}

/** The window's summary from its chunk rows (those the store returned for the window), chunk by chunk. */
export async function summariseRows(
  store: ChunkStore,
  trace: StoredTrace,
  rows: ChunkSummaryRow[],
  fromUs: number,
  toUs: number,
): Promise<SampleSummary | null> {
  const pieces: SampleSummary[] = [];
  // Only the first and last chunk of a window can be partly outside it.
  const data = await readEdgeData(store, trace.traceId, rows.filter((row) => !chunkInside(row, fromUs, toUs)));
  for (const row of rows) {
    const piece = chunkInside(row, fromUs, toUs) ? summaryOfRow(row, trace.gapThresholdS) : partialSummary(trace, row, data.get(row.seq) as ChunkData, fromUs, toUs);
    if (piece) pieces.push(piece);
  }
  return pieces.length === 0 ? null : mergeSummaryList(pieces);
}
