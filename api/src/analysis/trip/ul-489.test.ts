import { describe, expect, it } from 'vitest';
import { profileFromSteps } from './current-profile.js';
import { assessInstantaneous } from './instantaneous-band.js';
import { assessThermal, meetsTestPoint } from './thermal-family.js';
import { naInstantaneousBand, ul489TestPoints, ul489ThermalFamily } from './ul-489.js';

const constant = (currentA: number, durationS: number) => profileFromSteps([{ currentA, durationS }]);

describe('UL 489 calibration points', () => {
  // source: UL 489 calibration (optifuse.com summary) — 135 % trips within 1 h (≤ 50 A); trade-facts 6.1 example 2
  it.each([
    [20, 27],
    [15, 20.25],
  ])('%d A breaker: %d A (135 %%) trips within 60 min', (ratingA, amps) => {
    const result = assessThermal(ul489ThermalFamily(ratingA), ratingA, constant(amps, 3600 + 1e-3));
    expect(result.outcome).toBe('will-trip');
    expect(result.latestTripS!).toBeLessThanOrEqual(3600 + 1e-6);
  });

  // source: UL 489 calibration — 200 % trips within 2 min for ratings ≤ 30 A; trade-facts 6.1 example 2
  it.each([
    [20, 40],
    [15, 30],
  ])('%d A breaker: %d A (200 %%) trips within 2 min', (ratingA, amps) => {
    const result = assessThermal(ul489ThermalFamily(ratingA), ratingA, constant(amps, 120 + 1e-3));
    expect(result.outcome).toBe('will-trip');
    expect(result.latestTripS!).toBeCloseTo(120, 6);
    // Before 2 min it may or may not have tripped: inside the band.
    expect(assessThermal(ul489ThermalFamily(ratingA), ratingA, constant(amps, 60)).outcome).toBe('may-trip');
  });

  // source: UL 489 calibration — 100 % of rating must be carried
  it('a 20 A breaker holds 20 A indefinitely in every member of the band', () => {
    const result = assessThermal(ul489ThermalFamily(20), 20, constant(20, 3 * 3600), { holdLast: true });
    expect(result.outcome).toBe('will-not-trip');
    expect(result.fastestHeatingRatio).toBeCloseTo(1, 9);
  });

  // from memory: UL 489 200 % maximum 4 min for 31–50 A; 135 % within 2 h above 50 A (trade-facts 1.3)
  it('uses the larger-frame times (from memory) above 30 A and 50 A', () => {
    expect(ul489TestPoints(40).tripWithinHigh.timeS).toBe(240);
    expect(ul489TestPoints(40).tripWithinHigh.citation.tag).toBe('from memory');
    expect(ul489TestPoints(100).tripWithinLow.timeS).toBe(7200);
    expect(ul489TestPoints(100).tripWithinHigh.timeS).toBe(360);
    expect(ul489TestPoints(20).tripWithinHigh.citation.tag).toBe('verified');
  });

  it('every member of the fitted band meets every calibration point', () => {
    // source: UL 489 calibration points (100 %, 135 %, 200 %) and the assumed 5 × / 1 s point (from memory)
    for (const ratingA of [15, 20, 40, 100, 400]) {
      const family = ul489ThermalFamily(ratingA);
      for (const member of family.members) {
        for (const point of family.testPoints) expect(meetsTestPoint(member, point)).toBe(true);
      }
    }
  });

  it('rejects ratings outside the profile', () => {
    expect(() => ul489TestPoints(601)).toThrow(RangeError);
    expect(() => ul489TestPoints(-15)).toThrow(RangeError);
  });
});

describe('North-American typical instantaneous band', () => {
  // from memory / common practice, no source: residential pickup about 5–20 × rating, typically 10 × (trade-facts 1.4)
  it('places 20 A breaker currents against 100 A / 400 A edges and says it is from memory', () => {
    const band = naInstantaneousBand();
    expect(band.citation.tag).toBe('from memory');
    expect(band.typicalMultiple).toBe(10);
    expect(assessInstantaneous(band, 20, 100, 'half-cycle-rms').outcome).toBe('will-not-trip');
    expect(assessInstantaneous(band, 20, 200, 'half-cycle-rms').outcome).toBe('may-trip');
    expect(assessInstantaneous(band, 20, 400, 'half-cycle-rms').outcome).toBe('will-trip');
  });
});
