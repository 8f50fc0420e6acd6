import { necCitation, type NecEdition } from './nec-edition.js';
import { assertPositive } from '../validation/assert-input.js';
import { formatAmps, limitRule, type RuleResult } from './rule-result.js';

/** Conductor material for the small-conductor rule: `cu` copper, `al` aluminum or copper-clad aluminum. */
export type ConductorMaterial = 'cu' | 'al';

const MATERIAL_NAMES: Readonly<Record<ConductorMaterial, string>> = { cu: 'copper', al: 'aluminum' };

/** A branch-circuit conductor: AWG size as written (e.g. `'12'`) and material. */
export interface Conductor {
  sizeAwg: string;
  material: ConductorMaterial;
}

/**
 * NEC 240.4(D) small conductors: the largest overcurrent device permitted, in amps, after correction and
 * adjustment, unless 240.4(E) or (G) permits otherwise (e.g. motor and air-conditioning circuits). Values
 * verified (2020, 2023); the (D)(1)–(D)(7) item numbers are from memory and not cited.
 * 18 AWG Cu 7 A; 16 AWG Cu 10 A; 14 AWG Cu 15 A; 12 AWG Cu 20 A; 10 AWG Cu 30 A; 12 AWG Al/CCA 15 A;
 * 10 AWG Al/CCA 25 A.
 */
export const SMALL_CONDUCTOR_LIMITS_A: Readonly<Record<ConductorMaterial, Readonly<Record<string, number>>>> = {
  cu: { '18': 7, '16': 10, '14': 15, '12': 20, '10': 30 },
  al: { '12': 15, '10': 25 },
};

/** The AWG number of a size as written: `'12 AWG'` and `'12'` are both `'12'`. */
function awgNumber(sizeAwg: string): string {
  return sizeAwg.trim().replace(/\s*AWG$/i, '');
}

/**
 * The 240.4(D) device limit for `conductor`, or null when 240.4(D) does not cover that size and material
 * (larger conductors follow the ampacity tables, which Headroom does not model).
 */
export function smallConductorLimitA(conductor: Conductor): number | null {
  const table = SMALL_CONDUCTOR_LIMITS_A[conductor.material];
  if (table === undefined) throw new RangeError(`conductor.material must be cu or al`);
  return table[awgNumber(conductor.sizeAwg)] ?? null;
}

/**
 * NEC 240.4(D) check of a device of `ratingA` on `conductor`: fails (severity `warning`) when the device is
 * larger than the small-conductor limit, e.g. 14 AWG Cu on a 20 A breaker (limit 15 A) or 12 AWG Al on a
 * 20 A breaker (limit 15 A). Returns null when 240.4(D) does not cover the conductor.
 * A warning, not a verdict: motor and A/C circuits may be permitted larger devices by 240.4(G).
 */
export function checkSmallConductor(ratingA: number, conductor: Conductor, edition: NecEdition): RuleResult | null {
  assertPositive(ratingA, 'ratingA');
  const limitA = smallConductorLimitA(conductor);
  if (limitA === null) return null;
  const label = `${awgNumber(conductor.sizeAwg)} AWG ${MATERIAL_NAMES[conductor.material]}`;
  return limitRule({
    ruleId: 'nec-240.4-small-conductor',
    citation: necCitation(edition, '240.4(D)'),
    limitA,
    actualA: ratingA,
    severity: 'warning',
    whenPassed: `${label} may be protected at up to ${formatAmps(limitA)}; the ${formatAmps(ratingA)} device is within it.`,
    whenFailed:
      `${label} may be protected at no more than ${formatAmps(limitA)}, but the device is ` +
      `${formatAmps(ratingA)}: check the conductor or the device (motor and A/C circuits may have other rules).`,
  });
}
