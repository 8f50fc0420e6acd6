import type { Request } from 'express';
import { pipeline } from 'node:stream/promises';
import { Readable } from 'node:stream';
import { parseByteSize } from '../../ingest/body-stream.js';
import { readMultipartFile } from '../../ingest/multipart-file.js';
import { parseRequestPart } from '../validate.js';
import { defineRoute, type RouteDefinition } from '../define-route.js';
import {
  AppendResult,
  CloseResponse,
  EventsQuery,
  EventsResponse,
  ExportQuery,
  IdempotencyHeaders,
  ImportBody,
  ImportFields,
  ImportResult,
  SampleBodies,
  SampleHeaders,
  SampleQuery,
  SeriesQuery,
  SeriesResponse,
  StatsQuery,
  StatsResponse,
  Trace,
  TraceCreate,
  TraceListQuery,
  TracePage,
  TraceParams,
  TraceUpdate,
} from './schemas/traces.js';

const tags = ['Traces'];
const REPLAYED = { 'Idempotent-Replayed': 'true' };

/** POST /traces/{id}/samples reads its own body as a stream: the JSON body parser must leave it alone. */
export function streamsOwnBody(req: Request): boolean {
  return req.method === 'POST' && /^\/traces\/[^/]+\/samples\/?$/.test(req.path);
}

function answer(r: { status: number; body: unknown; replayed: boolean }) {
  return { status: r.status, body: r.body, ...(r.replayed ? { headers: REPLAYED } : {}) };
}

export const traceRoutes: RouteDefinition[] = [
  defineRoute(
    {
      method: 'get',
      path: '/traces',
      operationId: 'listTraces',
      summary: 'List traces',
      description: 'Filters combine (and); `q` searches names and notes. Pages follow `nextCursor`.',
      tags,
      permission: 'read',
      query: TraceListQuery,
      responses: { 200: { description: 'A page of traces', schema: TracePage } },
    },
    async ({ services, scope, query }) => ({ status: 200, body: await services.traces.list(scope, query) }),
  ),
  defineRoute(
    {
      method: 'post',
      path: '/traces',
      operationId: 'createTrace',
      summary: 'Create a trace (no samples yet)',
      description: 'Then send samples with POST /traces/{traceId}/samples and close it with POST /traces/{traceId}/close.',
      tags,
      permission: 'ingest',
      headers: IdempotencyHeaders,
      body: TraceCreate,
      responses: { 201: { description: 'The new trace', schema: Trace } },
    },
    async ({ services, scope, body, headers }) => answer(await services.traces.create(scope, body, headers['idempotency-key'])),
  ),
  defineRoute(
    {
      method: 'post',
      path: '/traces/import',
      operationId: 'importTrace',
      summary: 'Create a trace from a CSV file in one step',
      description:
        'Multipart form: the trace\'s fields and the CSV reading options (as for POST /traces/{traceId}/samples), then the file in the field `file`. ' +
        'The trace is created and filled in one batch; when the file has an error (named by line) nothing is kept.',
      tags,
      permission: 'ingest',
      headers: IdempotencyHeaders,
      rawBody: ImportBody,
      responses: { 201: { description: 'The new trace and how its file was read', schema: ImportResult } },
    },
    async ({ services, scope, config, req, res, headers }) => {
      const result = await readMultipartFile(req, res, parseByteSize(config.sampleBodyLimit), async (fields, file, formRead) => {
        const { name, kind, inputUnit, sensitivityPerA, loops, tags: tagList, ...rest } = parseRequestPart(ImportFields, fields, 'body');
        const { start, rate, valueType, timeFormat, utcOffset, delimiter, decimal, timeColumn, dateColumn, valueColumn, unit, missing, ...trace } = rest;
        return services.traces.importCsv(
          scope,
          { ...trace, name, kind, probe: { inputUnit, sensitivityPerA, loops }, tags: tagList ? tagList.split(',').map((s) => s.trim()).filter(Boolean) : [] },
          { start, rate, valueType, timeFormat, utcOffset, delimiter, decimal, timeColumn, dateColumn, valueColumn, unit, missing },
          file,
          headers['idempotency-key'],
          formRead,
        );
      });
      return answer(result);
    },
  ),
  defineRoute(
    {
      method: 'get',
      path: '/traces/{traceId}',
      operationId: 'getTrace',
      summary: 'Get a trace with the statistics of its samples',
      tags,
      permission: 'read',
      params: TraceParams,
      responses: { 200: { description: 'The trace', schema: Trace } },
    },
    async ({ services, scope, params }) => ({ status: 200, body: await services.traces.get(scope, params.traceId) }),
  ),
  defineRoute(
    {
      method: 'patch',
      path: '/traces/{traceId}',
      operationId: 'updateTrace',
      summary: 'Update a trace\'s metadata',
      description: 'Changing the probe, voltage or mains frequency of a closed trace runs its analysis again.',
      tags,
      permission: 'write',
      params: TraceParams,
      body: TraceUpdate,
      responses: { 200: { description: 'The updated trace', schema: Trace } },
    },
    async ({ services, scope, params, body }) => ({ status: 200, body: await services.traces.update(scope, params.traceId, body) }),
  ),
  defineRoute(
    {
      method: 'delete',
      path: '/traces/{traceId}',
      operationId: 'deleteTrace',
      summary: 'Delete a trace with its samples',
      tags,
      permission: 'write',
      params: TraceParams,
      responses: { 204: { description: 'Deleted' } },
    },
    async ({ services, scope, params }) => {
      await services.traces.remove(scope, params.traceId);
    },
  ),
  defineRoute(
    {
      method: 'post',
      path: '/traces/{traceId}/samples',
      operationId: 'appendSamples',
      summary: 'Append a batch of samples',
      description:
        'JSON (`{"t": [...], "a": [...]}` or `{"start", "rate", "values"}`), NDJSON (one `{"t", "a"}` per line), CSV (header row; ' +
        'columns, time format, separator, decimal mark and unit detected or given as query parameters) or little-endian float32/float64 ' +
        '(`application/octet-stream`, at `start` and `rate`). The batch must come after the samples already stored (409 naming the ' +
        'overlap otherwise) and is stored completely or not at all. With an `Idempotency-Key`, a retry returns the first answer ' +
        '(header `Idempotent-Replayed: true`) and stores nothing twice.',
      tags,
      permission: 'ingest',
      params: TraceParams,
      query: SampleQuery,
      headers: SampleHeaders,
      rawBody: SampleBodies,
      responses: { 200: { description: 'What was stored', schema: AppendResult } },
    },
    async ({ services, scope, params, query, headers, req }) => {
      const length = req.headers['content-length'];
      const result = await services.traces.append(scope, params.traceId, {
        contentType: req.headers['content-type'],
        contentLength: length === undefined ? undefined : Number(length),
        options: {
          ...query,
          rate: query.rate ?? headers['sample-rate'],
          start: query.start ?? headers['sample-start'],
          valueType: query.valueType ?? headers['sample-value-type'],
        },
        body: req,
        idempotencyKey: headers['idempotency-key'],
      });
      return answer(result);
    },
  ),
  defineRoute(
    {
      method: 'post',
      path: '/traces/{traceId}/close',
      operationId: 'closeTrace',
      summary: 'Close a trace: analyse it and store its inrush events and surges',
      description: 'A closed trace takes no more samples. The analysis is the one POST /analyze gives, over every stored sample.',
      tags,
      permission: 'ingest',
      params: TraceParams,
      headers: IdempotencyHeaders,
      responses: { 200: { description: 'The closed trace and its analysis', schema: CloseResponse } },
    },
    async ({ services, scope, params, headers }) => answer(await services.traces.close(scope, params.traceId, headers['idempotency-key'])),
  ),
  defineRoute(
    {
      method: 'get',
      path: '/traces/{traceId}/stats',
      operationId: 'getTraceStats',
      summary: 'Statistics of a window of a trace',
      description:
        'Assembled from the stored chunk summaries and the two edge chunks, so any window costs about the same. Percentiles need ' +
        '`percentiles=true` (reads the window\'s samples). The whole of a closed rms trace answers with the statistics stored at close.',
      tags,
      permission: 'read',
      params: TraceParams,
      query: StatsQuery,
      responses: { 200: { description: 'Statistics in amperes', schema: StatsResponse } },
    },
    async ({ services, scope, params, query }) => {
      const { from, to, ...options } = query;
      return { status: 200, body: await services.traces.stats(scope, params.traceId, { from, to }, options) };
    },
  ),
  defineRoute(
    {
      method: 'get',
      path: '/traces/{traceId}/series',
      operationId: 'getTraceSeries',
      summary: 'Chart envelope of a window: at most `points` buckets with min, max and mean',
      tags,
      permission: 'read',
      params: TraceParams,
      query: SeriesQuery,
      responses: { 200: { description: 'Buckets as columns', schema: SeriesResponse } },
    },
    async ({ services, scope, params, query }) => ({
      status: 200,
      body: await services.traces.series(scope, params.traceId, { from: query.from, to: query.to }, query.points),
    }),
  ),
  defineRoute(
    {
      method: 'get',
      path: '/traces/{traceId}/events',
      operationId: 'getTraceEvents',
      summary: 'Inrush events and surges of a trace',
      description: 'Those stored at close; with any parameter given (or on an open trace) they are computed for this request.',
      tags,
      permission: 'read',
      params: TraceParams,
      query: EventsQuery,
      responses: { 200: { description: 'Events (times epoch ms)', schema: EventsResponse } },
    },
    async ({ services, scope, params, query }) => ({ status: 200, body: await services.traces.events(scope, params.traceId, query) }),
  ),
  defineRoute(
    {
      method: 'get',
      path: '/traces/{traceId}/samples',
      operationId: 'exportSamples',
      summary: 'Export the samples of a window (streamed)',
      description: 'CSV (`time_ms,reading_<unit>`) or JSON in the append format (`{"t": [...], "a": [...]}`): what was sent comes back bit for bit.',
      tags,
      permission: 'read',
      params: TraceParams,
      query: ExportQuery,
      responses: { 200: { description: 'The samples', contentTypes: ['text/csv', 'application/json'] } },
    },
    async ({ services, scope, params, query, res }) => {
      const out = await services.traces.exportSamples(scope, params.traceId, { from: query.from, to: query.to }, query.format, query.values);
      res.status(200);
      res.setHeader('Content-Type', query.format === 'csv' ? 'text/csv; charset=utf-8' : 'application/json; charset=utf-8');
      res.setHeader('Content-Disposition', `attachment; filename="trace-${out.trace.id}.${query.format}"`);
      await pipeline(Readable.from(out.body), res);
    },
  ),
];
