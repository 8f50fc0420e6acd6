import type { Citation } from '../code-rules/citation.js';
import type { CurrentProfile } from './current-profile.js';
import {
  constantCurrentTripTimeS,
  runThermalModel,
  type ThermalParameters,
  type ThermalRunOptions,
} from './thermal-model.js';
import type { TripOutcome } from './trip-outcome.js';

/**
 * One time-current requirement of a product standard, in multiples of the rated current In:
 * - `hold`: at `multiple` the device must not trip for `timeS` (Infinity = must carry indefinitely);
 * - `trip-within`: at `multiple` it must trip within `timeS`;
 * - `trip-not-before`: at `multiple` it must not trip before `timeS`.
 * `initialMultiple` is the current (× In) the device carried to equilibrium before the test: 0 = cold.
 */
export interface ThermalTestPoint {
  requirement: 'hold' | 'trip-within' | 'trip-not-before';
  multiple: number;
  timeS: number;
  initialMultiple: number;
  citation: Citation;
}

/**
 * The four test points a thermal family is fitted through:
 * - `hold`: the highest multiple that must not trip (it becomes the fast edge's pickup);
 * - `notBefore`: the fastest trip allowed (it sets the fast edge's time constant);
 * - `tripWithinLow` and `tripWithinHigh`: the slowest trips allowed at a low and a high overload (together
 *   they fix the slow edge's pickup and time constant).
 */
export interface ThermalFitPoints {
  hold: ThermalTestPoint;
  notBefore: ThermalTestPoint;
  tripWithinLow: ThermalTestPoint;
  tripWithinHigh: ThermalTestPoint;
}

/**
 * A family of first-order thermal models (see thermal-model.ts) that all meet the standard's test points,
 * from the fastest (`members[0]`) to the slowest (`members[last]`). Members between the edges interpolate
 * the pickup linearly and the time constant geometrically; `nominalIndex` is the middle member, used for
 * the single "estimated" time. The family is Headroom's modelling assumption: the standard fixes only the
 * test points, and the breaker maker's curve governs.
 */
export interface ThermalFamily {
  members: readonly ThermalParameters[];
  nominalIndex: number;
  testPoints: readonly ThermalTestPoint[];
}

/** Number of members in a fitted family (fast edge, 7 between, slow edge). */
export const DEFAULT_FAMILY_SIZE = 9;

/** Fast edge: pickup at the hold multiple, time constant so that `notBefore` trips exactly at its time. */
function fitFastEdge(points: ThermalFitPoints): ThermalParameters {
  const pickupMultiple = points.hold.multiple;
  const m2 = points.notBefore.multiple ** 2;
  const k2 = pickupMultiple ** 2;
  if (m2 <= k2) throw new RangeError('notBefore.multiple must be above hold.multiple');
  return { pickupMultiple, timeConstantS: points.notBefore.timeS / Math.log(m2 / (m2 - k2)) };
}

/**
 * Slow edge: pickup k and time constant τ such that `tripWithinHigh` trips exactly at its time from its
 * initial state and `tripWithinLow` trips exactly at its time from its initial state. Solved by bisection on
 * log(mLow² − k²), because k ends up extremely close to the low multiple when the low test is long.
 */
function fitSlowEdge(points: ThermalFitPoints): ThermalParameters {
  const low = points.tripWithinLow;
  const high = points.tripWithinHigh;
  const lowM2 = low.multiple ** 2;
  const highM2 = high.multiple ** 2;
  const lowInitial = low.initialMultiple ** 2;
  const highInitial = high.initialMultiple ** 2;
  const holdK2 = points.hold.multiple ** 2;
  if (!(holdK2 < lowM2 && lowM2 < highM2)) {
    throw new RangeError('fit points must satisfy hold < tripWithinLow < tripWithinHigh multiples');
  }
  const tauFor = (k2: number): number => high.timeS / Math.log((highM2 - highInitial) / (highM2 - k2));
  // g(gap) > 0: the low test would trip too late; g < 0: too early. g falls as the gap grows.
  const g = (gap: number): number => {
    const k2 = lowM2 - gap;
    return tauFor(k2) * Math.log((lowM2 - lowInitial) / gap) - low.timeS;
  };
  let logGapHigh = Math.log(lowM2 - Math.max(holdK2, lowInitial));
  let logGapLow = Math.log(lowM2 * 1e-15);
  if (g(Math.exp(logGapHigh)) > 0) throw new RangeError('test points are inconsistent: the slow edge cannot be fitted');
  if (g(Math.exp(logGapLow)) < 0) logGapHigh = logGapLow; // pickup within 1e-15 of the low multiple
  for (let i = 0; i < 200 && logGapLow < logGapHigh; i++) {
    const mid = (logGapLow + logGapHigh) / 2;
    if (mid === logGapLow || mid === logGapHigh) break;
    if (g(Math.exp(mid)) > 0) logGapLow = mid;
    else logGapHigh = mid;
  }
  // Take the larger gap (the side where the low test trips no later than required).
  const k2 = lowM2 - Math.exp(logGapHigh);
  return { pickupMultiple: Math.sqrt(k2), timeConstantS: tauFor(k2) };
}

/**
 * Fits a {@link ThermalFamily} of `size` members (default 9, at least 2) through the four points:
 * fastest member = pickup at the hold multiple and the `notBefore` time; slowest member = exactly on both
 * `trip-within` limits. Example (IEC 60898-1, In ≤ 32 A): fast edge k = 1.13, τ ≈ 4.58 s (2.55 In trips at
 * 1 s); slow edge k ≈ 1.45, τ ≈ 153.6 s (2.55 In trips at 60 s; 1.45 In from hot at 1 h).
 */
export function fitThermalFamily(
  points: ThermalFitPoints,
  extraTestPoints: readonly ThermalTestPoint[] = [],
  size = DEFAULT_FAMILY_SIZE,
): ThermalFamily {
  if (!Number.isInteger(size) || size < 2) throw new RangeError('size must be an integer ≥ 2');
  const fast = fitFastEdge(points);
  const slow = fitSlowEdge(points);
  const members: ThermalParameters[] = [];
  for (let j = 0; j < size; j++) {
    const s = j / (size - 1);
    members.push({
      pickupMultiple: fast.pickupMultiple + s * (slow.pickupMultiple - fast.pickupMultiple),
      timeConstantS: fast.timeConstantS * Math.pow(slow.timeConstantS / fast.timeConstantS, s),
    });
  }
  const testPoints = [points.hold, points.notBefore, points.tripWithinLow, points.tripWithinHigh, ...extraTestPoints];
  return { members, nominalIndex: Math.floor((size - 1) / 2), testPoints };
}

/**
 * Whether one model meets one test point (time compared with a relative tolerance of 1e-9, so that the
 * edges fitted exactly on a limit count as meeting it).
 */
export function meetsTestPoint(params: ThermalParameters, point: ThermalTestPoint): boolean {
  const t = constantCurrentTripTimeS(params, point.multiple, point.initialMultiple ** 2);
  const tolerance = Number.isFinite(point.timeS) ? 1e-9 * point.timeS : 0;
  switch (point.requirement) {
    case 'hold':
      return t >= point.timeS - tolerance;
    case 'trip-within':
      return t <= point.timeS + tolerance;
    case 'trip-not-before':
      return t >= point.timeS - tolerance;
  }
}

/** Result of {@link assessThermal}. */
export interface ThermalAssessment {
  /** `will-trip` when every member trips, `will-not-trip` when none does, `may-trip` otherwise. */
  outcome: TripOutcome;
  /** Trip time of the nominal (middle) member, seconds after the profile start; null if it holds. */
  estimatedTripS: number | null;
  /** Earliest trip over the family (the fastest breaker the standard allows); null if none trips. */
  earliestTripS: number | null;
  /** Latest trip over the family; null when at least one member never trips (it may hold indefinitely). */
  latestTripS: number | null;
  membersTripping: number;
  memberCount: number;
  /** Highest θ/k² reached by the fastest and by the nominal member (≥ 1 means it tripped). */
  fastestHeatingRatio: number;
  nominalHeatingRatio: number;
}

/**
 * Runs every member of `family` over `profile` (RMS amps, device rated `ratingA`) and summarises the trip
 * band. Accumulated heating over the whole duty is included (the model warms and cools between steps);
 * `options.initialCurrentA` starts the element in equilibrium with a prior load and `options.holdLast`
 * keeps the last current for ever. RangeError for bad input.
 */
export function assessThermal(
  family: ThermalFamily,
  ratingA: number,
  profile: CurrentProfile,
  options: ThermalRunOptions = {},
): ThermalAssessment {
  if (family.members.length === 0) throw new RangeError('family must have members');
  const runs = family.members.map((member) => runThermalModel(member, ratingA, profile, options));
  const tripTimes = runs.map((run) => run.tripAfterS).filter((t): t is number => t !== null);
  const membersTripping = tripTimes.length;
  const memberCount = runs.length;
  const nominal = runs[family.nominalIndex] ?? runs[0]!;
  const outcome: TripOutcome =
    membersTripping === memberCount ? 'will-trip' : membersTripping === 0 ? 'will-not-trip' : 'may-trip';
  return {
    outcome,
    estimatedTripS: nominal.tripAfterS,
    earliestTripS: membersTripping > 0 ? Math.min(...tripTimes) : null,
    latestTripS: membersTripping === memberCount ? Math.max(...tripTimes) : null,
    membersTripping,
    memberCount,
    fastestHeatingRatio: runs[0]!.peakHeatingRatio,
    nominalHeatingRatio: nominal.peakHeatingRatio,
  };
}
