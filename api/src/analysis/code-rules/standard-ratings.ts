import { assertNonNegative } from '../validation/assert-input.js';

/**
 * Standard ampere ratings of fuses and inverse-time circuit breakers, NEC 240.6(A) (2020 and 2023 editions,
 * unchanged between them). Source: NFPA 70 240.6(A); values verified (trade-facts section 2).
 */
export const NEC_STANDARD_RATINGS_A: readonly number[] = [
  15, 20, 25, 30, 35, 40, 45, 50, 60, 70, 80, 90, 100, 110, 125, 150, 175, 200, 225, 250, 300, 350, 400, 450, 500, 600,
  700, 800, 1000, 1200, 1600, 2000, 2500, 3000, 4000, 5000, 6000,
];

/** Additional standard ratings for fuses only, NEC 240.6(A): 1, 3, 6 and 10 A. verified. */
export const NEC_ADDITIONAL_FUSE_RATINGS_A: readonly number[] = [1, 3, 6, 10];

/** Which list of 240.6(A) to use: breakers use the main list; fuses add 1, 3, 6 and 10 A. */
export type RatingListKind = 'breaker' | 'fuse';

function ratingsFor(kind: RatingListKind): readonly number[] {
  return kind === 'fuse' ? [...NEC_ADDITIONAL_FUSE_RATINGS_A, ...NEC_STANDARD_RATINGS_A] : NEC_STANDARD_RATINGS_A;
}

/** True when `ratingA` is one of the NEC 240.6(A) standard ratings for `kind` (default `breaker`). */
export function isStandardRating(ratingA: number, kind: RatingListKind = 'breaker'): boolean {
  return ratingsFor(kind).includes(ratingA);
}

/**
 * The smallest NEC 240.6(A) standard rating that is not less than `requiredA` (amps): "the next standard
 * size", used where a code rule permits rounding up (e.g. 430.52 Exception No. 1, 422.11(E)(3)) and to
 * state the minimum device for a required rating (e.g. 21.25 A required → 25 A).
 * Returns null above 6000 A. RangeError for a negative or non-finite input.
 */
export function nextStandardRating(requiredA: number, kind: RatingListKind = 'breaker'): number | null {
  assertNonNegative(requiredA, 'requiredA');
  // A tiny tolerance so that 16 × 1.25 = 20.000000000000004 style rounding does not skip a size.
  const tolerance = 1e-9 * Math.max(1, requiredA);
  for (const rating of ratingsFor(kind)) {
    if (rating >= requiredA - tolerance) return rating;
  }
  return null;
}

/**
 * The largest NEC 240.6(A) standard rating that does not exceed `limitA` (amps), for rules that set a
 * ceiling without permitting rounding up. Returns null when even the smallest rating is above the limit.
 */
export function largestStandardRatingNotAbove(limitA: number, kind: RatingListKind = 'breaker'): number | null {
  assertNonNegative(limitA, 'limitA');
  const tolerance = 1e-9 * Math.max(1, limitA);
  let best: number | null = null;
  for (const rating of ratingsFor(kind)) {
    if (rating <= limitA + tolerance) best = rating;
  }
  return best;
}
