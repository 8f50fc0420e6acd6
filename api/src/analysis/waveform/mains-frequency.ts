/**
 * Mains frequency estimated from the zero crossings of a current waveform.
 *
 * Method: the record is scanned in consecutive windows of `windowS` (default 0.5 s). In each, the
 * rising zero crossings are found with hysteresis (the current must go below −10 % of the window's
 * peak before a rise above +10 % counts, which ignores noise around zero) and located by linear
 * interpolation between the two samples around zero. A window is accepted when it has at least
 * four crossing intervals, at least 80 % of them lie within ±5 % of their median (a steady
 * fundamental, not noise or a switching transient), and the mean period over the window (from the
 * first to the last crossing) gives 40–70 Hz. The estimate is the
 * median of the first `windowsWanted` accepted windows (default 10), so the scan usually stops
 * after a few seconds of a running load. Source: zero-crossing frequency measurement (textbook);
 * thresholds are our design choice.
 */

import { assertFiniteValues, assertPositive, assertSampleArray, type SampleArray } from '../validation/assert-input.js';
import { MAX_MAINS_FREQUENCY_HZ, MIN_MAINS_FREQUENCY_HZ } from './iec-windows.js';

/** Parameters of the estimate; see the file comment. */
export interface MainsFrequencyEstimateParams {
  windowS: number;
  windowsWanted: number;
  hysteresisFraction: number;
}

export const DEFAULT_MAINS_FREQUENCY_ESTIMATE_PARAMS: Readonly<MainsFrequencyEstimateParams> = Object.freeze({
  windowS: 0.5,
  windowsWanted: 10,
  hysteresisFraction: 0.1,
});

/** Result of the estimate. */
export interface MainsFrequencyEstimate {
  mainsFrequencyHz: number;
  /** Windows that gave a steady fundamental and were used. */
  windowsUsed: number;
}

function median(values: number[]): number {
  const sorted = [...values].sort((x, y) => x - y);
  const mid = sorted.length >> 1;
  return sorted.length % 2 ? (sorted[mid] as number) : ((sorted[mid - 1] as number) + (sorted[mid] as number)) / 2;
}

/** Frequency (Hz) of one window, or null when it shows no steady fundamental. */
function windowFrequency(a: SampleArray, w0: number, w1: number, rateHz: number, hysteresisFraction: number): number | null {
  let peak = 0;
  for (let i = w0; i < w1; i++) {
    const m = Math.abs(a[i] as number);
    if (m > peak) peak = m;
  }
  if (!(peak > 0)) return null;
  const level = hysteresisFraction * peak;
  const crossings: number[] = [];
  let armed = false;
  let lastNonPositive = -1;
  for (let i = w0; i < w1; i++) {
    const v = a[i] as number;
    if (v <= 0) lastNonPositive = i;
    if (v < -level) armed = true;
    else if (armed && v > level && lastNonPositive >= w0 && lastNonPositive + 1 < w1) {
      const x0 = a[lastNonPositive] as number;
      const x1 = a[lastNonPositive + 1] as number;
      crossings.push(lastNonPositive + x0 / (x0 - x1));
      armed = false;
    }
  }
  if (crossings.length < 5) return null;
  const intervals = crossings.slice(1).map((c, k) => c - (crossings[k] as number));
  const typical = median(intervals);
  const steady = intervals.filter((d) => Math.abs(d - typical) <= 0.05 * typical).length;
  // Mean period over the window (span / intervals) averages out the jitter of single crossings.
  const frequency = (rateHz * intervals.length) / ((crossings[crossings.length - 1] as number) - (crossings[0] as number));
  if (steady < 0.8 * intervals.length || frequency < MIN_MAINS_FREQUENCY_HZ || frequency > MAX_MAINS_FREQUENCY_HZ) return null;
  return frequency;
}

/**
 * Estimates the mains frequency (Hz) of waveform `a` sampled at `sampleRateHz` (see the file
 * comment). Throws a RangeError when no window shows a steady 40–70 Hz fundamental (a load that
 * never runs, a DC signal): give the frequency explicitly then.
 */
export function estimateMainsFrequency(
  a: SampleArray,
  sampleRateHz: number,
  params: MainsFrequencyEstimateParams = DEFAULT_MAINS_FREQUENCY_ESTIMATE_PARAMS,
): MainsFrequencyEstimate {
  assertSampleArray(a, 'samples');
  assertPositive(sampleRateHz, 'sampleRateHz');
  assertPositive(params.windowS, 'windowS');
  const windowSamples = Math.max(8, Math.round(params.windowS * sampleRateHz));
  const found: number[] = [];
  for (let w0 = 0; w0 < a.length && found.length < params.windowsWanted; w0 += windowSamples) {
    const f = windowFrequency(a, w0, Math.min(a.length, w0 + windowSamples), sampleRateHz, params.hysteresisFraction);
    if (f !== null) found.push(f);
  }
  if (found.length === 0) {
    assertFiniteValues(a, 'samples');
    throw new RangeError(
      'cannot estimate the mains frequency: no part of the waveform shows a steady 40–70 Hz fundamental; give mainsFrequencyHz',
    );
  }
  return { mainsFrequencyHz: median(found), windowsUsed: found.length };
}
