import type { Citation } from '../code-rules/citation.js';

/**
 * Headroom's judgement of a circuit, from best to worst:
 * - `fine`: every rule passes with room to spare;
 * - `tight`: every code rule passes, but a figure is within the tight margin of a limit (default 10 %),
 *   above the trade's 80 % loading rule of thumb, or only the fastest breakers the standard allows could
 *   trip;
 * - `dedicated-circuit-advised`: a load must not (NEC 210.23) or should not (its start-up reaches the
 *   instantaneous band, or a typical breaker could trip thermally) share this circuit;
 * - `over-the-limit`: the circuit as loaded breaks a limit no rearrangement of sharing fixes: the total
 *   exceeds the rating (NEC 210.23 / 210.22), the continuous-load rule (210.20(A)) fails, a single load is
 *   too large even for a circuit of its own at this rating, or every breaker the standard allows trips.
 */
export type Verdict = 'fine' | 'tight' | 'dedicated-circuit-advised' | 'over-the-limit';

/** Every verdict, best first. */
export const VERDICTS: readonly Verdict[] = ['fine', 'tight', 'dedicated-circuit-advised', 'over-the-limit'];

/** Orders verdicts: negative when `a` is better than `b`, 0 when equal. */
export function compareVerdicts(a: Verdict, b: Verdict): number {
  return VERDICTS.indexOf(a) - VERDICTS.indexOf(b);
}

/** The worse of two verdicts. */
export function worseVerdict(a: Verdict, b: Verdict): Verdict {
  return compareVerdicts(a, b) >= 0 ? a : b;
}

/**
 * Default "tight" margin: a figure within 10 % of its limit (above 90 % of it) makes the verdict at least
 * `tight`. Headroom's choice (no source), overridable per check.
 */
export const DEFAULT_TIGHT_FRACTION = 0.1;

/**
 * The trade's loading rule of thumb: keep steady loads within 80 % of the device rating (12 A on 15 A,
 * 16 A on 20 A). Common practice, derived from NEC 210.19/210.20/210.23 and applied to all loads; above it
 * the verdict is at least `tight` (never a code violation on its own).
 */
export const TRADE_LOADING_SHARE = 0.8;

/**
 * One reason behind a verdict: the verdict it leads to, the rule or standard clause it rests on, a
 * message in plain English, and the load it concerns (when one load is the cause).
 */
export interface CheckReason {
  verdict: Verdict;
  ruleId: string;
  citation: Citation;
  message: string;
  loadName?: string;
}

/** The worst verdict among `reasons` (`fine` when there are none). */
export function verdictOf(reasons: readonly CheckReason[]): Verdict {
  return reasons.reduce<Verdict>((worst, reason) => worseVerdict(worst, reason.verdict), 'fine');
}

/** Sorts reasons worst first, keeping the original order among equals. */
export function sortReasons(reasons: readonly CheckReason[]): CheckReason[] {
  return reasons
    .map((reason, index) => ({ reason, index }))
    .sort((a, b) => compareVerdicts(b.reason.verdict, a.reason.verdict) || a.index - b.index)
    .map(({ reason }) => reason);
}

/** True when `actual` is above (1 − tightFraction) × `limit`: within the tight margin of the limit. */
export function isWithinTightMargin(actual: number, limit: number, tightFraction: number): boolean {
  return actual > (1 - tightFraction) * limit;
}
