import { necCitation, type NecEdition } from './nec-edition.js';
import { assertNonNegative, assertPositive } from '../validation/assert-input.js';
import { formatAmps, limitRule, type RuleResult } from './rule-result.js';

/**
 * NEC Table 210.21(B)(2): the largest cord-and-plug load per receptacle on a circuit with two or more
 * receptacles or outlets, by circuit rating and receptacle rating (amps). verified (2017–2023 text):
 * 15 A receptacle on a 15 or 20 A circuit → 12 A; 20 A receptacle on a 20 A circuit → 16 A;
 * 30 A receptacle on a 30 A circuit → 24 A. Other combinations are not in the table.
 */
const TABLE_210_21_B_2: readonly { circuitA: number; receptacleA: number; maxLoadA: number }[] = [
  { circuitA: 15, receptacleA: 15, maxLoadA: 12 },
  { circuitA: 20, receptacleA: 15, maxLoadA: 12 },
  { circuitA: 20, receptacleA: 20, maxLoadA: 16 },
  { circuitA: 30, receptacleA: 30, maxLoadA: 24 },
];

/**
 * NEC Table 210.21(B)(3): receptacle ratings permitted on a circuit with two or more receptacles, by circuit
 * rating. verified. The 2023 edition made these minimums ("not less than"); the 2020 edition's wording was
 * "not over 15 A" for a 15 A circuit.
 */
export const PERMITTED_RECEPTACLE_RATINGS_A: Readonly<Record<number, readonly number[]>> = {
  15: [15],
  20: [15, 20],
  30: [30],
  40: [40, 50],
  50: [50],
};

/**
 * Maximum cord-and-plug load in amps for a receptacle of `receptacleA` on a multi-outlet circuit of
 * `circuitA`, from Table 210.21(B)(2); null when the table has no row for the pair.
 */
export function receptacleMaxLoadA(circuitA: number, receptacleA: number): number | null {
  assertPositive(circuitA, 'circuitA');
  assertPositive(receptacleA, 'receptacleA');
  const row = TABLE_210_21_B_2.find((r) => r.circuitA === circuitA && r.receptacleA === receptacleA);
  return row === undefined ? null : row.maxLoadA;
}

/**
 * NEC 210.21(B)(2) check of a cord-and-plug load of `loadA` on one receptacle. Returns null where the table
 * has no row for the circuit/receptacle pair (the caller should then check 210.21(B)(3) ratings).
 */
export function checkReceptacleLoad(
  circuitA: number,
  receptacleA: number,
  loadA: number,
  edition: NecEdition,
): RuleResult | null {
  assertNonNegative(loadA, 'loadA');
  const limitA = receptacleMaxLoadA(circuitA, receptacleA);
  if (limitA === null) return null;
  return limitRule({
    ruleId: 'nec-210.21-receptacle-load',
    citation: necCitation(edition, 'Table 210.21(B)(2)'),
    limitA,
    actualA: loadA,
    whenPassed: `${formatAmps(loadA)} on a ${formatAmps(receptacleA)} receptacle is within its ${formatAmps(limitA)} limit.`,
    whenFailed:
      `${formatAmps(loadA)} is more than the ${formatAmps(limitA)} a ${formatAmps(receptacleA)} receptacle on a ` +
      `${formatAmps(circuitA)} shared circuit may supply.`,
  });
}

/**
 * NEC 210.21(B)(3): whether a receptacle of `receptacleA` is permitted on a multi-receptacle circuit of
 * `circuitA`. Returns null for circuit ratings the table does not list.
 */
export function isPermittedReceptacleRating(circuitA: number, receptacleA: number): boolean | null {
  const permitted = PERMITTED_RECEPTACLE_RATINGS_A[circuitA];
  return permitted === undefined ? null : permitted.includes(receptacleA);
}
