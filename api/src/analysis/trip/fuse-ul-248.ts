import type { Citation } from '../code-rules/citation.js';
import { fitThermalFamily, type ThermalFamily, type ThermalTestPoint } from './thermal-family.js';

/** Largest rating of the time-delay fuse profile, amps: the 8 s at 5 × point is known only up to 30 A. */
export const UL_248_TIME_DELAY_MAX_RATING_A = 30;

/**
 * Test points of a 250 V time-delay (dual-element) branch-circuit fuse of ≤ 30 A:
 * - carries 100 % of its rating (UL 248-1; from memory for branch-circuit classes);
 * - opens at 135 % within 1 h (UL 248-1 Table 4, from memory; the same figure is verified for UL 248-14
 *   supplementary fuses);
 * - opens at 200 % within 2 min (≤ 30 A, 250 V; UL 248-1 Table 4, from memory);
 * - takes at least 8 s to open at 500 % (UL 248-9:2015 clause 8.3, Class K time-delay, ≤ 30 A, 250 V; verified).
 */
export function ul248TimeDelayTestPoints(ratingA: number): {
  hold: ThermalTestPoint;
  notBefore: ThermalTestPoint;
  tripWithinLow: ThermalTestPoint;
  tripWithinHigh: ThermalTestPoint;
} {
  if (!(Number.isFinite(ratingA) && ratingA > 0 && ratingA <= UL_248_TIME_DELAY_MAX_RATING_A)) {
    throw new RangeError(
      `ratingA must be > 0 and ≤ ${UL_248_TIME_DELAY_MAX_RATING_A} A for the time-delay fuse profile`,
    );
  }
  const table4: Citation = {
    code: 'UL 248-1',
    edition: 'unknown',
    section: 'Table 4 (overload tests)',
    tag: 'from memory',
  };
  return {
    hold: { requirement: 'hold', multiple: 1, timeS: Infinity, initialMultiple: 0, citation: table4 },
    notBefore: {
      requirement: 'trip-not-before',
      multiple: 5,
      timeS: 8,
      initialMultiple: 0,
      citation: { code: 'UL 248-9', edition: 2015, section: '8.3 (time-delay, 250 V, ≤ 30 A)', tag: 'verified' },
    },
    tripWithinLow: { requirement: 'trip-within', multiple: 1.35, timeS: 3600, initialMultiple: 0, citation: table4 },
    tripWithinHigh: { requirement: 'trip-within', multiple: 2, timeS: 120, initialMultiple: 0, citation: table4 },
  };
}

/**
 * Thermal family of a ≤ 30 A, 250 V time-delay fuse through {@link ul248TimeDelayTestPoints}. A fuse has
 * no separate instantaneous element: its melting characteristic is one curve, modelled here by the same
 * first-order family (which tends to constant I²t at high current, as a fuse element does). The fuse
 * maker's curve governs.
 */
export function ul248TimeDelayThermalFamily(ratingA: number): ThermalFamily {
  return fitThermalFamily(ul248TimeDelayTestPoints(ratingA));
}
