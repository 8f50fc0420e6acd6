import { describe, expect, it } from 'vitest';
import {
  checkContinuousLoadConductor,
  checkContinuousLoadDevice,
  minimumStandardDeviceA,
  requiredRatingForLoadA,
} from './continuous-load.js';

describe('NEC 210.19(A) / 210.20(A) continuous loads', () => {
  // source: NEC 210.20(A) + 240.6(A) (trade-facts 6.2 example 8): 16 A continuous → 20 A; 17 A → 21.25 A → 25 A
  it('sizes the device at 125 % of the continuous load and rounds up to a standard size', () => {
    expect(requiredRatingForLoadA(16, 0)).toBe(20);
    expect(minimumStandardDeviceA(16, 0)).toBe(20);
    expect(requiredRatingForLoadA(17, 0)).toBeCloseTo(21.25, 12);
    expect(minimumStandardDeviceA(17, 0)).toBe(25);
  });

  // source: NEC 210.20(A) — noncontinuous + 125 % of continuous, verified
  it('adds the noncontinuous load at 100 %', () => {
    expect(requiredRatingForLoadA(8, 6)).toBe(16);
    expect(checkContinuousLoadDevice(15, 8, 6, 2023).passed).toBe(false);
    expect(checkContinuousLoadDevice(20, 8, 6, 2023).passed).toBe(true);
  });

  it('passes 16 A continuous on a 20 A device and fails 17 A, naming 210.20(A) and the edition', () => {
    const ok = checkContinuousLoadDevice(20, 16, 0, 2023);
    expect(ok).toMatchObject({
      passed: true,
      limitA: 20,
      actualA: 20,
      citation: { edition: 2023, section: '210.20(A)' },
    });
    const over = checkContinuousLoadDevice(20, 17, 0, 2020);
    expect(over.passed).toBe(false);
    expect(over.citation.edition).toBe(2020);
    expect(over.message).toMatch(/25 A/);
  });

  // source: NEC 2020 210.19(A)(1)(a) / 2023 210.19(A)(1) (sub-number from memory): 17 A continuous needs 21.25 A ampacity
  it('checks conductor ampacity with the edition-specific clause', () => {
    const result = checkContinuousLoadConductor(20, 17, 0, 2023);
    expect(result.passed).toBe(false);
    expect(result.citation.section).toBe('210.19(A)(1)');
    expect(checkContinuousLoadConductor(30, 17, 0, 2020).citation.section).toBe('210.19(A)(1)(a)');
  });

  it('rejects bad figures', () => {
    expect(() => requiredRatingForLoadA(-1, 0)).toThrow(RangeError);
    expect(() => checkContinuousLoadDevice(Number.POSITIVE_INFINITY, 1, 0, 2023)).toThrow(RangeError);
  });
});
