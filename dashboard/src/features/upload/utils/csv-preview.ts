/**
 * Reading the start of a CSV export in the browser, to show it and to propose a column mapping before
 * the upload. Only guesses: the user confirms, and the server parses the whole file with the mapping.
 */

export type TimeFormat = 'iso' | 'epoch-ms' | 'epoch-s' | 'seconds';
export type CurrentUnit = 'A' | 'mA' | 'mV';

export interface CsvPreview {
  /** Column names (from the header row, or "Column 1"…). */
  columns: string[];
  hasHeader: boolean;
  /** The first data rows, as text. */
  rows: string[][];
  delimiter: string;
  decimalComma: boolean;
}

export interface MappingGuess {
  timeColumn: number | null;
  currentColumn: number | null;
  timeFormat: TimeFormat;
  unit: CurrentUnit;
}

const NUMBER = /^[+-]?(\d+([.,]\d*)?|[.,]\d+)([eE][+-]?\d+)?$/;

export function looksNumeric(cell: string): boolean {
  return NUMBER.test(cell.trim());
}

/** A date or clock time such as 2026-03-01T10:00:00Z or 2026-03-01 10:00:00.250. */
export function looksLikeIsoTime(cell: string): boolean {
  const s = cell.trim();
  return /^\d{4}-\d{2}-\d{2}[T ]\d{1,2}:\d{2}(:\d{2}([.,]\d+)?)?(Z|[+-]\d{2}:?\d{2})?$/.test(s);
}

/** Numbers with a decimal comma (1,25) are common in European exports, with ";" between fields. */
export function parseDecimal(cell: string, decimalComma: boolean): number {
  const s = cell.trim();
  return Number(decimalComma ? s.replace(',', '.') : s);
}

/** Builds the preview from parsed rows (the first few lines of the file). */
export function buildPreview(rawRows: string[][], delimiter: string, maxRows = 12): CsvPreview {
  const rows = rawRows.filter((r) => r.some((c) => c.trim() !== ''));
  const first = rows[0] ?? [];
  const hasHeader = first.length > 0 && first.some((c) => c.trim() !== '' && !looksNumeric(c) && !looksLikeIsoTime(c));
  const width = Math.max(0, ...rows.map((r) => r.length));
  const columns = hasHeader
    ? Array.from({ length: width }, (_, i) => first[i]?.trim() || `Column ${i + 1}`)
    : Array.from({ length: width }, (_, i) => `Column ${i + 1}`);
  const data = (hasHeader ? rows.slice(1) : rows).slice(0, maxRows);
  const cells = data.flat().filter(looksNumeric);
  const decimalComma =
    delimiter !== ',' &&
    cells.length > 0 &&
    cells.some((c) => /^\s*[+-]?\d*,\d+\s*$/.test(c)) &&
    !cells.some((c) => c.includes('.'));
  return { columns, hasHeader, rows: data, delimiter, decimalComma };
}

const TIME_NAME = /(^|[^a-z])(time|date|timestamp|datetime|t|sec|seconds|s|elapsed)([^a-z]|$)/i;
const CURRENT_NAME = /(current|amps?|ampere|\bi\b|\(a\)|\[a\]|\bma\b|\bmv\b|\brms\b|clamp|ch\s*1)/i;

/** Proposes which column is time and which is current, the time format and the unit. */
export function guessMapping(preview: CsvPreview): MappingGuess {
  const { columns, rows } = preview;
  const values = (i: number) => rows.map((r) => r[i] ?? '').filter((c) => c.trim() !== '');
  const allIso = (i: number) => values(i).length > 0 && values(i).every(looksLikeIsoTime);
  // Mostly numbers: a bad cell in the preview should not hide the column (the server names its line).
  const allNum = (i: number) => {
    const v = values(i);
    return v.length > 0 && v.filter(looksNumeric).length > v.length / 2;
  };

  let timeColumn: number | null = columns.findIndex((_, i) => allIso(i));
  if (timeColumn < 0)
    timeColumn = columns.findIndex((name, i) => preview.hasHeader && TIME_NAME.test(name) && allNum(i));
  if (timeColumn < 0) {
    // No name to go by: with two numeric columns or more, the first that only increases is time.
    const numeric = columns.map((_, i) => i).filter(allNum);
    const increasing = (i: number) => {
      const v = values(i).map((c) => parseDecimal(c, preview.decimalComma));
      return v.length > 1 && v.every((x, k) => k === 0 || x > v[k - 1]!);
    };
    timeColumn = numeric.length >= 2 ? (numeric.find(increasing) ?? -1) : -1;
  }
  if (timeColumn < 0) timeColumn = null;

  let currentColumn: number | null = columns.findIndex(
    (name, i) => i !== timeColumn && preview.hasHeader && CURRENT_NAME.test(name) && allNum(i),
  );
  if (currentColumn < 0) currentColumn = columns.findIndex((_, i) => i !== timeColumn && allNum(i));
  if (currentColumn < 0) currentColumn = null;

  let timeFormat: TimeFormat = 'seconds';
  if (timeColumn !== null) {
    const sample = values(timeColumn);
    if (sample.every(looksLikeIsoTime)) timeFormat = 'iso';
    else {
      const first = parseDecimal(sample[0] ?? '0', preview.decimalComma);
      if (first > 1e11) timeFormat = 'epoch-ms';
      else if (first > 1e8) timeFormat = 'epoch-s';
    }
  }

  const currentName = currentColumn !== null ? (columns[currentColumn] ?? '') : '';
  const unit: CurrentUnit = /\bmv\b|\(mv\)|\[mv\]/i.test(currentName)
    ? 'mV'
    : /\bma\b|\(ma\)|\[ma\]/i.test(currentName)
      ? 'mA'
      : 'A';
  return { timeColumn, currentColumn, timeFormat, unit };
}
