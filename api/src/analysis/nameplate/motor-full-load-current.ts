/**
 * Full-load current of single-phase AC motors from NEC Table 430.248.
 *
 * Source: NFPA 70 (National Electrical Code) Table 430.248 "Full-Load Currents in Amperes,
 * Single-Phase Alternating-Current Motors", identical in the 2020 and 2023 editions (and in 1999 as
 * Table 430-148). The table's note permits the 115 V column for system voltages of 110–120 V and the
 * 230 V column for 220–240 V. NEC 430.6(A)(1) says to use these table currents, not the nameplate,
 * for sizing conductors and short-circuit/ground-fault protection; the nameplate current is for
 * overload protection. Low-speed, high-torque and multispeed motors use the nameplate instead.
 */

import { assertPositive } from '../validation/assert-input.js';

/** The voltage columns of NEC Table 430.248, in volts. */
export type MotorTableVoltageV = 115 | 200 | 208 | 230;

/** One row of NEC Table 430.248: horsepower and full-load current (A) per voltage column. */
export interface SinglePhaseMotorRow {
  /** Rated horsepower as a number (1/3 hp is 0.3333…). */
  hp: number;
  /** The horsepower as the table prints it ("1/3", "1 1/2"). */
  hpLabel: string;
  /** Full-load current in amperes for each voltage column. */
  fullLoadA: Readonly<Record<MotorTableVoltageV, number>>;
}

/**
 * NEC Table 430.248, single-phase AC motors, full-load current in amperes.
 * Source: NFPA 70 Table 430.248 (2020, 2023 editions).
 */
export const NEC_TABLE_430_248: readonly SinglePhaseMotorRow[] = Object.freeze([
  { hp: 1 / 6, hpLabel: '1/6', fullLoadA: { 115: 4.4, 200: 2.5, 208: 2.4, 230: 2.2 } },
  { hp: 1 / 4, hpLabel: '1/4', fullLoadA: { 115: 5.8, 200: 3.3, 208: 3.2, 230: 2.9 } },
  { hp: 1 / 3, hpLabel: '1/3', fullLoadA: { 115: 7.2, 200: 4.1, 208: 4.0, 230: 3.6 } },
  { hp: 1 / 2, hpLabel: '1/2', fullLoadA: { 115: 9.8, 200: 5.6, 208: 5.4, 230: 4.9 } },
  { hp: 3 / 4, hpLabel: '3/4', fullLoadA: { 115: 13.8, 200: 7.9, 208: 7.6, 230: 6.9 } },
  { hp: 1, hpLabel: '1', fullLoadA: { 115: 16, 200: 9.2, 208: 8.8, 230: 8.0 } },
  { hp: 1.5, hpLabel: '1 1/2', fullLoadA: { 115: 20, 200: 11.5, 208: 11.0, 230: 10 } },
  { hp: 2, hpLabel: '2', fullLoadA: { 115: 24, 200: 13.8, 208: 13.2, 230: 12 } },
  { hp: 3, hpLabel: '3', fullLoadA: { 115: 34, 200: 19.6, 208: 18.7, 230: 17 } },
  { hp: 5, hpLabel: '5', fullLoadA: { 115: 56, 200: 32.2, 208: 30.8, 230: 28 } },
  { hp: 7.5, hpLabel: '7 1/2', fullLoadA: { 115: 80, 200: 46.0, 208: 44.0, 230: 40 } },
  { hp: 10, hpLabel: '10', fullLoadA: { 115: 100, 200: 57.5, 208: 55.0, 230: 50 } },
]);

/**
 * How close (in hp) a requested horsepower must be to a table row to match it, so that 0.33 finds
 * the 1/3 hp row and 0.17 the 1/6 hp row. Source: our design choice.
 */
export const HORSEPOWER_MATCH_TOLERANCE = 0.005;

/** Result of a Table 430.248 lookup. */
export interface MotorFullLoadCurrent {
  /** Table full-load current, amperes. */
  fullLoadA: number;
  /** The table row's horsepower. */
  hp: number;
  /** The table row's horsepower as printed. */
  hpLabel: string;
  /** The voltage column used, volts. */
  tableVoltageV: MotorTableVoltageV;
  /** Where the figure comes from. */
  source: string;
}

/**
 * Picks the Table 430.248 voltage column for a system or motor voltage: 110–120 V → 115 V column,
 * 200 V → 200 V, 208 V → 208 V, 220–240 V → 230 V (per the table's note). Any other voltage is a
 * RangeError: the table has no column for it.
 */
export function motorTableVoltageColumn(voltageV: number): MotorTableVoltageV {
  assertPositive(voltageV, 'voltageV');
  if (voltageV >= 110 && voltageV <= 120) return 115;
  if (voltageV === 200) return 200;
  if (voltageV === 208) return 208;
  if (voltageV >= 220 && voltageV <= 240) return 230;
  throw new RangeError(
    `voltageV ${voltageV} has no column in NEC Table 430.248 (use 110–120, 200, 208 or 220–240 V)`,
  );
}

/**
 * Full-load current (A) of a single-phase AC motor of `hp` horsepower at `voltageV`, from NEC
 * Table 430.248. No interpolation: a horsepower that is not a table row (within
 * HORSEPOWER_MATCH_TOLERANCE) is a RangeError, as is a voltage without a column.
 * Example: 1 hp at 115 V → 16 A; at 230 V → 8.0 A. Source: NFPA 70 Table 430.248.
 */
export function singlePhaseMotorFullLoadCurrent(hp: number, voltageV: number): MotorFullLoadCurrent {
  assertPositive(hp, 'hp');
  const column = motorTableVoltageColumn(voltageV);
  const row = NEC_TABLE_430_248.find((r) => Math.abs(r.hp - hp) <= HORSEPOWER_MATCH_TOLERANCE);
  if (!row) {
    const sizes = NEC_TABLE_430_248.map((r) => r.hpLabel).join(', ');
    throw new RangeError(`hp ${hp} is not a size in NEC Table 430.248 (${sizes} hp)`);
  }
  return {
    fullLoadA: row.fullLoadA[column],
    hp: row.hp,
    hpLabel: row.hpLabel,
    tableVoltageV: column,
    source: 'NEC (NFPA 70) Table 430.248, 2020/2023 editions',
  };
}
