/**
 * Expected locked-rotor current of a motor from its NEC code letter.
 *
 * Source: NFPA 70 (National Electrical Code) 430.7(B) and Table 430.7(B) "Locked-Rotor Indicating
 * Code Letters", which give kilovolt-amperes per horsepower with locked rotor for each letter
 * (2020 and 2023 editions). Letters I, O and Q are not used. The current follows from the
 * definition of apparent power (derived): single-phase LRA = kVA/hp × hp × 1000 / V; three-phase
 * divide also by √3.
 */

import { assertPositive } from '../validation/assert-input.js';

/** A code letter of NEC Table 430.7(B). */
export type LockedRotorCodeLetter =
  | 'A' | 'B' | 'C' | 'D' | 'E' | 'F' | 'G' | 'H' | 'J' | 'K' | 'L'
  | 'M' | 'N' | 'P' | 'R' | 'S' | 'T' | 'U' | 'V';

/** The kVA-per-horsepower band of one code letter (`maxKvaPerHp` null: "and up"). */
export interface KvaPerHpBand {
  minKvaPerHp: number;
  maxKvaPerHp: number | null;
}

/**
 * NEC Table 430.7(B): kilovolt-amperes per horsepower with locked rotor, by code letter.
 * Source: NFPA 70 Table 430.7(B) (2020, 2023 editions).
 */
export const NEC_TABLE_430_7_B: Readonly<Record<LockedRotorCodeLetter, KvaPerHpBand>> = Object.freeze({
  A: { minKvaPerHp: 0, maxKvaPerHp: 3.14 },
  B: { minKvaPerHp: 3.15, maxKvaPerHp: 3.54 },
  C: { minKvaPerHp: 3.55, maxKvaPerHp: 3.99 },
  D: { minKvaPerHp: 4.0, maxKvaPerHp: 4.49 },
  E: { minKvaPerHp: 4.5, maxKvaPerHp: 4.99 },
  F: { minKvaPerHp: 5.0, maxKvaPerHp: 5.59 },
  G: { minKvaPerHp: 5.6, maxKvaPerHp: 6.29 },
  H: { minKvaPerHp: 6.3, maxKvaPerHp: 7.09 },
  J: { minKvaPerHp: 7.1, maxKvaPerHp: 7.99 },
  K: { minKvaPerHp: 8.0, maxKvaPerHp: 8.99 },
  L: { minKvaPerHp: 9.0, maxKvaPerHp: 9.99 },
  M: { minKvaPerHp: 10.0, maxKvaPerHp: 11.19 },
  N: { minKvaPerHp: 11.2, maxKvaPerHp: 12.49 },
  P: { minKvaPerHp: 12.5, maxKvaPerHp: 13.99 },
  R: { minKvaPerHp: 14.0, maxKvaPerHp: 15.99 },
  S: { minKvaPerHp: 16.0, maxKvaPerHp: 17.99 },
  T: { minKvaPerHp: 18.0, maxKvaPerHp: 19.99 },
  U: { minKvaPerHp: 20.0, maxKvaPerHp: 22.39 },
  V: { minKvaPerHp: 22.4, maxKvaPerHp: null },
});

/** Expected locked-rotor current range for a motor. */
export interface LockedRotorCurrentRange {
  /** Lower end of the expected locked-rotor current, amperes. */
  minA: number;
  /** Upper end, amperes; null for letter V ("22.4 kVA/hp and up"). */
  maxA: number | null;
  /** The letter's kVA/hp band used. */
  minKvaPerHp: number;
  maxKvaPerHp: number | null;
  codeLetter: LockedRotorCodeLetter;
  hp: number;
  voltageV: number;
  phases: 1 | 3;
  source: string;
}

/** True when `letter` is a code letter of NEC Table 430.7(B) (upper case; I, O, Q are not). */
export function isLockedRotorCodeLetter(letter: string): letter is LockedRotorCodeLetter {
  return Object.prototype.hasOwnProperty.call(NEC_TABLE_430_7_B, letter);
}

/**
 * Expected locked-rotor current (A) of a motor of `hp` horsepower rated `voltageV`, from its NEC
 * code letter: LRA = kVA/hp × hp × 1000 / V for single phase, and / (√3 · V) for three phase,
 * evaluated at both ends of the letter's band. The letter is matched case-insensitively.
 * Example: 1 hp, 115 V, code G → 48.7–54.7 A. Source: NFPA 70 Table 430.7(B); formula derived.
 */
export function lockedRotorCurrentRange(
  codeLetter: string,
  hp: number,
  voltageV: number,
  phases: 1 | 3 = 1,
): LockedRotorCurrentRange {
  const letter = typeof codeLetter === 'string' ? codeLetter.trim().toUpperCase() : '';
  if (!isLockedRotorCodeLetter(letter)) {
    throw new RangeError(
      `codeLetter "${String(codeLetter)}" is not a code letter of NEC Table 430.7(B) (A–V without I, O, Q)`,
    );
  }
  assertPositive(hp, 'hp');
  assertPositive(voltageV, 'voltageV');
  if (phases !== 1 && phases !== 3) throw new RangeError(`phases must be 1 or 3 (got ${String(phases)})`);
  const band = NEC_TABLE_430_7_B[letter];
  const voltAmpsPerAmp = phases === 1 ? voltageV : Math.sqrt(3) * voltageV;
  const toAmps = (kvaPerHp: number): number => (kvaPerHp * hp * 1000) / voltAmpsPerAmp;
  return {
    minA: toAmps(band.minKvaPerHp),
    maxA: band.maxKvaPerHp === null ? null : toAmps(band.maxKvaPerHp),
    minKvaPerHp: band.minKvaPerHp,
    maxKvaPerHp: band.maxKvaPerHp,
    codeLetter: letter,
    hp,
    voltageV,
    phases,
    source: 'NEC (NFPA 70) Table 430.7(B), 2020/2023 editions; LRA = kVA/hp × hp × 1000 / V (derived)',
  };
}
