import type { CheckParameters, LoadUnderCheck, RunningCurrentSource } from '../analysis/check/check-input.js';
import { singlePhaseMotorFullLoadCurrent } from '../analysis/nameplate/motor-full-load-current.js';
import { ampsFromWatts, DEFAULT_POWER_FACTOR } from '../analysis/power/watts-amps.js';
import type { LoadFigures } from './load-figures.js';

/** A load as the check sees it, with the figures it was judged on and where they came from. */
export interface PreparedLoad {
  input: LoadUnderCheck;
  /** Plain-English notes on figures Headroom assumed for this load. */
  assumptions: string[];
}

/**
 * Running current of a load from its nameplate, in order of preference:
 * 1. nameplate amps (`nameplate-amps`);
 * 2. motor horsepower through NEC Table 430.248 (`motor-table-430.248`) — the table, not the nameplate, is
 *    what the code sizes circuits on (430.6(A)(1)), and it is on the safe side of a typical running current;
 * 3. nameplate watts at the circuit voltage and the load's power factor, 1 when not given
 *    (`nameplate-watts`; I = P / (V · PF)).
 * Returns null when the load has none of these (a load known only by its traces).
 */
export function nameplateRunningCurrent(
  figures: LoadFigures,
  circuitVoltageV: number,
): { runningA: number; source: RunningCurrentSource; assumption: string | null } | null {
  if (figures.nameplateA != null) return { runningA: figures.nameplateA, source: 'nameplate-amps', assumption: null };
  if (figures.motorHp != null) {
    const flc = singlePhaseMotorFullLoadCurrent(figures.motorHp, circuitVoltageV);
    return {
      runningA: flc.fullLoadA,
      source: 'motor-table-430.248',
      assumption: `${figures.name}: running current ${flc.fullLoadA} A for ${flc.hpLabel} hp at ${flc.tableVoltageV} V from NEC Table 430.248 (no nameplate amps).`,
    };
  }
  if (figures.nameplateW != null) {
    const powerFactor = figures.powerFactor ?? DEFAULT_POWER_FACTOR;
    const runningA = ampsFromWatts(figures.nameplateW, circuitVoltageV, powerFactor);
    return {
      runningA,
      source: 'nameplate-watts',
      assumption:
        `${figures.name}: running current ${runningA.toFixed(2)} A from ${figures.nameplateW} W at ${circuitVoltageV} V, ` +
        `power factor ${powerFactor}${figures.powerFactor == null ? ' (not given: resistive assumed)' : ''}.`,
    };
  }
  return null;
}

/**
 * A load for the check from its nameplate alone: running current (see {@link nameplateRunningCurrent}); the
 * start-up peak and duration when the maker gives them (held for `params.assumedMotorStartS` when the
 * duration is missing); otherwise the motor horsepower and code letter, from which the check derives a
 * locked-rotor current (NEC Table 430.7(B), or 6 × full-load current). RangeError when the load has no
 * running figure at all.
 */
export function loadFromNameplate(figures: LoadFigures, circuitVoltageV: number, params: CheckParameters): PreparedLoad {
  const running = nameplateRunningCurrent(figures, circuitVoltageV);
  if (running === null) throw new RangeError(`${figures.name} has no nameplate figure and no recorded trace`);
  const assumptions = running.assumption === null ? [] : [running.assumption];
  const input: LoadUnderCheck = {
    name: figures.name,
    runningA: running.runningA,
    runningSource: running.source,
    continuous: figures.continuous,
    connection: figures.connection,
  };
  if (figures.startPeakA != null) {
    const durationS = figures.startDurationS ?? params.assumedMotorStartS;
    if (figures.startDurationS == null) {
      assumptions.push(`${figures.name}: start-up peak ${figures.startPeakA} A held for an assumed ${durationS} s (no duration given).`);
    }
    input.startUp = { kind: 'events', events: [{ peakA: figures.startPeakA, durationS }], basis: 'half-cycle-rms' };
  } else if (figures.motorHp != null) {
    input.motor = { horsepower: figures.motorHp, codeLetter: figures.lockedRotorCode ?? null };
  }
  return { input, assumptions };
}
