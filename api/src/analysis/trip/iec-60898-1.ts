import type { Citation } from '../code-rules/citation.js';
import type { InstantaneousBand } from './instantaneous-band.js';
import { fitThermalFamily, type ThermalFamily, type ThermalTestPoint } from './thermal-family.js';

/** Edition of IEC 60898-1 whose values are used: 2015 (Ed. 2.0) + AMD1:2019 (consolidated Ed. 2.1). */
export const IEC_60898_1_EDITION = '2015+AMD1:2019';

/** Instantaneous-trip curves of IEC 60898-1. */
export type IecCurve = 'B' | 'C' | 'D';

/** Largest rated current in the scope of IEC 60898-1, amps. verified. */
export const IEC_60898_1_MAX_RATING_A = 125;

/** Reference calibration ambient of the thermal element, °C. verified (maker's FAQ summarising the standard). */
export const IEC_60898_1_REFERENCE_AMBIENT_C = 30;

/** Conventional non-tripping current, multiple of In (no trip for 1 h, or 2 h above 63 A, from cold). verified. */
export const IEC_CONVENTIONAL_NON_TRIPPING_MULTIPLE = 1.13;
/** Conventional tripping current, multiple of In (trip within 1 h / 2 h, starting hot after the 1.13 In test). verified. */
export const IEC_CONVENTIONAL_TRIPPING_MULTIPLE = 1.45;
/** Third thermal test point, multiple of In: from cold, trip after more than 1 s and within 60 s (≤ 32 A) or 120 s. verified. */
export const IEC_THERMAL_HIGH_MULTIPLE = 2.55;

/**
 * Instantaneous bands (multiples of In), tested from cold with a 0.1 s criterion: B 3–5 In, C 5–10 In,
 * D 10–20 In. Source: IEC 60898-1:2015 Table 7 (table number from memory; values verified). The standard
 * lets a maker declare a D upper limit up to 50 In for special cases (from memory) — not modelled.
 */
export const IEC_INSTANTANEOUS_MULTIPLES: Readonly<Record<IecCurve, { noTrip: number; trip: number }>> = {
  B: { noTrip: 3, trip: 5 },
  C: { noTrip: 5, trip: 10 },
  D: { noTrip: 10, trip: 20 },
};

function iecCitation(section: string, tag: Citation['tag'] = 'verified'): Citation {
  return { code: 'IEC 60898-1', edition: IEC_60898_1_EDITION, section, tag };
}

function assertIecRating(ratingA: number): void {
  if (!(Number.isFinite(ratingA) && ratingA > 0 && ratingA <= IEC_60898_1_MAX_RATING_A)) {
    throw new RangeError(`ratingA must be > 0 and ≤ ${IEC_60898_1_MAX_RATING_A} A for IEC 60898-1 (got ${ratingA})`);
  }
}

/** The instantaneous band of an IEC 60898-1 curve (see {@link IEC_INSTANTANEOUS_MULTIPLES}). */
export function iecInstantaneousBand(curve: IecCurve): InstantaneousBand {
  const multiples = IEC_INSTANTANEOUS_MULTIPLES[curve];
  if (multiples === undefined) throw new RangeError('curve must be B, C or D');
  return {
    noTripMultiple: multiples.noTrip,
    tripMultiple: multiples.trip,
    citation: iecCitation('8.6.1, Table 7 (instantaneous tripping)'),
  };
}

/**
 * The IEC 60898-1 thermal test points for a breaker rated `ratingA` (same for curves B, C and D):
 * 1.13 In from cold: no trip for 1 h (In ≤ 63 A) or 2 h; 1.45 In starting hot (after the 1.13 In test):
 * trip within 1 h / 2 h; 2.55 In from cold: trip after more than 1 s and within 60 s (In ≤ 32 A) or 120 s.
 * Reference ambient 30 °C. Values verified; clause/table numbers from memory.
 */
export function iecThermalTestPoints(ratingA: number): {
  hold: ThermalTestPoint;
  notBefore: ThermalTestPoint;
  tripWithinLow: ThermalTestPoint;
  tripWithinHigh: ThermalTestPoint;
} {
  assertIecRating(ratingA);
  const conventionalTimeS = ratingA <= 63 ? 3600 : 7200;
  const highMaxS = ratingA <= 32 ? 60 : 120;
  const citation = iecCitation('8.6.1, Table 7 (time-current characteristic)');
  return {
    hold: { requirement: 'hold', multiple: 1.13, timeS: conventionalTimeS, initialMultiple: 0, citation },
    notBefore: { requirement: 'trip-not-before', multiple: 2.55, timeS: 1, initialMultiple: 0, citation },
    tripWithinLow: {
      requirement: 'trip-within',
      multiple: 1.45,
      timeS: conventionalTimeS,
      initialMultiple: 1.13,
      citation,
    },
    tripWithinHigh: { requirement: 'trip-within', multiple: 2.55, timeS: highMaxS, initialMultiple: 0, citation },
  };
}

/**
 * The thermal family of an IEC 60898-1 breaker (see thermal-family.ts) fitted through its test points.
 * For In ≤ 32 A: fastest member k = 1.13, τ ≈ 4.58 s; slowest k ≈ 1.45, τ ≈ 153.6 s. The standard does not
 * fix anything between its test points; the family is Headroom's assumption and the maker's curve governs.
 */
export function iecThermalFamily(ratingA: number): ThermalFamily {
  return fitThermalFamily(iecThermalTestPoints(ratingA));
}
