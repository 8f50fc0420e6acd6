import { describe, expect, it } from 'vitest';
import { NEC_TABLE_430_7_B, lockedRotorCurrentRange } from './locked-rotor-current.js';

describe('lockedRotorCurrentRange', () => {
  it('reproduces the worked examples', () => {
    // source: NEC Table 430.7(B) with LRA = kVA/hp × hp × 1000 / V (trade-facts.md 6.3, example 14, derived)
    const g = lockedRotorCurrentRange('G', 1, 115);
    expect(g.minA).toBeCloseTo(48.7, 1);
    expect(g.maxA).toBeCloseTo(54.7, 1);
    const k = lockedRotorCurrentRange('K', 1, 115);
    expect(k.minA).toBeCloseTo(69.6, 1);
    expect(k.maxA).toBeCloseTo(78.2, 1);
    const j = lockedRotorCurrentRange('j', 0.5, 115);
    expect(j.minA).toBeCloseTo(30.9, 1);
    expect(j.maxA).toBeCloseTo(34.7, 1);
    const h = lockedRotorCurrentRange('H', 2, 230);
    expect(h.minA).toBeCloseTo(54.8, 1);
    expect(h.maxA).toBeCloseTo(61.7, 1);
  });

  it('holds the table bands', () => {
    // source: NEC Table 430.7(B) (trade-facts.md 3.9)
    expect(NEC_TABLE_430_7_B.A).toEqual({ minKvaPerHp: 0, maxKvaPerHp: 3.14 });
    expect(NEC_TABLE_430_7_B.B).toEqual({ minKvaPerHp: 3.15, maxKvaPerHp: 3.54 });
    expect(NEC_TABLE_430_7_B.M).toEqual({ minKvaPerHp: 10.0, maxKvaPerHp: 11.19 });
    expect(NEC_TABLE_430_7_B.U).toEqual({ minKvaPerHp: 20.0, maxKvaPerHp: 22.39 });
    expect(NEC_TABLE_430_7_B.V).toEqual({ minKvaPerHp: 22.4, maxKvaPerHp: null });
    expect(Object.keys(NEC_TABLE_430_7_B)).toHaveLength(19);
  });

  it('has contiguous bands (each letter starts 0.01 kVA/hp after the previous ends)', () => {
    // source: NEC Table 430.7(B) — bands are printed to two decimals without overlap
    const bands = Object.values(NEC_TABLE_430_7_B);
    for (let i = 1; i < bands.length; i++) {
      expect(bands[i]!.minKvaPerHp - bands[i - 1]!.maxKvaPerHp!).toBeCloseTo(0.01, 9);
    }
  });

  it('divides by √3 for three-phase motors', () => {
    // derived: three-phase S = √3 · V · I
    const one = lockedRotorCurrentRange('F', 5, 230, 1);
    const three = lockedRotorCurrentRange('F', 5, 230, 3);
    expect(three.minA * Math.sqrt(3)).toBeCloseTo(one.minA, 9);
  });

  it('gives an open upper end for letter V', () => {
    expect(lockedRotorCurrentRange('V', 1, 115).maxA).toBeNull();
  });

  it('rejects unknown letters and bad numbers', () => {
    for (const bad of ['I', 'O', 'Q', 'W', '', 'GG']) {
      expect(() => lockedRotorCurrentRange(bad, 1, 115)).toThrow(RangeError);
    }
    expect(() => lockedRotorCurrentRange('G', 0, 115)).toThrow(/hp/);
    expect(() => lockedRotorCurrentRange('G', 1, Number.POSITIVE_INFINITY)).toThrow(/voltageV/);
  });
});
