import { unwrap, type ClientContext, type HeadroomClient } from '../client.js';
import { errorFromResponse } from '../errors.js';
import type { components, operations } from '../generated/openapi.js';
import { newIdempotencyKey } from '../idempotency.js';
import { pageThrough, type PageIterator } from '../paginate.js';
import { sampleBatches, sampleCount, type BinaryValueType, type Samples } from '../samples.js';
import { multipartBody, sendBody, type UploadProgress } from '../upload.js';
import { callInit, type ListFilters, type RequestOptions } from './request-options.js';

type Schemas = components['schemas'];
export type Trace = Schemas['Trace'];
export type TraceCreate = Schemas['TraceCreate'];
export type TraceUpdate = Schemas['TraceUpdate'];
export type AppendResult = Schemas['AppendResult'];
export type ImportResult = Schemas['ImportResult'];
export type TraceStats = Schemas['TraceStats'];
export type TraceSeries = Schemas['TraceSeries'];
export type TraceEvents = Schemas['TraceEvents'];
export type TraceClosed = Schemas['TraceClosed'];
export type TraceFilters = ListFilters<operations['listTraces']['parameters']['query']>;
export type StatsQuery = NonNullable<operations['getTraceStats']['parameters']['query']>;
export type SeriesQuery = NonNullable<operations['getTraceSeries']['parameters']['query']>;
export type EventsQuery = NonNullable<operations['getTraceEvents']['parameters']['query']>;
export type ExportQuery = NonNullable<operations['exportSamples']['parameters']['query']>;
/** The import's form fields other than the file: the trace's fields and how to read the CSV. */
export type ImportFields = Omit<operations['importTrace']['requestBody']['content']['multipart/form-data'], 'file'>;

/** Progress of an append, after each batch the API has stored. */
export interface AppendProgress {
  batches: number;
  sentSamples: number;
  totalSamples: number;
  last: AppendResult;
}

export interface AppendOptions extends Omit<RequestOptions, 'idempotencyKey'> {
  /** Samples per request. Default 262,144 for uniform (binary) data, 50,000 for timed (JSON) data. */
  batchSize?: number;
  /** Binary value type for uniform data. Default float32 (what the API stores). */
  valueType?: BinaryValueType;
  /**
   * Base of the batches' Idempotency-Keys (`<base>-<batch number>`); default a new random key per batch.
   * A fixed base lets a whole append be replayed later without storing anything twice.
   */
  idempotencyKeyBase?: string;
  /** Told after each stored batch. */
  onBatch?: (progress: AppendProgress) => void;
  /** Byte progress of the batch being sent. */
  onUploadProgress?: (progress: UploadProgress & { batch: number }) => void;
}

export interface ImportOptions extends RequestOptions {
  /** Byte progress of the upload (XMLHttpRequest in browsers, a streamed body in Node). */
  onProgress?: (progress: UploadProgress) => void;
}

/** A file to import: a browser File or Blob, bytes, or CSV text. */
export type CsvFile = Blob | Uint8Array | string;

/** Traces: create, list, read, append samples, close, and read figures of any window. */
export function tracesResource(client: HeadroomClient, context: ClientContext) {
  const path = (traceId: string) => ({ path: { traceId } });

  return {
    /** Every trace matching the filters (newest first unless `sort` says otherwise), page by page. */
    list(filters: TraceFilters = {}, options?: RequestOptions): PageIterator<Trace> {
      return pageThrough((cursor) => unwrap(client.GET('/traces', { params: { query: { ...filters, cursor } }, ...callInit(options) })));
    },
    get(traceId: string, options?: RequestOptions): Promise<Trace> {
      return unwrap(client.GET('/traces/{traceId}', { params: path(traceId), ...callInit(options) }));
    },
    /** A new, empty, open trace. Retried safely: the Idempotency-Key makes a repeat return the same trace. */
    create(trace: TraceCreate, options?: RequestOptions): Promise<Trace> {
      return unwrap(client.POST('/traces', { body: trace, ...callInit(options) }));
    },
    update(traceId: string, changes: TraceUpdate, options?: RequestOptions): Promise<Trace> {
      return unwrap(client.PATCH('/traces/{traceId}', { params: path(traceId), body: changes, ...callInit(options) }));
    },
    /** Analyses every stored sample, stores the inrush events and surges, and closes the trace to new samples. */
    close(traceId: string, options?: RequestOptions): Promise<TraceClosed> {
      return unwrap(client.POST('/traces/{traceId}/close', { params: path(traceId), ...callInit(options) }));
    },
    /** Deletes the trace with its samples. */
    async delete(traceId: string, options?: RequestOptions): Promise<void> {
      await unwrap(client.DELETE('/traces/{traceId}', { params: path(traceId), ...callInit(options) }));
    },
    /** Statistics (amperes) of the whole trace or of a window `{ from, to }` (epoch ms or ISO 8601). */
    stats(traceId: string, query: StatsQuery = {}, options?: RequestOptions): Promise<TraceStats> {
      return unwrap(client.GET('/traces/{traceId}/stats', { params: { ...path(traceId), query }, ...callInit(options) }));
    },
    /** A chart envelope: at most `points` buckets with min, max and mean (and the RMS series of waveforms). */
    series(traceId: string, query: SeriesQuery = {}, options?: RequestOptions): Promise<TraceSeries> {
      return unwrap(client.GET('/traces/{traceId}/series', { params: { ...path(traceId), query }, ...callInit(options) }));
    },
    /** Inrush events and surges: those stored at close, or computed now with the parameters given. */
    events(traceId: string, query: EventsQuery = {}, options?: RequestOptions): Promise<TraceEvents> {
      return unwrap(client.GET('/traces/{traceId}/events', { params: { ...path(traceId), query }, ...callInit(options) }));
    },

    /**
     * The samples of a window, as sent (`values: 'raw'`) or in amperes. `format: 'json'` (default here)
     * answers `{ t, a }`; `format: 'csv'` answers the CSV text.
     */
    async export(traceId: string, query: ExportQuery = {}, options?: RequestOptions): Promise<{ t: number[]; a: number[] } | string> {
      const format = query.format ?? 'json';
      const { data, error, response } = await client.GET('/traces/{traceId}/samples', { params: { ...path(traceId), query: { ...query, format } }, parseAs: 'text', ...callInit(options) });
      if (!response.ok || data === undefined) throw errorFromResponse(response, error);
      return format === 'csv' ? data : (JSON.parse(data) as { t: number[]; a: number[] });
    },

    /**
     * Appends samples in batches, one request each, in order: explicit times `{ t, a }` go as JSON,
     * uniform series `{ values, rate, start? }` as binary float32 (the first batch carries `start`; the
     * API continues each later batch where the stored series ends). Every batch has its own
     * Idempotency-Key and is retried on network errors, 429 and 5xx, so a retried batch is never stored
     * twice. Resolves with the last batch's answer (the trace's sample count and last time after it).
     */
    async append(traceId: string, samples: Samples, options: AppendOptions = {}): Promise<AppendResult> {
      const totalSamples = sampleCount(samples);
      if (totalSamples === 0) throw new RangeError('no samples to append');
      let last: AppendResult | undefined;
      let sentSamples = 0;
      for (const batch of sampleBatches(samples, { ...(options.batchSize ? { batchSize: options.batchSize } : {}), ...(options.valueType ? { valueType: options.valueType } : {}) })) {
        const onUploadProgress = options.onUploadProgress;
        const response = await sendBody(context, {
          method: 'POST',
          path: `/traces/${encodeURIComponent(traceId)}/samples`,
          query: batch.query,
          headers: { 'Content-Type': batch.contentType },
          body: batch.body,
          idempotencyKey: options.idempotencyKeyBase ? `${options.idempotencyKeyBase}-${batch.index}` : newIdempotencyKey(),
          ...(options.retry !== undefined ? { retry: options.retry } : {}),
          ...(options.signal ? { signal: options.signal } : {}),
          ...(onUploadProgress ? { onProgress: (p: UploadProgress) => onUploadProgress({ ...p, batch: batch.index }) } : {}),
        });
        last = (await response.json()) as AppendResult;
        sentSamples += batch.count;
        options.onBatch?.({ batches: batch.index + 1, sentSamples, totalSamples, last });
      }
      return last as AppendResult;
    },

    /**
     * Creates a trace from a CSV file in one request (`POST /traces/import`): the trace's fields and the
     * column options go first, then the file, as multipart/form-data. All or nothing: an error names the
     * line and keeps nothing. `onProgress` reports bytes sent (for an upload bar).
     */
    async importCsv(file: CsvFile, fields: ImportFields, options: ImportOptions = {}): Promise<ImportResult> {
      const name = typeof Blob !== 'undefined' && file instanceof Blob && 'name' in file && typeof file.name === 'string' ? file.name : 'trace.csv';
      const multipart = multipartBody(fields, { field: 'file', name, type: 'text/csv', content: file });
      const response = await sendBody(context, {
        method: 'POST',
        path: '/traces/import',
        headers: { 'Content-Type': multipart.contentType },
        body: multipart.body,
        ...(options.idempotencyKey ? { idempotencyKey: options.idempotencyKey } : {}),
        ...(options.retry !== undefined ? { retry: options.retry } : {}),
        ...(options.signal ? { signal: options.signal } : {}),
        ...(options.onProgress ? { onProgress: options.onProgress } : {}),
      });
      return (await response.json()) as ImportResult;
    },
  };
}
