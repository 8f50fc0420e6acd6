import { nextStandardRating } from './standard-ratings.js';
import { assertPositive } from '../validation/assert-input.js';

/**
 * Conductor sizing factor for a single continuous-duty motor: 125 % of the table full-load current.
 * Source: NEC 430.22 (2020, 2023). verified.
 */
export const MOTOR_CONDUCTOR_FACTOR = 1.25;

/**
 * Minimum conductor ampacity in amps for one continuous-duty motor, NEC 430.22: 1.25 × `tableFlcA`, where
 * `tableFlcA` is the full-load current from Tables 430.247–430.250 (430.6(A)(1)), not the nameplate.
 * Example: 1 hp, 115 V single-phase, 16 A → 20 A.
 */
export function motorConductorAmpacityA(tableFlcA: number): number {
  assertPositive(tableFlcA, 'tableFlcA');
  return MOTOR_CONDUCTOR_FACTOR * tableFlcA;
}

/** Branch-circuit short-circuit and ground-fault protective device types of NEC Table 430.52. */
export type MotorProtectiveDevice =
  'non-time-delay-fuse' | 'dual-element-fuse' | 'instantaneous-trip-breaker' | 'inverse-time-breaker';

/**
 * NEC Table 430.52 percentages of full-load current for single-phase motors and squirrel-cage motors other
 * than Design B energy-efficient: non-time-delay fuse 300 %, dual-element (time-delay) fuse 175 %,
 * instantaneous-trip breaker 800 %, inverse-time breaker 250 %. verified (2008 and 2011 text).
 */
export const TABLE_430_52_PERCENT: Readonly<Record<MotorProtectiveDevice, number>> = {
  'non-time-delay-fuse': 300,
  'dual-element-fuse': 175,
  'instantaneous-trip-breaker': 800,
  'inverse-time-breaker': 250,
};

/** Result of {@link motorMaxOcpdA}: the percentage limit and the device permitted by the next-size rule. */
export interface MotorOcpdLimit {
  /** Table 430.52 percentage × full-load current, amps. */
  percentLimitA: number;
  /** Largest device permitted: the limit itself when standard, else the next standard size, amps. */
  permittedDeviceA: number;
  /** True when Exception No. 1 (next higher standard size) was used. */
  roundedUp: boolean;
}

/**
 * Largest motor branch-circuit short-circuit and ground-fault device for a single-phase motor, NEC Table
 * 430.52 with 430.52(C)(1) Exception No. 1 (next higher standard size permitted when the percentage gives
 * no standard size). Exception No. 2 (raising for motors that will not start) is not applied.
 * Example (1 hp, 115 V, 16 A): inverse-time breaker 40 A; dual-element fuse 28 A → 30 A;
 * non-time-delay fuse 48 A → 50 A. An instantaneous-trip breaker is only allowed as part of a listed
 * combination controller (430.52(C)(3)).
 */
export function motorMaxOcpdA(tableFlcA: number, device: MotorProtectiveDevice): MotorOcpdLimit {
  assertPositive(tableFlcA, 'tableFlcA');
  const percent = TABLE_430_52_PERCENT[device];
  if (percent === undefined)
    throw new RangeError(`device must be one of ${Object.keys(TABLE_430_52_PERCENT).join(', ')}`);
  const percentLimitA = (tableFlcA * percent) / 100;
  const listKind = device.endsWith('fuse') ? 'fuse' : 'breaker';
  const next = nextStandardRating(percentLimitA, listKind);
  if (next === null) throw new RangeError(`tableFlcA ${tableFlcA} A needs a device above 6000 A`);
  return { percentLimitA, permittedDeviceA: next, roundedUp: Math.abs(next - percentLimitA) > 1e-9 };
}

/**
 * Largest short-circuit and ground-fault device for a single hermetic motor-compressor, NEC 440.22(A):
 * 175 % of the rated-load current or the branch-circuit selection current, whichever is greater (may be
 * raised to 225 % where needed for starting — `forStarting`). Example: RLA 38 A, BCSC 40 A → 70 A.
 * verified (2005 and 2023 summaries). Returns the percentage limit in amps; 440.22(A) permits the next
 * standard size only within the limits it states, so no rounding is applied here.
 */
export function compressorMaxOcpdA(ratedLoadA: number, branchCircuitSelectionA?: number, forStarting = false): number {
  assertPositive(ratedLoadA, 'ratedLoadA');
  if (branchCircuitSelectionA !== undefined) assertPositive(branchCircuitSelectionA, 'branchCircuitSelectionA');
  const basis = Math.max(ratedLoadA, branchCircuitSelectionA ?? 0);
  return basis * (forStarting ? 2.25 : 1.75);
}
