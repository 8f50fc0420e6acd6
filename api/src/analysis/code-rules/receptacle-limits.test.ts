import { describe, expect, it } from 'vitest';
import { checkReceptacleLoad, isPermittedReceptacleRating, receptacleMaxLoadA } from './receptacle-limits.js';

describe('NEC 210.21(B) receptacles', () => {
  // source: NEC Table 210.21(B)(2) (trade-facts 6.2 example 7): 15 A receptacle on 20 A → 12 A; 20 A → 16 A; 30 on 30 → 24 A
  it('gives the largest cord-and-plug load per receptacle', () => {
    expect(receptacleMaxLoadA(20, 15)).toBe(12);
    expect(receptacleMaxLoadA(20, 20)).toBe(16);
    expect(receptacleMaxLoadA(15, 15)).toBe(12);
    expect(receptacleMaxLoadA(30, 30)).toBe(24);
    expect(receptacleMaxLoadA(15, 20)).toBeNull();
    expect(checkReceptacleLoad(20, 15, 13, 2023)).toMatchObject({
      passed: false,
      limitA: 12,
      citation: { section: 'Table 210.21(B)(2)' },
    });
  });

  // source: NEC Table 210.21(B)(3): 15 A circuit → 15 A receptacles; 20 A → 15 or 20 A; 40 A → 40 or 50 A
  it('knows which receptacle ratings a shared circuit may have', () => {
    expect(isPermittedReceptacleRating(20, 15)).toBe(true);
    expect(isPermittedReceptacleRating(15, 20)).toBe(false);
    expect(isPermittedReceptacleRating(40, 50)).toBe(true);
    expect(isPermittedReceptacleRating(25, 25)).toBeNull();
  });
});
