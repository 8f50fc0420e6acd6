/**
 * `text/csv` sample bodies (and files uploaded to /traces/import), streamed line by line.
 *
 * The first line is a header. Which columns hold the time and the reading, the separator, the decimal
 * mark and the units come from options (query parameters or form fields) or are detected:
 * - separator: the most frequent of `,` `;` tab `|` in the header;
 * - columns: with two columns, time then reading; otherwise a column named like a time
 *   (time, timestamp, datetime…) or separate `Date` and `Time` columns, and a column named like a
 *   current (current, amps, a, value, reading…); anything else must be named (`timeColumn`,
 *   `dateColumn`, `valueColumn`: a header name or a 1-based position);
 * - decimal mark: `,` when the separator is not a comma and the first reading has a comma and no point;
 * - unit of the readings: `unit`, or a unit in the value column's header (`current (mA)`, `I_A`, `[mV]`),
 *   converted to the probe's input unit when they differ by a prefix (A and mA).
 * Rows whose reading is one of the `missing` markers (e.g. `?`) are skipped and counted. Without a
 * time column, readings are taken at `rate` from `start`. Errors name the line and column and stop
 * the upload; the first MAX_LISTED_ERRORS are listed.
 */
import { Problem, type ProblemFieldError } from '../errors/problem.js';
import { MAX_LISTED_ERRORS, badParameter, invalidSamples, malformedAt } from './body-errors.js';
import { parseDecimalText } from './decimal-text.js';
import { LineSplitter, splitBody } from './line-splitter.js';
import { growableFloat32, growableFloat64, readingProblem, type SampleSink, type UniformStart } from './sample-sink.js';
import { TimestampError, type TimestampReader } from './timestamps.js';

export const CSV_DELIMITERS = [',', ';', '\t', '|'] as const;
export type CsvDelimiter = (typeof CSV_DELIMITERS)[number];
export const READING_UNITS = ['A', 'mA', 'mV'] as const;
export type ReadingUnit = (typeof READING_UNITS)[number];

export interface CsvOptions {
  delimiter?: CsvDelimiter | undefined;
  decimal?: '.' | ',' | undefined;
  timeColumn?: string | undefined;
  dateColumn?: string | undefined;
  valueColumn?: string | undefined;
  /** Unit of the readings in the file; default: from the header, else the probe's. */
  unit?: ReadingUnit | undefined;
  /** The probe's input unit: readings are stored in it. */
  probeUnit: ReadingUnit;
  /** Reading markers that mean "no reading" (the row is skipped). */
  missing?: string[] | undefined;
  timestamps: TimestampReader;
  /** For files without a time column: readings at `rateHz` from `start`. */
  uniform?: { start: UniformStart | null; rateHz: number | null } | undefined;
}

export interface CsvResult {
  count: number;
  skipped: number;
  columns: { time: string | null; date: string | null; value: string };
  delimiter: CsvDelimiter;
  decimal: '.' | ',';
  unit: ReadingUnit;
}

const PUSH_SAMPLES = 1 << 16;
const TIME_NAMES = /^(time|timestamp|datetime|date_time|date-time|ts|t|epoch|time_ms|time_s|time \(.*\)|timestamp \(.*\))$/i;
const CURRENT_NAMES = /^(a|i|amps?|ampere|current|value|reading|irms|i_rms|rms|current_a|current \(.*\)|i \(.*\)|amps \(.*\)|reading_.*)$/i;

/** Parses a decimal reading (point or comma); NaN when it is not one (hex, words and blanks included). */
export function parseDecimal(text: string, decimalComma: boolean): number {
  return parseDecimalText((decimalComma ? text.replace(',', '.') : text).trim());
}

/** Unit named in a column header: `current (mA)`, `I_A`, `reading [mV]`, or null. */
export function unitInHeader(name: string): ReadingUnit | null {
  const m = /(?:[([]\s*(ma|mv|a)\s*[)\]]|[_ ](ma|mv|a))\s*$/i.exec(name.trim());
  const unit = (m?.[1] ?? m?.[2])?.toLowerCase();
  return unit === 'ma' ? 'mA' : unit === 'mv' ? 'mV' : unit === 'a' ? 'A' : null;
}

/** Factor from `unit` to the probe's unit; a 400 when they differ by more than a prefix. */
function unitFactor(unit: ReadingUnit, probeUnit: ReadingUnit, parameter: string): number {
  if (unit === probeUnit) return 1;
  if (unit === 'mA' && probeUnit === 'A') return 0.001;
  if (unit === 'A' && probeUnit === 'mA') return 1000;
  throw badParameter(parameter, `the readings are in ${unit} but the trace's probe reads ${probeUnit}; set the probe to match the file`);
}

/**
 * Field `index` of a line without quotes, or undefined when the line has fewer fields. Reading only the
 * fields needed, without splitting the whole line, keeps the per-row cost of large bodies low.
 */
function unquotedField(line: string, delimiter: string, index: number): string | undefined {
  let start = 0;
  for (let k = 0; k < index; k++) {
    const d = line.indexOf(delimiter, start);
    if (d < 0) return undefined;
    start = d + 1;
  }
  const end = line.indexOf(delimiter, start);
  return line.slice(start, end < 0 ? line.length : end);
}

/** Field `index` of a row: from its split fields when it had quotes, else read from the line. */
function fieldOf(line: string, quoted: string[] | null, delimiter: string, index: number): string | undefined {
  return quoted ? quoted[index] : unquotedField(line, delimiter, index);
}

/** All fields of a row (for error messages). */
function fieldsOf(line: string, quoted: string[] | null, delimiter: string): string[] {
  return quoted ?? splitCsvLine(line, delimiter) ?? [];
}

/** 1-based column where field `index` starts. */
function columnOf(fields: string[], index: number): number {
  return fields.slice(0, index).reduce((n, f) => n + f.length + 1, 1);
}

/** Splits one CSV line into fields (RFC 4180 quoting within a line). */
export function splitCsvLine(line: string, delimiter: string): string[] | null {
  if (!line.includes('"')) return line.split(delimiter);
  const fields: string[] = [];
  let i = 0;
  while (i <= line.length) {
    if (line[i] === '"') {
      let value = '';
      i++;
      while (true) {
        const q = line.indexOf('"', i);
        if (q < 0) return null;
        value += line.slice(i, q);
        if (line[q + 1] === '"') {
          value += '"';
          i = q + 2;
        } else {
          i = q + 1;
          break;
        }
      }
      fields.push(value);
      if (i < line.length && line[i] !== delimiter) return null;
      i++;
    } else {
      const d = line.indexOf(delimiter, i);
      const end = d < 0 ? line.length : d;
      fields.push(line.slice(i, end));
      i = end + 1;
    }
  }
  return fields;
}

function detectDelimiter(header: string): CsvDelimiter {
  let best: CsvDelimiter = ',';
  let bestCount = 0;
  for (const d of CSV_DELIMITERS) {
    const count = header.split(d).length - 1;
    if (count > bestCount) {
      best = d;
      bestCount = count;
    }
  }
  return best;
}

/** Index of a column named by header name (case-insensitive) or 1-based position; -1 when absent. */
function findColumn(header: string[], wanted: string): number {
  if (/^\d+$/.test(wanted)) {
    const k = Number(wanted) - 1;
    return k >= 0 && k < header.length ? k : -1;
  }
  const w = wanted.trim().toLowerCase();
  return header.findIndex((h) => h.trim().toLowerCase() === w);
}

interface Layout {
  time: number;
  date: number;
  value: number;
}

function chooseColumns(header: string[], options: CsvOptions): Layout {
  const named = (parameter: 'timeColumn' | 'dateColumn' | 'valueColumn'): number => {
    const wanted = options[parameter];
    if (wanted === undefined) return -2;
    const k = findColumn(header, wanted);
    if (k < 0) throw badParameter(parameter, `no column "${wanted}" in the header (${header.join(', ')})`);
    return k;
  };
  let time = named('timeColumn');
  let date = named('dateColumn');
  let value = named('valueColumn');
  const timeless = options.uniform !== undefined && options.timeColumn === undefined;
  if (time === -2 && !timeless) {
    const dateIndex = header.findIndex((h) => h.trim().toLowerCase() === 'date');
    const timeIndex = header.findIndex((h) => TIME_NAMES.test(h.trim()));
    if (timeIndex >= 0) {
      time = timeIndex;
      if (date === -2 && dateIndex >= 0 && header[timeIndex]?.trim().toLowerCase() === 'time') date = dateIndex;
    } else if (header.length === 2) time = 0;
  }
  if (value === -2) {
    const byName = header.findIndex((h, k) => k !== time && k !== date && (CURRENT_NAMES.test(h.trim()) || unitInHeader(h) !== null));
    if (byName >= 0) value = byName;
    else if (header.length === 2 && time === 0) value = 1;
    else if (header.length === 1 && timeless) value = 0;
  }
  if (value < 0) throw badParameter('valueColumn', `name the column that holds the readings (one of: ${header.join(', ')})`);
  if (time < 0 && !timeless) {
    throw badParameter('timeColumn', `name the column that holds the time (one of: ${header.join(', ')}), or send rate (and start) for readings without times`);
  }
  return { time: timeless ? -1 : time, date: date < 0 ? -1 : date, value };
}

export async function readCsvSamples(chunks: AsyncIterable<Buffer>, options: CsvOptions, sink: SampleSink): Promise<CsvResult> {
  const times = growableFloat64();
  const values = growableFloat32();
  const errors: ProblemFieldError[] = [];
  const missing = new Set((options.missing ?? []).map((m) => m.trim()));
  let header: string[] | null = null;
  let delimiter: CsvDelimiter = options.delimiter ?? ',';
  let decimalComma = options.decimal === ',';
  let decimalKnown = options.decimal !== undefined;
  let layout: Layout = { time: -1, date: -1, value: 0 };
  let unit: ReadingUnit = options.probeUnit;
  let factor = 1;
  let lastUs = Number.NEGATIVE_INFINITY;
  let lastLine = 0;
  let count = 0;
  let skipped = 0;
  let pushedUniform = 0;

  const addError = (error: ProblemFieldError) => {
    errors.push(error);
    if (errors.length >= MAX_LISTED_ERRORS) throw invalidSamples(errors, errors.length);
  };

  const splitter = new LineSplitter((text, line) => {
    if (header === null) {
      const raw = text.replace(/^\uFEFF/, '');
      if (raw.trim() === '') throw malformedAt('the first line must be a header naming the columns', line);
      delimiter = options.delimiter ?? detectDelimiter(raw);
      const fields = splitCsvLine(raw, delimiter);
      if (!fields) throw malformedAt('unbalanced quotes in the header', line);
      header = fields.map((f) => f.trim());
      layout = chooseColumns(header, options);
      const headerUnit = unitInHeader(header[layout.value] ?? '');
      unit = options.unit ?? headerUnit ?? options.probeUnit;
      factor = unitFactor(unit, options.probeUnit, options.unit ? 'unit' : 'valueColumn');
      return;
    }
    if (text.trim() === '') return;
    // Rows without quotes (nearly all) are read field by field; others are split whole.
    const quoted = text.includes('"') ? splitCsvLine(text, delimiter) : null;
    if (quoted === null && text.includes('"')) return addError({ detail: 'unbalanced quotes', line, column: 1 });
    // (No closures here: this runs once per row, and each closure made costs more than the row's work.)
    const needed = Math.max(layout.time, layout.date, layout.value);
    if (fieldOf(text, quoted, delimiter, needed) === undefined) {
      return addError({ detail: `expected at least ${needed + 1} fields separated by "${delimiter === '\t' ? 'tab' : delimiter}", found ${fieldsOf(text, quoted, delimiter).length}`, line, column: 1 });
    }
    const rawValue = (fieldOf(text, quoted, delimiter, layout.value) as string).trim();
    if (missing.size > 0 && missing.has(rawValue)) {
      skipped++;
      return;
    }
    if (!decimalKnown) {
      decimalComma = delimiter !== ',' && rawValue.includes(',') && !rawValue.includes('.');
      decimalKnown = true;
    }
    const reading = parseDecimal(rawValue, decimalComma);
    if (rawValue === '') return addError({ detail: `empty reading in column "${header[layout.value]}" (use missing= to skip such rows)`, line, column: columnOf(fieldsOf(text, quoted, delimiter), layout.value) });
    if (Number.isNaN(reading)) {
      const hint = /^(nan|inf|-inf|infinity|-infinity)$/i.test(rawValue) ? `${rawValue} is not a reading` : `"${rawValue}" is not a number${decimalComma ? ' (decimal comma)' : ''}`;
      return addError({ detail: hint, line, column: columnOf(fieldsOf(text, quoted, delimiter), layout.value) });
    }
    const problem = readingProblem(reading * factor);
    if (problem) return addError({ detail: `the reading is ${problem}`, line, column: columnOf(fieldsOf(text, quoted, delimiter), layout.value) });
    if (layout.time >= 0) {
      const timeText = layout.date >= 0 ? `${(fieldOf(text, quoted, delimiter, layout.date) as string).trim()} ${(fieldOf(text, quoted, delimiter, layout.time) as string).trim()}`
          : (fieldOf(text, quoted, delimiter, layout.time) as string);
      let us: number;
      try {
        us = options.timestamps.fromText(timeText);
      } catch (err) {
        if (err instanceof TimestampError) return addError({ detail: err.message, line, column: columnOf(fieldsOf(text, quoted, delimiter), layout.date >= 0 ? layout.date : layout.time) });
        throw err;
      }
      if (!(us > lastUs)) {
        return addError({ detail: `the time is not after the previous row's (line ${lastLine}); rows must be in time order without repeats`, line, column: columnOf(fieldsOf(text, quoted, delimiter), layout.time) });
      }
      lastUs = us;
      lastLine = line;
      if (errors.length === 0) times.push(us);
    }
    if (errors.length === 0) values.push(reading * factor);
  });

  const flush = async () => {
    if (errors.length > 0 || values.length === 0) return;
    if (layout.time >= 0) await sink.pushExplicit(values.view(), times.view());
    else {
      const uniform = options.uniform;
      if (!uniform?.rateHz) throw badParameter('rate', 'required for readings without a time column');
      if (!uniform.start) throw badParameter('start', 'required: the trace has no start time and no stored series to continue');
      await sink.pushUniform(values.view(), pushedUniform === 0 ? uniform.start : 'continue', uniform.rateHz);
      pushedUniform += values.length;
    }
    count += values.length;
    times.dropFirst(times.length);
    values.dropFirst(values.length);
  };

  await splitBody(chunks, splitter, async () => {
    if (values.length >= PUSH_SAMPLES) await flush();
  }, 'CSV');
  if (errors.length > 0) throw invalidSamples(errors);
  if (header === null) throw new Problem('validation', 'The CSV body is empty', { errors: [{ detail: 'a header and at least one row are needed', line: 1 }] });
  await flush();
  if (count === 0) throw invalidSamples([{ detail: skipped > 0 ? `all ${skipped} rows are missing readings` : 'the file has a header but no rows', line: 2 }]);
  const h: string[] = header;
  return {
    count,
    skipped,
    columns: { time: layout.time >= 0 ? (h[layout.time] as string) : null, date: layout.date >= 0 ? (h[layout.date] as string) : null, value: h[layout.value] as string },
    delimiter,
    decimal: decimalComma ? ',' : '.',
    unit,
  };
}
