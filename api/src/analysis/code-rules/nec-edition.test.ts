import { describe, expect, it } from 'vitest';
import { assertNecEdition, necSectionFor } from './nec-edition.js';

describe('NEC editions', () => {
  // source: trade-facts 3.0 — 2023 inserted 10 A circuits as 210.23(A), so 15/20 A moved from (A) to (B)
  it('maps concepts to the clause of each edition', () => {
    expect(necSectionFor(2020, 'cordAndPlugShare').section).toBe('210.23(A)(1)');
    expect(necSectionFor(2023, 'cordAndPlugShare').section).toBe('210.23(B)(1)');
    expect(necSectionFor(2020, 'fastenedInPlaceShare').section).toBe('210.23(A)(2)');
    expect(necSectionFor(2023, 'fastenedInPlaceShare').section).toBe('210.23(B)(2)');
  });

  it('accepts 2020 and 2023 only', () => {
    expect(() => assertNecEdition(2017)).toThrow(/2020 or 2023/);
    expect(() => assertNecEdition(2026)).toThrow(RangeError);
    expect(() => assertNecEdition(2023)).not.toThrow();
  });
});
