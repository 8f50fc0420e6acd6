import { describe, expect, it } from 'vitest';
import { applianceMaxOcpdA, checkApplianceOcpd } from './appliance-ocpd.js';

describe('NEC 422.11(E) single non-motor appliance', () => {
  // source: EC&M Code Q&A, Aug 2020 (trade-facts 6.2 example 9): 4500 W, 240 V water heater → 18.75 A → 28.1 A → 30 A
  it('allows 150 % of a 18.75 A water heater rounded up to 30 A', () => {
    expect(4500 / 240).toBe(18.75);
    expect(applianceMaxOcpdA(18.75)).toBe(30);
    expect(checkApplianceOcpd(30, 18.75, 2023)).toMatchObject({ passed: true, citation: { section: '422.11(E)(3)' } });
    expect(checkApplianceOcpd(35, 18.75, 2023).passed).toBe(false);
  });

  // source: NEC 422.11(E)(1)/(2) — marked rating governs; unmarked ≤ 13.3 A → 20 A (verified)
  it('uses the marked rating when there is one and 20 A for small unmarked appliances', () => {
    expect(applianceMaxOcpdA(10)).toBe(20);
    expect(applianceMaxOcpdA(13.3)).toBe(20);
    expect(applianceMaxOcpdA(10, 15)).toBe(15);
    expect(checkApplianceOcpd(20, 10, 2020, 15).citation.section).toBe('422.11(E)(1)');
    expect(() => applianceMaxOcpdA(0)).toThrow(RangeError);
  });
});
