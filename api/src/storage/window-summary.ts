/**
 * The mergeable summary of any window of a trace, assembled from the stored summaries of the chunks
 * inside it plus the summaries of the two partial edge chunks, computed from their samples. The
 * result equals the analysis engine's summary of the window's samples computed directly (up to
 * floating-point rounding; tested in window-summary.test.ts): whatever the window's length, it reads
 * the small summary rows and at most two chunks of samples.
 */
import { mergeSummaryList } from '../analysis/stats/merge-summaries.js';
import { summarise, type SampleSummary } from '../analysis/stats/sample-summary.js';
import { chunkAxis, chunkInside, decodeChunk, indexRangeInWindow } from './chunk-reader.js';
import type { ChunkStore } from './chunk-store.js';
import { summaryOfRow, type ChunkSummaryRow } from './summary-rows.js';

/** Storage facts of a trace a window query needs. */
export interface StoredTrace {
  traceId: string;
  chunkCount: number;
  originUs: number | null;
  gapThresholdS: number | null;
}

/** Summary (raw units) of the samples in [fromUs, toUs], or null when the window holds none. */
export async function windowSummary(store: ChunkStore, trace: StoredTrace, fromUs: number, toUs: number): Promise<SampleSummary | null> {
  if (trace.chunkCount === 0 || trace.originUs === null) return null;
  const rows = await store.readSummaries(trace.traceId, trace.chunkCount, fromUs, toUs);
  return summariseRows(store, trace, rows, fromUs, toUs);
}

/** The window's summary from its chunk rows (those the store returned for the window). */
export async function summariseRows(
  store: ChunkStore,
  trace: StoredTrace,
  rows: ChunkSummaryRow[],
  fromUs: number,
  toUs: number,
): Promise<SampleSummary | null> {
  const origin = trace.originUs as number;
  const pieces: SampleSummary[] = [];
  for (let k = 0; k < rows.length; k++) {
    const row = rows[k] as ChunkSummaryRow;
    if (chunkInside(row, fromUs, toUs)) {
      pieces.push(summaryOfRow(row, trace.gapThresholdS));
      continue;
    }
    // Only the first and last chunk of a window can be partly outside it.
    const [data] = await store.readData(trace.traceId, row.seq, row.seq);
    if (!data) throw new Error(`chunk ${row.seq} of trace ${trace.traceId} has no data`);
    const chunk = decodeChunk(row, data);
    const { from, to } = indexRangeInWindow(chunk, fromUs, toUs);
    if (from < to) pieces.push(summarise(chunkAxis(chunk, origin), chunk.values, from, to, { gapThresholdS: trace.gapThresholdS }));
  }
  return pieces.length === 0 ? null : mergeSummaryList(pieces);
}
