import { describe, expect, it } from 'vitest';
import { profileFromSteps } from './current-profile.js';
import { ul248TimeDelayThermalFamily, ul248TimeDelayTestPoints } from './fuse-ul-248.js';
import { assessThermal, meetsTestPoint } from './thermal-family.js';

describe('UL 248 time-delay fuse profile', () => {
  // source: UL 248-9:2015 clause 8.3 — a 250 V time-delay fuse ≤ 30 A takes at least 8 s to open at 5 In (verified)
  it('does not open within 8 s at 500 % (100 A on a 20 A fuse)', () => {
    const family = ul248TimeDelayThermalFamily(20);
    expect(assessThermal(family, 20, profileFromSteps([{ currentA: 100, durationS: 7.99 }])).outcome).toBe(
      'will-not-trip',
    );
  });

  // from memory: UL 248-1 Table 4 — opens at 135 % within 1 h and at 200 % within 2 min (≤ 30 A, 250 V)
  it('opens at 200 % within 2 min and at 135 % within 1 h', () => {
    const family = ul248TimeDelayThermalFamily(20);
    expect(assessThermal(family, 20, profileFromSteps([{ currentA: 40, durationS: 120.001 }])).outcome).toBe(
      'will-trip',
    );
    expect(assessThermal(family, 20, profileFromSteps([{ currentA: 27, durationS: 3600.001 }])).outcome).toBe(
      'will-trip',
    );
    for (const member of family.members) {
      for (const point of family.testPoints) expect(meetsTestPoint(member, point)).toBe(true);
    }
  });

  it('covers ratings up to 30 A only', () => {
    expect(() => ul248TimeDelayTestPoints(35)).toThrow(RangeError);
  });
});
