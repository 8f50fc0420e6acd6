import { profilePeak, type CurrentProfile } from './current-profile.js';
import { assertDeviceKind, type DeviceKind } from './device-kind.js';
import { ul248TimeDelayThermalFamily } from './fuse-ul-248.js';
import { iecInstantaneousBand, iecThermalFamily, IEC_60898_1_REFERENCE_AMBIENT_C } from './iec-60898-1.js';
import {
  assessInstantaneous,
  type InstantaneousAssessment,
  type InstantaneousBand,
  type InstantaneousBasis,
} from './instantaneous-band.js';
import { assessThermal, type ThermalAssessment, type ThermalFamily } from './thermal-family.js';
import { worseTripOutcome, type TripOutcome } from './trip-outcome.js';
import { naInstantaneousBand, ul489ThermalFamily } from './ul-489.js';

/**
 * The time-current model of one overcurrent device: its instantaneous band (null for fuses, which have
 * none), its thermal family fitted through the standard's test points, and notes on what the model
 * assumes. Built by {@link tripModelFor}.
 */
export interface TripModel {
  deviceKind: DeviceKind;
  ratingA: number;
  label: string;
  instantaneous: InstantaneousBand | null;
  thermal: ThermalFamily;
  notes: readonly string[];
}

const MAKER_GOVERNS =
  'The breaker maker’s published time-current curve, the ambient temperature and the device’s condition govern; ' +
  'this model only spans what the standard allows.';

/**
 * The trip model of a device of `deviceKind` rated `ratingA` amps. RangeError for an unknown kind or a
 * rating outside the model's scope (IEC 60898-1 ≤ 125 A, North-American profile ≤ 600 A, time-delay fuse
 * ≤ 30 A).
 */
export function tripModelFor(deviceKind: DeviceKind, ratingA: number): TripModel {
  assertDeviceKind(deviceKind);
  switch (deviceKind) {
    case 'iec-b':
    case 'iec-c':
    case 'iec-d': {
      const curve = deviceKind === 'iec-b' ? 'B' : deviceKind === 'iec-c' ? 'C' : 'D';
      return {
        deviceKind,
        ratingA,
        label: `IEC 60898-1 curve ${curve}, In = ${ratingA} A`,
        instantaneous: iecInstantaneousBand(curve),
        thermal: iecThermalFamily(ratingA),
        notes: [
          `Thermal limits are stated at the ${IEC_60898_1_REFERENCE_AMBIENT_C} °C reference ambient; no ambient correction is applied.`,
          'Between its test points (1.13, 1.45 and 2.55 In) the standard fixes nothing: the thermal band is a first-order model fitted through them.',
          MAKER_GOVERNS,
        ],
      };
    }
    case 'na-thermal-magnetic':
      return {
        deviceKind,
        ratingA,
        label: `North-American thermal-magnetic breaker, ${ratingA} A (UL 489 calibration points)`,
        instantaneous: naInstantaneousBand(),
        thermal: ul489ThermalFamily(ratingA),
        notes: [
          'The instantaneous band (about 5–20 × rating, typically 10 ×) is a typical figure from memory, not from UL 489; the maker’s curve governs.',
          'The fastest thermal trip assumed (5 × rating held at least 1 s) is from memory / common practice.',
          'UL 489 fixes only 100 % (hold), 135 % and 200 % (maximum trip times); the thermal band is a first-order model fitted through them.',
          MAKER_GOVERNS,
        ],
      };
    case 'fuse-ul-248-time-delay':
    case 'fuse': {
      const notes = [
        'A fuse has one melting curve and no separate instantaneous element; the band is a first-order model through UL 248 test points (135 % and 200 % from memory, 8 s at 500 % verified).',
        'The fuse maker’s curve governs.',
      ];
      if (deviceKind === 'fuse') {
        notes.unshift(
          'The fuse class is not recorded: it is modelled as a 250 V time-delay fuse; a non-time-delay fuse opens much sooner on start-up currents.',
        );
      }
      return {
        deviceKind,
        ratingA,
        label: `${deviceKind === 'fuse' ? 'Fuse (class not recorded; modelled as time-delay)' : 'Time-delay fuse'}, ${ratingA} A, 250 V (UL 248)`,
        instantaneous: null,
        thermal: ul248TimeDelayThermalFamily(ratingA),
        notes,
      };
    }
  }
}

/** Options of {@link assessProfileTrip}. */
export interface ProfileTripOptions {
  /** What the profile's currents are, for the instantaneous comparison (see {@link InstantaneousBasis}). */
  basis: InstantaneousBasis;
  /** Current carried to thermal equilibrium before the profile (amps); default 0 (cold). */
  initialCurrentA?: number;
  /** Hold the last current for ever after the profile (default false). */
  holdLast?: boolean;
}

/** Result of {@link assessProfileTrip}: both parts and the worse of their outcomes. */
export interface ProfileTripAssessment {
  instantaneous: InstantaneousAssessment | null;
  thermal: ThermalAssessment;
  outcome: TripOutcome;
}

/**
 * Answers for one device and one current profile: the instantaneous part (the profile's highest current
 * against the band) and the thermal part (the family run over the whole profile, with accumulated
 * heating). RangeError for a bad profile.
 */
export function assessProfileTrip(
  model: TripModel,
  profile: CurrentProfile,
  options: ProfileTripOptions,
): ProfileTripAssessment {
  const { peakA } = profilePeak(profile);
  const instantaneous =
    model.instantaneous === null ? null : assessInstantaneous(model.instantaneous, model.ratingA, peakA, options.basis);
  const thermal = assessThermal(model.thermal, model.ratingA, profile, {
    initialCurrentA: options.initialCurrentA ?? 0,
    holdLast: options.holdLast ?? false,
  });
  const outcome = instantaneous === null ? thermal.outcome : worseTripOutcome(instantaneous.outcome, thermal.outcome);
  return { instantaneous, thermal, outcome };
}
