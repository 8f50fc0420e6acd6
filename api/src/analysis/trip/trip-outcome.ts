/**
 * What a trip model says about a current profile:
 * - `will-not-trip`: below every limit the standard sets (the device must hold);
 * - `may-trip`: inside the band where the standard allows the device either to hold or to trip — the
 *   breaker maker's own curve decides;
 * - `will-trip`: beyond the point where the standard requires the device to have tripped.
 */
export type TripOutcome = 'will-not-trip' | 'may-trip' | 'will-trip';

const RANK: Record<TripOutcome, number> = { 'will-not-trip': 0, 'may-trip': 1, 'will-trip': 2 };

/** The worse (more likely to trip) of two outcomes. */
export function worseTripOutcome(a: TripOutcome, b: TripOutcome): TripOutcome {
  return RANK[a] >= RANK[b] ? a : b;
}

/** Orders outcomes from best to worst: negative when `a` is better than `b`, 0 when equal. */
export function compareTripOutcomes(a: TripOutcome, b: TripOutcome): number {
  return RANK[a] - RANK[b];
}
