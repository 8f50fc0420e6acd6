import { describe, expect, it } from 'vitest';
import { circuitWarnings, type CircuitForWarnings } from './circuit-warnings.js';

const base: CircuitForWarnings = { deviceRatingA: 20, deviceKind: 'na-thermal-magnetic', conductorSize: '12 AWG', conductorMaterial: 'cu', necEdition: 2023 };
const ids = (c: Partial<CircuitForWarnings>) => circuitWarnings({ ...base, ...c }).map((w) => w.ruleId);

describe('circuitWarnings', () => {
  it('when the conductor is too small for the device, then a 240.4(D) warning on conductorSize', () => {
    // source: NEC 240.4(D) (trade-facts 6.2 #11): 14 AWG Cu → 15 A max; 12 AWG Cu → 20 A; 12 AWG Al → 15 A
    const [w] = circuitWarnings({ ...base, conductorSize: '14 AWG' });
    expect(w).toMatchObject({ ruleId: 'nec-240.4-small-conductor', pointer: '/conductorSize', citation: { code: 'NFPA 70', edition: 2023, section: '240.4(D)' } });
    expect(w!.message).toContain('15 A');
    expect(ids({})).toEqual([]);
    expect(ids({ conductorMaterial: 'al' })).toEqual(['nec-240.4-small-conductor']);
    expect(ids({ conductorSize: '14', deviceRatingA: 15 })).toEqual([]);
    // source: NEC 240.4(D): 10 AWG Cu → 30 A
    expect(ids({ conductorSize: '10 awg', deviceRatingA: 30 })).toEqual([]);
  });

  it('when the material is not recorded, then copper is assumed and said', () => {
    const [w] = circuitWarnings({ ...base, conductorSize: '14 AWG', conductorMaterial: null });
    expect(w!.message).toContain('copper assumed');
  });

  it('when the conductor is metric or unknown, then 240.4(D) is not applied', () => {
    expect(ids({ conductorSize: '2.5 mm2', deviceKind: 'iec-c', deviceRatingA: 16 })).toEqual([]);
    expect(ids({ conductorSize: null })).toEqual([]);
  });

  it('when a North-American rating is not in NEC 240.6(A), then a warning names the nearest standard sizes', () => {
    // source: NEC 240.6(A): 15, 20, 25, 30 … A; fuses also 1, 3, 6, 10 A
    const [w] = circuitWarnings({ ...base, deviceRatingA: 16, conductorSize: null });
    expect(w).toMatchObject({ ruleId: 'nec-240.6-standard-rating', pointer: '/deviceRatingA' });
    expect(w!.message).toContain('15 A or 20 A');
    expect(ids({ deviceKind: 'fuse', deviceRatingA: 10, conductorSize: null })).toEqual([]);
    expect(ids({ deviceKind: 'na-thermal-magnetic', deviceRatingA: 10, conductorSize: null })).toEqual(['nec-240.6-standard-rating']);
  });

  it('when an IEC rating is not a preferred value, then a warning; a C16 is fine', () => {
    // from memory: IEC 60898-1 5.3.2 preferred values include 13 and 16 A, not 15 A
    expect(ids({ deviceKind: 'iec-c', deviceRatingA: 16, conductorSize: '2.5 mm2' })).toEqual([]);
    const [w] = circuitWarnings({ ...base, deviceKind: 'iec-b', deviceRatingA: 15, conductorSize: null });
    expect(w).toMatchObject({ ruleId: 'iec-60898-1-preferred-rating', citation: { tag: 'from memory' } });
    expect(w!.message).toContain('13 A or 16 A');
  });

  it('when the device is outside every trip model, then a scope warning', () => {
    // source: IEC 60898-1 scope In ≤ 125 A (trade-facts 1.1, verified)
    expect(ids({ deviceKind: 'iec-c', deviceRatingA: 160, conductorSize: null })).toEqual(['iec-60898-1-preferred-rating', 'trip-model-scope']);
  });
});
