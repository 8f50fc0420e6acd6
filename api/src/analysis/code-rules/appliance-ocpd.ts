import { necCitation, type NecEdition } from './nec-edition.js';
import { nextStandardRating } from './standard-ratings.js';
import { assertNonNegative, assertPositive } from '../validation/assert-input.js';
import { formatAmps, limitRule, type RuleResult } from './rule-result.js';

/**
 * Rated current below which an unmarked single non-motor appliance may be protected at up to 20 A:
 * 13.3 A. Source: NEC 422.11(E)(2) (2020, 2023). verified.
 */
export const APPLIANCE_SMALL_CURRENT_A = 13.3;

/** Largest device for an unmarked appliance rated ≤ 13.3 A: 20 A. NEC 422.11(E)(2). verified. */
export const APPLIANCE_SMALL_MAX_OCPD_A = 20;

/** Largest device for an unmarked appliance rated > 13.3 A: 150 % of its rated current. 422.11(E)(3). verified. */
export const APPLIANCE_LARGE_OCPD_FACTOR = 1.5;

/**
 * Largest overcurrent device in amps for a single non-motor-operated appliance, NEC 422.11(E):
 * (1) not above `markedOcpdA` when the appliance is marked with one; (2) unmarked and rated ≤ 13.3 A:
 * 20 A; (3) unmarked and rated > 13.3 A: 150 % of the rated current, where the next standard size
 * (240.6(A)) is permitted. Example: a 4500 W, 240 V water heater (18.75 A) → 28.1 A → 30 A.
 */
export function applianceMaxOcpdA(ratedA: number, markedOcpdA?: number): number {
  assertPositive(ratedA, 'ratedA');
  if (markedOcpdA !== undefined) {
    assertPositive(markedOcpdA, 'markedOcpdA');
    return markedOcpdA;
  }
  if (ratedA <= APPLIANCE_SMALL_CURRENT_A) return APPLIANCE_SMALL_MAX_OCPD_A;
  const limit = APPLIANCE_LARGE_OCPD_FACTOR * ratedA;
  const next = nextStandardRating(limit);
  if (next === null) throw new RangeError(`ratedA ${ratedA} A needs a device above 6000 A`);
  return next;
}

/** Which item of 422.11(E) sets the limit for an appliance (for the citation). */
function applianceClause(ratedA: number, markedOcpdA?: number): string {
  if (markedOcpdA !== undefined) return '422.11(E)(1)';
  return ratedA <= APPLIANCE_SMALL_CURRENT_A ? '422.11(E)(2)' : '422.11(E)(3)';
}

/**
 * NEC 422.11(E) check of a device of `deviceA` protecting a single non-motor appliance rated `ratedA`
 * (optionally marked with its maximum device `markedOcpdA`).
 */
export function checkApplianceOcpd(
  deviceA: number,
  ratedA: number,
  edition: NecEdition,
  markedOcpdA?: number,
): RuleResult {
  assertNonNegative(deviceA, 'deviceA');
  const limitA = applianceMaxOcpdA(ratedA, markedOcpdA);
  return limitRule({
    ruleId: 'nec-422.11-appliance-ocpd',
    citation: necCitation(edition, applianceClause(ratedA, markedOcpdA)),
    limitA,
    actualA: deviceA,
    whenPassed: `A ${formatAmps(deviceA)} device is within the ${formatAmps(limitA)} allowed for this appliance.`,
    whenFailed:
      `A ${formatAmps(deviceA)} device is larger than the ${formatAmps(limitA)} allowed for an appliance ` +
      `rated ${formatAmps(ratedA)}.`,
  });
}
