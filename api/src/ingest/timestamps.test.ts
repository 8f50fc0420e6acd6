import { describe, expect, it } from 'vitest';
import { TimestampError, TimestampReader, parseInstantUs, parseUtcOffset } from './timestamps.js';

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
});
