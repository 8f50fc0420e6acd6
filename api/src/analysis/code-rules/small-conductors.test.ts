import { describe, expect, it } from 'vitest';
import { checkSmallConductor, smallConductorLimitA } from './small-conductors.js';

describe('NEC 240.4(D) small conductors', () => {
  // source: NEC 240.4(D) values (trade-facts 3.6, verified)
  it.each([
    ['18', 'cu', 7],
    ['16', 'cu', 10],
    ['14', 'cu', 15],
    ['12', 'cu', 20],
    ['10', 'cu', 30],
    ['12', 'al', 15],
    ['10', 'al', 25],
  ] as const)('%s AWG %s → %d A', (sizeAwg, material, limit) => {
    expect(smallConductorLimitA({ sizeAwg, material })).toBe(limit);
  });

  // source: trade-facts 6.2 example 11 (240.4(D)): 14 AWG Cu on 20 A → warning; 12 AWG Cu → OK; 12 AWG Al → warning
  it('warns for 14 AWG copper or 12 AWG aluminum on a 20 A breaker, not for 12 AWG copper', () => {
    const cu14 = checkSmallConductor(20, { sizeAwg: '14', material: 'cu' }, 2023)!;
    expect(cu14).toMatchObject({ passed: false, severity: 'warning', limitA: 15, citation: { section: '240.4(D)' } });
    expect(checkSmallConductor(20, { sizeAwg: '12', material: 'cu' }, 2023)!.passed).toBe(true);
    expect(checkSmallConductor(20, { sizeAwg: '12', material: 'al' }, 2020)!).toMatchObject({
      passed: false,
      limitA: 15,
    });
  });

  it('accepts "12 AWG" spelling and leaves larger conductors to other rules', () => {
    expect(smallConductorLimitA({ sizeAwg: '12 AWG', material: 'cu' })).toBe(20);
    expect(checkSmallConductor(40, { sizeAwg: '8', material: 'cu' }, 2023)).toBeNull();
  });
});
