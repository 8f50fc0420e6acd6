/**
 * Window lengths of the IEC 61000-4-30 RMS measurements, applied to current.
 *
 * Definitions: the half-cycle-refreshed RMS (written U_rms(1/2) for voltage) is the RMS over one
 * fundamental cycle, refreshed every half cycle; the basic aggregation interval for magnitude is
 * 10 cycles at 50 Hz and 12 cycles at 60 Hz (≈ 200 ms). Headroom applies the method to current,
 * which is our design choice rather than the standard's scope (trade-facts.md 4.2).
 * Source: IEC 61000-4-30 Ed. 3 (2015) + AMD1:2021, RMS-over-one-cycle method and aggregation
 * intervals (gist verified from public summaries; clause numbers from memory).
 */

import { assertInRange, assertPositive } from '../validation/assert-input.js';

/** Mains frequencies accepted, in Hz: 40 to 70 covers 50 and 60 Hz systems with any drift. */
export const MIN_MAINS_FREQUENCY_HZ = 40;
export const MAX_MAINS_FREQUENCY_HZ = 70;

/** Window lengths for one mains frequency (and, when a sample rate is given, in samples). */
export interface IecWindowLengths {
  mainsFrequencyHz: number;
  /** One cycle, the RMS window (s): 20 ms at 50 Hz, 16.667 ms at 60 Hz. */
  windowS: number;
  /** Half a cycle, the refresh step (s): 10 ms at 50 Hz, 8.333 ms at 60 Hz. */
  stepS: number;
  /** Cycles in the basic aggregation interval: 10 at 50 Hz, 12 at 60 Hz. */
  aggregationCycles: number;
  /** Length of that interval (s): 0.2 s at both frequencies (exact at 50/60 Hz). */
  aggregationS: number;
  /** One cycle in samples (may be fractional), when a sample rate is given. */
  windowSamples: number | null;
  /** Half a cycle in samples (may be fractional), when a sample rate is given. */
  stepSamples: number | null;
}

/**
 * Cycles in the IEC 61000-4-30 basic aggregation interval: 10 for a 50 Hz system, 12 for 60 Hz.
 * A frequency below 55 Hz counts as a 50 Hz system (the standard names only those two).
 */
export function aggregationCyclesFor(mainsFrequencyHz: number): 10 | 12 {
  assertInRange(mainsFrequencyHz, MIN_MAINS_FREQUENCY_HZ, MAX_MAINS_FREQUENCY_HZ, 'mainsFrequencyHz');
  return mainsFrequencyHz < 55 ? 10 : 12;
}

/**
 * IEC 61000-4-30 window lengths at `mainsFrequencyHz` (40–70 Hz), and in samples at
 * `sampleRateHz` when given. Example: 60 Hz at 7680 samples/s → 128-sample window, 64-sample step.
 */
export function iecWindowLengths(mainsFrequencyHz: number, sampleRateHz?: number): IecWindowLengths {
  const aggregationCycles = aggregationCyclesFor(mainsFrequencyHz);
  if (sampleRateHz !== undefined) assertPositive(sampleRateHz, 'sampleRateHz');
  const windowS = 1 / mainsFrequencyHz;
  return {
    mainsFrequencyHz,
    windowS,
    stepS: windowS / 2,
    aggregationCycles,
    aggregationS: aggregationCycles * windowS,
    windowSamples: sampleRateHz === undefined ? null : sampleRateHz / mainsFrequencyHz,
    stepSamples: sampleRateHz === undefined ? null : sampleRateHz / (2 * mainsFrequencyHz),
  };
}
