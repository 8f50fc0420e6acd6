import { open, stat } from 'node:fs/promises';
import path from 'node:path';
import cliProgress from 'cli-progress';
import { HeadroomConflictError } from '../errors.js';
import type { Headroom } from '../headroom.js';
import type { Trace, TraceCreate } from '../resources/traces.js';
import { planCsv, readCsvBatches, type CsvOptions, type CsvTotals } from './csv-source.js';
import { UsageError, type CliIo } from './output.js';
import { parseTime, parseUtcOffset } from './time-format.js';

/** `headroom push` options as commander hands them over. */
export interface PushOptions {
  trace?: string;
  new?: boolean;
  name?: string;
  kind: 'rms' | 'waveform';
  rate?: number;
  start?: string;
  site?: string;
  circuit?: string;
  load?: string;
  voltage?: number;
  mains?: number;
  unit?: 'A' | 'mA' | 'mV';
  sensitivity?: number;
  loops?: number;
  timeColumn?: string;
  currentColumn?: string;
  delimiter?: string;
  timeFormat?: CsvOptions['timeFormat'];
  utcOffset?: string;
  decimalComma?: boolean;
  missing?: string;
  batch?: number;
  close?: boolean;
  progress: boolean;
}

export interface PushResult {
  traceId: string;
  created: boolean;
  /** Samples sent by this run. */
  sent: number;
  batches: number;
  /** Samples of the file skipped because the trace already held them (a resumed push). */
  alreadyStored: number;
  /** CSV rows skipped as missing readings. */
  missing: number;
  sampleCount: number;
  firstSampleTime: number | null;
  lastSampleTime: number | null;
  status: string;
}

interface PushContext {
  io: CliIo;
  json: boolean;
  signal: AbortSignal;
}

type FileKind = { kind: 'csv' } | { kind: 'binary'; valueType: 'float32' | 'float64'; bytesPerValue: 4 | 8 };

function fileKindOf(file: string): FileKind {
  const ext = path.extname(file).toLowerCase();
  if (ext === '.f32') return { kind: 'binary', valueType: 'float32', bytesPerValue: 4 };
  if (ext === '.f64') return { kind: 'binary', valueType: 'float64', bytesPerValue: 8 };
  return { kind: 'csv' };
}

/** Epoch ms of a `--start`-style value (ISO 8601 with a zone, or epoch ms). */
function instantMs(text: string, option: string): number {
  const ms = /^\d+(\.\d+)?$/.test(text.trim()) ? Number(text) : parseTime(text, 'iso');
  if (ms === undefined) throw new UsageError(`${option} "${text}" is neither ISO 8601 nor epoch milliseconds`);
  return ms;
}

async function targetTrace(headroom: Headroom, file: string, fileKind: FileKind, options: PushOptions, context: PushContext): Promise<{ trace: Trace; created: boolean }> {
  if (options.trace && options.new) throw new UsageError('give either --trace ID (append, resuming) or --new (create), not both');
  if (options.trace) return { trace: await headroom.traces.get(options.trace, { signal: context.signal }), created: false };
  if (!options.new) throw new UsageError('say where the samples go: --trace ID, or --new --name NAME');
  if (!options.name) throw new UsageError('--new needs --name');
  if (fileKind.kind === 'binary' && !options.rate) throw new UsageError(`${path.basename(file)} holds bare values: give --rate (Hz)`);
  const input: TraceCreate = {
    name: options.name,
    kind: options.kind,
    ...(options.rate ? { sampleRateHz: options.rate } : {}),
    ...(options.start ? { startTime: instantMs(options.start, '--start') } : {}),
    ...(options.site ? { siteId: options.site } : {}),
    ...(options.circuit ? { circuitId: options.circuit } : {}),
    ...(options.load ? { loadId: options.load } : {}),
    ...(options.voltage ? { nominalVoltageV: options.voltage } : {}),
    ...(options.mains ? { mainsHz: options.mains } : {}),
    ...(options.unit || options.sensitivity || options.loops ? { probe: { inputUnit: options.unit ?? 'A', sensitivityPerA: options.sensitivity ?? 1, loops: options.loops ?? 1 } } : {}),
  };
  const trace = await headroom.traces.create(input, { signal: context.signal });
  context.io.stderr.write(`created trace ${trace.id}; if the push is interrupted, resume with: headroom push ${file} --trace ${trace.id}\n`);
  return { trace, created: true };
}

function progressBar(context: PushContext, options: PushOptions, totalBytes: number) {
  if (!options.progress || context.json || !context.io.stderr.isTTY) return undefined;
  const bar = new cliProgress.SingleBar(
    { stream: context.io.stderr as NodeJS.WritableStream, format: 'push |{bar}| {percentage}% | {mb} of {totalMb} MB | {samples} samples | ETA {eta_formatted}', hideCursor: true, clearOnComplete: false },
    cliProgress.Presets.shades_classic,
  );
  const mb = (bytes: number) => (bytes / 1e6).toFixed(1);
  bar.start(totalBytes, 0, { mb: mb(0), totalMb: mb(totalBytes), samples: '0' });
  return {
    update(bytes: number, samples: number) {
      bar.update(bytes, { mb: mb(bytes), samples: samples.toLocaleString('en-US') });
    },
    stop: () => bar.stop(),
  };
}

/**
 * After a 409, asks the trace where it ends now. When it has grown past what this run knew (a batch of
 * an interrupted run that the server finished after the resume looked), that is the new end to
 * continue after; otherwise the conflict is real (a closed trace) and is thrown on.
 */
async function storedEndAfterConflict(headroom: Headroom, traceId: string, error: unknown, known: { count: number; lastTime: number }): Promise<{ count: number; lastTime: number }> {
  if (!(error instanceof HeadroomConflictError)) throw error;
  const trace = await headroom.traces.get(traceId);
  if (trace.status !== 'open' || trace.sampleCount <= known.count || trace.lastSampleTime === null || trace.lastSampleTime <= known.lastTime) throw error;
  return { count: trace.sampleCount, lastTime: trace.lastSampleTime };
}

/**
 * Pushes a file into a trace in batches. Resuming: the trace says how many samples it holds and when
 * the last one is; a CSV push skips rows up to that time, a binary push skips that many values (the
 * file must be the same recording from its first value).
 */
export async function pushFile(headroom: Headroom, file: string, options: PushOptions, context: PushContext): Promise<PushResult> {
  const fileKind = fileKindOf(file);
  const size = (await stat(file).catch(() => undefined))?.size;
  if (size === undefined) throw new UsageError(`cannot read ${file}`);
  const { trace, created } = await targetTrace(headroom, file, fileKind, options, context);
  if (trace.status === 'closed') throw new UsageError(`trace ${trace.id} is closed and takes no more samples; push to a new trace with --new`);
  const stored = { count: trace.sampleCount, lastTime: trace.lastSampleTime };
  if (!created && stored.count > 0) context.io.stderr.write(`trace ${trace.id} holds ${stored.count.toLocaleString('en-US')} samples up to ${new Date(stored.lastTime ?? 0).toISOString()}; continuing after them\n`);

  const result: PushResult = { traceId: trace.id, created, sent: 0, batches: 0, alreadyStored: 0, missing: 0, sampleCount: stored.count, firstSampleTime: trace.firstSampleTime, lastSampleTime: trace.lastSampleTime, status: trace.status };
  const bar = progressBar(context, options, size);
  const note = (answer: { sampleCount: number; firstSampleTime: number | null; lastSampleTime: number | null }, count: number) => {
    result.sent += count;
    result.batches += 1;
    Object.assign(result, { sampleCount: answer.sampleCount, firstSampleTime: answer.firstSampleTime, lastSampleTime: answer.lastSampleTime });
  };
  try {
    if (fileKind.kind === 'csv') {
      const csvOptions: CsvOptions = {
        ...(options.delimiter ? { delimiter: options.delimiter === '\\t' ? '\t' : options.delimiter } : {}),
        ...(options.timeColumn ? { timeColumns: options.timeColumn.split(',').map((s) => s.trim()) } : {}),
        ...(options.currentColumn ? { currentColumn: options.currentColumn } : {}),
        ...(options.timeFormat ? { timeFormat: options.timeFormat } : {}),
        ...(options.utcOffset ? { utcOffsetMin: parseUtcOffset(options.utcOffset) } : {}),
        ...(options.decimalComma ? { decimalComma: true } : {}),
        ...(options.missing !== undefined ? { missing: ['', ...options.missing.split(',')] } : {}),
        ...(options.start ? { startMs: instantMs(options.start, '--start') } : trace.startTime !== null ? { startMs: trace.startTime } : {}),
        ...(stored.count > 0 && stored.lastTime !== null ? { afterMs: stored.lastTime } : {}),
        batchSize: options.batch ?? 50_000,
      };
      const plan = await planCsv(file, csvOptions);
      const totals: CsvTotals = { readings: 0, missing: 0, alreadyStored: 0 };
      let storedUntil = csvOptions.afterMs ?? -Infinity;
      for await (const batch of readCsvBatches(file, plan, csvOptions, totals)) {
        let { t, a } = batch;
        for (;;) {
          // Rows the trace already holds (stored by an interrupted run that the server finished late).
          const keepFrom = t.findIndex((time) => time > storedUntil);
          const skip = keepFrom < 0 ? t.length : keepFrom;
          if (skip > 0) {
            totals.alreadyStored += skip;
            totals.readings -= skip;
            t = t.slice(skip);
            a = a.slice(skip);
          }
          if (t.length === 0) break;
          try {
            note(await headroom.traces.append(trace.id, { t, a }, { batchSize: t.length, signal: context.signal }), t.length);
            break;
          } catch (error) {
            const end = await storedEndAfterConflict(headroom, trace.id, error, { count: result.sampleCount, lastTime: storedUntil });
            storedUntil = end.lastTime;
            result.sampleCount = end.count;
          }
        }
        bar?.update(batch.bytesRead, result.sent);
      }
      result.alreadyStored = totals.alreadyStored;
      result.missing = totals.missing;
    } else {
      const rate = options.rate ?? trace.sampleRateHz ?? undefined;
      if (!rate) throw new UsageError(`trace ${trace.id} has no sample rate: give --rate (Hz)`);
      const batchValues = options.batch ?? 262_144;
      const handle = await open(file, 'r');
      try {
        let offset = stored.count * fileKind.bytesPerValue;
        result.alreadyStored = Math.min(stored.count, Math.floor(size / fileKind.bytesPerValue));
        const buffer = Buffer.alloc(batchValues * fileKind.bytesPerValue);
        let first = stored.count === 0;
        while (offset < size) {
          const { bytesRead } = await handle.read(buffer, 0, buffer.length, offset);
          if (bytesRead === 0) break;
          if (bytesRead % fileKind.bytesPerValue !== 0) throw new UsageError(`${file} ends in a partial ${fileKind.valueType} value (${size} bytes is not a multiple of ${fileKind.bytesPerValue})`);
          const bytes = new Uint8Array(buffer.buffer, buffer.byteOffset, bytesRead).slice();
          const values = fileKind.valueType === 'float32' ? new Float32Array(bytes.buffer) : new Float64Array(bytes.buffer);
          const start = first && options.start ? { start: instantMs(options.start, '--start') } : {};
          try {
            note(await headroom.traces.append(trace.id, { values, rate, ...start }, { batchSize: values.length, valueType: fileKind.valueType, signal: context.signal }), values.length);
            offset += bytesRead;
          } catch (error) {
            // The trace grew behind our back (an interrupted run finished late): continue after its end.
            const end = await storedEndAfterConflict(headroom, trace.id, error, { count: result.sampleCount, lastTime: result.lastSampleTime ?? -Infinity });
            result.alreadyStored += end.count - result.sampleCount;
            result.sampleCount = end.count;
            offset = end.count * fileKind.bytesPerValue;
          }
          first = false;
          bar?.update(offset, result.sent);
        }
      } finally {
        await handle.close();
      }
    }
    if (options.close) {
      const closed = await headroom.traces.close(trace.id, { signal: context.signal });
      result.status = closed.trace.status;
    }
  } catch (error) {
    bar?.stop();
    if (context.signal.aborted) {
      context.io.stderr.write(`\ninterrupted after ${result.sent.toLocaleString('en-US')} samples; resume with: headroom push ${file} --trace ${trace.id}\n`);
    } else if (result.sent > 0 || created) {
      context.io.stderr.write(`stopped after ${result.sent.toLocaleString('en-US')} samples; after fixing the cause, resume with: headroom push ${file} --trace ${trace.id}\n`);
    }
    throw error;
  }
  bar?.stop();
  return result;
}
