import { assertPositive } from '../validation/assert-input.js';

/**
 * Preferred values of rated current In of IEC 60898-1 circuit-breakers, amps: 6, 8, 10, 13, 16, 20, 25, 32,
 * 40, 50, 63, 80, 100, 125. Source: IEC 60898-1 clause 5.3.2 "preferred values of rated current" — from
 * memory (no public copy of the clause was found). Makers also sell other ratings (e.g. 1, 2, 3, 4 A); the
 * list is a preference of the standard, not a prohibition.
 */
export const IEC_60898_1_PREFERRED_RATINGS_A: readonly number[] = [6, 8, 10, 13, 16, 20, 25, 32, 40, 50, 63, 80, 100, 125];

/** True when `ratingA` (amps, > 0) is one of the IEC 60898-1 preferred rated currents. RangeError otherwise invalid. */
export function isIecPreferredRating(ratingA: number): boolean {
  assertPositive(ratingA, 'ratingA');
  return IEC_60898_1_PREFERRED_RATINGS_A.includes(ratingA);
}

/**
 * The preferred ratings either side of `ratingA` (amps): the largest not above it and the smallest not below
 * it, null beyond the ends of the list. For 15 A → { below: 13, above: 16 }.
 */
export function nearestIecPreferredRatings(ratingA: number): { below: number | null; above: number | null } {
  assertPositive(ratingA, 'ratingA');
  const below = [...IEC_60898_1_PREFERRED_RATINGS_A].reverse().find((r) => r <= ratingA) ?? null;
  const above = IEC_60898_1_PREFERRED_RATINGS_A.find((r) => r >= ratingA) ?? null;
  return { below, above };
}
