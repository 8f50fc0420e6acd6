import { describe, expect, it } from 'vitest';
import { profileFromSteps, profilePeak, validateCurrentProfile } from './current-profile.js';

describe('current profiles', () => {
  it('builds consecutive steps and ends after the last one', () => {
    const profile = profileFromSteps([
      { currentA: 39, durationS: 0.3 },
      { currentA: 22, durationS: 60 },
    ]);
    expect(Array.from(profile.timesS)).toEqual([0, 0.3]);
    expect(Array.from(profile.currentA)).toEqual([39, 22]);
    expect(validateCurrentProfile(profile)).toBeCloseTo(60.3, 12);
    expect(profilePeak(profile)).toEqual({ peakA: 39, atS: 0 });
  });

  it('defaults the end to the last time plus the last spacing', () => {
    const profile = { timesS: new Float64Array([0, 0.5, 1.5]), currentA: new Float32Array([1, 2, 3]) };
    expect(validateCurrentProfile(profile)).toBe(2.5);
  });

  it('rejects malformed profiles with a RangeError naming the field', () => {
    const times = new Float64Array([0, 1]);
    expect(() => validateCurrentProfile({ timesS: new Float64Array(0), currentA: new Float64Array(0) })).toThrow(
      /at least one sample/,
    );
    expect(() => validateCurrentProfile({ timesS: times, currentA: new Float64Array([1]) })).toThrow(RangeError);
    expect(() =>
      validateCurrentProfile({ timesS: new Float64Array([0, 0]), currentA: new Float64Array([1, 1]) }),
    ).toThrow(/timesS\[1\]/);
    expect(() => validateCurrentProfile({ timesS: times, currentA: new Float64Array([1, -1]) })).toThrow(
      /currentA\[1\]/,
    );
    expect(() => validateCurrentProfile({ timesS: times, currentA: new Float64Array([1, Number.NaN]) })).toThrow(
      RangeError,
    );
    expect(() => validateCurrentProfile({ timesS: new Float64Array([0]), currentA: new Float64Array([1]) })).toThrow(
      /endS/,
    );
    expect(() => validateCurrentProfile({ timesS: times, currentA: new Float64Array([1, 1]), endS: 1 })).toThrow(
      /endS/,
    );
    expect(() => profileFromSteps([])).toThrow(RangeError);
    expect(() => profileFromSteps([{ currentA: 1, durationS: 0 }])).toThrow(/durationS/);
  });
});
