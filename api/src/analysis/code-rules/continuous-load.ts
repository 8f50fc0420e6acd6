import { necCitation, necSectionFor, type NecEdition } from './nec-edition.js';
import { nextStandardRating } from './standard-ratings.js';
import { assertNonNegative, assertPositive } from '../validation/assert-input.js';
import { formatAmps, limitRule, type RuleResult } from './rule-result.js';

/**
 * Sizing factor for continuous loads: the device and the conductors must be rated for the noncontinuous
 * load plus 125 % of the continuous load. Source: NEC 210.19(A) and 210.20(A) (2020, 2023). verified.
 * A continuous load is one whose maximum current is expected to last 3 hours or more (NEC Article 100).
 */
export const CONTINUOUS_LOAD_FACTOR = 1.25;

/**
 * Required rating in amps for a mix of loads: `noncontinuousA + 1.25 × continuousA`.
 * Applies to the overcurrent device (NEC 210.20(A)) and, before adjustment and correction factors, to the
 * conductor ampacity (NEC 210.19(A)). Exception not modelled: an assembly listed for 100 % operation.
 */
export function requiredRatingForLoadA(continuousA: number, noncontinuousA: number): number {
  assertNonNegative(continuousA, 'continuousA');
  assertNonNegative(noncontinuousA, 'noncontinuousA');
  return noncontinuousA + CONTINUOUS_LOAD_FACTOR * continuousA;
}

/**
 * The smallest NEC 240.6(A) standard device for a load mix (210.20(A) then next standard size), e.g.
 * 16 A continuous → 20 A; 17 A continuous → 21.25 A required → 25 A. Null above 6000 A.
 */
export function minimumStandardDeviceA(continuousA: number, noncontinuousA: number): number | null {
  return nextStandardRating(requiredRatingForLoadA(continuousA, noncontinuousA));
}

/**
 * NEC 210.20(A) check of an overcurrent device of `ratingA` against a load mix: passes when
 * `noncontinuousA + 1.25 × continuousA ≤ ratingA`, i.e. the continuous part stays within 80 % of the rating
 * when alone. `limitA` is the rating and `actualA` the required figure. Severity `violation` on failure.
 */
export function checkContinuousLoadDevice(
  ratingA: number,
  continuousA: number,
  noncontinuousA: number,
  edition: NecEdition,
): RuleResult {
  assertPositive(ratingA, 'ratingA');
  const requiredA = requiredRatingForLoadA(continuousA, noncontinuousA);
  const minimum = nextStandardRating(requiredA);
  return limitRule({
    ruleId: 'nec-210.20-continuous-load-device',
    citation: necCitation(edition, '210.20(A)'),
    limitA: ratingA,
    actualA: requiredA,
    whenPassed:
      `The ${formatAmps(ratingA)} device covers the noncontinuous load plus 125 % of the continuous load ` +
      `(${formatAmps(requiredA)} needed).`,
    whenFailed:
      `The noncontinuous load plus 125 % of the continuous load needs ${formatAmps(requiredA)}, more than the ` +
      `${formatAmps(ratingA)} device; the smallest standard device for it is ` +
      `${minimum === null ? 'above 6000 A' : formatAmps(minimum)}.`,
  });
}

/**
 * NEC 210.19(A) check of conductor ampacity (before adjustment and correction factors) against a load mix:
 * passes when `noncontinuousA + 1.25 × continuousA ≤ ampacityA`. Cites 210.19(A)(1)(a) in the 2020 edition
 * and 210.19(A)(1) in 2023 (sub-number from memory).
 */
export function checkContinuousLoadConductor(
  ampacityA: number,
  continuousA: number,
  noncontinuousA: number,
  edition: NecEdition,
): RuleResult {
  assertPositive(ampacityA, 'ampacityA');
  const requiredA = requiredRatingForLoadA(continuousA, noncontinuousA);
  return limitRule({
    ruleId: 'nec-210.19-continuous-load-conductor',
    citation: necSectionFor(edition, 'continuousConductor'),
    limitA: ampacityA,
    actualA: requiredA,
    whenPassed:
      `Conductor ampacity ${formatAmps(ampacityA)} covers the load with 125 % of its continuous part ` +
      `(${formatAmps(requiredA)}).`,
    whenFailed:
      `Conductors need an ampacity of at least ${formatAmps(requiredA)} (noncontinuous load plus 125 % of ` +
      `the continuous load) but have ${formatAmps(ampacityA)}.`,
  });
}
