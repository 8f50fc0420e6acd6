import { describe, expect, it } from 'vitest';
import { commonPracticeCitation } from '../code-rules/citation.js';
import {
  compareVerdicts,
  isWithinTightMargin,
  sortReasons,
  verdictOf,
  worseVerdict,
  type CheckReason,
} from './verdict.js';

const reason = (verdict: CheckReason['verdict'], ruleId: string): CheckReason => ({
  verdict,
  ruleId,
  citation: commonPracticeCitation('test'),
  message: ruleId,
});

describe('verdict ordering', () => {
  it('orders fine < tight < dedicated-circuit-advised < over-the-limit', () => {
    expect(compareVerdicts('fine', 'tight')).toBeLessThan(0);
    expect(compareVerdicts('over-the-limit', 'dedicated-circuit-advised')).toBeGreaterThan(0);
    expect(worseVerdict('tight', 'dedicated-circuit-advised')).toBe('dedicated-circuit-advised');
    expect(verdictOf([])).toBe('fine');
    expect(verdictOf([reason('tight', 'a'), reason('over-the-limit', 'b')])).toBe('over-the-limit');
  });

  it('sorts reasons worst first and keeps the order among equals', () => {
    const sorted = sortReasons([reason('tight', 'a'), reason('over-the-limit', 'b'), reason('tight', 'c')]);
    expect(sorted.map((r) => r.ruleId)).toEqual(['b', 'a', 'c']);
  });

  // Headroom's choice, no source: "tight" means above 90 % of a limit with the default 10 % margin
  it('treats a figure above (1 − margin) × limit as tight', () => {
    expect(isWithinTightMargin(14.5, 16, 0.1)).toBe(true);
    expect(isWithinTightMargin(14.4, 16, 0.1)).toBe(false);
  });
});
