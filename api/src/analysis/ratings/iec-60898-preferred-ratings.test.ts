import { describe, expect, it } from 'vitest';
import { IEC_60898_1_PREFERRED_RATINGS_A, isIecPreferredRating, nearestIecPreferredRatings } from './iec-60898-preferred-ratings.js';

describe('IEC 60898-1 preferred ratings', () => {
  it('when the common household ratings are asked, then they are preferred and 15 A is not', () => {
    // from memory: IEC 60898-1 5.3.2 lists 6, 10, 16, 20, 32 A among the preferred values; 15 A is a North-American size
    for (const r of [6, 10, 16, 20, 32]) expect(isIecPreferredRating(r)).toBe(true);
    expect(isIecPreferredRating(15)).toBe(false);
    expect(IEC_60898_1_PREFERRED_RATINGS_A.at(-1)).toBe(125); // source: IEC 60898-1 scope, In ≤ 125 A (trade-facts 1.1, verified)
  });

  it('when a rating lies between preferred values, then both neighbours are given; beyond the ends, null', () => {
    expect(nearestIecPreferredRatings(15)).toEqual({ below: 13, above: 16 });
    expect(nearestIecPreferredRatings(16)).toEqual({ below: 16, above: 16 });
    expect(nearestIecPreferredRatings(4)).toEqual({ below: null, above: 6 });
    expect(nearestIecPreferredRatings(160)).toEqual({ below: 125, above: null });
  });

  it('when the rating is not a positive number, then RangeError', () => {
    expect(() => isIecPreferredRating(0)).toThrow(RangeError);
    expect(() => nearestIecPreferredRatings(Number.NaN)).toThrow(RangeError);
  });
});
