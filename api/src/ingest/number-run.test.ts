import fc from 'fast-check';
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { compileNumberRun, WASM_FILE } from './compile-number-run.js';
import {
  forgetNumberRunInput,
  NUMBER_RUN_CAPACITY,
  numberRunEnd,
  numberRunValues,
  readNumberRun,
} from './number-run.js';

/** Reads the run at the start of `text`: the values taken and where it stopped. */
function run(text: string | Buffer, p = 0) {
  const buf = typeof text === 'string' ? Buffer.from(text) : text;
  forgetNumberRunInput();
  const count = readNumberRun(buf, p, buf.length);
  return {
    values: Array.from(numberRunValues.subarray(0, count)),
    stop: numberRunEnd.stop,
    closed: numberRunEnd.closed,
  };
}

describe('the WebAssembly number-run reader', () => {
  it('when the module is compiled from its text, then it is the committed number-run.wasm', async () => {
    // The server loads the .wasm; the .wat is what people read and change.
    expect(Buffer.from(await compileNumberRun()).equals(readFileSync(WASM_FILE))).toBe(true);
  });

  it('when it reads a number, then the value is the one JSON.parse gives, or it leaves the number to the JavaScript reader', () => {
    // source: ECMA-262 JSON.parse (correctly rounded, as Clinger's fast path is when it applies).
    const text = fc.oneof(
      fc.double({ noNaN: true, noDefaultInfinity: true }).map((x) => JSON.stringify(x)),
      fc.bigInt({ min: -(10n ** 20n), max: 10n ** 20n }).map(String),
      fc
        .tuple(fc.bigInt({ min: 0n, max: 10n ** 19n }), fc.stringMatching(/^[0-9]{1,25}$/), fc.boolean())
        .map(([i, f, neg]) => `${neg ? '-' : ''}${i}.${f}`),
      fc.integer({ min: -99_999, max: 99_999 }).map((n) => String(n / 100)),
    );
    let taken = 0;
    fc.assert(
      fc.property(text, fc.constantFrom(',', ']'), (number, after) => {
        const result = run(number + after + '7]');
        if (result.values.length === 0) {
          expect(result.stop).toBe(0);
          return;
        }
        taken++;
        expect(Object.is(result.values[0], JSON.parse(number))).toBe(true);
        // After "]" the run ends; after "," it goes on to the 7.
        expect(result).toMatchObject(
          after === ']'
            ? { values: [result.values[0]], stop: number.length + 1, closed: true }
            : { values: [result.values[0], 7], stop: number.length + 3, closed: true },
        );
      }),
      { numRuns: 5000 },
    );
    expect(taken).toBeGreaterThan(1000); // a third are read here (not those with exponents or long digits), so the comparison above means something
  });

  it('when a number is exact in the fast path, then it is read; at its limits, left to the JavaScript reader', () => {
    // source: IEEE 754 binary64: integers up to 2^53 = 9007199254740992 and 10^0..10^22 are exact
    // (Clinger 1990's fast path); the reader's limits follow them.
    const read = (text: string) => run(`${text},`).values;
    expect(read('9007199254740992')).toEqual([9007199254740992]);
    expect(read('9007199254740993')).toEqual([]);
    expect(read('1764000000001.25')).toEqual([1764000000001.25]);
    expect(read('0.000000000000000001')).toEqual([1e-18]);
    expect(read('0.0000000000000000001')).toEqual([]); // 19 digits
    expect(read('12.3456789012345')).toEqual([12.3456789012345]);
    expect(read('1234567890.12345678')).toEqual([]); // 18 digits, but a mantissa over 2^53
    expect(Object.is(read('-0')[0], -0)).toBe(true);
    expect(Object.is(read('-0.0')[0], -0)).toBe(true);
    expect(read('0')).toEqual([0]);
    expect(read('-12.5')).toEqual([-12.5]);
  });

  it('when an element is anything but a plain number followed at once by "," or "]", then it stops there and takes nothing of it', () => {
    // common practice, no source: the JavaScript reader reads these, or names the error (RFC 8259 grammar).
    for (const text of [
      ' 1,',
      '"1",',
      'null,',
      '1e5,',
      '1E5,',
      '01,',
      '1.,',
      '.5,',
      '-,',
      '--1,',
      '+1,',
      '1 ,',
      '1x,',
      'Infinity,',
      '1',
      '12.',
      '-',
      '',
    ]) {
      expect(run(text), text).toEqual({ values: [], stop: 0, closed: false });
    }
    expect(run('1,2,3 ,4]')).toEqual({ values: [1, 2], stop: 4, closed: false }); // "3 " is the JavaScript reader's
    expect(run('1,2]3,4]')).toEqual({ values: [1, 2], stop: 4, closed: true });
    expect(run('5,6,78')).toEqual({ values: [5, 6], stop: 4, closed: false }); // "78" may go on in the next Buffer
  });

  it('when a run is longer than its output, then it stops after NUMBER_RUN_CAPACITY values and the next read goes on', () => {
    const numbers = Array.from({ length: NUMBER_RUN_CAPACITY + 10 }, (_, i) => i * 1.5);
    const buf = Buffer.from(`${numbers.join(',')}]`);
    const first = run(buf);
    expect(first.values).toEqual(numbers.slice(0, NUMBER_RUN_CAPACITY));
    const second = run(buf, first.stop);
    expect(second.values).toEqual(numbers.slice(NUMBER_RUN_CAPACITY));
    expect(second).toMatchObject({ stop: buf.length, closed: true });
  });

  it('when a Buffer is longer than the module holds, then reads go on from a new copy', () => {
    // 300 KB of numbers in one Buffer (the input area is 256 KB): read on until "]".
    const numbers = Array.from({ length: 30_000 }, (_, i) => 1_764_000_000_000 + i * 1.25);
    const buf = Buffer.from(`${numbers.join(',')}]`);
    forgetNumberRunInput();
    const read: number[] = [];
    let p = 0;
    while (p < buf.length) {
      const count = readNumberRun(buf, p, buf.length);
      if (count === 0) {
        // The number cut by the end of the copy: what the JavaScript reader does, in short.
        const comma = buf.indexOf(',', p);
        read.push(Number(buf.toString('latin1', p, comma)));
        p = comma + 1;
        continue;
      }
      read.push(...numberRunValues.subarray(0, count));
      p = numberRunEnd.stop;
    }
    expect(read).toEqual(numbers);
  });

  it('when a Buffer changes between two reads, then forgetNumberRunInput makes the next read see the new bytes', () => {
    const buf = Buffer.from('1,2,3]');
    expect(run(buf).values).toEqual([1, 2, 3]);
    buf.write('4,5,6]');
    forgetNumberRunInput();
    expect(readNumberRun(buf, 0, buf.length)).toBe(3);
    expect(Array.from(numberRunValues.subarray(0, 3))).toEqual([4, 5, 6]);
  });
});
