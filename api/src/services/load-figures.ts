import { motorTableVoltageColumn, singlePhaseMotorFullLoadCurrent } from '../analysis/nameplate/motor-full-load-current.js';
import type { ProblemFieldError } from '../errors/problem.js';
import type { LoadConnection } from '../models/load.js';

/** A load's nameplate figures, as stored or as posted for a what-if check. */
export interface LoadFigures {
  name: string;
  nameplateA?: number | null | undefined;
  nameplateW?: number | null | undefined;
  powerFactor?: number | null | undefined;
  connection: LoadConnection;
  continuous: boolean;
  motorHp?: number | null | undefined;
  lockedRotorCode?: string | null | undefined;
  startPeakA?: number | null | undefined;
  startDurationS?: number | null | undefined;
}

/**
 * The cross-field rules of a load's figures, as problem entries under `pointerPrefix` (e.g. `/extraLoads/0`):
 * - a running figure is needed (nameplate amps, watts or motor horsepower) unless traces are linked;
 * - a locked-rotor code letter needs the horsepower it multiplies (NEC 430.7(B) gives kVA per hp);
 * - without nameplate amps, the horsepower must be a row of NEC Table 430.248 with a column for the circuit
 *   voltage, because the running current then comes from that table;
 * - a start-up duration needs the start-up peak, and the peak may not be below the nameplate running current.
 */
export function loadFigureProblems(
  figures: LoadFigures,
  circuitVoltageV: number,
  options: { pointerPrefix?: string; hasTraces?: boolean } = {},
): ProblemFieldError[] {
  const at = (field: string) => `${options.pointerPrefix ?? ''}/${field}`;
  const problems: ProblemFieldError[] = [];
  const { nameplateA, nameplateW, motorHp, lockedRotorCode, startPeakA, startDurationS } = figures;
  if (nameplateA == null && nameplateW == null && motorHp == null && !options.hasTraces) {
    problems.push({
      pointer: at('nameplateA'),
      detail: 'give the nameplate current (nameplateA), power (nameplateW) or motor horsepower (motorHp), or link a trace',
    });
  }
  if (lockedRotorCode != null && motorHp == null) {
    problems.push({ pointer: at('lockedRotorCode'), detail: 'a locked-rotor code letter needs the motor horsepower (motorHp)' });
  }
  if (motorHp != null && nameplateA == null) {
    try {
      motorTableVoltageColumn(circuitVoltageV);
      singlePhaseMotorFullLoadCurrent(motorHp, circuitVoltageV);
    } catch (err) {
      if (!(err instanceof RangeError)) throw err;
      problems.push({
        pointer: at('motorHp'),
        detail: `${err.message}; give the nameplate current (nameplateA) instead`,
      });
    }
  }
  if (startDurationS != null && startPeakA == null) {
    problems.push({ pointer: at('startDurationS'), detail: 'a start-up duration needs the start-up peak (startPeakA)' });
  }
  if (startPeakA != null && nameplateA != null && startPeakA < nameplateA) {
    problems.push({ pointer: at('startPeakA'), detail: 'the start-up peak must not be below the nameplate running current' });
  }
  return problems;
}
