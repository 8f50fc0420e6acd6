import { commonPracticeCitation, type Citation } from '../code-rules/citation.js';
import { lockedRotorCurrentRange } from '../nameplate/locked-rotor-current.js';
import { singlePhaseMotorFullLoadCurrent } from '../nameplate/motor-full-load-current.js';
import { profileFromSteps, profilePeak, validateCurrentProfile, type CurrentProfile } from '../trip/current-profile.js';
import type { InstantaneousBasis } from '../trip/instantaneous-band.js';
import type { CheckParameters, LoadUnderCheck, StartUpEvent } from './check-input.js';

/**
 * Locked-rotor current of a motor with no better data, as a multiple of its full-load current: 6 ×.
 * Common practice, no source (trade-facts section 7: motor start planning figure).
 */
export const ASSUMED_LOCKED_ROTOR_MULTIPLE = 6;

/** Where a load's start-up figures come from. */
export type StartUpSource = 'events' | 'start-profile' | 'motor-code-letter' | 'motor-six-times-flc' | 'running-only';

/**
 * A load's own current from switch-on, ready to be stacked with the others:
 * - `peakA`: highest current of the start (amps, on `basis`), never below the running current;
 * - `profile` + `holdLast`: the load's current over time for the thermal check — its duty when one was
 *   given (not held after its end), otherwise the start followed by the running current held;
 * - `source`, `assumption` (plain English, or null when the figures are measured) and `citation` of any
 *   assumed figure.
 */
export interface LoadStartUp {
  peakA: number;
  basis: InstantaneousBasis;
  profile: CurrentProfile;
  holdLast: boolean;
  source: StartUpSource;
  assumption: string | null;
  citation: Citation | null;
}

/**
 * Duration of the rectangle that stands for one event: the pulse at `peakA` with the event's I²t
 * (i2tA2s / peakA²), else `durationS`, else `settleTimeS`; never shorter than one half cycle (the shortest
 * interval a half-cycle RMS value describes).
 */
export function equivalentPulseS(event: StartUpEvent, mainsHz: number): number {
  const halfCycleS = 1 / (2 * mainsHz);
  const fromI2t =
    event.i2tA2s !== undefined && event.i2tA2s > 0 ? event.i2tA2s / (event.peakA * event.peakA) : undefined;
  const pick = [fromI2t, event.durationS, event.settleTimeS].find((v) => v !== undefined && v > 0);
  if (pick === undefined)
    throw new RangeError('a start-up event needs i2tA2s, durationS or settleTimeS greater than 0');
  return Math.max(pick, halfCycleS);
}

/** A pulse at `pulseA` for `pulseS`, then `runningA` (held by the caller). */
function pulseThenRunning(pulseA: number, pulseS: number, runningA: number): CurrentProfile {
  return profileFromSteps([
    { currentA: Math.max(pulseA, runningA), durationS: pulseS },
    { currentA: runningA, durationS: 1 },
  ]);
}

/** A start profile followed by the running current (one extra sample at the profile's end). */
function startProfileThenRunning(start: CurrentProfile, runningA: number): CurrentProfile {
  const endS = validateCurrentProfile(start);
  const n = start.timesS.length;
  const timesS = new Float64Array(n + 1);
  const currentA = new Float64Array(n + 1);
  timesS.set(start.timesS);
  currentA.set(start.currentA);
  timesS[n] = endS;
  currentA[n] = runningA;
  return { timesS, currentA, endS: endS + 1 };
}

/** Table 430.248 full-load current, or null when the horsepower or voltage has no entry in the table. */
function tableFullLoadCurrentA(horsepower: number, voltageV: number): number | null {
  try {
    return singlePhaseMotorFullLoadCurrent(horsepower, voltageV).fullLoadA;
  } catch (error) {
    if (error instanceof RangeError) return null;
    throw error;
  }
}

interface StartFigures {
  peakA: number;
  pulse: CurrentProfile;
  basis: InstantaneousBasis;
  source: StartUpSource;
  assumption: string | null;
  citation: Citation | null;
}

/** The start of a load from its events, start profile, motor nameplate, or (lacking all) its running current. */
function startFigures(
  load: LoadUnderCheck,
  mainsHz: number,
  circuitVoltageV: number,
  params: CheckParameters,
): StartFigures {
  const startUp = load.startUp;
  if (startUp?.kind === 'events') {
    // Envelope of all the load's starts: the highest peak held for the longest equivalent pulse.
    const peakA = Math.max(load.runningA, ...startUp.events.map((e) => e.peakA));
    const pulseS = Math.max(...startUp.events.map((e) => equivalentPulseS(e, mainsHz)));
    return {
      peakA,
      pulse: pulseThenRunning(peakA, pulseS, load.runningA),
      basis: startUp.basis ?? 'half-cycle-rms',
      source: 'events',
      assumption: null,
      citation: null,
    };
  }
  if (startUp?.kind === 'profile') {
    return {
      peakA: Math.max(load.runningA, profilePeak(startUp.profile).peakA),
      pulse: startProfileThenRunning(startUp.profile, load.runningA),
      basis: startUp.basis ?? 'half-cycle-rms',
      source: 'start-profile',
      assumption: null,
      citation: null,
    };
  }
  const motor = load.motor;
  if (motor) {
    const voltageV = motor.voltageV ?? circuitVoltageV;
    const startS = params.assumedMotorStartS;
    const timing = `for an assumed ${startS} s (from memory: small motors reach speed within about a second)`;
    if (motor.codeLetter) {
      const range = lockedRotorCurrentRange(motor.codeLetter, motor.horsepower, voltageV);
      const lockedA = range.maxA ?? range.minA;
      return {
        peakA: Math.max(load.runningA, lockedA),
        pulse: pulseThenRunning(lockedA, startS, load.runningA),
        basis: 'half-cycle-rms',
        source: 'motor-code-letter',
        assumption:
          `${load.name}: locked-rotor current ${lockedA.toFixed(1)} A from code letter ${range.codeLetter} ` +
          `(NEC Table 430.7(B), top of the band) ${timing}.`,
        citation: { code: 'NFPA 70', edition: '2020/2023', section: 'Table 430.7(B)', tag: 'derived' },
      };
    }
    const tableA = tableFullLoadCurrentA(motor.horsepower, voltageV);
    const fullLoadA = tableA ?? load.runningA;
    const lockedA = ASSUMED_LOCKED_ROTOR_MULTIPLE * fullLoadA;
    return {
      peakA: Math.max(load.runningA, lockedA),
      pulse: pulseThenRunning(lockedA, startS, load.runningA),
      basis: 'half-cycle-rms',
      source: 'motor-six-times-flc',
      assumption:
        `${load.name}: locked-rotor current taken as 6 × ${tableA === null ? 'the running current' : 'the NEC Table 430.248 full-load current'} ` +
        `= ${lockedA.toFixed(1)} A (common practice, no source) ${timing}.`,
      citation: commonPracticeCitation('locked-rotor current ≈ 6 × full-load current'),
    };
  }
  return {
    peakA: load.runningA,
    pulse: profileFromSteps([{ currentA: load.runningA, durationS: 1 }]),
    basis: 'sample-rms',
    source: 'running-only',
    assumption: `${load.name}: no start-up data; taken as starting at its running current.`,
    citation: null,
  };
}

/**
 * Describes how load `load` starts and runs, for stacking: its start figures from (in order of
 * preference) its inrush events, its start profile, its motor nameplate (locked-rotor current from the
 * code letter, NEC Table 430.7(B), else 6 × full-load current — common practice, no source — held for
 * `params.assumedMotorStartS`), or its running current alone. When a duty profile is given it is the
 * thermal profile (and its peak counts for the instantaneous check too). RangeError for bad input.
 */
export function describeLoadStartUp(
  load: LoadUnderCheck,
  mainsHz: number,
  circuitVoltageV: number,
  params: CheckParameters,
): LoadStartUp {
  const { pulse, ...start } = startFigures(load, mainsHz, circuitVoltageV, params);
  if (load.duty) {
    const dutyPeakA = profilePeak(load.duty).peakA;
    return {
      ...start,
      peakA: Math.max(start.peakA, dutyPeakA),
      basis: dutyPeakA > start.peakA ? 'sample-rms' : start.basis,
      profile: load.duty,
      holdLast: false,
    };
  }
  return { ...start, profile: pulse, holdLast: true };
}
