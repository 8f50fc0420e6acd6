import { describe, expect, it } from 'vitest';
import { isStandardRating, largestStandardRatingNotAbove, nextStandardRating } from './standard-ratings.js';

describe('NEC 240.6(A) standard ratings', () => {
  // source: NEC 240.6(A) (2020, 2023) list, verified (trade-facts section 2)
  it('rounds up to the next standard size', () => {
    expect(nextStandardRating(21.25)).toBe(25);
    expect(nextStandardRating(20)).toBe(20);
    expect(nextStandardRating(16 * 1.25)).toBe(20);
    expect(nextStandardRating(28.125)).toBe(30);
    expect(nextStandardRating(48)).toBe(50);
    expect(nextStandardRating(6000)).toBe(6000);
    expect(nextStandardRating(6001)).toBeNull();
    expect(nextStandardRating(2)).toBe(15);
    expect(nextStandardRating(2, 'fuse')).toBe(3);
  });

  // source: NEC 240.6(A) — 1, 3, 6 and 10 A are standard for fuses only
  it('knows which ratings are standard', () => {
    expect(isStandardRating(110)).toBe(true);
    expect(isStandardRating(105)).toBe(false);
    expect(isStandardRating(10)).toBe(false);
    expect(isStandardRating(10, 'fuse')).toBe(true);
    expect(largestStandardRatingNotAbove(28.1)).toBe(25);
    expect(largestStandardRatingNotAbove(14)).toBeNull();
  });

  it('rejects negative input', () => {
    expect(() => nextStandardRating(-1)).toThrow(RangeError);
  });
});
