import type { Citation } from './citation.js';

/**
 * How much a failed rule matters:
 * - `violation`: the installation as described breaks the cited rule;
 * - `warning`: something to correct or confirm (e.g. a conductor too small for its device, 240.4(D));
 * - `advice`: a rule of thumb of the trade, not a code requirement.
 */
export type RuleSeverity = 'violation' | 'warning' | 'advice';

/**
 * The outcome of one code rule applied to one circuit or load.
 * - `ruleId`: stable identifier (kebab-case), e.g. `nec-210.23-cord-and-plug-share`;
 * - `citation`: document, edition and clause the rule rests on;
 * - `limitA` / `actualA`: the limit and the value compared with it, amps;
 * - `passed`: true when `actualA` is within `limitA`;
 * - `severity`: what a failure means (see {@link RuleSeverity});
 * - `message`: plain English of our own (no quotation of the code text).
 */
export interface RuleResult {
  ruleId: string;
  citation: Citation;
  limitA: number;
  actualA: number;
  passed: boolean;
  severity: RuleSeverity;
  message: string;
}

/** Formats amps for messages: at most two decimals, trailing zeros dropped (16 → "16 A", 7.5 → "7.5 A"). */
export function formatAmps(amps: number): string {
  return `${String(Math.round(amps * 100) / 100)} A`;
}

/** Tolerance (amps) for comparing a figure with its limit, so that 16 × 1.25 = 20.000000000000004 passes at 20 A. */
export const LIMIT_TOLERANCE_A = 1e-9;

/** What {@link limitRule} needs: the rule's identity, the two figures and a message for each outcome. */
export interface LimitRuleFields {
  ruleId: string;
  citation: Citation;
  limitA: number;
  actualA: number;
  severity?: RuleSeverity;
  whenPassed: string;
  whenFailed: string;
}

/**
 * Builds a {@link RuleResult} for a rule of the form "actual must not exceed limit": passes when
 * `actualA ≤ limitA` (within {@link LIMIT_TOLERANCE_A}); severity defaults to `violation`.
 */
export function limitRule(fields: LimitRuleFields): RuleResult {
  const passed = fields.actualA <= fields.limitA + LIMIT_TOLERANCE_A;
  return {
    ruleId: fields.ruleId,
    citation: fields.citation,
    limitA: fields.limitA,
    actualA: fields.actualA,
    passed,
    severity: fields.severity ?? 'violation',
    message: passed ? fields.whenPassed : fields.whenFailed,
  };
}
