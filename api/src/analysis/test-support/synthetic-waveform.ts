/**
 * Synthetic current waveforms for tests and benchmarks (invented data, never reference data):
 * a load that is off, then starts with an exponentially decaying surge, runs, and has one surge
 * while running, with Gaussian noise. The RMS envelope is I(t) = Is + (Ip − Is)·e^(−t/τ) after the
 * switch-on; the instantaneous current is √2·I(t)·sin(2πft + φ).
 */

import { normalDeviate, seededRandom } from './seeded-random.js';

/** Shape of the synthetic start-up. */
export interface SyntheticStartParams {
  sampleRateHz: number;
  mainsFrequencyHz: number;
  sampleCount: number;
  /** Switch-on time (s). */
  onsetS: number;
  /** RMS at the switch-on (A) and when running (A). */
  peakRmsA: number;
  steadyRmsA: number;
  tauS: number;
  /** A surge while running: start (s), length (s) and factor on the running RMS. */
  surgeStartS: number;
  surgeLengthS: number;
  surgeFactor: number;
  noiseA: number;
  phase: number;
  seed: number;
}

export const DEFAULT_SYNTHETIC_START: Readonly<SyntheticStartParams> = Object.freeze({
  sampleRateHz: 30_000,
  mainsFrequencyHz: 60,
  sampleCount: 30_000 * 5,
  onsetS: 0.5,
  peakRmsA: 60,
  steadyRmsA: 10,
  tauS: 0.1,
  surgeStartS: 3,
  surgeLengthS: 0.2,
  surgeFactor: 1.5,
  noiseA: 0.05,
  phase: 0.3,
  seed: 1,
});

/** RMS envelope (A) of the synthetic start at time t (s). */
export function syntheticRmsEnvelope(p: SyntheticStartParams, t: number): number {
  if (t < p.onsetS) return 0;
  const running = p.steadyRmsA + (p.peakRmsA - p.steadyRmsA) * Math.exp(-(t - p.onsetS) / p.tauS);
  const inSurge = t >= p.surgeStartS && t < p.surgeStartS + p.surgeLengthS;
  return inSurge ? running * p.surgeFactor : running;
}

/** Fills (or creates) a Float64Array with the synthetic waveform. */
export function syntheticStartWaveform(params: Partial<SyntheticStartParams> = {}, out?: Float64Array): Float64Array {
  const p = { ...DEFAULT_SYNTHETIC_START, ...params };
  const a = out ?? new Float64Array(p.sampleCount);
  const random = seededRandom(p.seed);
  const omega = 2 * Math.PI * p.mainsFrequencyHz;
  for (let i = 0; i < a.length; i++) {
    const t = i / p.sampleRateHz;
    const onT = t - p.onsetS;
    const instantaneous = onT < 0 ? 0 : Math.SQRT2 * syntheticRmsEnvelope(p, t) * Math.sin(omega * onT + p.phase);
    a[i] = instantaneous + p.noiseA * normalDeviate(random);
  }
  return a;
}
