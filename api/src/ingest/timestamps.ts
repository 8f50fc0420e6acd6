/**
 * Timestamps of posted samples, to integer microseconds since the Unix epoch (the storage unit: exact
 * for every time given in ms, µs or ISO 8601 with up to six decimals).
 *
 * Formats (`timeFormat` query parameter, or detected from the first timestamp of a batch):
 * - `epoch-ms`: milliseconds since 1970-01-01 UTC (numbers from 1e11 up: after March 1973);
 * - `epoch-s`: seconds since 1970-01-01 UTC (never detected in JSON; detected in CSV from 1e8 up);
 * - `seconds`: seconds from the trace's start time (smaller numbers);
 * - `iso`: ISO 8601 date-time, `2026-11-30T09:15:00.250Z`; without an offset it is read at `utcOffset`;
 * - `d/m/y`, `m/d/y`, `y/m/d`: date and time as loggers write them (`16/12/2006 17:24:00`, `12/16/2006 5:24:00`,
 *   `2006-12-16 17:24:00`), read at `utcOffset`.
 * Every timestamp of a batch must have the format of the first: a change is a "mixed formats" error.
 * Every time must be one storage holds exactly (MAX_ABS_TIME_US: 1684 to 2255).
 */

import { isStorableTimeUs, MAX_ABS_TIME_US, TIME_RANGE_TEXT } from '../storage/chunk-codec.js';
import { parseDecimalText } from './decimal-text.js';

export const TIME_FORMATS = ['epoch-ms', 'epoch-s', 'seconds', 'iso', 'd/m/y', 'm/d/y', 'y/m/d'] as const;
export type TimeFormat = (typeof TIME_FORMATS)[number];

/** Numbers at or above this are epoch milliseconds when the format is detected (1973-03-03). */
export const EPOCH_MS_FROM = 1e11;
/** In CSV, numbers at or above this (and below EPOCH_MS_FROM) are epoch seconds (1973-03-03). */
export const EPOCH_S_FROM = 1e8;

/** A timestamp that cannot be read; the parser adds where it was. */
export class TimestampError extends Error {
  /** Set by fromNumbers: the index of the value at fault. */
  index = 0;
}

/**
 * How a settled numeric format turns a number into µs, round(offsetUs + value × scale), for values in
 * [from, to); a value outside them is one fromNumber refuses (or reads as another format).
 */
interface LinearTime {
  scale: number;
  offsetUs: number;
  from: number;
  to: number;
}

export interface TimestampOptions {
  /** Fixed format, or undefined to detect it from the first timestamp. */
  format?: TimeFormat | undefined;
  /** The trace's start time (µs), needed by `seconds`. */
  traceStartUs: number | null;
  /** Offset from UTC (minutes) of date-times that carry none. Default 0 (UTC). */
  utcOffsetMinutes?: number;
  /** Whether plain numbers from 1e8 to 1e11 are epoch seconds when detecting (CSV) or seconds from the start (JSON). */
  detectEpochSeconds?: boolean;
}

const ISO_PATTERN = /^(\d{4})-(\d{2})-(\d{2})(?:[T ](\d{2}):(\d{2})(?::(\d{2})(?:[.,](\d{1,9}))?)?)?\s*(Z|[+-]\d{2}(?::?\d{2})?)?$/i;
const SLASHED_PATTERN = /^(\d{1,4})[/.-](\d{1,2})[/.-](\d{1,4})(?:[ T](\d{1,2}):(\d{2})(?::(\d{2})(?:[.,](\d{1,9}))?)?)?$/;

function describe(format: TimeFormat): string {
  switch (format) {
    case 'epoch-ms':
      return 'epoch milliseconds';
    case 'epoch-s':
      return 'epoch seconds';
    case 'seconds':
      return 'seconds from the trace start';
    case 'iso':
      return 'ISO 8601 date-times';
    default:
      return `${format} date-times`;
  }
}

/** Microseconds of a fraction of a second given as its decimal digits ("25" -> 250000). */
function fractionUs(digits: string | undefined): number {
  if (!digits) return 0;
  return Math.round(Number(`0.${digits}`) * 1e6);
}

function utcUs(year: number, month: number, day: number, hour: number, minute: number, second: number, fraction: string | undefined): number {
  if (month < 1 || month > 12) throw new TimestampError(`month ${month} does not exist`);
  const dayMs = Date.UTC(year, month - 1, day);
  const check = new Date(dayMs);
  if (check.getUTCDate() !== day || day < 1) throw new TimestampError(`day ${day} does not exist in month ${month} of ${year}`);
  if (hour > 23 || minute > 59 || second > 60) throw new TimestampError('the time of day is out of range');
  return (dayMs + ((hour * 60 + minute) * 60 + second) * 1000) * 1000 + fractionUs(fraction);
}

function zoneMinutes(zone: string): number {
  if (zone === 'Z' || zone === 'z') return 0;
  const sign = zone[0] === '-' ? -1 : 1;
  const digits = zone.slice(1).replace(':', '');
  const hours = Number(digits.slice(0, 2));
  const minutes = digits.length > 2 ? Number(digits.slice(2, 4)) : 0;
  return sign * (hours * 60 + minutes);
}

/** Reads timestamps of one batch, detecting the format from the first and holding every later one to it. */
export class TimestampReader {
  private format: TimeFormat | undefined;
  private readonly fixed: boolean;
  private readonly utcOffsetUs: number;
  /** The settled format as a linear map, when it is a numeric one. */
  private linear: LinearTime | null = null;

  constructor(private readonly options: TimestampOptions) {
    this.format = options.format;
    this.fixed = options.format !== undefined;
    this.utcOffsetUs = (options.utcOffsetMinutes ?? 0) * 60_000_000;
    if (options.format !== undefined) this.linear = this.linearTime(options.format);
  }

  /**
   * The numbers `format` takes as a linear map to µs (null for the text formats, or seconds without a
   * start time). Its range is fromNumbers' fast path, so it is narrowed to storable times, a
   * millisecond inside the limit so that rounding never carries a time it takes past it; fromNumber
   * decides on the last millisecond with the time itself.
   */
  private linearTime(format: TimeFormat): LinearTime | null {
    const map = this.formatMap(format);
    if (map === null) return null;
    const limitUs = MAX_ABS_TIME_US - 1000;
    return { ...map, from: Math.max(map.from, (-limitUs - map.offsetUs) / map.scale), to: Math.min(map.to, (limitUs - map.offsetUs) / map.scale) };
  }

  private formatMap(format: TimeFormat): LinearTime | null {
    // A fixed format takes any finite number; a detected one only the numbers it is detected from.
    const any = { from: -Number.MAX_VALUE, to: Number.POSITIVE_INFINITY };
    const seconds = this.options.detectEpochSeconds ? EPOCH_S_FROM : EPOCH_MS_FROM;
    // An offset of -0 adds nothing to any value, -0 included (+0 would turn -0 into +0).
    switch (format) {
      case 'epoch-ms':
        return { scale: 1000, offsetUs: -0, ...(this.fixed ? any : { from: EPOCH_MS_FROM, to: Number.POSITIVE_INFINITY }) };
      case 'epoch-s':
        return { scale: 1e6, offsetUs: -0, ...(this.fixed ? any : { from: EPOCH_S_FROM, to: EPOCH_MS_FROM }) };
      case 'seconds':
        if (this.options.traceStartUs === null) return null;
        return { scale: 1e6, offsetUs: this.options.traceStartUs, ...(this.fixed ? any : { from: -Number.MAX_VALUE, to: seconds }) };
      default:
        return null;
    }
  }

  /** The format in use (known after the first timestamp). */
  get detected(): TimeFormat | undefined {
    return this.format;
  }

  private numericFormat(value: number): TimeFormat {
    if (value >= EPOCH_MS_FROM) return 'epoch-ms';
    if (this.options.detectEpochSeconds && value >= EPOCH_S_FROM) return 'epoch-s';
    return 'seconds';
  }

  private settle(format: TimeFormat): TimeFormat {
    if (this.format === undefined) {
      this.format = format;
      this.linear = this.linearTime(format);
    } else if (this.format !== format) {
      throw new TimestampError(
        this.fixed
          ? `expected ${describe(this.format)} (timeFormat=${this.format})`
          : `mixed timestamp formats: ${describe(format)} after ${describe(this.format)}`,
      );
    }
    return this.format;
  }

  /** A timestamp given as a number (JSON number, or a CSV field that is one). */
  fromNumber(value: number): number {
    if (!Number.isFinite(value)) throw new TimestampError('the timestamp is not a finite number');
    const format = this.fixed ? (this.format as TimeFormat) : this.settle(this.numericFormat(value));
    // settle holds a detected format to the numbers it is detected from, and a fixed one takes any
    // finite number: the settled format's linear map gives this value's time, if storable.
    const linear = this.linear;
    if (linear !== null) {
      const us = Math.round(linear.offsetUs + value * linear.scale);
      if (isStorableTimeUs(us)) return us;
      throw new TimestampError(`the timestamp ${value} (${describe(format)}) is not ${TIME_RANGE_TEXT}`);
    }
    if (format === 'seconds') {
      throw new TimestampError('seconds from the trace start need the trace\'s startTime; set it, or send epoch milliseconds or ISO 8601');
    }
    throw new TimestampError(`expected ${describe(format)}, got a number`);
  }

  /**
   * Timestamps given as numbers, values[0, count), into out[at, at + count): what fromNumber gives
   * each, in one loop once the format is settled (a JSON body's `t` array holds thousands). On a bad
   * one, throws its TimestampError with `index` set; out holds the values before it.
   */
  fromNumbers(values: Float64Array, count: number, out: Float64Array, at: number): void {
    let k = 0;
    try {
      for (; k < count; k++) {
        const value = values[k] as number;
        const linear = this.linear;
        // fromNumber's linear map written out here, and two stores, not one of a conditional: V8 then
        // keeps the fast one's double unboxed.
        if (linear !== null && value >= linear.from && value < linear.to) out[at + k] = Math.round(linear.offsetUs + value * linear.scale);
        else out[at + k] = this.fromNumber(value);
      }
    } catch (err) {
      if (err instanceof TimestampError) err.index = k;
      throw err;
    }
  }

  /** A timestamp given as text (JSON string or CSV field). */
  fromText(raw: string): number {
    const text = raw.trim();
    if (text === '') throw new TimestampError('the timestamp is empty');
    if (this.format === undefined || this.format === 'epoch-ms' || this.format === 'epoch-s' || this.format === 'seconds') {
      const n = parseDecimalText(text);
      if (!Number.isNaN(n)) return this.fromNumber(n);
      if (this.format !== undefined) {
        if (this.fixed) throw new TimestampError(`expected ${describe(this.format)}, got "${raw}"`);
        this.settle(detectTextFormat(text)); // a text date-time after numbers: mixed formats
      }
    }
    if (this.format === undefined) this.settle(detectTextFormat(text));
    const format = this.format as TimeFormat;
    let us: number;
    if (format === 'iso' || (format === 'y/m/d' && ISO_PATTERN.test(text))) us = this.fromIso(text, raw, format);
    else if (format === 'd/m/y' || format === 'm/d/y' || format === 'y/m/d') us = this.fromSlashed(text, raw, format);
    else throw new TimestampError(`expected ${describe(format)}, got "${raw}"`);
    if (!isStorableTimeUs(us)) throw new TimestampError(`"${raw}" is not ${TIME_RANGE_TEXT}`);
    return us;
  }

  private fromIso(text: string, raw: string, format: TimeFormat): number {
    const m = ISO_PATTERN.exec(text);
    if (!m) {
      throw new TimestampError(SLASHED_PATTERN.test(text) ? `mixed timestamp formats: "${raw}" after ${describe(format)}` : `"${raw}" is not an ISO 8601 date-time`);
    }
    const us = utcUs(Number(m[1]), Number(m[2]), Number(m[3]), Number(m[4] ?? 0), Number(m[5] ?? 0), Number(m[6] ?? 0), m[7]);
    return m[8] ? us - zoneMinutes(m[8]) * 60_000_000 : us - this.utcOffsetUs;
  }

  private fromSlashed(text: string, raw: string, format: 'd/m/y' | 'm/d/y' | 'y/m/d'): number {
    const m = SLASHED_PATTERN.exec(text);
    if (!m) throw new TimestampError(ISO_PATTERN.test(text) ? `mixed timestamp formats: "${raw}" after ${describe(format)}` : `"${raw}" is not a date-time in ${format} order`);
    const [a, b, c] = [Number(m[1]), Number(m[2]), Number(m[3])];
    const yearFirst = m[1]!.length === 4;
    if (yearFirst !== (format === 'y/m/d')) {
      throw new TimestampError(yearFirst ? `"${raw}" starts with the year; set timeFormat=y/m/d` : `"${raw}" does not start with the year (timeFormat=y/m/d)`);
    }
    const [year, month, day] = format === 'y/m/d' ? [a, b, c] : format === 'd/m/y' ? [c, b, a] : [c, a, b];
    if (month > 12) throw new TimestampError(`"${raw}" has month ${month} in ${format} order; is it ${format === 'd/m/y' ? 'm/d/y' : 'd/m/y'}? Set timeFormat`);
    const fullYear = format !== 'y/m/d' && m[3]!.length <= 2 ? 2000 + year : year;
    return utcUs(fullYear, month, day, Number(m[4] ?? 0), Number(m[5] ?? 0), Number(m[6] ?? 0), m[7]) - this.utcOffsetUs;
  }
}

/** Format of a textual date-time, guessed from its shape: ISO, year first, or day/month order. */
function detectTextFormat(text: string): TimeFormat {
  if (ISO_PATTERN.test(text)) return 'iso';
  const m = SLASHED_PATTERN.exec(text);
  if (!m) throw new TimestampError(`"${text}" is not a timestamp this API reads (epoch ms, ISO 8601, or a date-time; see timeFormat)`);
  if (m[1]!.length === 4) return 'y/m/d';
  // Day first unless the first number cannot be a day-of-month-with-month-second reading.
  return Number(m[2]) > 12 ? 'm/d/y' : 'd/m/y';
}

/** Parses a `utcOffset` parameter: `UTC`, `Z`, `0` or an offset `+01:00` / `-0500`; returns minutes east of UTC. */
export function parseUtcOffset(zone: string): number | null {
  const z = zone.trim();
  if (/^(utc|z|gmt|0)$/i.test(z)) return 0;
  const m = /^([+-])(\d{2}):?(\d{2})$/.exec(z);
  if (!m) return null;
  const minutes = Number(m[2]) * 60 + Number(m[3]);
  return minutes > 14 * 60 ? null : (m[1] === '-' ? -1 : 1) * minutes;
}

/**
 * Parses `from`/`to` style instants: epoch milliseconds or ISO 8601 (UTC when no offset). Returns µs,
 * or null when it is neither or not a storable time.
 */
export function parseInstantUs(value: string | number): number | null {
  const storable = (us: number) => (isStorableTimeUs(us) ? us : null);
  if (typeof value === 'number') return storable(Math.round(value * 1000));
  const text = value.trim();
  if (/^[+-]?\d+(\.\d+)?$/.test(text)) return storable(Math.round(Number(text) * 1000));
  try {
    return new TimestampReader({ format: 'iso', traceStartUs: null }).fromText(text);
  } catch {
    return null;
  }
}
