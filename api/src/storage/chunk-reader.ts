/**
 * Reading chunks back: their times, which of their samples fall in a window, and the samples of a
 * whole window as one series. Times inside the storage layer are microseconds since the epoch;
 * summaries and the analysis engine use seconds from the trace's origin (`originUs`).
 */
import { explicitTimeAxis, uniformTimeAxis, type TimeAxis } from '../analysis/time/time-axis.js';
import { decodeSamples, decodeTimes } from './chunk-codec.js';
import type { ChunkData, ChunkStore } from './chunk-store.js';
import type { ChunkSummaryRow } from './summary-rows.js';

/** A decoded chunk: raw values and the time of each in microseconds since the epoch. */
export interface DecodedChunk {
  row: ChunkSummaryRow;
  values: Float32Array;
  timesUs: Float64Array;
}

/** Time (µs) of sample `offset + index` of a uniform run that starts at startUs. */
function uniformRunTimeUs(startUs: number, offset: number, rateHz: number, index: number): number {
  return startUs + ((offset + index) * 1e6) / rateHz;
}

/** Time (µs) of sample `index` of a uniform chunk. */
export function uniformTimeUs(row: ChunkSummaryRow, index: number): number {
  return uniformRunTimeUs(row.runStartUs as number, row.runOffset as number, row.rateHz as number, index);
}

/** Times (µs) of every sample of a chunk. */
export function chunkTimesUs(row: ChunkSummaryRow, data: ChunkData): Float64Array {
  if (row.encoding === 'explicit') return decodeTimes(data.times ?? Buffer.alloc(0), row.firstUs, row.count);
  // The row's fields read once: a window's edge chunks are decoded for every chart request, and in
  // the server (rows of several shapes) reading them per sample made a 1 % window's two edge chunks
  // cost 0.25 ms instead of 0.20.
  const startUs = row.runStartUs as number;
  const offset = row.runOffset as number;
  const rateHz = row.rateHz as number;
  const out = new Float64Array(row.count);
  for (let i = 0; i < out.length; i++) out[i] = uniformRunTimeUs(startUs, offset, rateHz, i);
  return out;
}

export function decodeChunk(row: ChunkSummaryRow, data: ChunkData): DecodedChunk {
  const values = decodeSamples(data.samples);
  if (values.length !== row.count) throw new Error(`chunk ${row.seq} holds ${values.length} samples, its summary says ${row.count}`);
  return { row, values, timesUs: chunkTimesUs(row, data) };
}

/** The analysis time axis of a chunk's samples, in seconds from `originUs` (as its stored summary). */
export function chunkAxis(chunk: DecodedChunk, originUs: number): TimeAxis {
  const { row } = chunk;
  if (row.encoding === 'uniform') {
    return uniformTimeAxis(((row.runStartUs as number) - originUs) / 1e6 + (row.runOffset as number) / (row.rateHz as number), row.rateHz as number);
  }
  const timesS = new Float64Array(row.count);
  for (let i = 0; i < row.count; i++) timesS[i] = ((chunk.timesUs[i] as number) - originUs) / 1e6;
  return explicitTimeAxis(timesS);
}

/** First index whose time is >= t (or > t when `strict`), by binary search. */
function lowerBound(timesUs: Float64Array, t: number, strict: boolean): number {
  let lo = 0;
  let hi = timesUs.length;
  while (lo < hi) {
    const mid = (lo + hi) >>> 1;
    const tm = timesUs[mid] as number;
    if (strict ? tm > t : tm >= t) hi = mid;
    else lo = mid + 1;
  }
  return lo;
}

/** Index range [from, to) of a chunk's samples whose time lies in the closed window [fromUs, toUs]. */
export function indexRangeInWindow(chunk: DecodedChunk, fromUs: number, toUs: number): { from: number; to: number } {
  return { from: lowerBound(chunk.timesUs, fromUs, false), to: lowerBound(chunk.timesUs, toUs, true) };
}

/** True when every sample of the chunk lies in [fromUs, toUs]. */
export function chunkInside(row: ChunkSummaryRow, fromUs: number, toUs: number): boolean {
  return row.firstUs >= fromUs && row.lastUs <= toUs;
}

/** The data of a window's edge chunks (those partly outside it: at most two), in one query, by seq. */
export async function readEdgeData(store: ChunkStore, traceId: string, rows: ChunkSummaryRow[]): Promise<Map<number, ChunkData>> {
  const bySeq = new Map((await store.readDataOf(traceId, rows.map((row) => row.seq))).map((d) => [d.seq, d]));
  for (const row of rows) if (!bySeq.has(row.seq)) throw new Error(`chunk ${row.seq} of trace ${traceId} has no data`);
  return bySeq;
}

/**
 * The decoded chunks of `rows` (in seq order), read in groups so memory stays bounded by the caller's
 * use: a run of consecutive chunks by its seq range, scattered chunks by their seqs (never the ones
 * between).
 */
export async function* readChunks(store: ChunkStore, traceId: string, rows: ChunkSummaryRow[], groupSize = 64): AsyncGenerator<DecodedChunk> {
  for (let start = 0; start < rows.length; start += groupSize) {
    const group = rows.slice(start, start + groupSize);
    const first = group[0] as ChunkSummaryRow;
    const last = group[group.length - 1] as ChunkSummaryRow;
    const consecutive = last.seq - first.seq + 1 === group.length;
    const data = consecutive ? await store.readData(traceId, first.seq, last.seq) : await store.readDataOf(traceId, group.map((row) => row.seq));
    const bySeq = new Map(data.map((d) => [d.seq, d]));
    for (const row of group) {
      const d = bySeq.get(row.seq);
      if (!d) throw new Error(`chunk ${row.seq} of trace ${traceId} has no data`);
      yield decodeChunk(row, d);
    }
  }
}

/** The samples of a window as one series: raw values, their times (µs) and an analysis axis. */
export interface WindowSamples {
  values: Float32Array;
  timesUs: Float64Array;
  axis: TimeAxis;
}

/**
 * Every sample in [fromUs, toUs] as one series. The axis is uniform when the window lies in one
 * uniform run (no 8-byte time per sample), explicit otherwise.
 */
export async function readWindowSamples(
  store: ChunkStore,
  traceId: string,
  rows: ChunkSummaryRow[],
  originUs: number,
  fromUs: number,
  toUs: number,
): Promise<WindowSamples> {
  const total = rows.reduce((n, r) => n + r.count, 0);
  const values = new Float32Array(total);
  const timesUs = new Float64Array(total);
  let n = 0;
  let firstRow: ChunkSummaryRow | null = null;
  let firstIndex = 0;
  for await (const chunk of readChunks(store, traceId, rows)) {
    const { from, to } = indexRangeInWindow(chunk, fromUs, toUs);
    if (from >= to) continue;
    if (firstRow === null) {
      firstRow = chunk.row;
      firstIndex = from;
    }
    values.set(chunk.values.subarray(from, to), n);
    timesUs.set(chunk.timesUs.subarray(from, to), n);
    n += to - from;
  }
  const v = values.subarray(0, n);
  const t = timesUs.subarray(0, n);
  const oneRun =
    firstRow !== null &&
    rows.every((r) => r.encoding === 'uniform' && r.runStartUs === firstRow.runStartUs && r.rateHz === firstRow.rateHz) &&
    rows.every((r, k) => k === 0 || (r.runOffset as number) === ((rows[k - 1] as ChunkSummaryRow).runOffset as number) + (rows[k - 1] as ChunkSummaryRow).count);
  if (oneRun && firstRow) {
    const rate = firstRow.rateHz as number;
    const startS = ((firstRow.runStartUs as number) - originUs) / 1e6 + ((firstRow.runOffset as number) + firstIndex) / rate;
    return { values: v, timesUs: t, axis: uniformTimeAxis(startS, rate) };
  }
  const timesS = new Float64Array(n);
  for (let i = 0; i < n; i++) timesS[i] = ((t[i] as number) - originUs) / 1e6;
  return { values: v, timesUs: t, axis: explicitTimeAxis(timesS) };
}
