import { checkSmallConductor } from '../code-rules/small-conductors.js';
import type { RuleResult } from '../code-rules/rule-result.js';
import type { ThermalAssessment } from '../trip/thermal-family.js';
import { tripModelFor, type TripModel } from '../trip/trip-model.js';
import { headroomCautions, type Caution } from './cautions.js';
import {
  DEFAULT_CHECK_PARAMETERS,
  validateCheckInput,
  type CheckParameters,
  type CircuitUnderCheck,
  type LoadUnderCheck,
} from './check-input.js';
import { checkStackedScenarios, type StackedScenario } from './stacked-scenarios.js';
import { checkSteadyLoading, type SteadyLoading } from './steady-check.js';
import { sortReasons, verdictOf, type CheckReason, type Verdict } from './verdict.js';

/** The outcome of a headroom check. See check/README.md for how the verdict is reached. */
export interface HeadroomCheck {
  verdict: Verdict;
  /** Every finding that makes the verdict worse than `fine`, worst first, each naming its rule or clause. */
  reasons: CheckReason[];
  /**
   * Amps the circuit can still take as noncontinuous load: rating − (noncontinuous + 125 % of continuous)
   * (NEC 210.20(A) and 210.23); negative when over.
   */
  headroomA: number;
  /** Amps between the worst aligned start and the device's no-trip instantaneous edge (null for fuses). */
  startHeadroomA: number | null;
  steady: SteadyLoading;
  scenarios: StackedScenario[];
  /** All loads running together, from cold and held, through the device's thermal band. */
  allRunningThermal: ThermalAssessment;
  /** Circuit warnings that do not change the verdict (NEC 240.4(D) small-conductor limit). */
  warnings: RuleResult[];
  device: Pick<TripModel, 'deviceKind' | 'ratingA' | 'label'> & { notes: string[] };
  /** Assumed figures for loads without measured start-ups. */
  assumptions: string[];
  cautions: Caution[];
  /** The parameters used (defaults filled in) and the NEC edition applied. */
  parameters: CheckParameters & { necEdition: number };
}

/**
 * Judges whether `circuit` can carry `loads`: steady loading against the NEC rules (210.19/210.20
 * continuous load, 210.23 shares, never above the rating), each load's start stacked on the others'
 * running current against the device's instantaneous band, and the stacked profile through the device's
 * thermal band (IEC 60898-1 or UL 489 / UL 248 test points). The verdict is the worst of the reasons
 * (fine < tight < dedicated-circuit-advised < over-the-limit). Pure: inputs are not changed.
 * Parameters default to {@link DEFAULT_CHECK_PARAMETERS} (tight margin 10 %, motor start 1 s).
 * RangeError naming the field for bad input or a rating outside the device model's scope.
 */
export function checkCircuitHeadroom(
  circuit: CircuitUnderCheck,
  loads: readonly LoadUnderCheck[],
  parameters: Partial<CheckParameters> = {},
): HeadroomCheck {
  const params: CheckParameters = { ...DEFAULT_CHECK_PARAMETERS, ...parameters };
  validateCheckInput(circuit, loads, params);
  const model = tripModelFor(circuit.deviceKind, circuit.ratingA);
  const steady = checkSteadyLoading(circuit, loads, params);
  const stacked = checkStackedScenarios(circuit, loads, model, params);
  const reasons = sortReasons([...steady.reasons, ...stacked.reasons]);
  const conductorRule = circuit.conductor
    ? checkSmallConductor(circuit.ratingA, circuit.conductor, circuit.necEdition)
    : null;
  return {
    verdict: verdictOf(reasons),
    reasons,
    headroomA: circuit.ratingA - steady.requiredRatingA,
    startHeadroomA: stacked.startHeadroomA,
    steady,
    scenarios: stacked.scenarios,
    allRunningThermal: stacked.allRunning,
    warnings: conductorRule !== null && !conductorRule.passed ? [conductorRule] : [],
    device: { deviceKind: model.deviceKind, ratingA: model.ratingA, label: model.label, notes: [...model.notes] },
    assumptions: stacked.assumptions,
    cautions: headroomCautions(circuit.necEdition),
    parameters: { ...params, necEdition: circuit.necEdition },
  };
}
