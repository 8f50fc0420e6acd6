/**
 * Decimal numbers written as text (CSV fields, timestamps in strings), read without a regular
 * expression or an intermediate string: the common case of a CSV body is two numbers a row, and this
 * runs once per number.
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

/**
 * Whether text[start, end) is a number in JSON's stricter grammar (RFC 8259 section 6):
 * `-? (0 | [1-9] digits*) (. digits+)? ([eE] [+-]? digits+)?`.
 */
export function isJsonNumberText(text: string, start: number, end: number): boolean {
  let i = start;
  if (text.charCodeAt(i) === 45) i++;
  if (i >= end || !digitAt(text, i)) return false;
  if (text.charCodeAt(i) === 48) i++;
  else while (i < end && digitAt(text, i)) i++;
  if (i < end && text.charCodeAt(i) === 46) {
    i++;
    if (i >= end || !digitAt(text, i)) return false;
    while (i < end && digitAt(text, i)) i++;
  }
  if (i < end && (text.charCodeAt(i) === 101 || text.charCodeAt(i) === 69)) {
    i++;
    if (i < end && (text.charCodeAt(i) === 43 || text.charCodeAt(i) === 45)) i++;
    if (i >= end || !digitAt(text, i)) return false;
    while (i < end && digitAt(text, i)) i++;
  }
  return i === end;
}

function digitAt(text: string, k: number): boolean {
  const c = text.charCodeAt(k);
  return c >= 48 && c <= 57;
}
