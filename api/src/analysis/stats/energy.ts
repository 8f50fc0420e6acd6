/**
 * Charge and energy from the time integral of current.
 *
 * Definitions: charge Q = ∫ i dt, reported in ampere-hours (1 A·h = 3600 A·s). Energy at a constant
 * RMS voltage V and power factor PF: E = V · PF · ∫ I dt, reported in kilowatt-hours
 * (1 kWh = 3.6e6 J), i.e. active power P = V · I · PF integrated over time. The voltage is the
 * circuit's nominal voltage (not measured) and PF defaults to 1 (resistive load); both are stated
 * in every output. Source: IEEE Std 1459-2010 definition of active power (trade-facts.md 4.4);
 * unit conversions SI.
 */

import { assertFiniteNumber, assertInRange, assertPositive } from '../validation/assert-input.js';

/** Seconds per hour. */
const SECONDS_PER_HOUR = 3600;

/** Charge (A·h) from ∫ i dt in A·s. */
export function chargeAhFromIntegral(integralAs: number): number {
  assertFiniteNumber(integralAs, 'integralAs');
  return integralAs / SECONDS_PER_HOUR;
}

/**
 * Energy (kWh) from ∫ I dt in A·s at `voltageV` (RMS, V, > 0) and `powerFactor` (0 < PF ≤ 1):
 * E = V · PF · ∫ I dt / 3.6e6. Example: 12.5 A for 2 h at 120 V, PF 1 → 3.0 kWh.
 */
export function energyKWhFromIntegral(integralAs: number, voltageV: number, powerFactor: number): number {
  assertFiniteNumber(integralAs, 'integralAs');
  assertPositive(voltageV, 'voltageV');
  assertInRange(powerFactor, Number.MIN_VALUE, 1, 'powerFactor');
  return (integralAs * voltageV * powerFactor) / (SECONDS_PER_HOUR * 1000);
}
