import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { parseDecimalText } from './decimal-text.js';

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
