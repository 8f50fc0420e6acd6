/** Amps samples: single or double precision. */
export type AmpsArray = Float32Array | Float64Array;

/**
 * A current profile over time, read as a step function: sample `i` (an RMS value in amps, ≥ 0) holds from
 * `timesS[i]` until `timesS[i + 1]`; the last sample holds until `endS`. Times are seconds, strictly
 * increasing; they need not be evenly spaced. `endS` defaults to the last time plus the last spacing
 * (required when there is only one sample).
 */
export interface CurrentProfile {
  timesS: Float64Array;
  currentA: AmpsArray;
  endS?: number;
}

/** One step of a profile built by {@link profileFromSteps}: a current held for a duration. */
export interface ProfileStep {
  currentA: number;
  durationS: number;
}

/**
 * Checks a profile and returns its end time in seconds. RangeError (naming `field`) when the arrays differ
 * in length or are empty, a time is not finite or not strictly increasing, a current is negative or not
 * finite, or `endS` is missing for a single sample or not after the last time.
 */
export function validateCurrentProfile(profile: CurrentProfile, field = 'profile'): number {
  const { timesS, currentA } = profile;
  const n = timesS.length;
  if (n === 0) throw new RangeError(`${field} must have at least one sample`);
  if (currentA.length !== n) {
    throw new RangeError(`${field}.currentA has ${currentA.length} samples but ${field}.timesS has ${n}`);
  }
  let previous = -Infinity;
  for (let i = 0; i < n; i++) {
    const t = timesS[i]!;
    const a = currentA[i]!;
    if (!Number.isFinite(t)) throw new RangeError(`${field}.timesS[${i}] must be finite`);
    if (t <= previous) throw new RangeError(`${field}.timesS[${i}] must be greater than the time before it`);
    if (!Number.isFinite(a) || a < 0) throw new RangeError(`${field}.currentA[${i}] must be a finite number ≥ 0`);
    previous = t;
  }
  const last = timesS[n - 1]!;
  if (profile.endS === undefined) {
    if (n < 2) throw new RangeError(`${field}.endS is required when the profile has a single sample`);
    return last + (last - timesS[n - 2]!);
  }
  if (!Number.isFinite(profile.endS) || profile.endS <= last) {
    throw new RangeError(`${field}.endS must be finite and after the last sample time`);
  }
  return profile.endS;
}

/**
 * Builds a step profile from consecutive steps, starting at `startS` (default 0 s). For example
 * `[{ currentA: 39, durationS: 0.3 }, { currentA: 22, durationS: 60 }]` is 39 A for 0.3 s then 22 A for
 * 60 s. RangeError when a step has a negative/non-finite current or a non-positive duration.
 */
export function profileFromSteps(steps: readonly ProfileStep[], startS = 0): CurrentProfile {
  if (steps.length === 0) throw new RangeError('steps must not be empty');
  if (!Number.isFinite(startS)) throw new RangeError('startS must be finite');
  const timesS = new Float64Array(steps.length);
  const currentA = new Float64Array(steps.length);
  let t = startS;
  steps.forEach((step, i) => {
    if (!Number.isFinite(step.currentA) || step.currentA < 0) {
      throw new RangeError(`steps[${i}].currentA must be a finite number ≥ 0`);
    }
    if (!Number.isFinite(step.durationS) || step.durationS <= 0) {
      throw new RangeError(`steps[${i}].durationS must be a finite number > 0`);
    }
    timesS[i] = t;
    currentA[i] = step.currentA;
    t += step.durationS;
  });
  return { timesS, currentA, endS: t };
}

/** The highest current of a profile (amps) and the time it starts (s); the first one when tied. */
export function profilePeak(profile: CurrentProfile): { peakA: number; atS: number } {
  validateCurrentProfile(profile);
  let peakA = -Infinity;
  let atS = 0;
  for (let i = 0; i < profile.currentA.length; i++) {
    const a = profile.currentA[i]!;
    if (a > peakA) {
      peakA = a;
      atS = profile.timesS[i]!;
    }
  }
  return { peakA, atS };
}
