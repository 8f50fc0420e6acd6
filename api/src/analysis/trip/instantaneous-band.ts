import type { Citation } from '../code-rules/citation.js';
import type { TripOutcome } from './trip-outcome.js';

/**
 * The instantaneous (magnetic) trip band of a breaker, in multiples of its rated current In:
 * - at or below `noTripMultiple` × In the breaker must not trip instantaneously;
 * - at or above `tripMultiple` × In it must trip instantaneously;
 * - in between it may do either (the maker's curve decides).
 * `typicalMultiple`, when given, is a commonly quoted single figure inside the band (not a limit).
 * IEC 60898-1 tests the band from cold with the current held for 0.1 s.
 */
export interface InstantaneousBand {
  noTripMultiple: number;
  tripMultiple: number;
  typicalMultiple?: number;
  citation: Citation;
}

/**
 * What the current compared with the band is:
 * - `half-cycle-rms`: one-cycle RMS refreshed every half cycle (IEC 61000-4-30 method applied to current),
 *   the basis the band is stated in;
 * - `peak-over-root-2`: instantaneous peak divided by √2 (equals RMS for a sine; overstates a short spike);
 * - `sample-rms`: RMS over the logger's own interval (0.05 s and longer) — understates sub-interval peaks.
 */
export type InstantaneousBasis = 'half-cycle-rms' | 'peak-over-root-2' | 'sample-rms';

/** Result of {@link assessInstantaneous}. */
export interface InstantaneousAssessment {
  outcome: TripOutcome;
  /** The current compared with the band, amps, and what it is. */
  currentA: number;
  basis: InstantaneousBasis;
  /** Band edges in amps: `noTripMultiple × In` and `tripMultiple × In`. */
  noTripA: number;
  tripA: number;
  /** `currentA / noTripA` and `currentA / tripA`: below 1 means under that edge. */
  ratioToNoTripEdge: number;
  ratioToTripEdge: number;
  /** Amps left below the no-trip edge (negative when above it). */
  marginA: number;
  /** `currentA / In`. */
  multipleOfRating: number;
}

/** Throws RangeError unless the band is well formed (0 < noTrip < trip, finite). */
export function assertInstantaneousBand(band: InstantaneousBand): void {
  const { noTripMultiple, tripMultiple } = band;
  if (!(
    Number.isFinite(noTripMultiple) &&
    Number.isFinite(tripMultiple) &&
    noTripMultiple > 0 &&
    tripMultiple > noTripMultiple
  )) {
    throw new RangeError('instantaneous band needs finite multiples with 0 < noTripMultiple < tripMultiple');
  }
}

/**
 * Compares the worst current `currentA` (amps, on the stated `basis`) with the instantaneous band of a
 * breaker rated `ratingA`: `will-not-trip` at or below the no-trip edge, `will-trip` at or above the trip
 * edge, `may-trip` strictly between. Example: C16 (5–10 In) → 80 A will not trip, 80.1 A may trip,
 * 160 A will trip. Source of the bands: IEC 60898-1 (see iec-60898-1.ts) or the North-American profile
 * (see ul-489.ts). RangeError for a non-positive rating or a negative/non-finite current.
 */
export function assessInstantaneous(
  band: InstantaneousBand,
  ratingA: number,
  currentA: number,
  basis: InstantaneousBasis,
): InstantaneousAssessment {
  assertInstantaneousBand(band);
  if (!Number.isFinite(ratingA) || ratingA <= 0) throw new RangeError('ratingA must be a finite number > 0');
  if (!Number.isFinite(currentA) || currentA < 0) throw new RangeError('currentA must be a finite number ≥ 0');
  const noTripA = band.noTripMultiple * ratingA;
  const tripA = band.tripMultiple * ratingA;
  const outcome: TripOutcome = currentA <= noTripA ? 'will-not-trip' : currentA >= tripA ? 'will-trip' : 'may-trip';
  return {
    outcome,
    currentA,
    basis,
    noTripA,
    tripA,
    ratioToNoTripEdge: currentA / noTripA,
    ratioToTripEdge: currentA / tripA,
    marginA: noTripA - currentA,
    multipleOfRating: currentA / ratingA,
  };
}
