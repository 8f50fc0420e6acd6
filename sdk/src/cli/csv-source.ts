import { createReadStream } from 'node:fs';
import { open } from 'node:fs/promises';
import { parse } from 'csv-parse';
import { detectTimeFormat, parseTime, type TimeFormat } from './time-format.js';

/** A problem in the input file, with the 1-based line it is on (exit code 2: the file, not the API). */
export class InputFileError extends Error {
  constructor(
    message: string,
    readonly line?: number,
  ) {
    super(line === undefined ? message : `line ${line}: ${message}`);
    this.name = 'InputFileError';
  }
}

/** How to read a CSV export; every field has a default found from the header and first rows. */
export interface CsvOptions {
  /** Field separator; found from the header line (`,`, `;` or tab) when omitted. */
  delimiter?: string;
  /** Header names of the time column, or of a date and a time column to join with a space. */
  timeColumns?: string[];
  /** Header name of the current column (amps, or the probe's raw unit). */
  currentColumn?: string;
  timeFormat?: TimeFormat;
  /** Minutes east of UTC for times written without a zone. Default 0 (UTC). */
  utcOffsetMin?: number;
  /** Values written with a decimal comma (`12,5`). */
  decimalComma?: boolean;
  /** Current cells that mean "no reading": those rows are skipped and counted. Default: empty cells. */
  missing?: string[];
  /** Epoch ms that `seconds` times count from. */
  startMs?: number;
  /** Rows at or before this epoch ms are skipped (resuming an interrupted push). */
  afterMs?: number;
  /** Samples per batch. Default 50,000. */
  batchSize?: number;
}

/** The resolved reading plan, reported before the first batch. */
export interface CsvPlan {
  delimiter: string;
  timeColumns: string[];
  currentColumn: string;
  timeFormat: TimeFormat;
}

/** A run of consecutive readings, times in epoch ms, strictly increasing. */
export interface CsvBatch {
  t: number[];
  a: number[];
  firstLine: number;
  lastLine: number;
  /** Bytes of the file read so far (for a progress bar). */
  bytesRead: number;
}

export interface CsvTotals {
  readings: number;
  missing: number;
  /** Rows skipped because they were already stored (at or before `afterMs`). */
  alreadyStored: number;
}

const DELIMITERS = [',', ';', '\t'];
const TIME_HEADER = /^(date[ _-]?time|time[ _-]?stamp|timestamp|time|t|datetime|zeit|heure)$/i;
const DATE_HEADER = /^(date|datum)$/i;
const CURRENT_HEADER = /(current|intensity|amps?|ampere|^i$|^a$|\(a\)|\[a\])/i;

/** The header line and up to 20 data lines, for detection. */
async function readHead(path: string): Promise<string[]> {
  const handle = await open(path, 'r');
  try {
    const buffer = Buffer.alloc(64 * 1024);
    const { bytesRead } = await handle.read(buffer, 0, buffer.length, 0);
    const text = buffer.subarray(0, bytesRead).toString('utf8').replace(/^\uFEFF/, '');
    const lines = text.split(/\r?\n/);
    if (bytesRead === buffer.length) lines.pop(); // the last line may be cut
    return lines.filter((l) => l.trim() !== '').slice(0, 21);
  } finally {
    await handle.close();
  }
}

function splitSimple(line: string, delimiter: string): string[] {
  return line.split(delimiter).map((cell) => cell.trim().replace(/^"(.*)"$/, '$1'));
}

/** Works out the delimiter, columns and time format from the header and first rows. */
export async function planCsv(path: string, options: CsvOptions = {}): Promise<CsvPlan> {
  const head = await readHead(path);
  const headerLine = head[0];
  if (headerLine === undefined) throw new InputFileError('the file is empty');
  const delimiter = options.delimiter ?? DELIMITERS.map((d) => ({ d, n: headerLine.split(d).length })).sort((x, y) => y.n - x.n)[0]?.d ?? ',';
  const header = splitSimple(headerLine, delimiter);
  const has = (name: string) => header.includes(name);
  const missingColumn = (name: string) => new InputFileError(`no column "${name}" in the header (columns: ${header.join(', ')})`, 1);

  let timeColumns = options.timeColumns;
  if (!timeColumns) {
    const time = header.find((h) => TIME_HEADER.test(h));
    const date = header.find((h) => DATE_HEADER.test(h));
    if (date && time) timeColumns = [date, time];
    else if (time ?? date) timeColumns = [(time ?? date) as string];
    else throw new InputFileError(`no time column found (columns: ${header.join(', ')}); name it with --time-column`, 1);
  }
  for (const name of timeColumns) if (!has(name)) throw missingColumn(name);

  const currentColumn = options.currentColumn ?? header.find((h) => CURRENT_HEADER.test(h) && !timeColumns.includes(h));
  if (!currentColumn) throw new InputFileError(`no current column found (columns: ${header.join(', ')}); name it with --current-column`, 1);
  if (!has(currentColumn)) throw missingColumn(currentColumn);

  let timeFormat = options.timeFormat;
  if (!timeFormat) {
    const indices = timeColumns.map((name) => header.indexOf(name));
    const cells = head.slice(1).map((line) => {
      const row = splitSimple(line, delimiter);
      return indices.map((i) => row[i] ?? '').join(' ');
    });
    timeFormat = detectTimeFormat(cells);
    if (!timeFormat) throw new InputFileError(`the time format of "${cells[0] ?? ''}" is ambiguous; give --time-format (iso, epoch-ms, epoch-s, seconds, d/m/y, m/d/y)`, 2);
  }
  return { delimiter, timeColumns, currentColumn, timeFormat };
}

/**
 * Streams a CSV export as batches of (time, current) readings: the file is never held in memory.
 * Rows whose current is a `missing` token are skipped and counted; any other unreadable cell, or a time
 * that does not increase, stops the read with the line number.
 */
export async function* readCsvBatches(path: string, plan: CsvPlan, options: CsvOptions = {}, totals: CsvTotals = { readings: 0, missing: 0, alreadyStored: 0 }): AsyncGenerator<CsvBatch> {
  const batchSize = options.batchSize ?? 50_000;
  const missing = new Set(options.missing ?? ['']);
  const file = createReadStream(path);
  const parser = file.pipe(parse({ delimiter: plan.delimiter, bom: true, from_line: 1, relax_column_count: true, relax_quotes: true, skip_empty_lines: true, trim: true, info: true }));
  let timeIndices: number[] = [];
  let currentIndex = -1;
  let batch: CsvBatch = { t: [], a: [], firstLine: 0, lastLine: 0, bytesRead: 0 };
  let previousMs = -Infinity;
  try {
    for await (const { record, info } of parser as AsyncIterable<{ record: string[]; info: { lines: number } }>) {
      const line = info.lines;
      if (currentIndex < 0) {
        timeIndices = plan.timeColumns.map((name) => record.indexOf(name));
        currentIndex = record.indexOf(plan.currentColumn);
        continue;
      }
      const currentCell = record[currentIndex] ?? '';
      if (missing.has(currentCell)) {
        totals.missing += 1;
        continue;
      }
      const current = Number(options.decimalComma ? currentCell.replace(',', '.') : currentCell);
      if (currentCell === '' || !Number.isFinite(current)) throw new InputFileError(`current "${currentCell}" in column "${plan.currentColumn}" is not a number (use --missing to skip such rows)`, line);
      const timeCell = timeIndices.map((i) => record[i] ?? '').join(' ');
      const parsed = parseTime(timeCell, plan.timeFormat, options.utcOffsetMin ?? 0);
      if (parsed === undefined) throw new InputFileError(`time "${timeCell}" is not in the ${plan.timeFormat} format`, line);
      let timeMs = parsed;
      if (plan.timeFormat === 'seconds') {
        if (options.startMs === undefined) throw new InputFileError('times are seconds from the start: give --start (or push to a trace that has a start time)', line);
        timeMs = options.startMs + parsed * 1000;
      }
      if (!(timeMs > previousMs)) throw new InputFileError(`time "${timeCell}" does not come after the row before`, line);
      previousMs = timeMs;
      if (options.afterMs !== undefined && timeMs <= options.afterMs) {
        totals.alreadyStored += 1;
        continue;
      }
      if (batch.t.length === 0) batch.firstLine = line;
      batch.t.push(timeMs);
      batch.a.push(current);
      batch.lastLine = line;
      totals.readings += 1;
      if (batch.t.length >= batchSize) {
        batch.bytesRead = file.bytesRead;
        yield batch;
        batch = { t: [], a: [], firstLine: 0, lastLine: 0, bytesRead: 0 };
      }
    }
  } catch (error) {
    if (error instanceof InputFileError) throw error;
    const e = error as Error & { lines?: number };
    throw new InputFileError(`the CSV could not be read: ${e.message}`, e.lines);
  } finally {
    file.destroy();
  }
  if (batch.t.length > 0) {
    batch.bytesRead = file.bytesRead;
    yield batch;
  }
}
