/**
 * Decimal numbers written as text (CSV fields, timestamps in strings) or as the bytes of a JSON
 * number (JSON and NDJSON bodies), read without a regular expression or an intermediate string: a
 * sample body is mostly numbers, and these run once per number.
 *
 * Grammar: `[+-]? (digits [. digits?] | . digits) ([eE] [+-]? digits)?`, nothing else (no spaces, no
 * hex, no Infinity). Values of up to 15 significant digits with a power of ten up to 22 are computed
 * exactly (Clinger's fast path: both operands are exact doubles, so one division or multiplication
 * rounds correctly); anything else goes through Number(), which reads the same grammar.
 */

const POW10 = Array.from({ length: 23 }, (_, k) => 10 ** k);

/**
 * mantissa × 10^power, correctly rounded, when Clinger's fast path applies (at most 15 significant
 * digits, |power| ≤ 22: both operands are exact doubles, so one operation rounds correctly); else null,
 * and the caller reads the digits with Number(). Shared by the text and the byte (JSON body) readers.
 */
export function exactDecimal(mantissa: number, significant: number, power: number): number | null {
  if (significant > 15 || power < -22 || power > 22) return null;
  return power < 0 ? mantissa / (POW10[-power] as number) : mantissa * (POW10[power] as number);
}

/** The number `text` spells, or NaN when it is not a decimal number in the grammar above. */
export function parseDecimalText(text: string): number {
  const end = text.length;
  let i = 0;
  let negative = false;
  const first = text.charCodeAt(0);
  if (first === 43 || first === 45) {
    negative = first === 45;
    i = 1;
  }
  let mantissa = 0;
  let significant = 0;
  let digits = 0;
  let pointAt = -1;
  let c = 0;
  for (; i < end; i++) {
    c = text.charCodeAt(i);
    if (c === 46 && pointAt < 0) {
      pointAt = digits;
      continue;
    }
    if (c < 48 || c > 57) break;
    if (significant > 0 || c !== 48) significant++;
    mantissa = mantissa * 10 + (c - 48);
    digits++;
  }
  const fractionDigits = pointAt < 0 ? 0 : digits - pointAt;
  if (digits === 0) return Number.NaN;
  let exponent = 0;
  if (i < end && (c === 101 || c === 69)) {
    i++;
    let expNegative = false;
    c = text.charCodeAt(i);
    if (c === 43 || c === 45) {
      expNegative = c === 45;
      i++;
    }
    const expStart = i;
    while (i < end) {
      c = text.charCodeAt(i);
      if (c < 48 || c > 57) break;
      if (exponent < 100_000) exponent = exponent * 10 + (c - 48);
      i++;
    }
    if (i === expStart) return Number.NaN;
    if (expNegative) exponent = -exponent;
  }
  if (i !== end) return Number.NaN;
  const power = exponent - fractionDigits;
  const value = exactDecimal(mantissa, significant, power);
  if (value === null) return Number(text);
  return negative ? -value : value;
}

const isDigit = (b: number) => b >= 48 && b <= 57;

/** What scanJsonNumber read: the value and the index just after the number. */
export interface ScannedNumber {
  value: number;
  end: number;
}

/**
 * Reads the JSON number (RFC 8259 grammar) that starts at buf[start], in one pass, up to the first
 * byte that cannot continue it or up to `limit`: the value goes to out.value and the index after the
 * number to out.end. Returns false when the bytes at `start` do not begin a number ("-", "1.", "1e",
 * ".5", "x"). What follows the number is the caller's to check ("01" reads as 0 followed by "1").
 * Integers and decimals of up to 15 significant digits with a small exponent take the exact fast path.
 */
export function scanJsonNumber(buf: Uint8Array, start: number, limit: number, out: ScannedNumber): boolean {
  let i = start;
  let negative = false;
  if (buf[i] === 45) {
    negative = true;
    i++;
  }
  if (i >= limit) return false;
  const digitsStart = i;
  let mantissa = 0;
  let significant = 0;
  let fractionDigits = 0;
  const first = buf[i] as number;
  if (first === 48) i++;
  else if (first >= 49 && first <= 57) {
    while (i < limit && isDigit(buf[i] as number)) {
      mantissa = mantissa * 10 + ((buf[i] as number) - 48);
      significant++;
      i++;
    }
  } else return false;
  if (i < limit && buf[i] === 46) {
    i++;
    if (i >= limit || !isDigit(buf[i] as number)) return false;
    while (i < limit && isDigit(buf[i] as number)) {
      mantissa = mantissa * 10 + ((buf[i] as number) - 48);
      if (mantissa > 0) significant++;
      fractionDigits++;
      i++;
    }
  }
  let exponent = 0;
  if (i < limit && (buf[i] === 101 || buf[i] === 69)) {
    i++;
    let expNegative = false;
    if (buf[i] === 43 || buf[i] === 45) {
      expNegative = buf[i] === 45;
      i++;
    }
    if (i >= limit || !isDigit(buf[i] as number)) return false;
    while (i < limit && isDigit(buf[i] as number)) {
      if (exponent < 100000) exponent = exponent * 10 + ((buf[i] as number) - 48);
      i++;
    }
    if (expNegative) exponent = -exponent;
  }
  const power = exponent - fractionDigits;
  const value = exactDecimal(mantissa, significant, power) ?? Number(Buffer.from(buf.buffer, buf.byteOffset + digitsStart, i - digitsStart).toString('latin1'));
  out.value = negative ? -value : value;
  out.end = i;
  return true;
}

const scratch: ScannedNumber = { value: 0, end: 0 };

/** A JSON number in buf[start, end), or NaN when the bytes are not one (RFC 8259 grammar). */
export function parseJsonNumber(buf: Uint8Array, start: number, end: number): number {
  return scanJsonNumber(buf, start, end, scratch) && scratch.end === end ? scratch.value : Number.NaN;
}
