/**
 * Writing samples: append a batch (JSON, NDJSON, CSV or binary, streamed), import a CSV file as a new
 * trace, and close a trace (full analysis stored with it). Every batch is all-or-nothing, retries
 * with the same Idempotency-Key get the first answer, and batches of one trace are stored one at a
 * time in arrival order.
 */
import type { Scope } from '../auth/scope.js';
import type { Config } from '../config/config.js';
import type { Db } from '../db/open.js';
import { Problem, conflict } from '../errors/problem.js';
import type { Trace } from '../models/trace.js';
import { BINARY_VALUE_TYPES, readBinarySamples, type BinaryValueType } from '../ingest/binary-samples.js';
import { badParameter } from '../ingest/body-errors.js';
import { drainBody, limitedBody, parseByteSize, tooLarge } from '../ingest/body-stream.js';
import { readCsvSamples, type CsvOptions, type CsvResult } from '../ingest/csv-samples.js';
import { readJsonSamples } from '../ingest/json-samples.js';
import { readNdjsonSamples } from '../ingest/ndjson-samples.js';
import type { UniformStart } from '../ingest/sample-sink.js';
import { TimestampReader, parseInstantUs, parseUtcOffset, type TimeFormat } from '../ingest/timestamps.js';
import { startBatch, type BatchResult, type BatchWriter, type LastChunkData } from '../storage/batch-writer.js';
import { TIME_RANGE_TEXT } from '../storage/chunk-codec.js';
import type { ChunkSummaryRow } from '../storage/summary-rows.js';
import type { ChunkStore } from '../storage/chunk-store.js';
import { presentAnalysis } from './analysis-view.js';
import type { TraceCloser } from './traces-close.js';
import { isDuplicateKeyError, idempotencyContext, type IdempotencyContext, type IdempotencyStore, type Replay } from './traces-idempotency.js';
import type { KeyedQueue } from './traces-queue.js';
import { msOf, originMs, storageState, toTraceView } from './traces-view.js';
import type { TraceInput } from './traces.js';

/** Body formats of sample uploads, by media type. */
export const SAMPLE_MEDIA_TYPES = {
  'application/json': 'json',
  'application/x-ndjson': 'ndjson',
  'application/ndjson': 'ndjson',
  'application/jsonl': 'ndjson',
  'text/csv': 'csv',
  'application/octet-stream': 'binary',
} as const;
export type SampleFormat = (typeof SAMPLE_MEDIA_TYPES)[keyof typeof SAMPLE_MEDIA_TYPES];

/** Query parameters (or the form fields of an import) that say how to read a body. */
export interface SampleReadOptions extends Pick<CsvOptions, 'delimiter' | 'decimal' | 'timeColumn' | 'dateColumn' | 'valueColumn' | 'unit'> {
  /** Epoch ms or ISO 8601: time of the first reading of uniform data. */
  start?: string | undefined;
  rate?: number | undefined;
  valueType?: BinaryValueType | undefined;
  timeFormat?: TimeFormat | undefined;
  utcOffset?: string | undefined;
  /** Comma-separated markers of missing readings, e.g. `?` or `NA,?`. */
  missing?: string | undefined;
}

export interface SampleUpload {
  contentType: string | undefined;
  contentLength: number | undefined;
  options: SampleReadOptions;
  body: AsyncIterable<Buffer>;
  idempotencyKey: string | undefined;
}

export interface AppendResult {
  traceId: string;
  accepted: number;
  skipped: number;
  /** Time of the batch's first and last sample, epoch ms. */
  firstTime: number;
  lastTime: number;
  /** The trace after the batch. */
  sampleCount: number;
  firstSampleTime: number | null;
  lastSampleTime: number | null;
  /** How a CSV body was read (detected or given). */
  csv: Omit<CsvResult, 'count' | 'skipped'> | null;
  timeFormat: TimeFormat | null;
}

export interface IngestDeps {
  db: Db;
  config: Config;
  store: ChunkStore;
  queue: KeyedQueue;
  idempotency: IdempotencyStore;
  find: (scope: Scope, id: string) => Promise<Trace>;
  createTrace: (scope: Scope, input: TraceInput) => Promise<Trace>;
  closer: TraceCloser;
}

/** The body format of a Content-Type header, or a 415 problem naming the accepted ones. */
export function sampleFormatOf(contentType: string | undefined): SampleFormat {
  const [type = '', ...params] = (contentType ?? '').split(';').map((s) => s.trim().toLowerCase());
  const format = (SAMPLE_MEDIA_TYPES as Record<string, SampleFormat>)[type];
  const charset = params.find((p) => p.startsWith('charset='))?.slice('charset='.length).replace(/"/g, '');
  if (!format || (charset && charset !== 'utf-8' && charset !== 'utf8' && format !== 'binary')) {
    throw new Problem(
      'unsupported-media-type',
      `Samples are accepted as ${Object.keys(SAMPLE_MEDIA_TYPES).join(', ')} (text in UTF-8); got ${contentType ? `"${contentType}"` : 'no Content-Type'}`,
    );
  }
  return format;
}

export function createTraceIngest(deps: IngestDeps) {
  const { db, config, store, queue, idempotency, find, closer } = deps;
  const limitBytes = parseByteSize(config.sampleBodyLimit);
  /** Traces whose pending chunks left by an earlier process have been cleared in this one. */
  const cleared = new Set<string>();
  /**
   * The last chunk of recently written traces (row and samples), so the next batch need not read it
   * back to top it up. Valid only while the trace still has the counts it was stored with.
   */
  const lastChunks = new Map<string, { chunkCount: number; sampleCount: number; row: ChunkSummaryRow; data: LastChunkData }>();
  /** Most traces kept in lastChunks, and in recentTraces; past it the oldest entry goes. */
  const TRACES_KEPT = 1000;

  /** Keeps `value` as the newest entry of `map`, dropping the oldest one when TRACES_KEPT are kept. */
  function keepNewest<V>(map: Map<string, V>, traceId: string, value: V): void {
    map.delete(traceId);
    if (map.size >= TRACES_KEPT) map.delete(map.keys().next().value as string);
    map.set(traceId, value);
  }

  /** Sets the instance's storage fields to the ones a batch committed (the row itself is already written). */
  function setCommittedState(trace: Trace, batch: BatchResult): void {
    trace.set({ ...batch.state, summary: batch.state.summary as unknown as Record<string, unknown> });
  }
  /**
   * Traces this process appended to recently, as its last commit left them, so the trace's next batch
   * need not read the row again: under concurrent uploads that read waited its turn in the sqlite3
   * worker pool and then on the busy event loop, about 1–2 ms of each batch (`npm run bench -- ingest`).
   * Used only inside the trace's queue, for the same organisation. Every change to a trace row that an
   * append depends on runs in this one process, in the trace's queue, and forgets the entry: appends
   * (which keep it current), metadata updates, close and delete (`forget`). A change made any other way
   * (the status, organisation or chunk count) makes the commit's conditional UPDATE refuse the batch,
   * and a refused or failed batch forgets the entry, so the retry reads the row.
   */
  const recentTraces = new Map<string, Trace>();

  function rememberTrace(trace: Trace, batch: BatchResult): void {
    setCommittedState(trace, batch);
    keepNewest(recentTraces, trace.id, trace);
  }

  function forget(traceId: string): void {
    recentTraces.delete(traceId);
    lastChunks.delete(traceId);
  }

  /** The trace as the last append in this process left it, or as stored. */
  async function traceForAppend(scope: Scope, traceId: string): Promise<Trace> {
    const recent = recentTraces.get(traceId);
    if (recent && recent.organisationId === scope.organisationId) return recent;
    return find(scope, traceId);
  }

  function rememberLastChunk(traceId: string, writer: BatchWriter, batch: BatchResult): void {
    const last = writer.lastChunkAfter();
    if (!last) {
      lastChunks.delete(traceId);
      return;
    }
    keepNewest(lastChunks, traceId, { chunkCount: batch.state.chunkCount, sampleCount: batch.state.sampleCount, ...last });
  }

  function replayed(r: Replay) {
    return { status: r.status, body: r.body, replayed: true };
  }

  /** Starts a batch writer on the trace's committed state. */
  async function writerFor(trace: Trace): Promise<BatchWriter> {
    if (!cleared.has(trace.id)) {
      await store.discardPending(trace.id, trace.chunkCount);
      cleared.add(trace.id);
    }
    const known = lastChunks.get(trace.id);
    const fresh = known && known.chunkCount === trace.chunkCount && known.sampleCount === trace.sampleCount ? known : undefined;
    return startBatch({
      traceId: trace.id,
      organisationId: trace.organisationId,
      store,
      state: storageState(trace),
      sampleRateHz: trace.sampleRateHz,
      lastChunk: fresh?.row,
      lastChunkData: fresh?.data,
    });
  }

  function timestampReader(trace: Trace, options: SampleReadOptions, csv: boolean): TimestampReader {
    let utcOffsetMinutes = 0;
    if (options.utcOffset !== undefined) {
      const parsed = parseUtcOffset(options.utcOffset);
      if (parsed === null) throw badParameter('utcOffset', 'write the offset like +01:00, -05:00 or UTC');
      utcOffsetMinutes = parsed;
    }
    return new TimestampReader({
      format: options.timeFormat,
      traceStartUs: trace.startTime ? trace.startTime.getTime() * 1000 : null,
      utcOffsetMinutes,
      detectEpochSeconds: csv,
    });
  }

  /** Where uniform data starts when the batch does not say: after the stored run, or at the trace's start time. */
  function defaultStart(trace: Trace): UniformStart | null {
    if (trace.sampleCount > 0) return 'continue';
    return trace.startTime ? { startUs: trace.startTime.getTime() * 1000 } : null;
  }

  function explicitStart(options: SampleReadOptions, parameter: string): UniformStart | null {
    if (options.start === undefined) return null;
    const us = parseInstantUs(options.start);
    if (us === null) throw badParameter(parameter, `must be epoch milliseconds or an ISO 8601 date-time, ${TIME_RANGE_TEXT}`);
    return { startUs: us };
  }

  /** Reads a body of the given format into the writer. */
  async function readBody(format: SampleFormat, body: AsyncIterable<Buffer>, trace: Trace, options: SampleReadOptions, writer: BatchWriter) {
    const start = explicitStart(options, 'start') ?? defaultStart(trace);
    const rateHz = options.rate ?? trace.sampleRateHz;
    switch (format) {
      case 'binary': {
        if (!rateHz) throw badParameter('rate', 'required (query parameter rate, header Sample-Rate, or the trace\'s sampleRateHz)');
        if (!start) throw badParameter('start', 'required: the trace has no start time and no stored series to continue');
        await readBinarySamples(body, { valueType: options.valueType ?? 'float32', start, rateHz }, writer);
        return { skipped: 0, csv: null, timeFormat: null };
      }
      case 'json': {
        const timestamps = timestampReader(trace, options, false);
        await readJsonSamples(body, { timestamps, defaultRateHz: rateHz, defaultStart: start }, writer);
        return { skipped: 0, csv: null, timeFormat: timestamps.detected ?? null };
      }
      case 'ndjson': {
        const timestamps = timestampReader(trace, options, false);
        await readNdjsonSamples(body, timestamps, writer);
        return { skipped: 0, csv: null, timeFormat: timestamps.detected ?? null };
      }
      case 'csv': {
        const timestamps = timestampReader(trace, options, true);
        const hasRate = options.rate !== undefined && options.timeColumn === undefined;
        const result = await readCsvSamples(
          body,
          {
            delimiter: options.delimiter,
            decimal: options.decimal,
            timeColumn: options.timeColumn,
            dateColumn: options.dateColumn,
            valueColumn: options.valueColumn,
            unit: options.unit,
            probeUnit: trace.probe.inputUnit,
            missing: options.missing === undefined ? undefined : options.missing.split(','),
            timestamps,
            uniform: hasRate ? { start, rateHz: rateHz ?? null } : undefined,
          },
          writer,
        );
        const { count: _count, skipped, ...csv } = result;
        return { skipped, csv, timeFormat: timestamps.detected ?? null };
      }
    }
  }

  function appendResult(trace: Trace, batch: BatchResult, read: { skipped: number; csv: AppendResult['csv']; timeFormat: TimeFormat | null }): AppendResult {
    return {
      traceId: trace.id,
      accepted: batch.accepted,
      skipped: read.skipped,
      firstTime: batch.firstUs / 1000,
      lastTime: batch.lastUs / 1000,
      sampleCount: batch.state.sampleCount,
      firstSampleTime: msOf(batch.state.firstSampleUs),
      lastSampleTime: msOf(batch.state.lastSampleUs),
      csv: read.csv,
      timeFormat: read.timeFormat,
    };
  }

  /** The stored answer for the key, or null; drains (and hashes) the body when it is a replay. */
  async function replayOf(scope: Scope, ctx: IdempotencyContext | null, body: AsyncIterable<Buffer>): Promise<Replay | null> {
    if (!ctx) return null;
    const stored = await idempotency.find(scope, ctx.key);
    if (!stored) return null;
    await drainBody(body);
    return idempotency.checkReplay(stored, ctx, ctx.fingerprint());
  }

  /** Fills `trace` from the body in one batch and commits it with its idempotency record. */
  async function storeBatch(
    scope: Scope,
    trace: Trace,
    format: SampleFormat,
    body: AsyncIterable<Buffer>,
    options: SampleReadOptions,
    ctx: IdempotencyContext | null,
    status: number,
    respond: (r: AppendResult, batch: BatchResult) => unknown,
    beforeCommit?: Promise<void>,
  ) {
    const writer = await writerFor(trace);
    try {
      const read = await readBody(format, body, trace, options, writer);
      await beforeCommit;
      const fingerprint = ctx?.fingerprint() ?? '';
      let answer: unknown;
      const batch = await writer.finish((result) => {
        answer = respond(appendResult(trace, result, read), result);
        return ctx ? idempotency.record(scope, ctx, fingerprint, status, answer) : null;
      });
      rememberLastChunk(trace.id, writer, batch);
      return { batch, answer };
    } catch (err) {
      forget(trace.id);
      await writer.abort();
      throw err;
    }
  }

  function describeOptions(options: SampleReadOptions): string {
    return JSON.stringify(Object.entries(options).filter(([, v]) => v !== undefined).sort(([a], [b]) => a.localeCompare(b)));
  }

  return {
    /** Forgets what this module keeps of the trace: call it, in the trace's queue, after any other change to its row. */
    forget,

    /** POST /traces/{id}/samples */
    async append(scope: Scope, traceId: string, upload: SampleUpload): Promise<{ status: number; body: unknown; replayed: boolean }> {
      const format = sampleFormatOf(upload.contentType);
      if (upload.contentLength !== undefined && upload.contentLength > limitBytes) throw tooLarge(limitBytes);
      const ctx = idempotencyContext(upload.idempotencyKey, `append-samples:${traceId}`, `${format}\n${describeOptions(upload.options)}`);
      const body = limitedBody(upload.body, limitBytes, ctx?.hash);
      return queue.run(traceId, async () => {
        const known = await replayOf(scope, ctx, body);
        if (known) return replayed(known);
        const trace = await traceForAppend(scope, traceId);
        if (trace.status === 'closed') {
          throw conflict(`Trace ${traceId} is closed: it takes no more samples. Create a new trace for a new recording.`, { status: 'closed' });
        }
        try {
          const { answer, batch } = await storeBatch(scope, trace, format, body, upload.options, ctx, 200, (r) => r);
          rememberTrace(trace, batch);
          return { status: 200, body: answer, replayed: false };
        } catch (err) {
          if (ctx && isDuplicateKeyError(err)) {
            const stored = await idempotency.find(scope, ctx.key);
            if (stored) return replayed(idempotency.checkReplay(stored, ctx, ctx.fingerprint()));
          }
          throw err;
        }
      });
    },

    /**
     * POST /traces/import: a CSV file creates and fills a new trace; nothing is kept when it fails.
     * `formRead`: the rest of the upload; the samples are committed only once it has been read whole.
     */
    async importCsv(scope: Scope, input: TraceInput, options: SampleReadOptions, file: AsyncIterable<Buffer>, idempotencyKey: string | undefined, formRead?: Promise<void>) {
      const ctx = idempotencyContext(idempotencyKey, 'import-trace', `${JSON.stringify(input)}\n${describeOptions(options)}`);
      const body = limitedBody(file, limitBytes, ctx?.hash);
      const known = await replayOf(scope, ctx, body);
      if (known) return replayed(known);
      const trace = await deps.createTrace(scope, input);
      try {
        const { answer } = await storeBatch(
          scope,
          trace,
          'csv',
          body,
          options,
          ctx,
          201,
          (r, batch) => {
            // The answer shows the trace as the commit leaves it (the instance is not saved from here).
            setCommittedState(trace, batch);
            return { trace: toTraceView(trace), import: r };
          },
          formRead,
        );
        return { status: 201, body: answer, replayed: false };
      } catch (err) {
        await trace.destroy();
        if (ctx && isDuplicateKeyError(err)) {
          const stored = await idempotency.find(scope, ctx.key);
          if (stored) return replayed(idempotency.checkReplay(stored, ctx, ctx.fingerprint()));
        }
        throw err;
      }
    },

    /** POST /traces/{id}/close: runs the full analysis, stores it and marks the trace closed. */
    async close(scope: Scope, traceId: string, idempotencyKey: string | undefined) {
      const ctx = idempotencyContext(idempotencyKey, `close-trace:${traceId}`, '');
      const fingerprint = ctx?.fingerprint() ?? '';
      return queue.run(traceId, async () => {
        if (ctx) {
          const stored = await idempotency.find(scope, ctx.key);
          if (stored) return replayed(idempotency.checkReplay(stored, ctx, fingerprint));
        }
        forget(traceId);
        const trace = await find(scope, traceId);
        if (trace.status === 'closed') throw conflict(`Trace ${traceId} is already closed`, { status: 'closed' });
        const analysis = await closer.analyse(trace, {}, true);
        const closedAt = new Date();
        let body: unknown;
        await db.sequelize.transaction(async (transaction) => {
          await closer.saveAnalysis(trace, analysis, transaction);
          await trace.update({ status: 'closed', closedAt }, { transaction });
          body = { trace: toTraceView(trace), analysis: presentAnalysis(analysis.result, originMs(trace)) };
          if (ctx) await db.models.IdempotencyKey.create({ ...idempotency.record(scope, ctx, fingerprint, 200, body), createdAt: new Date() }, { transaction });
        });
        return { status: 200, body, replayed: false };
      });
    },
  };
}

export { BINARY_VALUE_TYPES };
