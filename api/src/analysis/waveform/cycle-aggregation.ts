/**
 * RMS over the IEC 61000-4-30 basic aggregation interval: 10 cycles at 50 Hz, 12 cycles at 60 Hz
 * (≈ 200 ms), contiguous and non-overlapping, from the start of the record.
 * Definition: value m is √(Σ i² / N) over half-cycle blocks [2·c·m, 2·c·(m + 1)) with c the
 * interval's cycle count; its time is the interval's centre. A trailing partial interval is dropped.
 * Source: IEC 61000-4-30 Ed. 3 aggregation intervals (trade-facts.md 4.2).
 */

import { aggregationCyclesFor } from './iec-windows.js';
import type { HalfCycleBlocks } from './half-cycle-blocks.js';

/** RMS values over consecutive 10/12-cycle intervals. */
export interface CycleAggregateSeries {
  cycles: number;
  timesS: Float64Array;
  rmsA: Float64Array;
}

/** 10/12-cycle RMS series from half-cycle blocks (no pass over the samples). */
export function cycleAggregateRms(blocks: HalfCycleBlocks): CycleAggregateSeries {
  const cycles = aggregationCyclesFor(blocks.mainsFrequencyHz);
  const blocksPer = 2 * cycles;
  const count = Math.floor(blocks.blockCount / blocksPer);
  const timesS = new Float64Array(count);
  const rmsA = new Float64Array(count);
  for (let m = 0; m < count; m++) {
    let s2 = 0;
    for (let k = m * blocksPer; k < (m + 1) * blocksPer; k++) s2 += blocks.sumSquares[k] as number;
    const first = blocks.boundaries[m * blocksPer] as number;
    const end = blocks.boundaries[(m + 1) * blocksPer] as number;
    rmsA[m] = Math.sqrt(s2 / (end - first));
    timesS[m] = blocks.startS + (first + end - 1) / 2 / blocks.sampleRateHz;
  }
  return { cycles, timesS, rmsA };
}
