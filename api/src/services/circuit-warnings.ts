import type { Citation } from '../analysis/code-rules/citation.js';
import { necCitation, type NecEdition } from '../analysis/code-rules/nec-edition.js';
import { formatAmps } from '../analysis/code-rules/rule-result.js';
import { checkSmallConductor } from '../analysis/code-rules/small-conductors.js';
import { isStandardRating, largestStandardRatingNotAbove, nextStandardRating } from '../analysis/code-rules/standard-ratings.js';
import { isIecPreferredRating, nearestIecPreferredRatings } from '../analysis/ratings/iec-60898-preferred-ratings.js';
import { tripModelFor } from '../analysis/trip/trip-model.js';
import type { ConductorMaterial, DeviceKind } from '../models/circuit.js';

/**
 * Something to correct or confirm about a circuit as recorded. Warnings never block saving: a site is
 * recorded as found, and the check still runs.
 * - `ruleId`: stable id; `pointer`: the circuit field concerned (JSON Pointer); `citation`: where the rule is
 *   (null for a limit of Headroom's own models).
 */
export interface CircuitWarning {
  ruleId: string;
  pointer: string;
  message: string;
  citation: Citation | null;
}

/** The circuit fields the warnings look at. */
export interface CircuitForWarnings {
  deviceRatingA: number;
  deviceKind: DeviceKind;
  conductorSize: string | null;
  conductorMaterial: ConductorMaterial | null;
  necEdition: number;
}

/** "12 AWG", "12awg" or a bare "12" → "12"; metric sizes ("2.5 mm2") → null (240.4(D) is in AWG). */
function awgSize(conductorSize: string | null): string | null {
  const match = /^\s*(\d{1,2})\s*(awg)?\s*$/i.exec(conductorSize ?? '');
  return match ? match[1]! : null;
}

function edition(circuit: CircuitForWarnings): NecEdition {
  return circuit.necEdition === 2020 ? 2020 : 2023;
}

/** NEC 240.4(D): a small conductor protected by a device above its limit. */
function smallConductorWarning(circuit: CircuitForWarnings): CircuitWarning | null {
  const size = awgSize(circuit.conductorSize);
  if (size === null) return null;
  const material = circuit.conductorMaterial ?? 'cu';
  const rule = checkSmallConductor(circuit.deviceRatingA, { sizeAwg: size, material }, edition(circuit));
  if (rule === null || rule.passed) return null;
  const assumed = circuit.conductorMaterial === null ? ' (material not recorded: copper assumed)' : '';
  return { ruleId: rule.ruleId, pointer: '/conductorSize', message: rule.message + assumed, citation: rule.citation };
}

/**
 * The device rating against the standard list of its family: NEC 240.6(A) for North-American breakers and
 * fuses (fuses add 1, 3, 6, 10 A), IEC 60898-1 preferred ratings for B/C/D breakers. A warning, not an
 * error: older or adjustable-trip devices (240.6(B), (C)) and devices made to other standards exist, and a
 * survey records what is installed.
 */
function standardRatingWarning(circuit: CircuitForWarnings): CircuitWarning | null {
  const ratingA = circuit.deviceRatingA;
  if (circuit.deviceKind.startsWith('iec-')) {
    if (isIecPreferredRating(ratingA)) return null;
    const { below, above } = nearestIecPreferredRatings(ratingA);
    const near = [below, above].filter((r): r is number => r !== null && r !== ratingA).map(formatAmps).join(' or ');
    return {
      ruleId: 'iec-60898-1-preferred-rating',
      pointer: '/deviceRatingA',
      message: `${formatAmps(ratingA)} is not a preferred rated current of IEC 60898-1${near ? ` (nearest: ${near})` : ''}; check the device label.`,
      citation: { code: 'IEC 60898-1', edition: '2015+AMD1:2019', section: '5.3.2 (preferred values of rated current)', tag: 'from memory' },
    };
  }
  const list = circuit.deviceKind === 'fuse' ? 'fuse' : 'breaker';
  if (isStandardRating(ratingA, list)) return null;
  const near = [largestStandardRatingNotAbove(ratingA, list), nextStandardRating(ratingA, list)]
    .filter((r): r is number => r !== null)
    .map(formatAmps)
    .join(' or ');
  return {
    ruleId: 'nec-240.6-standard-rating',
    pointer: '/deviceRatingA',
    message: `${formatAmps(ratingA)} is not a standard ${list} rating of NEC 240.6(A)${near ? ` (nearest: ${near})` : ''}; check the device label.`,
    citation: necCitation(edition(circuit), '240.6(A)'),
  };
}

/** A rating outside the range the trip model covers: the check can judge code limits but not tripping. */
function tripModelWarning(circuit: CircuitForWarnings): CircuitWarning | null {
  try {
    tripModelFor(circuit.deviceKind, circuit.deviceRatingA);
    return null;
  } catch (err) {
    if (!(err instanceof RangeError)) throw err;
    return {
      ruleId: 'trip-model-scope',
      pointer: '/deviceRatingA',
      message: `Headroom has no trip model for this device: ${err.message}. The check judges the code limits only.`,
      citation: null,
    };
  }
}

/** Every warning for a circuit as recorded, in field order. */
export function circuitWarnings(circuit: CircuitForWarnings): CircuitWarning[] {
  return [standardRatingWarning(circuit), tripModelWarning(circuit), smallConductorWarning(circuit)].filter(
    (w): w is CircuitWarning => w !== null,
  );
}
