import { validateCurrentProfile, type CurrentProfile } from './current-profile.js';

/**
 * Parameters of a first-order thermal model of a breaker's overload (thermal) element.
 *
 * Model (a modelling assumption, not part of any standard): the heating state θ, in units of In², follows
 * τ·dθ/dt = (I/In)² − θ, i.e. the element warms towards (I/In)² with time constant τ and cools the same
 * way; the element trips when θ reaches k², where k (`pickupMultiple`) is the lowest multiple of In that
 * trips eventually. From cold (θ = 0) at a constant multiple m > k the time to trip is
 * t = τ·ln(m² / (m² − k²)); at large m this tends to τ·k²/m² (constant I²t, as an adiabatic element).
 * `timeConstantS` is τ in seconds.
 */
export interface ThermalParameters {
  pickupMultiple: number;
  timeConstantS: number;
}

/** Options of {@link runThermalModel}. */
export interface ThermalRunOptions {
  /**
   * Current (amps) the device carried long enough before the profile to be in thermal equilibrium with it;
   * default 0 (cold). The IEC 60898-1 1.45 In test, for instance, starts hot after the 1.13 In test.
   */
  initialCurrentA?: number;
  /**
   * When true, the last sample is held for ever after the profile ends (a load left running); the model then
   * also reports a trip that happens after the end. Default false (the profile ends at its `endS`).
   */
  holdLast?: boolean;
}

/** Result of {@link runThermalModel}. */
export interface ThermalRun {
  /** Seconds from the profile's first time to the trip, or null when the model does not trip. */
  tripAfterS: number | null;
  /** Highest θ/k² reached (1 means the trip threshold); with `holdLast`, includes the final equilibrium. */
  peakHeatingRatio: number;
}

/** Throws RangeError unless both parameters are finite and positive. */
export function assertThermalParameters(params: ThermalParameters): void {
  if (!(Number.isFinite(params.pickupMultiple) && params.pickupMultiple > 0)) {
    throw new RangeError('pickupMultiple must be a finite number > 0');
  }
  if (!(Number.isFinite(params.timeConstantS) && params.timeConstantS > 0)) {
    throw new RangeError('timeConstantS must be a finite number > 0');
  }
}

/**
 * Time in seconds for the model to trip at a constant multiple `multiple` of In, starting from heating
 * state `initialHeating` (θ, In² units; 0 = cold): τ·ln((m² − θ0)/(m² − k²)); 0 when already at or past
 * the threshold; Infinity when m ≤ k.
 */
export function constantCurrentTripTimeS(params: ThermalParameters, multiple: number, initialHeating = 0): number {
  assertThermalParameters(params);
  if (!(Number.isFinite(multiple) && multiple >= 0)) throw new RangeError('multiple must be a finite number ≥ 0');
  const threshold = params.pickupMultiple * params.pickupMultiple;
  if (initialHeating >= threshold) return 0;
  const target = multiple * multiple;
  if (target <= threshold) return Infinity;
  return params.timeConstantS * Math.log((target - initialHeating) / (target - threshold));
}

/**
 * Runs the thermal model over a step profile of RMS currents for a device rated `ratingA` and returns when
 * it trips and how close it came. Exact for step profiles (the equation is solved in closed form over each
 * step; no time-step error). RangeError for a bad profile, rating or parameters.
 */
export function runThermalModel(
  params: ThermalParameters,
  ratingA: number,
  profile: CurrentProfile,
  options: ThermalRunOptions = {},
): ThermalRun {
  assertThermalParameters(params);
  if (!(Number.isFinite(ratingA) && ratingA > 0)) throw new RangeError('ratingA must be a finite number > 0');
  const endS = validateCurrentProfile(profile);
  const initialCurrentA = options.initialCurrentA ?? 0;
  if (!(Number.isFinite(initialCurrentA) && initialCurrentA >= 0)) {
    throw new RangeError('initialCurrentA must be a finite number ≥ 0');
  }
  const { timesS, currentA } = profile;
  const tau = params.timeConstantS;
  const threshold = params.pickupMultiple * params.pickupMultiple;
  const inverseRatingSquared = 1 / (ratingA * ratingA);
  const startS = timesS[0]!;
  let heating = initialCurrentA * initialCurrentA * inverseRatingSquared;
  let peak = heating;
  if (heating >= threshold) return { tripAfterS: 0, peakHeatingRatio: heating / threshold };

  const n = timesS.length;
  let target = 0;
  // Evenly spaced series (the usual case) reuse one decay factor instead of an exp per step; spacings
  // equal to 1e-9 relative (rounding of computed times) share it — the decay changes by far less.
  let cachedDurationS = NaN;
  let cachedDecay = 1;
  for (let i = 0; i < n; i++) {
    const a = currentA[i]!;
    target = a * a * inverseRatingSquared;
    const segmentStartS = timesS[i]!;
    const durationS = (i + 1 < n ? timesS[i + 1]! : endS) - segmentStartS;
    if (target > threshold) {
      const toTripS = tau * Math.log((target - heating) / (target - threshold));
      if (toTripS <= durationS) {
        return { tripAfterS: segmentStartS + toTripS - startS, peakHeatingRatio: 1 };
      }
    }
    if (!(Math.abs(durationS - cachedDurationS) <= 1e-9 * durationS)) {
      cachedDurationS = durationS;
      cachedDecay = Math.exp(-durationS / tau);
    }
    heating = target + (heating - target) * cachedDecay;
    if (heating > peak) peak = heating;
  }
  if (options.holdLast === true) {
    if (target > threshold) {
      const toTripS = tau * Math.log((target - heating) / (target - threshold));
      return { tripAfterS: endS + toTripS - startS, peakHeatingRatio: 1 };
    }
    if (target > peak) peak = target;
  }
  return { tripAfterS: null, peakHeatingRatio: peak / threshold };
}
