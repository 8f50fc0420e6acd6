/**
 * Watts <-> amperes for a single-phase load at a voltage and power factor.
 *
 * Definition: active power P = V · I · PF (W), with V and I RMS values and PF the power factor
 * (1 for a resistive load). Apparent power S = V · I (VA). Source: IEEE Std 1459-2010 definitions of
 * active and apparent power and power factor (trade-facts.md 4.4); "watts = volts × amps" for
 * resistive loads is common practice.
 */

import { assertFiniteNumber, assertInRange, assertPositive } from '../validation/assert-input.js';

/** Power factor used when none is given: 1 (a resistive load). Stated in every output that uses it. */
export const DEFAULT_POWER_FACTOR = 1;

function assertPowerFactor(powerFactor: number): void {
  assertInRange(powerFactor, Number.MIN_VALUE, 1, 'powerFactor');
}

/**
 * Active power (W) of a single-phase load drawing `amps` (RMS, A) at `volts` (RMS, V) with
 * power factor `powerFactor` (0 < PF ≤ 1, default 1): P = V · I · PF.
 * Example: 11.5 A at 120 V, PF 1 → 1380 W.
 */
export function wattsFromAmps(amps: number, volts: number, powerFactor: number = DEFAULT_POWER_FACTOR): number {
  assertFiniteNumber(amps, 'amps');
  assertPositive(volts, 'volts');
  assertPowerFactor(powerFactor);
  return amps * volts * powerFactor;
}

/**
 * RMS current (A) of a single-phase load of `watts` active power (W) at `volts` (RMS, V) with
 * power factor `powerFactor` (0 < PF ≤ 1, default 1): I = P / (V · PF).
 * Example: 1500 W at 120 V → 12.5 A; 3 kW at 230 V, PF 0.9 → 14.49 A.
 */
export function ampsFromWatts(watts: number, volts: number, powerFactor: number = DEFAULT_POWER_FACTOR): number {
  assertFiniteNumber(watts, 'watts');
  assertPositive(volts, 'volts');
  assertPowerFactor(powerFactor);
  return watts / (volts * powerFactor);
}

/** Apparent power (VA) of a load drawing `amps` (RMS, A) at `volts` (RMS, V): S = V · I. */
export function voltAmperes(amps: number, volts: number): number {
  assertFiniteNumber(amps, 'amps');
  assertPositive(volts, 'volts');
  return amps * volts;
}
