/**
 * Half-cycle RMS series of a waveform: the RMS over one fundamental cycle, refreshed every half
 * cycle (the IEC 61000-4-30 method, applied to current).
 *
 * Definition: value j is √(Σ i² / N) over the samples of half-cycle blocks j and j + 1 (one cycle,
 * N samples); its time is the centre of that window, t = start + ((first + last) / 2) / rate.
 * For a record of B whole half-cycle blocks the series has B − 1 values (none when B < 2).
 * Source: IEC 61000-4-30 Ed. 3 (half-cycle-refreshed one-cycle RMS; trade-facts.md 4.2).
 */

import type { SampleArray } from '../validation/assert-input.js';
import { halfCycleBlocks, type HalfCycleBlocks } from './half-cycle-blocks.js';

/** A half-cycle RMS series: one value per half cycle, with the time of each window's centre. */
export interface HalfCycleRmsSeries {
  /** Window centres (s). */
  timesS: Float64Array;
  /** One-cycle RMS values (A). */
  rmsA: Float64Array;
  /** Nominal window length in samples (one cycle, may be fractional). */
  windowSamples: number;
  /** Nominal refresh step in samples (half a cycle, may be fractional). */
  stepSamples: number;
  mainsFrequencyHz: number;
}

/** The half-cycle RMS series from precomputed half-cycle blocks (no pass over the samples). */
export function halfCycleRmsFromBlocks(blocks: HalfCycleBlocks): HalfCycleRmsSeries {
  const count = Math.max(0, blocks.blockCount - 1);
  const timesS = new Float64Array(count);
  const rmsA = new Float64Array(count);
  const b = blocks.boundaries;
  const sq = blocks.sumSquares;
  for (let j = 0; j < count; j++) {
    const first = b[j] as number;
    const end = b[j + 2] as number;
    rmsA[j] = Math.sqrt(((sq[j] as number) + (sq[j + 1] as number)) / (end - first));
    timesS[j] = blocks.startS + (first + end - 1) / 2 / blocks.sampleRateHz;
  }
  return {
    timesS,
    rmsA,
    windowSamples: 2 * blocks.halfCycleSamples,
    stepSamples: blocks.halfCycleSamples,
    mainsFrequencyHz: blocks.mainsFrequencyHz,
  };
}

/**
 * Half-cycle RMS series of waveform `a` (A) sampled uniformly at `sampleRateHz` from `startS`, at
 * mains frequency `mainsFrequencyHz` (40–70 Hz; see estimateMainsFrequency when unknown).
 * Example: 60 Hz at 7680 samples/s → 128-sample windows refreshed every 64 samples.
 */
export function halfCycleRms(
  a: SampleArray,
  sampleRateHz: number,
  mainsFrequencyHz: number,
  startS = 0,
): HalfCycleRmsSeries {
  return halfCycleRmsFromBlocks(halfCycleBlocks(a, sampleRateHz, mainsFrequencyHz, startS));
}
