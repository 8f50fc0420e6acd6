import { TRACE_KINDS, TRACE_STATUSES } from '../../../models/trace.js';
import { BINARY_VALUE_TYPES } from '../../../ingest/binary-samples.js';
import { CSV_DELIMITERS, READING_UNITS, type CsvDelimiter } from '../../../ingest/csv-samples.js';
import { TIME_FORMATS, parseInstantUs } from '../../../ingest/timestamps.js';
import { TIME_RANGE_TEXT } from '../../../storage/chunk-codec.js';
import { TRACE_SORTS } from '../../../services/traces.js';
import { AnalyzeResponse, EventParamsInput, InrushEvent, Probe, Surge } from './analyze.js';
import { Statistics } from './statistics.js';
import { Id, Pagination, Timestamp, pageOf, z } from './common.js';

const text = (max: number) => z.string().trim().max(max);

/** An instant given as epoch milliseconds (number or digits) or ISO 8601; parsed to epoch ms. */
export const Instant = z
  .union([z.number(), z.string()])
  .transform((value, ctx) => {
    const us = parseInstantUs(value);
    if (us === null) {
      ctx.addIssue({ code: 'custom', message: `must be epoch milliseconds or an ISO 8601 date-time, ${TIME_RANGE_TEXT}` });
      return z.NEVER;
    }
    return us / 1000;
  })
  .openapi({ description: 'Epoch milliseconds or ISO 8601 (UTC when no offset is given)', example: '2026-11-30T09:15:00Z' });

const flag = z.enum(['true', 'false']).transform((v) => v === 'true');
const queryNumber = (schema: z.ZodNumber) => z.coerce.number().pipe(schema);

const TraceFields = {
  name: text(200).min(1, 'must not be empty').openapi({ example: 'Dough mixer, Tuesday batch' }),
  probe: Probe.optional().openapi({ description: 'How raw readings become amperes; default amperes, one loop' }),
  nominalVoltageV: z.number().positive().max(1000).nullable().optional().openapi({ description: 'Default: the circuit\'s' }),
  mainsHz: z.number().min(40).max(70).nullable().optional().openapi({ description: 'Default: the circuit\'s' }),
  startTime: Instant.nullable().optional().openapi({ description: 'When the recording started; needed for timestamps given as seconds from the start' }),
  sampleRateHz: z.number().positive().max(1e7).nullable().optional().openapi({ description: 'Sample rate of a uniform series (required for waveform traces, at least 1 kHz)' }),
  siteId: Id.nullable().optional(),
  circuitId: Id.nullable().optional(),
  loadId: Id.nullable().optional(),
  tags: z.array(text(50).min(1)).max(20).optional(),
  notes: text(5000).nullable().optional(),
};

export const TraceCreate = z
  .object({ ...TraceFields, kind: z.enum(TRACE_KINDS).openapi({ description: '`rms`: each sample an RMS reading; `waveform`: instantaneous values at 1 kHz or more' }) })
  .strict()
  .openapi('TraceCreate');

export const TraceUpdate = z.object(TraceFields).partial().strict().openapi('TraceUpdate');

export const Trace = z
  .object({
    id: Id,
    name: z.string(),
    kind: z.enum(TRACE_KINDS),
    status: z.enum(TRACE_STATUSES).openapi({ description: '`open` while samples arrive; `closed` once analysed' }),
    siteId: z.string().nullable(),
    circuitId: z.string().nullable(),
    loadId: z.string().nullable(),
    probe: Probe,
    nominalVoltageV: z.number().nullable(),
    mainsHz: z.number().nullable(),
    startTime: z.number().nullable().openapi({ description: 'Epoch ms' }),
    sampleRateHz: z.number().nullable(),
    tags: z.array(z.string()),
    notes: z.string().nullable(),
    sampleCount: z.number().int(),
    firstSampleTime: z.number().nullable().openapi({ description: 'Time of the first stored sample, epoch ms' }),
    lastSampleTime: z.number().nullable().openapi({ description: 'Time of the last stored sample, epoch ms' }),
    // A union, not .nullable(): that would make the shared TraceStatistics schema itself nullable.
    summary: z.union([Statistics, z.null()]).openapi({ description: 'Statistics of every stored sample, kept current on each append (no percentiles); null while empty' }),
    createdAt: Timestamp,
    updatedAt: Timestamp,
    closedAt: Timestamp.nullable(),
  })
  .openapi('Trace');

export const TracePage = pageOf(Trace, 'TracePage');
export const TraceParams = z.object({ traceId: Id });

export const TraceListQuery = Pagination.extend({
  sort: z.enum(TRACE_SORTS).optional().openapi({ description: 'Order; `-` for descending. Default `-createdAt` (newest first)' }),
  siteId: Id.optional(),
  circuitId: Id.optional(),
  loadId: Id.optional(),
  kind: z.enum(TRACE_KINDS).optional(),
  status: z.enum(TRACE_STATUSES).optional(),
  createdFrom: Instant.optional(),
  createdTo: Instant.optional(),
  q: z.string().trim().min(1).max(200).optional().openapi({ description: 'Text in the name or notes' }),
});

/** How to read a sample body (query parameters of POST /traces/{id}/samples, form fields of the import). */
const DELIMITER_NAMES: Record<string, CsvDelimiter> = { comma: ',', semicolon: ';', tab: '\t', pipe: '|' };

const SampleReadFields = {
  start: z.string().max(40).optional().openapi({ description: 'Uniform data (binary, CSV without times): time of the first reading, epoch ms or ISO 8601. Default: right after the stored series, or the trace\'s startTime' }),
  rate: queryNumber(z.number().positive().max(1e7)).optional().openapi({ description: 'Uniform data: sample rate in Hz. Default: the trace\'s sampleRateHz' }),
  valueType: z.enum(BINARY_VALUE_TYPES).optional().openapi({ description: 'Binary bodies: little-endian float32 (default) or float64' }),
  timeFormat: z.enum(TIME_FORMATS).optional().openapi({ description: 'Format of the timestamps; default: detected from the first one' }),
  utcOffset: z.string().max(10).optional().openapi({ description: 'Offset of date-times written without one, e.g. +01:00; default UTC', example: '+01:00' }),
  delimiter: z
    .enum(['comma', 'semicolon', 'tab', 'pipe', ...CSV_DELIMITERS])
    .transform((v): CsvDelimiter => DELIMITER_NAMES[v] ?? (v as CsvDelimiter))
    .optional()
    .openapi({ description: 'CSV: field separator; default detected from the header' }),
  decimal: z.enum(['.', ',', 'point', 'comma']).transform((v) => (v === 'comma' || v === ',' ? ',' : '.')).optional().openapi({ description: 'CSV: decimal mark; default detected' }),
  timeColumn: z.string().max(200).optional().openapi({ description: 'CSV: header name or 1-based position of the time column' }),
  dateColumn: z.string().max(200).optional().openapi({ description: 'CSV: the date column, when date and time are separate' }),
  valueColumn: z.string().max(200).optional().openapi({ description: 'CSV: header name or 1-based position of the readings' }),
  unit: z.enum(READING_UNITS).optional().openapi({ description: 'CSV: unit of the readings; default from the header, else the probe\'s' }),
  missing: z.string().max(100).optional().openapi({ description: 'CSV: comma-separated markers of a missing reading (the row is skipped), e.g. `?`' }),
};

export const SampleQuery = z.object(SampleReadFields);

export const SampleHeaders = z.object({
  'idempotency-key': z.string().optional().openapi({ description: 'A retry with the same key returns the first answer and stores nothing twice' }),
  'sample-rate': queryNumber(z.number().positive().max(1e7)).optional().openapi({ description: 'Same as the rate query parameter' }),
  'sample-start': z.string().max(40).optional().openapi({ description: 'Same as the start query parameter' }),
  'sample-value-type': z.enum(BINARY_VALUE_TYPES).optional().openapi({ description: 'Same as the valueType query parameter' }),
});

export const IdempotencyHeaders = z.object({
  'idempotency-key': z.string().optional().openapi({ description: 'A retry with the same key returns the first answer and does the work once' }),
});

export const AppendResult = z
  .object({
    traceId: Id,
    accepted: z.number().int().openapi({ description: 'Samples stored' }),
    skipped: z.number().int().openapi({ description: 'CSV rows skipped as missing readings' }),
    firstTime: z.number().openapi({ description: 'First sample of the batch, epoch ms' }),
    lastTime: z.number().openapi({ description: 'Last sample of the batch, epoch ms' }),
    sampleCount: z.number().int().openapi({ description: 'Samples in the trace after the batch' }),
    firstSampleTime: z.number().nullable(),
    lastSampleTime: z.number().nullable(),
    csv: z
      .object({
        columns: z.object({ time: z.string().nullable(), date: z.string().nullable(), value: z.string() }),
        delimiter: z.string(),
        decimal: z.string(),
        unit: z.enum(READING_UNITS),
      })
      .nullable()
      .openapi({ description: 'How a CSV body was read' }),
    timeFormat: z.enum(TIME_FORMATS).nullable(),
  })
  .openapi('AppendResult');

const jsonBatch = z
  .object({
    t: z.array(z.union([z.number(), z.string()])).optional().openapi({ description: 'Timestamps: epoch ms (numbers from 1e11), ISO 8601 strings, or seconds from the trace start (smaller numbers); one format, increasing' }),
    a: z.array(z.number()).optional().openapi({ description: 'Readings at the times t, in the probe\'s unit' }),
    start: z.union([z.number(), z.string()]).nullable().optional().openapi({ description: 'Time of values[0] (epoch ms or ISO 8601); absent or null: after the stored series, or the trace\'s start time' }),
    rate: z.number().optional().openapi({ description: 'Sample rate of values (Hz); default the trace\'s' }),
    values: z.array(z.number()).optional().openapi({ description: 'Readings at a uniform rate' }),
  })
  .openapi('SampleBatch', { description: 'Either t and a, or start, rate and values' });

export const SampleBodies = {
  description:
    'A batch of samples. Large bodies are read as a stream. Every batch is all-or-nothing and must come after the samples already stored.',
  contentTypes: {
    'application/json': { schema: jsonBatch },
    'application/x-ndjson': { schema: z.string().openapi({ description: 'One {"t": ..., "a": ...} object per line' }) },
    'text/csv': { schema: z.string().openapi({ description: 'Header line, then one row per sample (see the CSV query parameters)' }) },
    'application/octet-stream': { binary: true },
  },
};

export const ImportFields = z
  .object({
    name: text(200).min(1, 'must not be empty'),
    kind: z.enum(TRACE_KINDS).default('rms'),
    inputUnit: z.enum(['A', 'mA', 'mV']).default('A'),
    sensitivityPerA: queryNumber(z.number().positive()).default(1),
    loops: queryNumber(z.number().int().min(1).max(100)).default(1),
    nominalVoltageV: queryNumber(z.number().positive().max(1000)).optional(),
    mainsHz: queryNumber(z.number().min(40).max(70)).optional(),
    startTime: Instant.optional(),
    sampleRateHz: queryNumber(z.number().positive().max(1e7)).optional(),
    siteId: Id.optional(),
    circuitId: Id.optional(),
    loadId: Id.optional(),
    tags: z.string().max(1000).optional().openapi({ description: 'Comma-separated' }),
    notes: text(5000).optional(),
    ...SampleReadFields,
  })
  .strict();

export const ImportBody = {
  description:
    'A CSV file (field `file`) and the new trace\'s fields. Send the fields before the file: the file is read as it arrives. ' +
    'Errors name the line of the file.',
  contentTypes: {
    'multipart/form-data': { schema: ImportFields.extend({ file: z.string().openapi({ format: 'binary', description: 'The CSV file' }) }) },
  },
};

export const ImportResult = z.object({ trace: Trace, import: AppendResult }).openapi('ImportResult');

const Window = {
  from: Instant.optional().openapi({ description: 'Start of the window (inclusive); default the first sample' }),
  to: Instant.optional().openapi({ description: 'End of the window (inclusive); default the last sample' }),
};

export const StatsQuery = z.object({
  ...Window,
  percentiles: flag.optional().openapi({ description: 'Exact p50/p95/p99 from the window\'s samples (slower on long windows)' }),
  onThresholdA: queryNumber(z.number().nonnegative()).optional().openapi({ description: 'Current above which the load counts as on, for the duty cycle (reads the samples)' }),
  powerFactor: queryNumber(z.number().gt(0).max(1)).optional().openapi({ description: 'For the energy figure; default 1' }),
});

export const StatsResponse = z
  .object({
    traceId: Id,
    fromTime: z.number().nullable(),
    toTime: z.number().nullable(),
    source: z.enum(['summaries', 'samples', 'analysis']).openapi({ description: 'Chunk summaries (fast, no percentiles), the samples, or the analysis stored at close' }),
    statistics: z.union([Statistics, z.null()]).openapi({ description: 'Null when the window holds no sample' }),
  })
  .openapi('TraceStats');

export const SeriesQuery = z.object({
  ...Window,
  points: queryNumber(z.number().int().min(1).max(20000)).default(1000).openapi({ description: 'Most buckets returned' }),
});

const bucketValues = z.array(z.number().nullable());
export const SeriesResponse = z
  .object({
    traceId: Id,
    fromTime: z.number().nullable(),
    toTime: z.number().nullable(),
    points: z.number().int(),
    level: z.enum(['samples', 'blocks', 'chunks']).openapi({ description: 'What the buckets were built from' }),
    sampleCount: z.number().int(),
    t: z.array(z.number()).openapi({ description: "Middle of each bucket (halfway between its first and last sample; a gap's middle for an empty bucket), epoch ms" }),
    count: z
      .array(z.number().int())
      .openapi({ description: "Samples per bucket; 0 for the empty bucket spanning a gap. Buckets hold consecutive samples, so the running total of `count` gives each bucket's first and last sample in the window" }),
    min: bucketValues.openapi({ description: 'Amperes; null in a gap' }),
    max: bucketValues,
    mean: bucketValues,
    rms: z
      .object({ min: bucketValues, max: bucketValues, mean: bucketValues, source: z.enum(['analysis', 'computed']) })
      .nullable()
      .openapi({ description: 'Waveform traces: the half-cycle RMS series per bucket (null for rms traces or long windows of open traces)' }),
  })
  .openapi('TraceSeries');

/** Event parameters as query parameters: the same fields as POST /analyze's `params.events`, read as numbers. */
const numericQuery = (schema: z.ZodType<number | null | undefined>) => z.preprocess((v) => (v === undefined ? v : Number(v)), schema);
export const EventsQuery = z.object({
  ...(Object.fromEntries(Object.entries(EventParamsInput.shape).map(([k, schema]) => [k, numericQuery(schema as z.ZodType<number | null | undefined>)])) as unknown as Record<
    keyof typeof EventParamsInput.shape,
    z.ZodType<number | undefined>
  >),
  mainsFrequencyHz: queryNumber(z.number().min(40).max(70)).optional(),
});

export const EventsResponse = z
  .object({
    traceId: Id,
    source: z.enum(['stored', 'computed']).openapi({ description: 'Stored at close, or computed for this request (open trace or parameters given)' }),
    inrushEvents: z.array(InrushEvent).openapi({ description: 'Start-ups (times epoch ms)' }),
    surges: z.array(Surge),
    onPeriodCount: z.number().int(),
    params: z.record(z.string(), z.unknown()).nullable(),
  })
  .openapi('TraceEvents');

export const ExportQuery = z.object({
  ...Window,
  format: z.enum(['csv', 'json']).default('csv'),
  values: z.enum(['raw', 'amps']).default('raw').openapi({ description: '`raw`: readings as sent (float32, the probe\'s unit); `amps`: converted through the probe' }),
});

export const CloseResponse = z
  .object({ trace: Trace, analysis: AnalyzeResponse.openapi({ description: 'As POST /analyze answers: statistics, inrush events, surges, parameters' }) })
  .openapi('TraceClosed');
