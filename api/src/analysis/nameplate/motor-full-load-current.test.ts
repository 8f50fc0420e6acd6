import { describe, expect, it } from 'vitest';
import {
  NEC_TABLE_430_248,
  motorTableVoltageColumn,
  singlePhaseMotorFullLoadCurrent,
} from './motor-full-load-current.js';

describe('singlePhaseMotorFullLoadCurrent', () => {
  it('gives the NEC Table 430.248 worked values', () => {
    // source: NEC Table 430.248 (trade-facts.md 6.3, example 12)
    expect(singlePhaseMotorFullLoadCurrent(1, 115).fullLoadA).toBe(16);
    expect(singlePhaseMotorFullLoadCurrent(1, 230).fullLoadA).toBe(8.0);
    expect(singlePhaseMotorFullLoadCurrent(0.5, 115).fullLoadA).toBe(9.8);
    expect(singlePhaseMotorFullLoadCurrent(2, 230).fullLoadA).toBe(12);
    expect(singlePhaseMotorFullLoadCurrent(3, 230).fullLoadA).toBe(17);
    expect(singlePhaseMotorFullLoadCurrent(5, 230).fullLoadA).toBe(28);
  });

  it('holds every cell of the table', () => {
    // source: NEC Table 430.248 (trade-facts.md 3.9), row by row: 115 V, 200 V, 208 V, 230 V
    const expected: Array<[string, number, number, number, number]> = [
      ['1/6', 4.4, 2.5, 2.4, 2.2],
      ['1/4', 5.8, 3.3, 3.2, 2.9],
      ['1/3', 7.2, 4.1, 4.0, 3.6],
      ['1/2', 9.8, 5.6, 5.4, 4.9],
      ['3/4', 13.8, 7.9, 7.6, 6.9],
      ['1', 16, 9.2, 8.8, 8.0],
      ['1 1/2', 20, 11.5, 11.0, 10],
      ['2', 24, 13.8, 13.2, 12],
      ['3', 34, 19.6, 18.7, 17],
      ['5', 56, 32.2, 30.8, 28],
      ['7 1/2', 80, 46.0, 44.0, 40],
      ['10', 100, 57.5, 55.0, 50],
    ];
    expect(NEC_TABLE_430_248.map((r) => [r.hpLabel, r.fullLoadA[115], r.fullLoadA[200], r.fullLoadA[208], r.fullLoadA[230]])).toEqual(expected);
  });

  it('maps system voltages to the table columns per the table note', () => {
    // source: NEC Table 430.248 note (110–120 V and 220–240 V ranges)
    expect(motorTableVoltageColumn(120)).toBe(115);
    expect(motorTableVoltageColumn(110)).toBe(115);
    expect(motorTableVoltageColumn(240)).toBe(230);
    expect(motorTableVoltageColumn(208)).toBe(208);
    expect(motorTableVoltageColumn(200)).toBe(200);
    expect(singlePhaseMotorFullLoadCurrent(1, 120).tableVoltageV).toBe(115);
  });

  it('matches rounded fractional horsepower', () => {
    expect(singlePhaseMotorFullLoadCurrent(0.33, 115).hpLabel).toBe('1/3');
    expect(singlePhaseMotorFullLoadCurrent(0.75, 208).fullLoadA).toBe(7.6);
  });

  it('rejects sizes and voltages the table does not have', () => {
    expect(() => singlePhaseMotorFullLoadCurrent(0.6, 115)).toThrow(RangeError);
    expect(() => singlePhaseMotorFullLoadCurrent(15, 230)).toThrow(/not a size/);
    expect(() => singlePhaseMotorFullLoadCurrent(1, 277)).toThrow(/no column/);
    expect(() => singlePhaseMotorFullLoadCurrent(Number.NaN, 115)).toThrow(RangeError);
    expect(() => singlePhaseMotorFullLoadCurrent(1, -115)).toThrow(RangeError);
  });
});
