import { describe, expect, it } from 'vitest';
import { buildPreview, guessMapping, looksLikeIsoTime, parseDecimal } from './csv-preview';

// Invented exports in the shapes loggers and scripts commonly write (demo data only).
describe('buildPreview and guessMapping', () => {
  it('when a logger export has ISO times and a current column in amps, then both are found', () => {
    const p = buildPreview(
      [
        ['Timestamp', 'Channel 1 current (A)', 'Note'],
        ['2026-03-01T10:00:00.000Z', '0.02', ''],
        ['2026-03-01T10:00:00.500Z', '9.81', 'start'],
      ],
      ',',
    );
    expect(p.hasHeader).toBe(true);
    expect(p.rows).toHaveLength(2);
    expect(guessMapping(p)).toEqual({ timeColumn: 0, currentColumn: 1, timeFormat: 'iso', unit: 'A' });
  });

  it('when a European export uses ";" and decimal commas with seconds and millivolts, then it is read as such', () => {
    const p = buildPreview(
      [
        ['t (s)', 'U (mV)'],
        ['0,0', '12,5'],
        ['0,5', '98,1'],
      ],
      ';',
    );
    expect(p.decimalComma).toBe(true);
    expect(guessMapping(p)).toEqual({ timeColumn: 0, currentColumn: 1, timeFormat: 'seconds', unit: 'mV' });
    expect(parseDecimal('98,1', true)).toBeCloseTo(98.1, 10);
  });

  it('when there is no header and the first column is epoch milliseconds, then it is the time column', () => {
    const p = buildPreview(
      [
        ['1772359200000', '4.1'],
        ['1772359200050', '4.2'],
      ],
      ',',
    );
    expect(p.hasHeader).toBe(false);
    expect(p.columns).toEqual(['Column 1', 'Column 2']);
    expect(guessMapping(p)).toMatchObject({ timeColumn: 0, currentColumn: 1, timeFormat: 'epoch-ms' });
  });

  it('when the file holds one column of values, then there is no time column (the sample rate gives the times)', () => {
    const p = buildPreview([['amps'], ['1.0'], ['1.1']], ',');
    expect(guessMapping(p)).toMatchObject({ timeColumn: null, currentColumn: 0 });
  });

  it('when one reading in the preview is not a number, then the column is still proposed (the server reports the line)', () => {
    const p = buildPreview(
      [
        ['Time', 'Current (A)'],
        ['2026-03-01T09:00:00Z', '1.0'],
        ['2026-03-01T09:00:01Z', '1.1'],
        ['2026-03-01T09:00:02Z', 'oops'],
        ['2026-03-01T09:00:03Z', '1.2'],
        ['2026-03-01T09:00:04Z', '1.3'],
      ],
      ',',
    );
    expect(guessMapping(p)).toMatchObject({ timeColumn: 0, currentColumn: 1 });
  });

  it('when a time is written with a space and milliseconds, then it counts as ISO', () => {
    expect(looksLikeIsoTime('2026-03-01 10:00:00.250')).toBe(true);
    expect(looksLikeIsoTime('10:00')).toBe(false);
  });
});
