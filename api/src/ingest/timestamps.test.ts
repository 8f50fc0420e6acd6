import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { MAX_ABS_TIME_US } from '../storage/chunk-codec.js';
import { EPOCH_MS_FROM, EPOCH_S_FROM, TIME_FORMATS, TimestampError, TimestampReader, parseInstantUs, parseUtcOffset, type TimestampOptions } from './timestamps.js';

describe('timestamps', () => {
  it('when date-times are written as loggers write them, then they read as the same instant', () => {
    // source: ISO 8601-1:2019 (date-time with offset); 16/12/2006 17:24 is the first row of the UCI household file (reference-data README).
    const utc = Date.UTC(2006, 11, 16, 17, 24) * 1000;
    expect(new TimestampReader({ traceStartUs: null }).fromText('16/12/2006 17:24:00')).toBe(utc);
    expect(new TimestampReader({ traceStartUs: null, format: 'm/d/y' }).fromText('12/16/2006 17:24:00')).toBe(utc);
    expect(new TimestampReader({ traceStartUs: null }).fromText('2006-12-16T18:24:00+01:00')).toBe(utc);
    expect(new TimestampReader({ traceStartUs: null }).fromText('2006/12/16 17:24')).toBe(utc);
    expect(new TimestampReader({ traceStartUs: null, utcOffsetMinutes: 60 }).fromText('16/12/2006 18:24:00')).toBe(utc);
    expect(new TimestampReader({ traceStartUs: null }).fromText('2006-12-16T17:24:00.000250Z')).toBe(utc + 250);
    expect(new TimestampReader({ traceStartUs: null }).fromNumber(Date.UTC(2006, 11, 16, 17, 24) + 0.25)).toBe(utc + 250);
    expect(new TimestampReader({ traceStartUs: utc }).fromNumber(1.5)).toBe(utc + 1_500_000);
    expect(new TimestampReader({ traceStartUs: null, detectEpochSeconds: true }).fromText('1166289840')).toBe(utc);
  });

  it('when a day does not exist or the formats change within a batch, then the timestamp is refused', () => {
    expect(() => new TimestampReader({ traceStartUs: null }).fromText('31/04/2024 10:00')).toThrow(TimestampError);
    const reader = new TimestampReader({ traceStartUs: null });
    reader.fromNumber(1_700_000_000_000);
    expect(() => reader.fromNumber(12.5)).toThrow(/mixed timestamp formats/);
    expect(() => reader.fromText('2024-01-01T00:00:00Z')).toThrow(/mixed timestamp formats/);
    expect(() => new TimestampReader({ traceStartUs: null }).fromNumber(3)).toThrow(/startTime/);
    expect(() => new TimestampReader({ traceStartUs: null }).fromText('')).toThrow(/empty/);
  });

  it('when offsets and instants are given as parameters, then they parse or are refused', () => {
    expect(parseUtcOffset('+01:00')).toBe(60);
    expect(parseUtcOffset('-0530')).toBe(-330);
    expect(parseUtcOffset('UTC')).toBe(0);
    expect(parseUtcOffset('Europe/Paris')).toBeNull();
    expect(parseInstantUs('1700000000000')).toBe(1_700_000_000_000_000);
    expect(parseInstantUs('2023-11-14T22:13:20Z')).toBe(1_700_000_000_000_000);
    expect(parseInstantUs('yesterday')).toBeNull();
  });

  it('when a time lies outside what whole microseconds hold exactly, then it is refused wherever it is given', () => {
    // source: ECMA-262, Number.MAX_SAFE_INTEGER = 2^53 − 1, the largest integer a double holds with
    // every integer below it: 9,007,199,254,740,991 µs after 1970 is 2255-06-05T23:47:34.740991Z.
    expect(MAX_ABS_TIME_US).toBe(2 ** 53 - 1);
    const reader = () => new TimestampReader({ traceStartUs: null });
    expect(reader().fromNumber(9_007_199_254_740.99)).toBe(9_007_199_254_740_990);
    expect(() => reader().fromNumber(9_007_199_254_741)).toThrow(/the timestamp 9007199254741 \(epoch milliseconds\) is not between 1684-07-28 and 2255-06-05/);
    expect(() => reader().fromNumber(1e300)).toThrow(/is not between/);
    expect(() => new TimestampReader({ traceStartUs: null, format: 'epoch-ms' }).fromNumber(-9_007_199_254_741)).toThrow(/is not between/);
    expect(() => new TimestampReader({ traceStartUs: null, format: 'epoch-s' }).fromNumber(1e10)).toThrow(/is not between/);
    // Seconds from a start in 2023 run out some 232 years later.
    expect(() => new TimestampReader({ traceStartUs: 1_700_000_000_000_000 }).fromNumber(7.4e9)).toThrow(/seconds from the trace start\) is not between/);
    expect(reader().fromText('2255-06-05T23:47:34Z')).toBe(9_007_199_254_000_000);
    expect(() => reader().fromText('2255-06-06T00:00:00Z')).toThrow(/"2255-06-06T00:00:00Z" is not between/);
    expect(() => reader().fromText('01/01/1600 00:00')).toThrow(/is not between/);
    expect(parseInstantUs(9_007_199_254_740)).toBe(9_007_199_254_740_000);
    expect(parseInstantUs('9007199254741')).toBeNull();
    expect(parseInstantUs(1e300)).toBeNull();
    expect(parseInstantUs('9999-12-31T00:00:00Z')).toBeNull();
  });

  it('when a run of numbers is read in one loop, then each timestamp and each refusal is the one fromNumber gives', () => {
    // The loop (fromNumbers, for JSON `t` arrays) must be fromNumber on each value, in order: same µs,
    // same first error at the same index. Values around each format's detection bounds.
    const near = (x: number) => fc.oneof(fc.constant(x), fc.double({ min: x - 1e3, max: x + 1e3, noNaN: true }));
    // The storable limits too: ±2^53 µs as epoch ms, epoch s, and seconds from the start below.
    const limits = [MAX_ABS_TIME_US / 1000, -MAX_ABS_TIME_US / 1000, MAX_ABS_TIME_US / 1e6, (MAX_ABS_TIME_US - 1_764_000_000_000_000) / 1e6];
    const value = fc.oneof(near(EPOCH_MS_FROM), near(EPOCH_S_FROM), near(0), ...limits.map(near), fc.double({ noNaN: false }), fc.constantFrom(-0, 1_764_000_000_000.25, Number.MAX_VALUE, -Number.MAX_VALUE));
    const options = fc.record({
      format: fc.constantFrom(undefined, ...TIME_FORMATS),
      traceStartUs: fc.constantFrom(null, 1_764_000_000_000_000),
      detectEpochSeconds: fc.boolean(),
    });
    fc.assert(
      fc.property(options, fc.array(value, { minLength: 1, maxLength: 12 }), (opts: TimestampOptions, values) => {
        const one = new TimestampReader(opts);
        const expected: number[] = [];
        let error: { message: string; index: number } | null = null;
        for (const [index, v] of values.entries()) {
          try {
            expected.push(one.fromNumber(v));
          } catch (err) {
            error = { message: (err as Error).message, index };
            break;
          }
        }
        const out = new Float64Array(values.length + 2);
        let thrown: { message: string; index: number } | null = null;
        try {
          new TimestampReader(opts).fromNumbers(Float64Array.from(values), values.length, out, 2);
        } catch (err) {
          expect(err).toBeInstanceOf(TimestampError);
          thrown = { message: (err as TimestampError).message, index: (err as TimestampError).index };
        }
        expect(thrown).toEqual(error);
        for (const [k, us] of expected.entries()) expect(Object.is(out[2 + k], us), `value ${k}`).toBe(true);
      }),
      { numRuns: 3000 },
    );
  });
});
