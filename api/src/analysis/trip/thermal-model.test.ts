import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { profileFromSteps, type CurrentProfile } from './current-profile.js';
import { constantCurrentTripTimeS, runThermalModel, type ThermalParameters } from './thermal-model.js';

const model: ThermalParameters = { pickupMultiple: 1.25, timeConstantS: 60 };

/** A constant current split into `n` equal steps (the step profile must not change the answer). */
function splitConstant(currentA: number, durationS: number, n: number): CurrentProfile {
  return profileFromSteps(Array.from({ length: n }, () => ({ currentA, durationS: durationS / n })));
}

describe('first-order thermal model', () => {
  // derived (textbook first-order response): t = τ ln(m² / (m² − k²)); m = 2, k = 1.25, τ = 60 s → 60 ln(4/2.4375)
  it('matches the closed-form trip time at constant current, however the profile is split', () => {
    const expected = 60 * Math.log(4 / (4 - 1.5625));
    expect(constantCurrentTripTimeS(model, 2)).toBeCloseTo(expected, 12);
    for (const n of [1, 7, 1000]) {
      const run = runThermalModel(model, 10, splitConstant(20, 100, n));
      expect(run.tripAfterS!).toBeCloseTo(expected, 9);
    }
  });

  // derived: at or below the pickup the element never reaches its threshold
  it('never trips at or below the pickup multiple, and reports how warm it got', () => {
    const run = runThermalModel(model, 10, splitConstant(12.5, 10_000, 3), { holdLast: true });
    expect(run.tripAfterS).toBeNull();
    expect(run.peakHeatingRatio).toBeCloseTo(1, 6);
    expect(constantCurrentTripTimeS(model, 1.25)).toBe(Infinity);
  });

  // derived: heating decays as e^(−t/τ) after the current stops, so a rest between two pulses lets it cool
  it('cools between pulses: a rest of several τ makes a second pulse no worse than the first', () => {
    const pulse = { currentA: 30, durationS: 5 };
    const oneRun = runThermalModel(model, 10, profileFromSteps([pulse]));
    const rested = runThermalModel(model, 10, profileFromSteps([pulse, { currentA: 0, durationS: 3000 }, pulse]));
    const backToBack = runThermalModel(model, 10, profileFromSteps([pulse, { currentA: 0, durationS: 1 }, pulse]));
    expect(rested.peakHeatingRatio).toBeCloseTo(oneRun.peakHeatingRatio, 9);
    expect(backToBack.peakHeatingRatio).toBeGreaterThan(oneRun.peakHeatingRatio);
  });

  // derived: holding the last value past the end adds the closed-form remaining time
  it('with holdLast, reports a trip after the end of the profile', () => {
    const run = runThermalModel(model, 10, profileFromSteps([{ currentA: 20, durationS: 1 }]), { holdLast: true });
    expect(run.tripAfterS!).toBeCloseTo(60 * Math.log(4 / (4 - 1.5625)), 9);
    expect(runThermalModel(model, 10, profileFromSteps([{ currentA: 20, durationS: 1 }])).tripAfterS).toBeNull();
  });

  it('starting in equilibrium with a prior load shortens the trip time', () => {
    const cold = runThermalModel(model, 10, splitConstant(20, 200, 1));
    const warm = runThermalModel(model, 10, splitConstant(20, 200, 1), { initialCurrentA: 10 });
    // derived: from θ0 = 1, t = τ ln((4 − 1)/(4 − 1.5625))
    expect(warm.tripAfterS!).toBeCloseTo(60 * Math.log(3 / 2.4375), 9);
    expect(warm.tripAfterS!).toBeLessThan(cold.tripAfterS!);
    expect(runThermalModel(model, 10, splitConstant(5, 1, 1), { initialCurrentA: 13 }).tripAfterS).toBe(0);
  });

  it('rejects bad parameters and inputs with RangeError', () => {
    const ok = splitConstant(5, 1, 1);
    expect(() => runThermalModel({ pickupMultiple: 0, timeConstantS: 1 }, 10, ok)).toThrow(RangeError);
    expect(() => runThermalModel({ pickupMultiple: 1.1, timeConstantS: Number.NaN }, 10, ok)).toThrow(RangeError);
    expect(() => runThermalModel(model, 0, ok)).toThrow(RangeError);
    expect(() => runThermalModel(model, 10, ok, { initialCurrentA: -1 })).toThrow(RangeError);
    expect(() => constantCurrentTripTimeS(model, Number.POSITIVE_INFINITY)).toThrow(RangeError);
  });

  it('property: more current never trips later; scaling current and rating together changes nothing', () => {
    const steps = fc.array(
      fc.record({
        currentA: fc.double({ min: 0, max: 200, noNaN: true }),
        durationS: fc.double({ min: 0.01, max: 500, noNaN: true }),
      }),
      { minLength: 1, maxLength: 20 },
    );
    fc.assert(
      fc.property(
        steps,
        fc.double({ min: 1, max: 3, noNaN: true }),
        fc.double({ min: 0.1, max: 10, noNaN: true }),
        (s, factor, scale) => {
          const base = runThermalModel(model, 16, profileFromSteps(s), { holdLast: true });
          const more = runThermalModel(
            model,
            16,
            profileFromSteps(s.map((x) => ({ ...x, currentA: x.currentA * factor }))),
            {
              holdLast: true,
            },
          );
          if (base.tripAfterS !== null) {
            expect(more.tripAfterS).not.toBeNull();
            expect(more.tripAfterS!).toBeLessThanOrEqual(base.tripAfterS * (1 + 1e-9) + 1e-9);
          }
          expect(more.peakHeatingRatio).toBeGreaterThanOrEqual(base.peakHeatingRatio * (1 - 1e-9));
          const scaled = runThermalModel(
            model,
            16 * scale,
            profileFromSteps(s.map((x) => ({ ...x, currentA: x.currentA * scale }))),
            {
              holdLast: true,
            },
          );
          if (base.tripAfterS === null) expect(scaled.tripAfterS).toBeNull();
          else expect(scaled.tripAfterS!).toBeCloseTo(base.tripAfterS, 6);
        },
      ),
    );
  });
});
