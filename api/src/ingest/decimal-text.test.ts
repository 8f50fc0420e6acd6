import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { parseDecimalText, scanJsonNumber, type ScannedNumber } from './decimal-text.js';

// source: ECMAScript's Number() (ECMA-262, StringToNumber) is the reference; it reads every string of
// the grammar exactly, correctly rounded.
const GRAMMAR = /^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/;

describe('parseDecimalText', () => {
  it('when the text is a decimal number, then it reads exactly what Number() reads', () => {
    const decimal = fc
      .tuple(
        fc.constantFrom('', '+', '-'),
        fc.stringMatching(/^\d{0,20}$/),
        fc.constantFrom('', '.'),
        fc.stringMatching(/^\d{0,20}$/),
        fc.constantFrom('', 'e', 'E', 'e-', 'E+'),
        fc.stringMatching(/^\d{1,3}$/),
      )
      .map(([sign, whole, point, fraction, e, exp]) => `${sign}${whole}${point}${point ? fraction : ''}${e ? e + exp : ''}`)
      .filter((s) => GRAMMAR.test(s));
    fc.assert(fc.property(decimal, (text) => Object.is(parseDecimalText(text), Number(text))), { numRuns: 20_000 });
    fc.assert(fc.property(fc.double({ noNaN: true, noDefaultInfinity: true }), (x) => Object.is(parseDecimalText(String(x)), Number(String(x)))));
  });

  it('when the text is anything else, then it is NaN', () => {
    for (const text of ['', '+', '-', '.', 'e5', '1e', '1e+', '1.2.3', ' 1', '1 ', '0x10', 'Infinity', 'NaN', '1,5', '--1', '12a']) {
      expect(parseDecimalText(text), text).toBeNaN();
    }
    fc.assert(fc.property(fc.string(), (text) => GRAMMAR.test(text) || Number.isNaN(parseDecimalText(text))));
  });

  it('reads the usual readings and timestamps', () => {
    expect(parseDecimalText('12.5')).toBe(12.5);
    expect(parseDecimalText('-0.001')).toBe(-0.001);
    expect(parseDecimalText('1772438400000')).toBe(1_772_438_400_000);
    expect(parseDecimalText('1772438400.123')).toBe(1_772_438_400.123);
    expect(parseDecimalText('.5')).toBe(0.5);
    expect(parseDecimalText('5.')).toBe(5);
    expect(Object.is(parseDecimalText('-0'), -0)).toBe(true);
  });
});

describe('scanJsonNumber', () => {
  // source: JSON.parse (ECMA-262) reads every number of the RFC 8259 grammar, correctly rounded.
  const scan = (text: string) => {
    const buf = Buffer.from(text);
    const out: ScannedNumber = { value: Number.NaN, end: -1 };
    return scanJsonNumber(buf, 0, buf.length, out) ? out : null;
  };

  it('when the bytes are a JSON number, then it reads exactly what JSON.parse reads, up to the byte after it', () => {
    const jsonNumber = fc
      .tuple(
        fc.constantFrom('', '-'),
        fc.oneof(fc.constant('0'), fc.stringMatching(/^[1-9]\d{0,22}$/)),
        fc.oneof(fc.constant(''), fc.stringMatching(/^\.\d{1,22}$/)),
        fc.oneof(fc.constant(''), fc.stringMatching(/^[eE][+-]?\d{1,3}$/)),
      )
      .map((parts) => parts.join(''));
    fc.assert(
      fc.property(jsonNumber, fc.constantFrom(',', ']', '}', ' ', ''), (text, after) => {
        const read = scan(text + after);
        return read !== null && read.end === text.length && Object.is(read.value, JSON.parse(text));
      }),
      { numRuns: 30_000 },
    );
  });

  it('reads mantissas at the edge of the exact path (2^53 = 9007199254740992) as JSON.parse does', () => {
    for (const text of [
      '9007199254740991',
      '9007199254740992',
      '9007199254740993',
      '9007199254740995',
      '90071992547409930',
      '900719925474099.3',
      '0.9007199254740993',
      '-9007199254740993e-10',
      '1772438400001.25',
      '17724384000012345',
      '0.00000000000000000000001',
      '1e22',
      '1e23',
      '123456789012345678901234567890',
    ]) {
      expect(scan(text)?.value, text).toBe(JSON.parse(text));
    }
  });

  it('when the bytes do not begin a number, then it says so; what follows a number is left to the caller', () => {
    for (const text of ['', '-', '-a', 'x', '.5', '1.', '1.e5', '1e', '1e+', '+1']) expect(scan(text), text).toBeNull();
    expect(scan('01')).toEqual({ value: 0, end: 1 });
    expect(scan('12.5x')).toEqual({ value: 12.5, end: 4 });
  });
});
