import { assertNecEdition, type NecEdition } from '../code-rules/nec-edition.js';
import type { Conductor } from '../code-rules/small-conductors.js';
import { validateCurrentProfile, type CurrentProfile } from '../trip/current-profile.js';
import { assertDeviceKind, type DeviceKind } from '../trip/device-kind.js';
import type { InstantaneousBasis } from '../trip/instantaneous-band.js';
import { assertNonNegative, assertPositive } from '../validation/assert-input.js';

/**
 * The circuit being judged.
 * - `ratingA`: overcurrent device rating, amps (an NEC 240.6(A) standard size is expected, not required);
 * - `deviceKind`: which trip model applies (see trip/device-kind.ts);
 * - `nominalVoltageV`: circuit voltage, volts (used for motor nameplate currents);
 * - `mainsHz`: 50 or 60;
 * - `conductor`: size and material, for the 240.4(D) warning (optional);
 * - `alsoFeedsLightingOrOutlets`: the circuit also supplies lighting or other outlets (NEC 210.23 50 % rule);
 * - `individualBranchCircuit`: the circuit supplies a single outlet/appliance only (NEC 210.22); default
 *   false (a multi-outlet circuit, where the 210.23 shares apply);
 * - `necEdition`: 2020 or 2023 (clause numbers differ).
 */
export interface CircuitUnderCheck {
  ratingA: number;
  deviceKind: DeviceKind;
  nominalVoltageV: number;
  mainsHz: number;
  conductor?: Conductor | null;
  alsoFeedsLightingOrOutlets: boolean;
  individualBranchCircuit?: boolean;
  necEdition: NecEdition;
}

/** Where a load's running current comes from (echoed in the output so the reader knows its weight). */
export type RunningCurrentSource = 'trace' | 'nameplate-amps' | 'nameplate-watts' | 'motor-table-430.248';

/**
 * One start-up (inrush) event of a load, as the analysis engine reports it. `peakA` (amps, on the basis
 * given with the events) is required, and at least one of `i2tA2s`, `durationS` or `settleTimeS` to say how
 * long it lasts. `i2tA2s` is taken as ∫i²dt over the event (including the running part).
 */
export interface StartUpEvent {
  peakA: number;
  durationS?: number;
  i2tA2s?: number;
  timeToPeakS?: number;
  settleTimeS?: number;
}

/**
 * What is known of a load's start-up: its inrush events (from a trace), or a short current-vs-time
 * profile of one start (RMS amps, times in s from the switch-on). `basis` says what the currents are
 * (default `half-cycle-rms`; see trip/instantaneous-band.ts).
 */
export type StartUpInput =
  | { kind: 'events'; events: readonly StartUpEvent[]; basis?: InstantaneousBasis }
  | { kind: 'profile'; profile: CurrentProfile; basis?: InstantaneousBasis };

/** Motor nameplate data, used when a motor load has no start-up data: horsepower and NEC code letter. */
export interface MotorNameplate {
  horsepower: number;
  codeLetter?: string | null;
  /** Motor voltage, volts; defaults to the circuit's nominal voltage. */
  voltageV?: number;
}

/**
 * One load on the circuit.
 * - `runningA`: steady running current, amps (RMS); `runningSource` says where it comes from;
 * - `continuous`: its maximum current lasts 3 h or more (NEC Article 100);
 * - `connection`: cord-and-plug (not fastened in place) or fastened in place;
 * - `startUp`: inrush events or a start profile (optional);
 * - `motor`: nameplate of a motor load without start-up data (optional);
 * - `duty`: the load's own current over a typical duty (RMS amps, including its start), for the thermal
 *   check (optional).
 */
export interface LoadUnderCheck {
  name: string;
  runningA: number;
  runningSource: RunningCurrentSource;
  continuous: boolean;
  connection: 'cord-and-plug' | 'fastened-in-place';
  startUp?: StartUpInput | null;
  motor?: MotorNameplate | null;
  duty?: CurrentProfile | null;
}

/**
 * Parameters of the check, with defaults:
 * - `tightFraction`: margin below a limit that counts as tight, default 0.1 (10 %);
 * - `assumedMotorStartS`: how long a nameplate-only motor draws its locked-rotor current, default 1 s
 *   (from memory: small single-phase motors reach speed in well under a second to a few seconds).
 */
export interface CheckParameters {
  tightFraction: number;
  assumedMotorStartS: number;
}

/** Defaults of {@link CheckParameters}. */
export const DEFAULT_CHECK_PARAMETERS: Readonly<CheckParameters> = { tightFraction: 0.1, assumedMotorStartS: 1 };

/** Largest number of loads one check accepts (a branch circuit; keeps the work bounded). */
export const MAX_LOADS_PER_CHECK = 50;

const RUNNING_SOURCES: readonly RunningCurrentSource[] = [
  'trace',
  'nameplate-amps',
  'nameplate-watts',
  'motor-table-430.248',
];

function validateStartUp(startUp: StartUpInput, field: string): void {
  if (startUp.kind === 'events') {
    if (startUp.events.length === 0) throw new RangeError(`${field}.events must not be empty`);
    startUp.events.forEach((event, i) => {
      const at = `${field}.events[${i}]`;
      assertPositive(event.peakA, `${at}.peakA`);
      for (const key of ['durationS', 'i2tA2s', 'timeToPeakS', 'settleTimeS'] as const) {
        const value = event[key];
        if (value !== undefined) assertNonNegative(value, `${at}.${key}`);
      }
      const lasts = [event.i2tA2s, event.durationS, event.settleTimeS].some((v) => v !== undefined && v > 0);
      if (!lasts) throw new RangeError(`${at} needs i2tA2s, durationS or settleTimeS greater than 0`);
    });
  } else if (startUp.kind === 'profile') {
    validateCurrentProfile(startUp.profile, `${field}.profile`);
  } else {
    throw new RangeError(`${field}.kind must be events or profile`);
  }
}

/**
 * Checks a circuit and its loads; RangeError naming the field path (e.g. `loads[1].runningA`) on the first
 * problem. Also checks `parameters` (0 ≤ tightFraction < 1, assumedMotorStartS > 0).
 */
export function validateCheckInput(
  circuit: CircuitUnderCheck,
  loads: readonly LoadUnderCheck[],
  parameters: CheckParameters,
): void {
  assertPositive(circuit.ratingA, 'circuit.ratingA');
  assertDeviceKind(circuit.deviceKind, 'circuit.deviceKind');
  assertPositive(circuit.nominalVoltageV, 'circuit.nominalVoltageV');
  if (circuit.mainsHz !== 50 && circuit.mainsHz !== 60) throw new RangeError('circuit.mainsHz must be 50 or 60');
  assertNecEdition(circuit.necEdition, 'circuit.necEdition');
  if (circuit.conductor) {
    const { sizeAwg, material } = circuit.conductor;
    if (typeof sizeAwg !== 'string' || sizeAwg.trim() === '')
      throw new RangeError('circuit.conductor.sizeAwg must not be empty');
    if (material !== 'cu' && material !== 'al') throw new RangeError('circuit.conductor.material must be cu or al');
  }
  if (typeof circuit.alsoFeedsLightingOrOutlets !== 'boolean') {
    throw new RangeError('circuit.alsoFeedsLightingOrOutlets must be true or false');
  }
  if (loads.length > MAX_LOADS_PER_CHECK)
    throw new RangeError(`loads must have at most ${MAX_LOADS_PER_CHECK} entries`);
  loads.forEach((load, i) => {
    const at = `loads[${i}]`;
    if (typeof load.name !== 'string' || load.name.trim() === '') throw new RangeError(`${at}.name must not be empty`);
    assertNonNegative(load.runningA, `${at}.runningA`);
    if (!RUNNING_SOURCES.includes(load.runningSource)) {
      throw new RangeError(`${at}.runningSource must be one of ${RUNNING_SOURCES.join(', ')}`);
    }
    if (load.connection !== 'cord-and-plug' && load.connection !== 'fastened-in-place') {
      throw new RangeError(`${at}.connection must be cord-and-plug or fastened-in-place`);
    }
    if (load.startUp) validateStartUp(load.startUp, `${at}.startUp`);
    if (load.motor) {
      assertPositive(load.motor.horsepower, `${at}.motor.horsepower`);
      if (load.motor.voltageV !== undefined) assertPositive(load.motor.voltageV, `${at}.motor.voltageV`);
    }
    if (load.duty) validateCurrentProfile(load.duty, `${at}.duty`);
  });
  if (!(parameters.tightFraction >= 0 && parameters.tightFraction < 1)) {
    throw new RangeError('parameters.tightFraction must be at least 0 and below 1');
  }
  assertPositive(parameters.assumedMotorStartS, 'parameters.assumedMotorStartS');
}
