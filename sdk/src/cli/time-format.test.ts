import { describe, expect, it } from 'vitest';
import { detectTimeFormat, parseTime, parseUtcOffset } from './time-format.js';

describe('time cells', () => {
  it('when ISO 8601 times carry a zone, then it is used; without one, the UTC offset given', () => {
    // source: ISO 8601-1:2019 extended format; epoch values from Date.UTC (ECMA-262 §21.4.1.28)
    expect(parseTime('2024-03-01T08:15:00.250Z', 'iso')).toBe(Date.UTC(2024, 2, 1, 8, 15, 0, 250));
    expect(parseTime('2024-03-01T08:15:00+01:00', 'iso')).toBe(Date.UTC(2024, 2, 1, 7, 15));
    expect(parseTime('2024-03-01 08:15:00', 'iso', 60)).toBe(Date.UTC(2024, 2, 1, 7, 15));
    expect(parseTime('2024-03-01 08:15', 'iso')).toBe(Date.UTC(2024, 2, 1, 8, 15));
  });

  it('when dates are day-first or month-first, then they read the same instant', () => {
    expect(parseTime('16/12/2006 17:24:00', 'd/m/y')).toBe(Date.UTC(2006, 11, 16, 17, 24));
    expect(parseTime('12/16/2006 17:24:00', 'm/d/y')).toBe(Date.UTC(2006, 11, 16, 17, 24));
    expect(parseTime('9/1/2007 00:00:00', 'd/m/y', -300)).toBe(Date.UTC(2007, 0, 9, 5, 0));
    expect(parseTime('16.12.2006 17:24:05,5', 'd/m/y')).toBe(Date.UTC(2006, 11, 16, 17, 24, 5, 500));
  });

  it('when a date does not exist or a cell does not match, then nothing is read', () => {
    expect(parseTime('31/4/2024 10:00', 'd/m/y')).toBeUndefined();
    expect(parseTime('13/13/2024', 'd/m/y')).toBeUndefined();
    expect(parseTime('2024-03-01T25:00:00Z', 'iso')).toBeUndefined();
    expect(parseTime('noon', 'epoch-ms')).toBeUndefined();
  });

  it('when numbers are Unix times or offsets, then they become milliseconds (offsets stay seconds)', () => {
    expect(parseTime('1700000000', 'epoch-s')).toBe(1_700_000_000_000);
    expect(parseTime('1700000000123', 'epoch-ms')).toBe(1_700_000_000_123);
    expect(parseTime('0.05', 'seconds')).toBe(0.05);
  });

  it('when the first cells are given, then the format is guessed only where it is not ambiguous', () => {
    expect(detectTimeFormat(['2024-03-01T08:15:00Z'])).toBe('iso');
    expect(detectTimeFormat(['1700000000123'])).toBe('epoch-ms');
    expect(detectTimeFormat(['1700000000'])).toBe('epoch-s');
    expect(detectTimeFormat(['0', '0.1'])).toBe('seconds');
    expect(detectTimeFormat(['16/12/2006 17:24:00'])).toBe('d/m/y');
    expect(detectTimeFormat(['12/16/2006 17:24:00'])).toBe('m/d/y');
    expect(detectTimeFormat(['1/2/2024 10:00'])).toBeUndefined();
  });

  it('when a UTC offset is written, then it reads as minutes east of UTC', () => {
    expect(parseUtcOffset('+01:00')).toBe(60);
    expect(parseUtcOffset('-0530')).toBe(-330);
    expect(parseUtcOffset('Z')).toBe(0);
    expect(() => parseUtcOffset('CET')).toThrow(RangeError);
  });
});
