import { necCitation, necSectionFor, type NecEdition } from './nec-edition.js';
import { assertNonNegative, assertPositive } from '../validation/assert-input.js';
import { formatAmps, limitRule, type RuleResult } from './rule-result.js';

/**
 * Share of the branch-circuit rating that any one cord-and-plug-connected load (not fastened in place) may
 * draw on a multi-outlet circuit: 80 %. Source: NEC 2023 210.23(B)(1) / 2020 210.23(A)(1) for 15 A and
 * 20 A circuits (verified); NEC 2023 210.23(C) / 2020 210.23(B) for 30 A circuits (from memory).
 */
export const CORD_AND_PLUG_SHARE = 0.8;

/**
 * Share of the rating that fastened-in-place equipment (other than luminaires) may draw in total on a
 * 15 A or 20 A circuit that also supplies lighting, cord-and-plug equipment not fastened in place, or both:
 * 50 %. Source: NEC 2023 210.23(B)(2) / 2020 210.23(A)(2). verified.
 */
export const FASTENED_IN_PLACE_SHARE = 0.5;

/**
 * Limit in amps for any one cord-and-plug load on a multi-outlet circuit of `ratingA`: 80 % of the rating
 * on 15, 20 and 30 A circuits (12 A on 15 A, 16 A on 20 A, 24 A on 30 A); null for other ratings, where
 * 210.23 sets no such share.
 */
export function cordAndPlugLimitA(ratingA: number): number | null {
  assertPositive(ratingA, 'ratingA');
  return ratingA === 15 || ratingA === 20 || ratingA === 30 ? CORD_AND_PLUG_SHARE * ratingA : null;
}

/**
 * Limit in amps for the total of fastened-in-place equipment on a 15 A or 20 A circuit that also feeds
 * lighting or other outlets: 50 % of the rating (7.5 A on 15 A, 10 A on 20 A); null for other ratings.
 */
export function fastenedInPlaceLimitA(ratingA: number): number | null {
  assertPositive(ratingA, 'ratingA');
  return ratingA === 15 || ratingA === 20 ? FASTENED_IN_PLACE_SHARE * ratingA : null;
}

/**
 * NEC 210.23 check of one cord-and-plug load (not fastened in place) of `loadA` amps on a multi-outlet
 * circuit of `ratingA`. Cites 210.23(B)(1) for 2023 and 210.23(A)(1) for 2020 (30 A: (C) / (B)).
 * Returns null where the rule does not apply (ratings other than 15, 20 and 30 A).
 * A failure means the appliance needs a circuit of its own (an individual branch circuit, NEC 210.22).
 */
export function checkCordAndPlugShare(
  ratingA: number,
  loadA: number,
  edition: NecEdition,
  loadName = 'the appliance',
): RuleResult | null {
  assertNonNegative(loadA, 'loadA');
  const limitA = cordAndPlugLimitA(ratingA);
  if (limitA === null) return null;
  const citation = necSectionFor(edition, ratingA === 30 ? 'thirtyAmpCordAndPlugShare' : 'cordAndPlugShare');
  return limitRule({
    ruleId: 'nec-210.23-cord-and-plug-share',
    citation,
    limitA,
    actualA: loadA,
    whenPassed:
      `${loadName} (${formatAmps(loadA)}) is within 80 % of the ${formatAmps(ratingA)} circuit ` +
      `(${formatAmps(limitA)}) allowed for one plug-in appliance on a shared circuit.`,
    whenFailed:
      `${loadName} draws ${formatAmps(loadA)}, more than the ${formatAmps(limitA)} (80 % of ` +
      `${formatAmps(ratingA)}) one plug-in appliance may draw on a circuit with other outlets; ` +
      `it needs a circuit of its own.`,
  });
}

/**
 * NEC 210.23 check of the total `fastenedTotalA` of fastened-in-place equipment (other than luminaires) on a
 * 15 A or 20 A circuit. Applies only when the circuit also supplies lighting or other outlets
 * (`alsoFeedsLightingOrOutlets`); returns null otherwise or for other ratings. Cites 210.23(B)(2) for 2023
 * and 210.23(A)(2) for 2020.
 */
export function checkFastenedInPlaceShare(
  ratingA: number,
  fastenedTotalA: number,
  alsoFeedsLightingOrOutlets: boolean,
  edition: NecEdition,
): RuleResult | null {
  assertNonNegative(fastenedTotalA, 'fastenedTotalA');
  const limitA = fastenedInPlaceLimitA(ratingA);
  if (limitA === null || !alsoFeedsLightingOrOutlets) return null;
  return limitRule({
    ruleId: 'nec-210.23-fastened-in-place-share',
    citation: necSectionFor(edition, 'fastenedInPlaceShare'),
    limitA,
    actualA: fastenedTotalA,
    whenPassed:
      `Fastened-in-place equipment totals ${formatAmps(fastenedTotalA)}, within the ${formatAmps(limitA)} ` +
      `(50 %) allowed on a circuit that also feeds lighting or outlets.`,
    whenFailed:
      `Fastened-in-place equipment totals ${formatAmps(fastenedTotalA)}, more than the ${formatAmps(limitA)} ` +
      `(50 % of ${formatAmps(ratingA)}) allowed where the circuit also feeds lighting or other outlets; ` +
      `it is not permitted as wired — give that equipment a circuit of its own.`,
  });
}

/**
 * The total load on a branch circuit may never exceed its rating: NEC 210.23 parent text for multi-outlet
 * circuits; an individual branch circuit may supply any load up to its rating, NEC 210.22
 * (`individualBranchCircuit`). Both verified; same numbering in 2020 and 2023.
 */
export function checkTotalWithinRating(
  ratingA: number,
  totalA: number,
  edition: NecEdition,
  individualBranchCircuit = false,
): RuleResult {
  assertPositive(ratingA, 'ratingA');
  assertNonNegative(totalA, 'totalA');
  return limitRule({
    ruleId: 'nec-210.23-total-within-rating',
    citation: necCitation(edition, individualBranchCircuit ? '210.22' : '210.23'),
    limitA: ratingA,
    actualA: totalA,
    whenPassed: `The loads total ${formatAmps(totalA)}, within the ${formatAmps(ratingA)} circuit rating.`,
    whenFailed:
      `The loads total ${formatAmps(totalA)}, more than the ${formatAmps(ratingA)} circuit rating; ` +
      `a branch circuit may never carry more than its rating.`,
  });
}
