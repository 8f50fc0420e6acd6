import type { Citation } from '../code-rules/citation.js';
import type { InstantaneousBand } from './instantaneous-band.js';
import { fitThermalFamily, type ThermalFamily, type ThermalTestPoint } from './thermal-family.js';

/**
 * Edition of UL 489 whose calibration points were seen: 10th edition (2002, also NEMA AB 1-2002). Later
 * editions are current; the points are believed unchanged (from memory).
 */
export const UL_489_EDITION = '10th ed. (2002)';

/** Largest rating Headroom's North-American profile covers, amps (the 200 % table beyond is unknown). */
export const UL_489_MAX_RATING_A = 600;

/** Calibration multiple that must trip within 1 h (≤ 50 A, verified) or 2 h (> 50 A, from memory). */
export const UL_489_LOW_CALIBRATION_MULTIPLE = 1.35;
/** Calibration multiple that must trip within 2 min (≤ 30 A, verified) or longer for larger frames. */
export const UL_489_HIGH_CALIBRATION_MULTIPLE = 2;

/**
 * Maximum trip time at 200 % of rating, seconds, by rating band: ≤ 30 A 2 min (verified); 31–50 A 4 min,
 * 51–100 A 6 min, 101–150 A 8 min, 151–225 A 10 min, 226–400 A 12 min, 401–600 A 14 min (from memory).
 */
const TWO_HUNDRED_PERCENT_MAX_S: readonly { upToA: number; maxS: number; verified: boolean }[] = [
  { upToA: 30, maxS: 120, verified: true },
  { upToA: 50, maxS: 240, verified: false },
  { upToA: 100, maxS: 360, verified: false },
  { upToA: 150, maxS: 480, verified: false },
  { upToA: 225, maxS: 600, verified: false },
  { upToA: 400, maxS: 720, verified: false },
  { upToA: 600, maxS: 840, verified: false },
];

/**
 * Typical instantaneous pickup band of North-American residential thermal-magnetic breakers, multiples of
 * the rating: about 5–20 × across makes, typically about 10 ×. **From memory / common practice, no
 * source**: UL 489 sets no single instantaneous multiple for these breakers, each maker publishes its own
 * band (which governs), and bands have changed without a part-number change (NRC Information Notice 89-21).
 */
export const NA_TYPICAL_INSTANTANEOUS = { noTrip: 5, trip: 20, typical: 10 } as const;

/**
 * Fastest thermal trip assumed for the North-American profile: a residential breaker rides through 5 × its
 * rating for at least 1 s on its thermal element (motor locked-rotor current for a second or two).
 * **From memory / common practice, no source** — UL 489 sets no lower limit at these points.
 */
export const NA_ASSUMED_NOT_BEFORE = { multiple: 5, timeS: 1 } as const;

function ulCitation(section: string, tag: Citation['tag']): Citation {
  return { code: 'UL 489', edition: UL_489_EDITION, section, tag };
}

function assertUlRating(ratingA: number): void {
  if (!(Number.isFinite(ratingA) && ratingA > 0 && ratingA <= UL_489_MAX_RATING_A)) {
    throw new RangeError(
      `ratingA must be > 0 and ≤ ${UL_489_MAX_RATING_A} A for the North-American profile (got ${ratingA})`,
    );
  }
}

/**
 * The UL 489 calibration points for a breaker rated `ratingA` plus the assumed fastest trip:
 * 100 % must be carried (verified; tested at 40 °C); 135 % from cold trips within 1 h for ≤ 50 A (verified)
 * or 2 h above (from memory); 200 % from cold trips within 2 min for ≤ 30 A (verified), longer for larger
 * ratings (from memory, see the table in this file); 5 × not before 1 s (from memory / common practice).
 * The 135 % and 200 % tests are at 25 °C.
 */
export function ul489TestPoints(ratingA: number): {
  hold: ThermalTestPoint;
  notBefore: ThermalTestPoint;
  tripWithinLow: ThermalTestPoint;
  tripWithinHigh: ThermalTestPoint;
} {
  assertUlRating(ratingA);
  const band = TWO_HUNDRED_PERCENT_MAX_S.find((b) => ratingA <= b.upToA)!;
  const lowVerified = ratingA <= 50;
  return {
    hold: {
      requirement: 'hold',
      multiple: 1,
      timeS: Infinity,
      initialMultiple: 0,
      citation: ulCitation('calibration at 100 % (40 °C)', 'verified'),
    },
    notBefore: {
      requirement: 'trip-not-before',
      multiple: NA_ASSUMED_NOT_BEFORE.multiple,
      timeS: NA_ASSUMED_NOT_BEFORE.timeS,
      initialMultiple: 0,
      citation: {
        code: 'common practice',
        edition: 'none',
        section: 'rides through motor starting',
        tag: 'from memory',
      },
    },
    tripWithinLow: {
      requirement: 'trip-within',
      multiple: UL_489_LOW_CALIBRATION_MULTIPLE,
      timeS: lowVerified ? 3600 : 7200,
      initialMultiple: 0,
      citation: ulCitation('calibration at 135 % (25 °C)', lowVerified ? 'verified' : 'from memory'),
    },
    tripWithinHigh: {
      requirement: 'trip-within',
      multiple: UL_489_HIGH_CALIBRATION_MULTIPLE,
      timeS: band.maxS,
      initialMultiple: 0,
      citation: ulCitation('calibration at 200 % (25 °C)', band.verified ? 'verified' : 'from memory'),
    },
  };
}

/**
 * The thermal family of a North-American thermal-magnetic breaker rated `ratingA`, fitted through
 * {@link ul489TestPoints}. For ≤ 30 A: fastest member k = 1.0, τ ≈ 24.5 s (5 × trips at 1 s); slowest k ≈
 * 1.35, τ ≈ 197 s (200 % trips at 2 min, 135 % at 1 h).
 */
export function ul489ThermalFamily(ratingA: number): ThermalFamily {
  return fitThermalFamily(ul489TestPoints(ratingA));
}

/** The typical North-American instantaneous band ({@link NA_TYPICAL_INSTANTANEOUS}), tagged from memory. */
export function naInstantaneousBand(): InstantaneousBand {
  return {
    noTripMultiple: NA_TYPICAL_INSTANTANEOUS.noTrip,
    tripMultiple: NA_TYPICAL_INSTANTANEOUS.trip,
    typicalMultiple: NA_TYPICAL_INSTANTANEOUS.typical,
    citation: {
      code: 'common practice',
      edition: 'none',
      section: 'typical residential instantaneous pickup; the maker’s curve governs',
      tag: 'from memory',
    },
  };
}
