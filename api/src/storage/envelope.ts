/**
 * Chart envelope of a window: at most N buckets of consecutive samples, each with its min, max and
 * mean, so a chart of any length keeps every peak (an inrush never vanishes between points).
 *
 * The window is read at the coarsest level that still gives N buckets:
 * - samples: fewer than 64 samples per bucket: the samples themselves;
 * - blocks: the stored envelope of each chunk (min/max/mean per 64 samples);
 * - chunks: the chunk summary rows.
 * The two edge chunks, partly outside the window, are always read from their samples (at block level
 * in pieces ending at the chunk's 64-sample block boundaries, as its stored envelope), and so are the
 * interior chunks with a gap inside while gaps split buckets (see below). Buckets hold
 * equal numbers of samples (not equal time). A gap (an interval longer than the trace's gap
 * threshold) ends a bucket and is shown as an empty bucket (count 0, null values) spanning it, so a
 * chart breaks its line there instead of bridging the gap (while gaps are few; with very many gaps
 * in view, buckets simply run across them). Never more than N buckets, whatever the window.
 */
import { CHUNK_SAMPLES, ENVELOPE_BLOCK_SAMPLES, decodeEnvelope, decodeTimes } from './chunk-codec.js';
import { chunkInside, decodeChunk, indexRangeInWindow, readChunks, readEdgeData, uniformTimeUs, type DecodedChunk } from './chunk-reader.js';
import type { ChunkData, ChunkStore } from './chunk-store.js';
import type { ChunkSummaryRow } from './summary-rows.js';
import type { StoredTrace } from './window-summary.js';

export type EnvelopeLevel = 'samples' | 'blocks' | 'chunks';

/** Buckets as columns (raw units; times in µs since the epoch). */
export interface EnvelopeBuckets {
  startUs: number[];
  endUs: number[];
  count: number[];
  min: Array<number | null>;
  max: Array<number | null>;
  mean: Array<number | null>;
}

export interface Envelope {
  level: EnvelopeLevel;
  sampleCount: number;
  buckets: EnvelopeBuckets;
}

/** Collects pieces (runs of consecutive samples) into buckets of at least `target` samples. */
class BucketBuilder {
  readonly out: EnvelopeBuckets = { startUs: [], endUs: [], count: [], min: [], max: [], mean: [] };
  private count = 0;
  private startUs = 0;
  private endUs = 0;
  private min = 0;
  private max = 0;
  private sum = 0;
  private lastUs: number | null = null;

  constructor(
    private readonly target: number,
    /** Gaps longer than this (µs) end a bucket and get an empty bucket; null: gaps do not. */
    private readonly splitGapUs: number | null,
  ) {}

  add(firstUs: number, lastUs: number, count: number, min: number, max: number, sum: number): void {
    if (this.lastUs !== null && this.splitGapUs !== null && firstUs - this.lastUs > this.splitGapUs) {
      this.flush();
      this.push(this.lastUs, firstUs, 0, null, null, null);
    }
    if (this.count === 0) {
      this.startUs = firstUs;
      this.min = min;
      this.max = max;
      this.sum = 0;
    } else {
      if (min < this.min) this.min = min;
      if (max > this.max) this.max = max;
    }
    this.count += count;
    this.sum += sum;
    this.endUs = lastUs;
    this.lastUs = lastUs;
    if (this.count >= this.target) this.flush();
  }

  flush(): void {
    if (this.count === 0) return;
    this.push(this.startUs, this.endUs, this.count, this.min, this.max, this.sum / this.count);
    this.count = 0;
  }

  private push(startUs: number, endUs: number, count: number, min: number | null, max: number | null, mean: number | null): void {
    const o = this.out;
    o.startUs.push(startUs);
    o.endUs.push(endUs);
    o.count.push(count);
    o.min.push(min);
    o.max.push(max);
    o.mean.push(mean);
  }
}

/**
 * Adds samples [from, to) of a chunk in pieces that end at multiples of `pieceSamples` in the chunk, or
 * earlier at a gap when `splitGapUs` is given: one sample a piece at sample level, a 64-sample block
 * (as the stored envelope) at block level, a whole chunk at chunk level. One add per piece instead of
 * one per sample.
 */
function addSamplePieces(builder: BucketBuilder, chunk: DecodedChunk, from: number, to: number, pieceSamples: number, splitGapUs: number | null): void {
  const { values, timesUs } = chunk;
  let i = from;
  while (i < to) {
    const pieceEnd = Math.min(to, (Math.floor(i / pieceSamples) + 1) * pieceSamples);
    const first = i;
    let v = values[i] as number;
    let min = v;
    let max = v;
    let sum = v;
    for (i++; i < pieceEnd; i++) {
      if (splitGapUs !== null && (timesUs[i] as number) - (timesUs[i - 1] as number) > splitGapUs) break;
      v = values[i] as number;
      if (v < min) min = v;
      if (v > max) max = v;
      sum += v;
    }
    builder.add(timesUs[first] as number, timesUs[i - 1] as number, i - first, min, max, sum);
  }
}

/** Adds the blocks of an interior chunk from its stored envelope (and times, for explicit chunks). */
function addBlocks(builder: BucketBuilder, row: ChunkSummaryRow, envelope: Buffer, times: Buffer | null): void {
  const blocks = decodeEnvelope(envelope);
  const timesUs = row.encoding === 'explicit' ? decodeTimes(times ?? Buffer.alloc(0), row.firstUs, row.count) : null;
  const timeAt = (i: number) => (timesUs ? (timesUs[i] as number) : uniformTimeUs(row, i));
  for (let b = 0; b * ENVELOPE_BLOCK_SAMPLES < row.count; b++) {
    const i0 = b * ENVELOPE_BLOCK_SAMPLES;
    const i1 = Math.min(row.count, i0 + ENVELOPE_BLOCK_SAMPLES);
    const n = i1 - i0;
    builder.add(timeAt(i0), timeAt(i1 - 1), n, blocks[b * 3] as number, blocks[b * 3 + 1] as number, (blocks[b * 3 + 2] as number) * n);
  }
}

/** Upper bound on the gaps in a window, from the summaries: gaps inside chunks plus between them. */
function countGapsUpperBound(rows: ChunkSummaryRow[], gapUs: number | null): number {
  if (gapUs === null) return 0;
  let gaps = 0;
  for (let k = 0; k < rows.length; k++) {
    const row = rows[k] as ChunkSummaryRow;
    gaps += row.gapCount;
    if (k > 0 && row.firstUs - (rows[k - 1] as ChunkSummaryRow).lastUs > gapUs) gaps += 1;
  }
  return gaps;
}

/** The envelope of [fromUs, toUs] in at most `points` buckets. */
export async function envelope(store: ChunkStore, trace: StoredTrace, fromUs: number, toUs: number, points: number): Promise<Envelope> {
  const empty: Envelope = { level: 'samples', sampleCount: 0, buckets: new BucketBuilder(1, null).out };
  if (trace.chunkCount === 0) return empty;
  const rows = await store.readSummaries(trace.traceId, trace.chunkCount, fromUs, toUs, trace.sampleCount);
  if (rows.length === 0) return empty;

  // Edge chunks partly outside the window are decoded; every other chunk counts whole.
  const edges = new Map<number, { chunk: DecodedChunk; from: number; to: number }>();
  let sampleCount = 0;
  const edgeRows = rows.filter((row) => !chunkInside(row, fromUs, toUs));
  for (const row of rows) if (chunkInside(row, fromUs, toUs)) sampleCount += row.count;
  const edgeData = await readEdgeData(store, trace.traceId, edgeRows);
  edgeRows.forEach((row) => {
    const data = edgeData.get(row.seq) as ChunkData;
    const chunk = decodeChunk(row, data);
    const range = indexRangeInWindow(chunk, fromUs, toUs);
    edges.set(row.seq, { chunk, ...range });
    sampleCount += Math.max(0, range.to - range.from);
  });
  if (sampleCount === 0) return empty;

  const gapUs = trace.gapThresholdS === null ? null : trace.gapThresholdS * 1e6;
  const gaps = countGapsUpperBound(rows, gapUs);
  // Each gap may cost two buckets (the one it ends and the empty one); split at gaps only while they
  // leave at least half of `points` for the samples.
  const splitGaps = gapUs !== null && 2 * gaps + 1 <= points / 2;
  const budget = splitGaps ? points - 2 * gaps - 1 : points;
  const target = Math.max(1, Math.ceil(sampleCount / budget));
  const level: EnvelopeLevel = target < ENVELOPE_BLOCK_SAMPLES ? 'samples' : target < CHUNK_SAMPLES ? 'blocks' : 'chunks';
  const builder = new BucketBuilder(target, splitGaps ? gapUs : null);

  const interior = rows.filter((r) => !edges.has(r.seq));
  // Interior chunks read from their samples: all of them at sample level; at block and chunk level
  // those with a gap inside while gaps split buckets, since a stored block envelope or chunk summary
  // spanning the gap cannot end a bucket there (gaps are few when they split: at most points / 4).
  const fromSamples = level === 'samples' ? interior : splitGaps ? interior.filter((r) => r.gapCount > 0) : [];
  const readFromSamples = new Set(fromSamples.map((r) => r.seq));
  const decoded = readChunks(store, trace.traceId, fromSamples);
  const pieceSamples = level === 'samples' ? 1 : level === 'blocks' ? ENVELOPE_BLOCK_SAMPLES : CHUNK_SAMPLES;
  const pieceGapUs = splitGaps ? gapUs : null;
  const blobsBySeq = new Map<number, { envelope: Buffer; times: Buffer | null }>();
  if (level === 'blocks' && interior.length > 0) {
    const first = (interior[0] as ChunkSummaryRow).seq;
    const last = (interior[interior.length - 1] as ChunkSummaryRow).seq;
    const withTimes = interior.some((r) => r.encoding === 'explicit');
    for (const b of await store.readEnvelopes(trace.traceId, first, last, withTimes)) blobsBySeq.set(b.seq, b);
  }

  for (const row of rows) {
    const edge = edges.get(row.seq);
    if (edge) {
      addSamplePieces(builder, edge.chunk, edge.from, edge.to, pieceSamples, pieceGapUs);
    } else if (readFromSamples.has(row.seq)) {
      const next = await decoded.next();
      if (next.done || next.value.row.seq !== row.seq) throw new Error(`chunk ${row.seq} of trace ${trace.traceId} was not read`);
      addSamplePieces(builder, next.value, 0, row.count, pieceSamples, pieceGapUs);
    } else if (level === 'blocks') {
      const blobs = blobsBySeq.get(row.seq);
      if (!blobs) throw new Error(`chunk ${row.seq} of trace ${trace.traceId} has no envelope`);
      addBlocks(builder, row, blobs.envelope, blobs.times);
    } else {
      builder.add(row.firstUs, row.lastUs, row.count, row.minValue, row.maxValue, row.mean * row.count);
    }
  }
  builder.flush();
  return { level, sampleCount, buckets: builder.out };
}

/** Min, max and mean of a series (times in µs) within each bucket's time span; null where a bucket holds none. */
export function bucketSeries(
  buckets: Pick<EnvelopeBuckets, 'startUs' | 'endUs'>,
  timesUs: Float64Array,
  values: Float32Array | Float64Array,
): { min: Array<number | null>; max: Array<number | null>; mean: Array<number | null> } {
  const out = { min: [] as Array<number | null>, max: [] as Array<number | null>, mean: [] as Array<number | null> };
  let i = 0;
  for (let b = 0; b < buckets.startUs.length; b++) {
    const start = buckets.startUs[b] as number;
    const end = buckets.endUs[b] as number;
    while (i < timesUs.length && (timesUs[i] as number) < start) i++;
    let n = 0;
    let min = Number.POSITIVE_INFINITY;
    let max = Number.NEGATIVE_INFINITY;
    let sum = 0;
    let j = i;
    while (j < timesUs.length && (timesUs[j] as number) <= end) {
      const v = values[j] as number;
      if (v < min) min = v;
      if (v > max) max = v;
      sum += v;
      n++;
      j++;
    }
    out.min.push(n ? min : null);
    out.max.push(n ? max : null);
    out.mean.push(n ? sum / n : null);
    i = j;
  }
  return out;
}
