/** Display formats shared by every page: numbers with units, clock times with their zone, durations. */

const numberFormats = new Map<number, Intl.NumberFormat>();
function numberFormat(digits: number) {
  let f = numberFormats.get(digits);
  if (!f) {
    f = new Intl.NumberFormat(undefined, { maximumFractionDigits: digits, minimumFractionDigits: digits });
    numberFormats.set(digits, f);
  }
  return f;
}

/** A number with fixed decimals and its unit, or an en dash when there is no value. */
export function formatValue(value: number | null | undefined, unit: string, digits = 2): string {
  if (value === null || value === undefined || !Number.isFinite(value)) return '–';
  return unit ? `${numberFormat(digits).format(value)} ${unit}` : numberFormat(digits).format(value);
}

export function formatCount(value: number | null | undefined): string {
  return value === null || value === undefined ? '–' : numberFormat(0).format(value);
}

/** Seconds as "1 h 02 min", "3 min 20 s", "4.25 s" or "180 ms". */
export function formatDuration(seconds: number | null | undefined): string {
  if (seconds === null || seconds === undefined || !Number.isFinite(seconds)) return '–';
  const s = Math.abs(seconds);
  if (s < 1) return `${numberFormat(0).format(s * 1000)} ms`;
  if (s < 60) return `${numberFormat(s < 10 ? 2 : 1).format(s)} s`;
  // Round first, so 239.95 s reads 4 min 00 s, not 3 min 60 s.
  if (s < 3600 - 0.5) {
    const whole = Math.round(s);
    return `${Math.floor(whole / 60)} min ${String(whole % 60).padStart(2, '0')} s`;
  }
  const minutes = Math.round(s / 60);
  return `${Math.floor(minutes / 60)} h ${String(minutes % 60).padStart(2, '0')} min`;
}

/** The browser's time zone as shown beside clock times: "Europe/Oslo (UTC+02:00)". */
export function timeZoneLabel(at: Date = new Date()): string {
  const zone = Intl.DateTimeFormat().resolvedOptions().timeZone || 'local time';
  const offsetMin = -at.getTimezoneOffset();
  const sign = offsetMin >= 0 ? '+' : '−';
  const hh = String(Math.floor(Math.abs(offsetMin) / 60)).padStart(2, '0');
  const mm = String(Math.abs(offsetMin) % 60).padStart(2, '0');
  return `${zone} (UTC${sign}${hh}:${mm})`;
}

const dateTimeFormat = new Intl.DateTimeFormat(undefined, { dateStyle: 'medium', timeStyle: 'medium' });
const shortDateTimeFormat = new Intl.DateTimeFormat(undefined, { dateStyle: 'short', timeStyle: 'short' });

/** A clock time in the browser's zone, from epoch ms or an ISO string. */
export function formatDateTime(value: number | string | null | undefined, short = false): string {
  if (value === null || value === undefined) return '–';
  const date = new Date(value);
  if (Number.isNaN(date.getTime())) return '–';
  return (short ? shortDateTimeFormat : dateTimeFormat).format(date);
}

/** Clock time with milliseconds, for events that last a fraction of a second. */
export function formatClockMs(epochMs: number): string {
  const d = new Date(epochMs);
  const hms = d.toLocaleTimeString(undefined, { hour12: false });
  return `${hms}.${String(d.getMilliseconds()).padStart(3, '0')}`;
}

/** Bytes as "12.3 MB". */
export function formatBytes(bytes: number): string {
  if (bytes < 1024) return `${bytes} B`;
  const units = ['KB', 'MB', 'GB'];
  let v = bytes / 1024;
  let i = 0;
  while (v >= 1024 && i < units.length - 1) {
    v /= 1024;
    i++;
  }
  return `${numberFormat(1).format(v)} ${units[i]}`;
}
