import { commonPracticeCitation } from '../code-rules/citation.js';
import { checkContinuousLoadDevice, CONTINUOUS_LOAD_FACTOR } from '../code-rules/continuous-load.js';
import {
  checkCordAndPlugShare,
  checkFastenedInPlaceShare,
  checkTotalWithinRating,
} from '../code-rules/permissible-loads.js';
import { formatAmps, type RuleResult } from '../code-rules/rule-result.js';
import type { CheckParameters, CircuitUnderCheck, LoadUnderCheck } from './check-input.js';
import { isWithinTightMargin, TRADE_LOADING_SHARE, type CheckReason, type Verdict } from './verdict.js';

/** Result of {@link checkSteadyLoading}. */
export interface SteadyLoading {
  /** Sum of running currents, amps (arithmetic: assumes the currents are in phase — the worst case). */
  runningTotalA: number;
  continuousA: number;
  noncontinuousA: number;
  fastenedInPlaceA: number;
  /** Noncontinuous + 125 % of continuous, amps (NEC 210.20(A)). */
  requiredRatingA: number;
  /** Every code rule evaluated, passed or not. */
  rules: RuleResult[];
  /** The findings that make the verdict worse than `fine`. */
  reasons: CheckReason[];
}

function reasonFrom(rule: RuleResult, verdict: Verdict, message = rule.message, loadName?: string): CheckReason {
  return {
    verdict,
    ruleId: rule.ruleId,
    citation: rule.citation,
    message,
    ...(loadName === undefined ? {} : { loadName }),
  };
}

/** A failed rule gives `failVerdict`; a pass within the tight margin of its limit gives `tight`. */
function judgeRule(
  rule: RuleResult,
  failVerdict: Verdict,
  tightFraction: number,
  loadName?: string,
): CheckReason | null {
  if (!rule.passed) return reasonFrom(rule, failVerdict, rule.message, loadName);
  if (isWithinTightMargin(rule.actualA, rule.limitA, tightFraction)) {
    const message =
      `${rule.message} That leaves ${formatAmps(rule.limitA - rule.actualA)}, within ` +
      `${Math.round(tightFraction * 100)} % of the limit.`;
    return reasonFrom(rule, 'tight', message, loadName);
  }
  return null;
}

/**
 * Steady loading of a circuit: the running currents against
 * - the rating (NEC 210.23 parent text; 210.22 for an individual branch circuit) → `over-the-limit`;
 * - noncontinuous + 125 % of continuous ≤ rating (NEC 210.20(A)) → `over-the-limit`;
 * - any one cord-and-plug load ≤ 80 % on a 15/20/30 A multi-outlet circuit (NEC 2023 210.23(B)(1),
 *   2020 (A)(1)) → `dedicated-circuit-advised` (or `over-the-limit` when the load would not fit a circuit
 *   of its own at this rating);
 * - fastened-in-place total ≤ 50 % on a 15/20 A circuit that also feeds lighting or outlets (NEC 2023
 *   210.23(B)(2), 2020 (A)(2)) → `dedicated-circuit-advised`;
 * - each passing rule within `tightFraction` of its limit → `tight`; and a running total above 80 % of the
 *   rating (the trade's rule of thumb, common practice) → `tight`.
 */
export function checkSteadyLoading(
  circuit: CircuitUnderCheck,
  loads: readonly LoadUnderCheck[],
  params: CheckParameters,
): SteadyLoading {
  const edition = circuit.necEdition;
  const ratingA = circuit.ratingA;
  const individual = circuit.individualBranchCircuit === true;
  const sum = (pick: (l: LoadUnderCheck) => boolean) => loads.filter(pick).reduce((s, l) => s + l.runningA, 0);
  const runningTotalA = sum(() => true);
  const continuousA = sum((l) => l.continuous);
  const noncontinuousA = runningTotalA - continuousA;
  const fastenedInPlaceA = sum((l) => l.connection === 'fastened-in-place');

  const rules: RuleResult[] = [];
  const reasons: CheckReason[] = [];
  const record = (rule: RuleResult | null, failVerdict: Verdict, loadName?: string) => {
    if (rule === null) return;
    rules.push(rule);
    const reason = judgeRule(rule, failVerdict, params.tightFraction, loadName);
    if (reason !== null) reasons.push(reason);
  };

  record(checkTotalWithinRating(ratingA, runningTotalA, edition, individual), 'over-the-limit');
  if (continuousA > 0)
    record(checkContinuousLoadDevice(ratingA, continuousA, noncontinuousA, edition), 'over-the-limit');
  if (!individual) {
    for (const load of loads) {
      if (load.connection !== 'cord-and-plug') continue;
      const fitsOwnCircuit = (load.continuous ? CONTINUOUS_LOAD_FACTOR : 1) * load.runningA <= ratingA;
      const rule = checkCordAndPlugShare(ratingA, load.runningA, edition, load.name);
      record(rule, fitsOwnCircuit ? 'dedicated-circuit-advised' : 'over-the-limit', load.name);
    }
    record(
      checkFastenedInPlaceShare(ratingA, fastenedInPlaceA, circuit.alsoFeedsLightingOrOutlets, edition),
      'dedicated-circuit-advised',
    );
  }

  const totalAlreadyFlagged = reasons.some(
    (r) => r.ruleId === 'nec-210.23-total-within-rating' || r.ruleId === 'nec-210.20-continuous-load-device',
  );
  const tradeLimitA = TRADE_LOADING_SHARE * ratingA;
  if (!totalAlreadyFlagged && runningTotalA > tradeLimitA) {
    reasons.push({
      verdict: 'tight',
      ruleId: 'trade-80-percent-loading',
      citation: commonPracticeCitation('keep steady loads within 80 % of the device rating'),
      message:
        `The loads total ${formatAmps(runningTotalA)}, above the ${formatAmps(tradeLimitA)} (80 % of ` +
        `${formatAmps(ratingA)}) the trade keeps as steady loading; within the code, but little room is left.`,
    });
  }

  return {
    runningTotalA,
    continuousA,
    noncontinuousA,
    fastenedInPlaceA,
    requiredRatingA: noncontinuousA + CONTINUOUS_LOAD_FACTOR * continuousA,
    rules,
    reasons,
  };
}
