import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  checkCordAndPlugShare,
  checkFastenedInPlaceShare,
  checkTotalWithinRating,
  cordAndPlugLimitA,
  fastenedInPlaceLimitA,
} from './permissible-loads.js';

describe('NEC 210.23 permissible loads on 15 A and 20 A circuits', () => {
  // source: NEC 2023 210.23(B)(1) / 2020 210.23(A)(1) — one cord-and-plug load ≤ 80 % (trade-facts 6.2 example 4)
  it('limits one cord-and-plug load to 16 A on 20 A and 12 A on 15 A', () => {
    expect(cordAndPlugLimitA(20)).toBe(16);
    expect(cordAndPlugLimitA(15)).toBe(12);
    expect(checkCordAndPlugShare(20, 16, 2023)!.passed).toBe(true);
    expect(checkCordAndPlugShare(20, 16.5, 2023)!.passed).toBe(false);
    expect(checkCordAndPlugShare(15, 12, 2023)!.passed).toBe(true);
    expect(checkCordAndPlugShare(15, 12.1, 2023)!.passed).toBe(false);
  });

  // source: NEC 2023 210.23(B)(2) / 2020 210.23(A)(2) — fastened-in-place total ≤ 50 % where lighting/outlets are also fed
  it('limits fastened-in-place equipment to 10 A on 20 A and 7.5 A on 15 A', () => {
    expect(fastenedInPlaceLimitA(20)).toBe(10);
    expect(fastenedInPlaceLimitA(15)).toBe(7.5);
    expect(checkFastenedInPlaceShare(15, 7.5, true, 2023)!.passed).toBe(true);
    expect(checkFastenedInPlaceShare(15, 7.6, true, 2023)!.passed).toBe(false);
  });

  // source: NEC 210.23 (2020 (A)(1)/(A)(2), 2023 (B)(1)/(B)(2)); renumbering verified (trade-facts 3.0)
  it('cites the clause number of the edition asked for', () => {
    expect(checkCordAndPlugShare(20, 10, 2023)!.citation).toMatchObject({
      code: 'NFPA 70',
      edition: 2023,
      section: '210.23(B)(1)',
    });
    expect(checkCordAndPlugShare(20, 10, 2020)!.citation).toMatchObject({
      code: 'NFPA 70',
      edition: 2020,
      section: '210.23(A)(1)',
    });
    expect(checkFastenedInPlaceShare(20, 5, true, 2023)!.citation.section).toBe('210.23(B)(2)');
    expect(checkFastenedInPlaceShare(20, 5, true, 2020)!.citation.section).toBe('210.23(A)(2)');
  });

  // source: jadelearning.com 210.23 article (trade-facts 6.2 example 5): water cooler 3 A + ice machine 8 A = 11 A > 10 A
  it('does not permit a 3 A water cooler and an 8 A ice machine on a 20 A circuit that also feeds a receptacle', () => {
    const result = checkFastenedInPlaceShare(20, 3 + 8, true, 2023)!;
    expect(result.passed).toBe(false);
    expect(result.limitA).toBe(10);
    expect(result.actualA).toBe(11);
    expect(result.message).toMatch(/not permitted/);
  });

  // source: EC&M Code Q&A, Sept 2012 (trade-facts 6.2 example 6): 13 A central vacuum, fastened, shared 20 A circuit
  it('sends a 13 A fastened-in-place central vacuum on a shared 20 A circuit to its own circuit', () => {
    const result = checkFastenedInPlaceShare(20, 13, true, 2020)!;
    expect(result.passed).toBe(false);
    expect(result.citation.section).toBe('210.23(A)(2)');
    // On a circuit that feeds nothing else the 50 % rule does not apply.
    expect(checkFastenedInPlaceShare(20, 13, false, 2020)).toBeNull();
  });

  // from memory: NEC 2023 210.23(C) / 2020 210.23(B) — 30 A circuits, one cord-and-plug load ≤ 80 % (24 A)
  it('applies the 80 % share on 30 A circuits (from memory) and nothing on other ratings', () => {
    const result = checkCordAndPlugShare(30, 25, 2023)!;
    expect(result.limitA).toBe(24);
    expect(result.citation).toMatchObject({ section: '210.23(C)', tag: 'from memory' });
    expect(checkCordAndPlugShare(25, 25, 2023)).toBeNull();
    expect(checkFastenedInPlaceShare(30, 25, true, 2023)).toBeNull();
  });

  // source: NEC 210.23 parent text (multi-outlet) and 210.22 (individual circuit): never above the rating
  it('never lets the total exceed the rating', () => {
    expect(checkTotalWithinRating(20, 22, 2023).passed).toBe(false);
    expect(checkTotalWithinRating(20, 22, 2023).citation.section).toBe('210.23');
    expect(checkTotalWithinRating(20, 20, 2023, true)).toMatchObject({ passed: true, citation: { section: '210.22' } });
  });

  it('rejects negative and non-finite figures', () => {
    expect(() => checkCordAndPlugShare(20, -1, 2023)).toThrow(RangeError);
    expect(() => checkTotalWithinRating(0, 1, 2023)).toThrow(RangeError);
    expect(() => checkFastenedInPlaceShare(20, Number.NaN, true, 2023)).toThrow(RangeError);
  });

  it('property: a larger load never turns a failed share into a pass', () => {
    fc.assert(
      fc.property(
        fc.constantFrom(15, 20, 30),
        fc.double({ min: 0, max: 100, noNaN: true }),
        fc.double({ min: 0, max: 50, noNaN: true }),
        (rating, a, extra) => {
          const base = checkCordAndPlugShare(rating, a, 2023)!;
          const more = checkCordAndPlugShare(rating, a + extra, 2023)!;
          if (!base.passed) expect(more.passed).toBe(false);
        },
      ),
    );
  });
});
