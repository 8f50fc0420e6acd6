import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { Problem } from '../errors/problem.js';
import { parseJsonNumber } from './decimal-text.js';
import { readJsonSamples } from './json-samples.js';
import { collectingSink } from './test-support.js';
import { TimestampReader } from './timestamps.js';

const collect = collectingSink;

async function* pieces(text: string, size: number) {
  const buf = Buffer.from(text);
  for (let i = 0; i < buf.length; i += size) yield buf.subarray(i, i + size);
}

const options = () => ({ timestamps: new TimestampReader({ traceStartUs: null }), defaultRateHz: null, defaultStart: null });

describe('JSON sample bodies', () => {
  it('when numbers are read from bytes, then they equal JSON.parse exactly', () => {
    // source: ECMA-262 Number parsing (JSON.parse) is the reference; Clinger's fast path must agree bit for bit.
    fc.assert(
      fc.property(fc.double({ noNaN: true, noDefaultInfinity: true }), (x) => {
        const text = JSON.stringify(x);
        const buf = Buffer.from(text);
        expect(Object.is(parseJsonNumber(buf, 0, buf.length), JSON.parse(text))).toBe(true);
      }),
      { numRuns: 2000 },
    );
    for (const text of ['0.1', '-0.5', '1e22', '123456789012345', '1234567890123456789', '1.5e-7', '0.000123', '17e300']) {
      const buf = Buffer.from(text);
      expect(parseJsonNumber(buf, 0, buf.length)).toBe(Number(text));
    }
    for (const bad of ['01', '1.', '.5', '+1', '1e', '--1', '1x', '']) {
      const buf = Buffer.from(bad);
      expect(parseJsonNumber(buf, 0, buf.length)).toBeNaN();
    }
  });

  it('when a body arrives in pieces of any size, then the same samples come out', async () => {
    const body = JSON.stringify({ t: [1_700_000_000_000, '2023-11-14T22:13:20.5Z', 1_700_000_001_000], a: [1.5, -2, 3e-3] });
    for (const size of [1, 2, 3, 7, 1000]) {
      const sink = collect();
      const err = (await readJsonSamples(pieces(body, size), options(), sink).catch((e: unknown) => e)) as Problem;
      expect(err.errors?.[0]).toEqual({ detail: 'mixed timestamp formats: ISO 8601 date-times after epoch milliseconds', pointer: '/t/1' });
    }
    const good = JSON.stringify({ a: [1.5, -2, 3e-3], t: ['2023-11-14T22:13:20Z', '2023-11-14T22:13:20.5Z', '2023-11-14T22:13:21.000001Z'] });
    for (const size of [1, 5, 1000]) {
      const sink = collect();
      expect(await readJsonSamples(pieces(good, size), options(), sink)).toBe(3);
      expect(sink.times).toEqual([1_700_000_000_000_000, 1_700_000_000_500_000, 1_700_000_001_000_001]);
      expect(sink.values).toEqual([1.5, -2, Math.fround(3e-3)]);
    }
  });

  it('when the JSON is broken, then the problem names the line and column', async () => {
    const body = '{\n  "t": [1700000000000, 1700000000100],\n  "a": [1, 2,]\n}';
    const err = await readJsonSamples(pieces(body, 4), options(), collect()).catch((e: unknown) => e);
    expect(err).toBeInstanceOf(Problem);
    expect((err as Problem).type).toBe('malformed-body');
    expect((err as Problem).errors).toEqual([{ detail: 'expected a value after ","', line: 3, column: 14 }]);
  });

  it('when long arrays of numbers are cut anywhere, then every reading and timestamp equals JSON.parse of it', async () => {
    // source: ECMA-262 JSON.parse is the reference for each number (readings then rounded to float32,
    // the storage type); the one-pass run reader and the general element reader must both agree with it.
    const reading = fc.oneof(
      fc.double({ min: -1e12, max: 1e12, noNaN: true }),
      fc.integer({ min: -1_000_000, max: 1_000_000 }),
      fc.integer({ min: -99_999, max: 99_999 }).map((n) => n / 100),
    );
    await fc.assert(
      fc.asyncProperty(fc.array(reading, { minLength: 1, maxLength: 300 }), fc.integer({ min: 1, max: 64 }), fc.boolean(), async (values, size, spaced) => {
        const t = values.map((_, i) => 1_700_000_000_000 + i * 0.25);
        const body = spaced ? JSON.stringify({ t, a: values }, null, 1) : JSON.stringify({ t, a: values });
        const sink = collect();
        expect(await readJsonSamples(pieces(body, size), options(), sink)).toBe(values.length);
        const parsed = JSON.parse(body) as { t: number[]; a: number[] };
        expect(sink.values).toEqual(parsed.a.map((x) => Math.fround(x)));
        expect(sink.times).toEqual(parsed.t.map((x) => Math.round(x * 1000)));
      }),
      { numRuns: 300 },
    );
  });

  it('when a body holds more numbers than one read of the number-run reader, in one Buffer or in many, then every sample equals JSON.parse of it', async () => {
    // source: ECMA-262 JSON.parse, as above. 30,000 pairs (about 600 KB): more than the reader's
    // output (4,096 values) and input (256 KB) hold at a time, and more than the arrays start with.
    const t = Array.from({ length: 30_000 }, (_, i) => 1_764_000_000_000 + i * 1.25);
    const a = t.map((_, i) => Math.round((8 + 4 * Math.sin(i / 900)) * 1000) / 1000 - 6);
    const body = JSON.stringify({ t, a });
    for (const size of [body.length, 65_536, 4_099]) {
      const sink = collect();
      expect(await readJsonSamples(pieces(body, size), options(), sink)).toBe(t.length);
      expect(sink.times).toEqual(t.map((x) => Math.round(x * 1000)));
      expect(sink.values).toEqual(a.map((x) => Math.fround(x)));
    }
  });

  it('when a bad element sits inside a run of numbers, then the problem names that element wherever the body is cut', async () => {
    // common practice, no source: RFC 9457 problem details point at the first bad element (JSON Pointer, or line and column).
    const cases: Array<[string, { detail: string; pointer?: string; line?: number; column?: number }]> = [
      ['{"values":[1,2,3,1e400,5]}', { detail: 'not finite (Infinity)', pointer: '/values/3' }],
      ['{"values":[1,2,3,-2e12,5]}', { detail: 'larger in magnitude than 1000000000000', pointer: '/values/3' }],
      ['{"values":[1,2,3,01,5]}', { detail: '"01" is not a JSON value', line: 1, column: 18 }],
      ['{"values":[1,2,3,1.,5]}', { detail: '"1." is not a JSON value', line: 1, column: 18 }],
      ['{"values":[1,2,3,null,5]}', { detail: 'must be a number, not null', pointer: '/values/3' }],
      ['{"values":[1,2,3,,5]}', { detail: 'expected a value after ","', line: 1, column: 18 }],
      ['{"values":[1,2,3 4]}', { detail: 'expected "," or "]" in the array', line: 1, column: 18 }],
      ['{"t":[1700000000000,1700000000001,1700000000001],"a":[1,2,3]}', { detail: 'timestamps must increase: this one is not after the previous one', pointer: '/t/2' }],
      ['{"values":[1,2,3,2000000000000,5]}', { detail: 'larger in magnitude than 1000000000000', pointer: '/values/3' }],
      // The first problem in the body's order, whichever check finds it.
      ['{"t":[1700000000000,1700000000000,5],"a":[1,2,3]}', { detail: 'timestamps must increase: this one is not after the previous one', pointer: '/t/1' }],
      ['{"t":[1700000000000,5,1700000000000],"a":[1,2,3]}', { detail: 'mixed timestamp formats: seconds from the trace start after epoch milliseconds', pointer: '/t/1' }],
      ['{"t":[1700000000000,1700000000001],"a":[1,2000000000000,3e15]}', { detail: 'larger in magnitude than 1000000000000', pointer: '/a/1' }],
    ];
    for (const [body, expected] of cases) {
      for (const size of [1, 3, 7, 1000]) {
        const uniform = { ...options(), defaultRateHz: 10, defaultStart: { startUs: 0 } };
        const err = (await readJsonSamples(pieces(body, size), uniform, collect()).catch((e: unknown) => e)) as Problem;
        expect(err, `${body} in pieces of ${size}`).toBeInstanceOf(Problem);
        expect(err.errors, `${body} in pieces of ${size}`).toEqual([expected]);
      }
    }
  });

  it('when a body is mangled anywhere, then it is read as JSON.parse reads it or refused with a problem, never anything else', async () => {
    // source: RFC 8259 via ECMA-262 JSON.parse as the oracle: a body JSON.parse refuses must be refused
    // (never stored); one it reads as {"values": [numbers]} must give the same readings (rounded to float32).
    const alphabet = [...'0123456789.,-+eE[]{} \n"x'];
    const edit = fc.record({ at: fc.nat(), kind: fc.constantFrom('insert', 'delete', 'replace'), char: fc.constantFrom(...alphabet) });
    await fc.assert(
      fc.asyncProperty(fc.array(fc.double({ min: -1e6, max: 1e6, noNaN: true }), { minLength: 1, maxLength: 40 }), fc.array(edit, { minLength: 1, maxLength: 4 }), fc.integer({ min: 1, max: 40 }), async (values, edits, size) => {
        let body = JSON.stringify({ values });
        for (const { at, kind, char } of edits) {
          const i = at % (body.length + 1);
          body = kind === 'insert' ? body.slice(0, i) + char + body.slice(i) : kind === 'delete' ? body.slice(0, i) + body.slice(i + 1) : body.slice(0, i) + char + body.slice(i + 1);
        }
        let parsed: unknown;
        try {
          parsed = JSON.parse(body);
        } catch {
          parsed = undefined;
        }
        const uniform = { ...options(), defaultRateHz: 10, defaultStart: { startUs: 0 } };
        const sink = collect();
        const outcome = await readJsonSamples(pieces(body, size), uniform, sink).catch((e: unknown) => e);
        if (parsed === undefined) {
          // Refused; the problem is the first one in the body's order, which may be an unknown member
          // or a bad value met before the syntax error.
          expect(outcome, body).toBeInstanceOf(Problem);
          return;
        }
        const list = (parsed as { values?: unknown }).values;
        const plain =
          typeof parsed === 'object' && parsed !== null && Object.keys(parsed).length === 1 && body.split('"values"').length === 2 &&
          Array.isArray(list) && list.length > 0 && list.every((x) => typeof x === 'number' && Math.abs(x) <= 1e12);
        if (plain) {
          expect(outcome, body).toBe(list.length);
          expect(sink.values, body).toEqual(list.map((x) => Math.fround(x)));
        } else expect(typeof outcome === 'number' || outcome instanceof Problem, body).toBe(true);
      }),
      { numRuns: 1500 },
    );
  });
});
