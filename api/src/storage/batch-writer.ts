/**
 * Writes one batch of samples into a trace's chunks: parsers push runs of samples as they stream in;
 * the writer cuts them into chunks of CHUNK_SAMPLES, summarises each chunk with the analysis engine's
 * mergeable summary, writes full groups of chunks as pending while the body is still arriving, and
 * makes the whole batch visible in one final transaction (see chunk-store.ts).
 *
 * Chunks stay full for small batches: when the trace's last chunk is not full, the batch continues it
 * in the same encoding (explicit times after explicit times, or the same uniform run) and the batch
 * fits in the room left, the batch tops it up; the rewritten chunk replaces the old one in the final
 * transaction. So a device posting one reading a second still fills 4,096-sample chunks, while a large
 * batch never rewrites what is stored.
 */
import { mergeSummaries, mergeSummaryList } from '../analysis/stats/merge-summaries.js';
import { summarise, type SampleSummary } from '../analysis/stats/sample-summary.js';
import { explicitTimeAxis, uniformTimeAxis, type TimeAxis } from '../analysis/time/time-axis.js';
import { DEFAULT_GAP_FACTOR, gapThresholdFromSpacing, typicalSpacingS } from '../analysis/time/typical-spacing.js';
import { Problem } from '../errors/problem.js';
import {
  CHUNK_SAMPLES,
  decodeSamples,
  decodeTimes,
  encodeEnvelope,
  encodeSamples,
  encodeTimes,
  isStorableTimeUs,
  TIME_RANGE_TEXT,
} from './chunk-codec.js';
import type { ChunkStore, IdempotencyRecord, StoredChunk, TraceStorageState } from './chunk-store.js';
import { summaryColumns, withGapThreshold, type ChunkSummaryRow } from './summary-rows.js';

/**
 * Samples buffered before pending chunks are written (1 MB of float32). Smaller steps keep less of a
 * streaming upload in flight to the writer thread: with 4 MB steps a 100M-sample upload peaked at
 * 256–306 MB of RSS, with 1 MB at 259–262 MB (and stored as fast).
 */
export const DEFAULT_FLUSH_SAMPLES = 1 << 18;

/** A uniform batch that starts within this distance (µs) of the stored run's next sample continues it. */
const RUN_CONTINUATION_TOLERANCE_US = 1;

export interface BatchWriterOptions {
  traceId: string;
  organisationId: string;
  store: ChunkStore;
  /** The trace's storage state as committed when the batch started. */
  state: TraceStorageState;
  /** The trace's last committed chunk (its summary row), when it has one. */
  lastChunk: ChunkSummaryRow | null;
  /** Its samples, when the caller has them (read from the store otherwise, when needed). */
  lastChunkData?: LastChunkData | null | undefined;
  /** Gap threshold (s) to use when the trace has none yet: 2.5 / sample rate when the trace states one. */
  defaultGapThresholdS: number | null;
  flushSamples?: number;
}

/** What a committed batch added. */
export interface BatchResult {
  accepted: number;
  firstUs: number;
  lastUs: number;
  state: TraceStorageState;
}

/** The samples of a trace's last chunk: raw values and, for explicit chunks, times in µs. */
export interface LastChunkData {
  values: Float32Array;
  timesUs: Float64Array | null;
}

/** Where a pushed run of samples sits in time. */
export type UniformStart = { startUs: number } | 'continue';

/** The chunk being filled. */
interface OpenChunk {
  seq: number;
  /** True when it replaces the trace's last committed chunk. */
  replaces: boolean;
  encoding: 'uniform' | 'explicit';
  values: Float32Array;
  timesUs: Float64Array | null;
  count: number;
  /** Samples that were already stored (top-up); they are not new. */
  oldCount: number;
  runStartUs: number;
  runOffset: number;
  rateHz: number;
}

/** The uniform run the next pushed samples may continue. */
interface Run {
  startUs: number;
  rateHz: number;
  /** Index in the run of the next sample. */
  nextIndex: number;
}

function timeOfRunIndex(run: { startUs: number; rateHz: number }, index: number): number {
  return run.startUs + (index * 1e6) / run.rateHz;
}

export class BatchWriter {
  private readonly flushSamples: number;
  private readonly state: TraceStorageState;
  private open: OpenChunk | null = null;
  private nextSeq: number;
  private readonly pending: StoredChunk[] = [];
  private pendingSamples = 0;
  private wrotePending = false;
  private replacement: StoredChunk | null = null;
  private readonly newPartSummaries: SampleSummary[] = [];
  private run: Run | null;
  private lastUs: number | null;
  private firstNewUs: number | null = null;
  private accepted = 0;
  private originUs: number | null;
  private gapThresholdS: number | null;
  private started = false;
  private lastExplicit: boolean;
  private readonly scratchTimesS = new Float64Array(CHUNK_SAMPLES);
  /** The last chunk encoded: after a commit, the trace's last chunk. */
  private lastEncoded: { row: ChunkSummaryRow; data: LastChunkData } | null = null;

  constructor(private readonly options: BatchWriterOptions) {
    this.flushSamples = options.flushSamples ?? DEFAULT_FLUSH_SAMPLES;
    this.state = options.state;
    this.nextSeq = options.state.chunkCount;
    this.lastUs = options.state.lastSampleUs;
    this.originUs = options.state.originUs;
    this.gapThresholdS = options.state.gapThresholdS ?? (options.state.sampleCount > 1 ? null : options.defaultGapThresholdS);
    const last = options.lastChunk;
    this.lastExplicit = last?.encoding === 'explicit';
    this.run =
      last && last.encoding === 'uniform' && last.runStartUs !== null && last.rateHz !== null && last.runOffset !== null
        ? { startUs: last.runStartUs, rateHz: last.rateHz, nextIndex: last.runOffset + last.count }
        : null;
  }

  /** Samples accepted so far. */
  get count(): number {
    return this.accepted;
  }

  /**
   * Appends samples at uniform times: a new run from `startUs` at `rateHz`, or the continuation of the
   * current run ('continue'). `values` may be reused by the caller afterwards.
   */
  async pushUniform(values: Float32Array, start: UniformStart, rateHz: number): Promise<void> {
    if (values.length === 0) return;
    const run = this.resolveRun(start, rateHz);
    const firstUs = timeOfRunIndex(run, run.nextIndex);
    this.checkTimes(firstUs, timeOfRunIndex(run, run.nextIndex + values.length - 1));
    await this.begin(firstUs, 'uniform', run);
    let i = 0;
    while (i < values.length) {
      const chunk = await this.chunkFor('uniform', run);
      const take = Math.min(values.length - i, CHUNK_SAMPLES - chunk.count);
      chunk.values.set(values.subarray(i, i + take), chunk.count);
      chunk.count += take;
      run.nextIndex += take;
      i += take;
    }
    this.accepted += values.length;
    this.lastUs = timeOfRunIndex(run, run.nextIndex - 1);
    this.run = run;
    this.lastExplicit = false;
  }

  /** Appends samples at explicit, strictly increasing integer-microsecond times. */
  async pushExplicit(values: Float32Array, timesUs: Float64Array): Promise<void> {
    if (values.length !== timesUs.length) throw new RangeError('values and times differ in length');
    if (values.length === 0) return;
    this.checkTimes(timesUs[0] as number, timesUs[timesUs.length - 1] as number);
    await this.begin(timesUs[0] as number, 'explicit', null);
    let i = 0;
    while (i < values.length) {
      const chunk = await this.chunkFor('explicit', null);
      const take = Math.min(values.length - i, CHUNK_SAMPLES - chunk.count);
      chunk.values.set(values.subarray(i, i + take), chunk.count);
      (chunk.timesUs as Float64Array).set(timesUs.subarray(i, i + take), chunk.count);
      chunk.count += take;
      i += take;
    }
    this.accepted += values.length;
    this.lastUs = timesUs[timesUs.length - 1] as number;
    this.run = null;
    this.lastExplicit = true;
  }

  private resolveRun(start: UniformStart, rateHz: number): Run {
    const continuing = this.run !== null && this.run.rateHz === rateHz;
    if (start === 'continue') {
      if (continuing) return { ...(this.run as Run) };
      // After samples at other times (or another rate): one sample period after the last one.
      if (this.lastUs !== null) return { startUs: this.lastUs + 1e6 / rateHz, rateHz, nextIndex: 0 };
      throw new Problem('validation', 'The trace has no samples yet and no start time: give the start time of the samples', {
        errors: [{ detail: 'required when the trace has no samples and no startTime', parameter: 'start' }],
      });
    }
    if (continuing) {
      const run = this.run as Run;
      if (Math.abs(timeOfRunIndex(run, run.nextIndex) - start.startUs) <= RUN_CONTINUATION_TOLERANCE_US) return { ...run };
    }
    return { startUs: start.startUs, rateHz, nextIndex: 0 };
  }

  /** Checks the order of the batch's samples; on the first push, sets the origin and may load the last chunk to top it up. */
  private async begin(firstUs: number, encoding: 'uniform' | 'explicit', run: Run | null): Promise<void> {
    if (this.lastUs !== null && !(firstUs > this.lastUs)) this.throwOverlap(firstUs);
    if (this.firstNewUs === null) this.firstNewUs = firstUs;
    this.originUs ??= firstUs;
    if (this.started) return;
    this.started = true;
    const last = this.options.lastChunk;
    if (!last || last.count >= CHUNK_SAMPLES || last.encoding !== encoding) return;
    if (encoding === 'uniform' && !(run && run.nextIndex === (last.runOffset ?? -1) + last.count && run.startUs === last.runStartUs)) return;
    if (encoding === 'explicit' && !this.lastExplicit) return;
    const chunk = this.newChunk(encoding, run, last.seq, true);
    const known = this.options.lastChunkData;
    if (known && known.values.length === last.count) {
      chunk.values.set(known.values);
      if (chunk.timesUs && known.timesUs) chunk.timesUs.set(known.timesUs);
    } else {
      const [data] = await this.options.store.readData(this.options.traceId, last.seq, last.seq);
      if (!data) return;
      decodeSamples(data.samples, chunk.values);
      if (chunk.timesUs) decodeTimes(data.times ?? Buffer.alloc(0), last.firstUs, last.count, chunk.timesUs);
    }
    if (encoding === 'uniform') chunk.runOffset = last.runOffset ?? 0;
    chunk.count = last.count;
    chunk.oldCount = last.count;
    this.open = chunk;
  }

  /**
   * Refuses samples running from firstUs to lastUs (in order) unless both are storable times: the
   * timestamp readers refuse a single time outside, this covers what they cannot see, such as a
   * uniform run whose rate is so low that its later samples fall past the range.
   */
  private checkTimes(firstUs: number, lastUs: number): void {
    if (isStorableTimeUs(firstUs) && isStorableTimeUs(lastUs)) return;
    const time = (us: number) =>
      isStorableTimeUs(us) ? new Date(Math.floor(us / 1000)).toISOString() : Number.isFinite(us) ? `${us / 1000} ms since 1970` : 'past any date';
    throw new Problem('validation', `Sample times must be ${TIME_RANGE_TEXT}; these samples run from ${time(firstUs)} to ${time(lastUs)}. Nothing was stored.`, {
      errors: [{ detail: `sample times must be ${TIME_RANGE_TEXT}`, pointer: '' }],
    });
  }

  private throwOverlap(firstUs: number): never {
    const storedFirst = this.state.firstSampleUs;
    const storedLast = this.lastUs as number;
    const ms = (us: number) => us / 1000;
    const iso = (us: number) => new Date(Math.floor(us / 1000)).toISOString();
    const fromUs = storedFirst !== null ? Math.max(firstUs, storedFirst) : firstUs;
    throw new Problem(
      'conflict',
      `The batch starts at ${iso(firstUs)}, not after the last stored sample at ${iso(storedLast)}: samples already stored from ` +
        `${iso(fromUs)} to ${iso(storedLast)} overlap it. Batches must follow each other in time; nothing was stored.`,
      { extensions: { overlap: { fromMs: ms(fromUs), toMs: ms(storedLast) }, lastStoredMs: ms(storedLast), batchStartMs: ms(firstUs) } },
    );
  }

  private newChunk(encoding: 'uniform' | 'explicit', run: Run | null, seq: number, replaces: boolean): OpenChunk {
    return {
      seq,
      replaces,
      encoding,
      values: new Float32Array(CHUNK_SAMPLES),
      timesUs: encoding === 'explicit' ? new Float64Array(CHUNK_SAMPLES) : null,
      count: 0,
      oldCount: 0,
      runStartUs: run?.startUs ?? 0,
      runOffset: run?.nextIndex ?? 0,
      rateHz: run?.rateHz ?? 0,
    };
  }

  /** The chunk the next samples go into: the open one if it fits, else a fresh one (closing the old). */
  private async chunkFor(encoding: 'uniform' | 'explicit', run: Run | null): Promise<OpenChunk> {
    let open = this.open;
    const continues = (c: OpenChunk) =>
      c.encoding === encoding &&
      (encoding === 'explicit' || (run !== null && c.runStartUs === run.startUs && c.rateHz === run.rateHz && c.runOffset + c.count === run.nextIndex));
    if (open !== null && open.replaces && open.count >= CHUNK_SAMPLES && continues(open)) {
      // The batch does not fit in the room the stored last chunk had: leave that chunk as it is and
      // give this batch's samples a chunk of their own (only batches that fit top it up).
      open = this.detachTopUp(open);
      this.open = open;
    }
    if (open !== null && open.count < CHUNK_SAMPLES && continues(open)) return open;
    if (open) await this.close(open);
    const chunk = this.newChunk(encoding, run, this.nextSeq++, false);
    this.open = chunk;
    return chunk;
  }

  /** A new chunk holding the samples this batch had put after the stored last chunk's own. */
  private detachTopUp(topUp: OpenChunk): OpenChunk {
    const fresh = this.newChunk(topUp.encoding, null, this.nextSeq++, false);
    fresh.values.set(topUp.values.subarray(topUp.oldCount, topUp.count));
    if (fresh.timesUs && topUp.timesUs) fresh.timesUs.set(topUp.timesUs.subarray(topUp.oldCount, topUp.count));
    fresh.count = topUp.count - topUp.oldCount;
    fresh.runStartUs = topUp.runStartUs;
    fresh.rateHz = topUp.rateHz;
    fresh.runOffset = topUp.runOffset + topUp.oldCount;
    return fresh;
  }

  private axisOf(chunk: OpenChunk): TimeAxis {
    const origin = this.originUs as number;
    if (chunk.encoding === 'uniform') {
      return uniformTimeAxis((chunk.runStartUs - origin) / 1e6 + chunk.runOffset / chunk.rateHz, chunk.rateHz);
    }
    const times = chunk.timesUs as Float64Array;
    const timesS = chunk.count === CHUNK_SAMPLES ? this.scratchTimesS : new Float64Array(chunk.count);
    for (let i = 0; i < chunk.count; i++) timesS[i] = ((times[i] as number) - origin) / 1e6;
    return explicitTimeAxis(timesS);
  }

  /** Summarises and encodes a finished chunk; queues it, flushing pending chunks when enough have gathered. */
  private async close(chunk: OpenChunk): Promise<void> {
    this.open = null;
    const stored = this.encode(chunk);
    if (chunk.replaces) {
      this.replacement = stored;
      return;
    }
    this.pending.push(stored);
    this.pendingSamples += chunk.count;
    if (this.pendingSamples >= this.flushSamples) {
      const group = this.pending.splice(0, this.pending.length);
      this.pendingSamples = 0;
      this.wrotePending = true;
      await this.options.store.insertPending(this.options.traceId, this.options.organisationId, group);
    }
  }

  private encode(chunk: OpenChunk): StoredChunk {
    const axis = this.axisOf(chunk);
    if (this.gapThresholdS === null && chunk.count > 1) {
      // The trace's spacing is known from its first chunk with two samples; it fixes the gap threshold for good.
      this.gapThresholdS = gapThresholdFromSpacing(typicalSpacingS(axis, 0, chunk.count), DEFAULT_GAP_FACTOR);
    }
    const options = { gapThresholdS: this.gapThresholdS };
    const values = chunk.values.subarray(0, chunk.count);
    const whole = summarise(axis, values, 0, chunk.count, options);
    this.newPartSummaries.push(chunk.oldCount === 0 ? whole : summarise(axis, values, chunk.oldCount, chunk.count, options));
    const uniform = chunk.encoding === 'uniform';
    const firstUs = uniform ? timeOfRunIndex({ startUs: chunk.runStartUs, rateHz: chunk.rateHz }, chunk.runOffset) : (chunk.timesUs![0] as number);
    const lastUs = uniform
      ? timeOfRunIndex({ startUs: chunk.runStartUs, rateHz: chunk.rateHz }, chunk.runOffset + chunk.count - 1)
      : (chunk.timesUs![chunk.count - 1] as number);
    const stored: StoredChunk = {
      row: {
        seq: chunk.seq,
        encoding: chunk.encoding,
        firstUs,
        lastUs,
        runStartUs: uniform ? chunk.runStartUs : null,
        runOffset: uniform ? chunk.runOffset : null,
        rateHz: uniform ? chunk.rateHz : null,
        ...summaryColumns(whole),
      },
      envelope: encodeEnvelope(chunk.values, 0, chunk.count),
      times: uniform ? null : encodeTimes(chunk.timesUs!, 0, chunk.count),
      samples: encodeSamples(chunk.values, 0, chunk.count),
    };
    // Chunk arrays are never reused, so keeping views of them is safe.
    this.lastEncoded = { row: stored.row, data: { values, timesUs: chunk.timesUs ? chunk.timesUs.subarray(0, chunk.count) : null } };
    return stored;
  }

  /** The trace's last chunk once this batch is committed (row and samples), for the next batch. */
  lastChunkAfter(): { row: ChunkSummaryRow; data: LastChunkData } | null {
    return this.lastEncoded;
  }

  /**
   * Makes the batch visible in one transaction; returns what it added. `record` makes the
   * idempotency record (the answer to store) from that result, written in the same transaction.
   */
  async finish(record: (result: BatchResult) => IdempotencyRecord | null = () => null): Promise<BatchResult> {
    if (this.open) await this.close(this.open);
    const before = this.state;
    if (this.accepted === 0) {
      throw new Problem('validation', 'The batch holds no samples', { errors: [{ detail: 'no samples', pointer: '' }] });
    }
    if (this.gapThresholdS === null && before.sampleCount + this.accepted > 1) this.gapThresholdS = this.thresholdFromSingleSamples();
    const threshold = this.gapThresholdS;
    const added = mergeSummaryList(this.newPartSummaries.map((s) => withGapThreshold(s, threshold)));
    const summary = before.summary ? mergeSummaries(withGapThreshold(before.summary, threshold), added) : added;
    const state: TraceStorageState = {
      sampleCount: before.sampleCount + this.accepted,
      chunkCount: this.nextSeq,
      originUs: this.originUs,
      firstSampleUs: before.firstSampleUs ?? this.firstNewUs,
      lastSampleUs: this.lastUs,
      gapThresholdS: this.gapThresholdS,
      summary,
    };
    const result: BatchResult = { accepted: this.accepted, firstUs: this.firstNewUs as number, lastUs: this.lastUs as number, state };
    const committed = await this.options.store.commit({
      traceId: this.options.traceId,
      organisationId: this.options.organisationId,
      expectedChunkCount: before.chunkCount,
      replaceLast: this.replacement,
      chunks: this.pending.splice(0, this.pending.length),
      state,
      idempotency: record(result),
    });
    if (!committed) {
      await this.abort();
      throw new Problem('conflict', 'The trace was closed, deleted or changed by another batch while this one was stored; nothing was stored');
    }
    return result;
  }

  /**
   * Gap threshold when every chunk so far holds one sample (single readings sent as separate uniform
   * batches): gapFactor × the shortest step between those samples.
   */
  private thresholdFromSingleSamples(): number | null {
    const times = this.newPartSummaries.map((s) => s.firstTimeS);
    if (this.state.summary) times.unshift(this.state.summary.lastTimeS);
    let spacing = Number.POSITIVE_INFINITY;
    for (let k = 1; k < times.length; k++) spacing = Math.min(spacing, (times[k] as number) - (times[k - 1] as number));
    return spacing > 0 && Number.isFinite(spacing) ? gapThresholdFromSpacing(spacing, DEFAULT_GAP_FACTOR) : null;
  }

  /** Deletes the pending chunks this batch wrote (call when the batch fails). */
  async abort(): Promise<void> {
    if (this.wrotePending) {
      this.wrotePending = false;
      await this.options.store.discardPending(this.options.traceId, this.state.chunkCount);
    }
  }
}

/**
 * A writer for the next batch of a trace: reads the trace's last chunk (to top it up or continue its
 * run) and takes the default gap threshold from the trace's stated sample rate.
 */
export async function startBatch(
  options: Omit<BatchWriterOptions, 'lastChunk' | 'defaultGapThresholdS'> & { sampleRateHz: number | null; lastChunk?: ChunkSummaryRow | undefined },
): Promise<BatchWriter> {
  const { state, store, sampleRateHz, lastChunk, ...rest } = options;
  const last =
    lastChunk ??
    (state.chunkCount > 0 && state.lastSampleUs !== null
      ? ((await store.readSummaries(rest.traceId, state.chunkCount, state.lastSampleUs, state.lastSampleUs)).at(-1) ?? null)
      : null);
  return new BatchWriter({ ...rest, store, state, lastChunk: last, defaultGapThresholdS: sampleRateHz ? DEFAULT_GAP_FACTOR / sampleRateHz : null });
}
