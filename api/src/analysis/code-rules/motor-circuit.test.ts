import { describe, expect, it } from 'vitest';
import { compressorMaxOcpdA, motorConductorAmpacityA, motorMaxOcpdA } from './motor-circuit.js';

describe('NEC 430.22 / 430.52 / 440.22(A)', () => {
  // source: trade-facts 6.3 example 13 (Table 430.248 FLC 16 A for 1 hp 115 V; 430.22; Table 430.52; 430.52 Ex. 1)
  it('1 hp, 115 V motor (16 A): conductors 20 A, inverse-time breaker 40 A, fuses 30 A and 50 A', () => {
    expect(motorConductorAmpacityA(16)).toBe(20);
    expect(motorMaxOcpdA(16, 'inverse-time-breaker')).toEqual({
      percentLimitA: 40,
      permittedDeviceA: 40,
      roundedUp: false,
    });
    expect(motorMaxOcpdA(16, 'dual-element-fuse')).toEqual({
      percentLimitA: 28,
      permittedDeviceA: 30,
      roundedUp: true,
    });
    expect(motorMaxOcpdA(16, 'non-time-delay-fuse')).toEqual({
      percentLimitA: 48,
      permittedDeviceA: 50,
      roundedUp: true,
    });
    expect(motorMaxOcpdA(16, 'instantaneous-trip-breaker').percentLimitA).toBe(128);
  });

  // source: EC&M Code Quiz, 2005 NEC (trade-facts 6.2 example 10): RLA 38 A, BCSC 40 A → 40 × 1.75 = 70 A
  it('hermetic compressor: 175 % of the larger of RLA and BCSC', () => {
    expect(compressorMaxOcpdA(38, 40)).toBeCloseTo(70, 12);
    expect(compressorMaxOcpdA(38, 40, true)).toBeCloseTo(90, 12);
    expect(() => compressorMaxOcpdA(-1)).toThrow(RangeError);
  });
});
