/**
 * Reading the time column of a CSV file into epoch milliseconds, for `headroom push`.
 * Loggers write times in many layouts; these are the ones we read, chosen with `--time-format`:
 * - `iso`: ISO 8601 (`2024-03-01T08:15:00.250Z`, or a space instead of `T`; no zone means `--utc-offset`);
 * - `epoch-ms`, `epoch-s`: Unix time in milliseconds or seconds (decimals allowed);
 * - `seconds`: seconds from the trace's start (the trace's start time, or `--start`);
 * - `d/m/y`, `m/d/y`: day-first or month-first dates (`/`, `.` or `-` between parts) with an optional
 *   `hh:mm[:ss[.fff]]` time after a space, in the zone given by `--utc-offset`.
 */
export const TIME_FORMATS = ['iso', 'epoch-ms', 'epoch-s', 'seconds', 'd/m/y', 'm/d/y'] as const;
export type TimeFormat = (typeof TIME_FORMATS)[number];

const ISO = /^(\d{4})-(\d{2})-(\d{2})(?:[T ](\d{2}):(\d{2})(?::(\d{2})(?:[.,](\d{1,9}))?)?)?\s*(Z|[+-]\d{2}:?\d{2})?$/i;
const DMY = /^(\d{1,2})[/.-](\d{1,2})[/.-](\d{4})(?:[ T]+(\d{1,2}):(\d{2})(?::(\d{2})(?:[.,](\d{1,9}))?)?)?$/;
const NUMBER = /^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/;

/** `+01:00`, `-0530`, `Z` or `0` -> minutes east of UTC; RangeError when unreadable. */
export function parseUtcOffset(text: string): number {
  const t = text.trim();
  if (t === 'Z' || t === 'z' || t === '0') return 0;
  const match = /^([+-])(\d{2}):?(\d{2})$/.exec(t);
  if (!match) throw new RangeError(`"${text}" is not a UTC offset (write it like +01:00 or -05:00)`);
  const minutes = Number(match[2]) * 60 + Number(match[3]);
  if (minutes > 14 * 60) throw new RangeError(`"${text}" is beyond ±14:00`);
  return match[1] === '-' ? -minutes : minutes;
}

/** Epoch ms of a calendar date and wall-clock time at a UTC offset; undefined when the date does not exist. */
function wallClockToEpochMs(year: number, month: number, day: number, hour: number, minute: number, second: number, fraction: string | undefined, offsetMin: number): number | undefined {
  if (month < 1 || month > 12 || day < 1 || hour > 23 || minute > 59 || second > 60) return undefined;
  const ms = Date.UTC(year, month - 1, day, hour, minute, second) + (fraction ? Number(`0.${fraction}`) * 1000 : 0);
  // Date.UTC rolls 31 April over to 1 May; refuse instead.
  if (new Date(ms).getUTCDate() !== day) return undefined;
  return ms - offsetMin * 60_000;
}

/**
 * One time cell -> epoch ms (or seconds from the start for `seconds`); undefined when the cell does not
 * match the format.
 */
export function parseTime(text: string, format: TimeFormat, utcOffsetMin = 0): number | undefined {
  const t = text.trim();
  if (format === 'epoch-ms' || format === 'epoch-s' || format === 'seconds') {
    if (!NUMBER.test(t)) return undefined;
    const value = Number(t);
    return format === 'epoch-s' ? value * 1000 : value;
  }
  if (format === 'iso') {
    const m = ISO.exec(t);
    if (!m) return undefined;
    const zone = m[8];
    const offset = zone === undefined ? utcOffsetMin : parseUtcOffset(zone.length === 5 ? `${zone.slice(0, 3)}:${zone.slice(3)}` : zone);
    return wallClockToEpochMs(Number(m[1]), Number(m[2]), Number(m[3]), Number(m[4] ?? 0), Number(m[5] ?? 0), Number(m[6] ?? 0), m[7], offset);
  }
  const m = DMY.exec(t);
  if (!m) return undefined;
  const [first, second] = [Number(m[1]), Number(m[2])];
  const [day, month] = format === 'd/m/y' ? [first, second] : [second, first];
  return wallClockToEpochMs(Number(m[3]), month, day, Number(m[4] ?? 0), Number(m[5] ?? 0), Number(m[6] ?? 0), m[7], utcOffsetMin);
}

/**
 * Guesses the format from the first time cells: ISO, Unix time by magnitude (ms after 1973 is above
 * 1e11; seconds are above 1e8), small numbers as seconds from the start, and d/m/y when a first part is
 * above 12 (m/d/y when a second part is). Undefined when the cells leave it open (say, only 1/2/2024):
 * the caller then asks for `--time-format`.
 */
export function detectTimeFormat(cells: string[]): TimeFormat | undefined {
  const sample = cells.map((c) => c.trim()).filter((c) => c !== '');
  if (sample.length === 0) return undefined;
  if (sample.every((c) => ISO.test(c))) return 'iso';
  if (sample.every((c) => NUMBER.test(c))) {
    const first = Math.abs(Number(sample[0]));
    if (first > 1e11) return 'epoch-ms';
    if (first > 1e8) return 'epoch-s';
    return 'seconds';
  }
  const parts = sample.map((c) => DMY.exec(c));
  if (parts.some((p) => p === null)) return undefined;
  if (parts.some((p) => Number(p?.[1]) > 12)) return 'd/m/y';
  if (parts.some((p) => Number(p?.[2]) > 12)) return 'm/d/y';
  return undefined;
}
