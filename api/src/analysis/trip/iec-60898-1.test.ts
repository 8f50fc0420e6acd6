import { describe, expect, it } from 'vitest';
import { profileFromSteps } from './current-profile.js';
import { iecInstantaneousBand, iecThermalFamily, iecThermalTestPoints } from './iec-60898-1.js';
import { assessInstantaneous } from './instantaneous-band.js';
import { assessThermal, meetsTestPoint } from './thermal-family.js';

const EPSILON = 1e-6;

describe('IEC 60898-1 instantaneous bands', () => {
  // source: IEC 60898-1:2015 Table 7 — C: no trip at 5 In, trip at 10 In (trade-facts 6.1 example 1: C16 80 A / 160 A)
  it('C16 does not trip instantaneously at 5 In − ε or at 5 In, may trip just above, trips at 10 In', () => {
    const band = iecInstantaneousBand('C');
    expect(assessInstantaneous(band, 16, 80 - EPSILON, 'half-cycle-rms').outcome).toBe('will-not-trip');
    expect(assessInstantaneous(band, 16, 80, 'half-cycle-rms').outcome).toBe('will-not-trip');
    expect(assessInstantaneous(band, 16, 80 + EPSILON, 'half-cycle-rms').outcome).toBe('may-trip');
    expect(assessInstantaneous(band, 16, 160 - EPSILON, 'half-cycle-rms').outcome).toBe('may-trip');
    expect(assessInstantaneous(band, 16, 160, 'half-cycle-rms').outcome).toBe('will-trip');
  });

  // source: IEC 60898-1:2015 Table 7 — B 3–5 In, D 10–20 In (trade-facts 6.1: B16 48/80 A, D16 160/320 A)
  it.each([
    ['B', 48, 80],
    ['D', 160, 320],
  ] as const)('curve %s, In = 16 A: band edges %d A and %d A', (curve, noTripA, tripA) => {
    const band = iecInstantaneousBand(curve);
    const at = (a: number) => assessInstantaneous(band, 16, a, 'half-cycle-rms');
    expect(at(noTripA).noTripA).toBe(noTripA);
    expect(at(noTripA).tripA).toBe(tripA);
    expect(at(noTripA - EPSILON).outcome).toBe('will-not-trip');
    expect(at(noTripA + EPSILON).outcome).toBe('may-trip');
    expect(at(tripA).outcome).toBe('will-trip');
  });

  it('reports the margin to the band and the basis used', () => {
    // source: IEC 60898-1:2015 Table 7 (B: no trip at 3 In); 39 A on B20 → 39/60 of the no-trip edge (derived)
    const result = assessInstantaneous(iecInstantaneousBand('B'), 20, 39, 'peak-over-root-2');
    expect(result.noTripA).toBe(60);
    expect(result.ratioToNoTripEdge).toBeCloseTo(0.65, 12);
    expect(result.marginA).toBeCloseTo(21, 12);
    expect(result.multipleOfRating).toBeCloseTo(1.95, 12);
    expect(result.basis).toBe('peak-over-root-2');
  });
});

describe('IEC 60898-1 thermal test points (In = 16 A)', () => {
  const family = iecThermalFamily(16);

  // source: IEC 60898-1:2015 Table 7 — 1.13 In from cold: no trip within 1 h for In ≤ 63 A
  it('holds 1.13 In (18.08 A) from cold for 1 h in every member of the band', () => {
    const result = assessThermal(family, 16, profileFromSteps([{ currentA: 18.08, durationS: 3600 }]));
    expect(result.outcome).toBe('will-not-trip');
    expect(result.earliestTripS).toBeNull();
  });

  // source: IEC 60898-1:2015 Table 7 — 1.45 In immediately after the 1.13 In test: trip within 1 h (In ≤ 63 A)
  it('trips at 1.45 In (23.2 A) within 1 h when started hot after the 1.13 In test', () => {
    const profile = profileFromSteps([
      { currentA: 18.08, durationS: 3600 },
      { currentA: 23.2, durationS: 3600 + 1 },
    ]);
    const result = assessThermal(family, 16, profile);
    expect(result.outcome).toBe('will-trip');
    expect(result.latestTripS).not.toBeNull();
    expect(result.latestTripS! - 3600).toBeLessThanOrEqual(3600 + 1e-6);
    // The same start through initialCurrentA (equilibrium at 1.13 In) gives the same band.
    const hot = assessThermal(family, 16, profileFromSteps([{ currentA: 23.2, durationS: 3601 }]), {
      initialCurrentA: 18.08,
    });
    expect(hot.outcome).toBe('will-trip');
    expect(hot.latestTripS!).toBeCloseTo(result.latestTripS! - 3600, 3);
  });

  // source: IEC 60898-1:2015 Table 7 — 2.55 In from cold: 1 s < t < 60 s for In ≤ 32 A (40.8 A for C16)
  it('trips at 2.55 In (40.8 A) from cold no sooner than 1 s and no later than 60 s', () => {
    expect(assessThermal(family, 16, profileFromSteps([{ currentA: 40.8, durationS: 0.999 }])).outcome).toBe(
      'will-not-trip',
    );
    expect(assessThermal(family, 16, profileFromSteps([{ currentA: 40.8, durationS: 30 }])).outcome).toBe('may-trip');
    const full = assessThermal(family, 16, profileFromSteps([{ currentA: 40.8, durationS: 60.001 }]));
    expect(full.outcome).toBe('will-trip');
    expect(full.earliestTripS!).toBeCloseTo(1, 6);
    expect(full.latestTripS!).toBeCloseTo(60, 6);
    expect(full.estimatedTripS!).toBeGreaterThan(1);
    expect(full.estimatedTripS!).toBeLessThan(60);
  });

  it('every member of the fitted band meets every test point of the standard', () => {
    // source: IEC 60898-1:2015 Table 7 (all three thermal rows), for In of 16, 40 and 100 A
    for (const ratingA of [16, 40, 100]) {
      const f = iecThermalFamily(ratingA);
      for (const member of f.members) {
        for (const point of f.testPoints) expect(meetsTestPoint(member, point)).toBe(true);
      }
    }
  });
});

describe('IEC 60898-1 test points by rating', () => {
  // source: IEC 60898-1:2015 Table 7 — conventional time 1 h for In ≤ 63 A, 2 h above; 2.55 In: 60 s ≤ 32 A, 120 s above
  it.each([
    [32, 3600, 60],
    [40, 3600, 120],
    [63, 3600, 120],
    [80, 7200, 120],
  ])('In = %d A: conventional time %d s, 2.55 In limit %d s', (ratingA, conventionalS, highS) => {
    const points = iecThermalTestPoints(ratingA);
    expect(points.hold.multiple).toBe(1.13);
    expect(points.hold.timeS).toBe(conventionalS);
    expect(points.tripWithinLow.multiple).toBe(1.45);
    expect(points.tripWithinLow.timeS).toBe(conventionalS);
    expect(points.tripWithinLow.initialMultiple).toBe(1.13);
    expect(points.tripWithinHigh.multiple).toBe(2.55);
    expect(points.tripWithinHigh.timeS).toBe(highS);
    expect(points.notBefore.timeS).toBe(1);
  });

  // source: IEC 60898-1 scope — In ≤ 125 A
  it('rejects ratings outside the scope of the standard', () => {
    expect(() => iecThermalTestPoints(160)).toThrow(RangeError);
    expect(() => iecThermalTestPoints(0)).toThrow(RangeError);
    expect(() => iecThermalTestPoints(Number.NaN)).toThrow(RangeError);
  });
});
