/**
 * Probe normalisation: raw readings (A, mA or mV) to amperes.
 *
 * A probe (clamp, current transformer, shunt) outputs `sensitivityPerA` units per ampere in its jaw,
 * e.g. 1 mA per A (a 1000:1 current clamp), 10 mV per A or 100 mV per A (voltage-output clamps),
 * 1 A per A (a meter that reads amperes). A line splitter with a ×10 loop passes the conductor
 * through the jaw ten times, so the jaw sees ten times the current: `loops` divides it back.
 * amps = raw / sensitivityPerA / loops. Source: definition of a transducer's sensitivity
 * (common practice, no source).
 */

import {
  MAX_ABS_CURRENT_A,
  assertFiniteValues,
  assertInteger,
  assertPositive,
  assertSampleArray,
  type SampleArray,
} from '../validation/assert-input.js';

/** Unit of the raw readings a probe produces. */
export type ProbeInputUnit = 'A' | 'mA' | 'mV';

/** How raw readings become amperes. */
export interface ProbeSettings {
  /** Unit of the raw readings. */
  inputUnit: ProbeInputUnit;
  /** Raw units per ampere through the jaw (e.g. 10 for 10 mV/A, 1 for 1 mA/A or for plain amperes). */
  sensitivityPerA: number;
  /** Turns of the conductor through the jaw (1 normally, 10 with a ×10 splitter loop). */
  loops: number;
}

/** A probe that reads amperes directly, one turn: raw readings are amperes. */
export const DEFAULT_PROBE: Readonly<ProbeSettings> = Object.freeze({
  inputUnit: 'A',
  sensitivityPerA: 1,
  loops: 1,
});

/** Largest loop count accepted (splitters offer ×1 and ×10; 100 leaves room). Our design choice. */
export const MAX_PROBE_LOOPS = 100;

/** Checks a probe description and throws a RangeError naming the bad field. */
export function assertProbeSettings(probe: ProbeSettings): void {
  if (probe.inputUnit !== 'A' && probe.inputUnit !== 'mA' && probe.inputUnit !== 'mV') {
    throw new RangeError(`probe.inputUnit must be "A", "mA" or "mV" (got ${String(probe.inputUnit)})`);
  }
  assertPositive(probe.sensitivityPerA, 'probe.sensitivityPerA');
  assertInteger(probe.loops, 1, 'probe.loops');
  if (probe.loops > MAX_PROBE_LOOPS) {
    throw new RangeError(`probe.loops must be at most ${MAX_PROBE_LOOPS} (got ${probe.loops})`);
  }
}

/**
 * Amperes per raw unit for a probe: 1 / (sensitivityPerA × loops).
 * Examples: 10 mV/A → 0.1 A per mV; 1 mA/A through a ×10 loop → 0.1 A per mA. Units: A per raw unit.
 */
export function probeScaleAPerUnit(probe: ProbeSettings): number {
  assertProbeSettings(probe);
  return 1 / (probe.sensitivityPerA * probe.loops);
}

/**
 * Converts raw probe readings to amperes: out[i] = raw[i] / sensitivityPerA / loops.
 * Returns a new Float64Array (or fills `out` when given, which must have the same length).
 * Non-finite raw readings, and results beyond ±MAX_ABS_CURRENT_A, are a RangeError naming the index.
 */
export function normaliseProbeReadings(
  raw: SampleArray,
  probe: ProbeSettings,
  out?: Float64Array,
): Float64Array {
  assertSampleArray(raw, 'raw');
  const scale = probeScaleAPerUnit(probe);
  const target = out ?? new Float64Array(raw.length);
  if (target.length !== raw.length) {
    throw new RangeError(`out has ${target.length} elements, raw has ${raw.length}`);
  }
  for (let i = 0; i < raw.length; i++) target[i] = (raw[i] as number) * scale;
  assertFiniteValues(target, 'samples (in amperes)', MAX_ABS_CURRENT_A);
  return target;
}
