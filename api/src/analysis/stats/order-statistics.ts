/**
 * Exact order statistics (the k-th smallest values) of a typed array without sorting it or copying it.
 *
 * Method: a histogram pass over the candidate value range finds the bin holding each wanted rank;
 * a second pass gathers the values of those few bins into a small scratch buffer, which is sorted.
 * A bin with too many values to gather is refined by recursing on its exact [min, max] (a bin whose
 * values are all equal answers directly, so heavily repeated values cost nothing more). Because
 * binning by floor((x − lo) · scale) is monotone in x, the bins preserve order and the result is
 * exact. Typical cost: two streaming passes. Extra memory: a 256 KiB histogram and a gather buffer
 * of at most a few MB, kept between calls. Source: selection by bucketing (a radix-select variant);
 * our implementation.
 */

import type { SampleArray } from '../validation/assert-input.js';

const BIN_COUNT = 1 << 16;
/** Largest number of values gathered from one bin before it is refined instead. */
const GATHER_LIMIT = 1 << 15;
/** Ranges with at most this many candidates are gathered and sorted directly. */
const SMALL_RANGE = 2048;

let histogram = new Uint32Array(0);
let binSlot = new Int16Array(0);
let gatherBuffer = new Float64Array(0);

function scratchHistogram(): Uint32Array {
  if (histogram.length === 0) histogram = new Uint32Array(BIN_COUNT);
  else histogram.fill(0);
  return histogram;
}

function scratchBinSlots(): Int16Array {
  if (binSlot.length === 0) binSlot = new Int16Array(BIN_COUNT).fill(-1);
  return binSlot;
}

function scratchGather(size: number): Float64Array {
  if (gatherBuffer.length < size) gatherBuffer = new Float64Array(Math.max(size, 1024));
  return gatherBuffer;
}

/**
 * Values of the given 0-based `ranks` among the candidates {x in values[from, to) : lo ≤ x ≤ hi},
 * which must number `candidateCount`; ranks must be integers in [0, candidateCount). Returns a Map
 * from rank to value. `lo`/`hi` must bound the candidates actually present (e.g. their min and max).
 * Inputs are assumed finite (callers validate).
 */
export function selectRanks(
  values: SampleArray,
  from: number,
  to: number,
  lo: number,
  hi: number,
  candidateCount: number,
  ranks: readonly number[],
): Map<number, number> {
  const result = new Map<number, number>();
  const wanted = [...new Set(ranks)].sort((x, y) => x - y);
  for (const r of wanted) {
    if (!Number.isInteger(r) || r < 0 || r >= candidateCount) {
      throw new RangeError(`rank ${r} is outside 0..${candidateCount - 1}`);
    }
  }
  if (wanted.length === 0) return result;
  if (lo === hi) {
    for (const r of wanted) result.set(r, lo);
    return result;
  }
  const scale = BIN_COUNT / (hi - lo);
  if (candidateCount <= SMALL_RANGE || !Number.isFinite(scale)) {
    const buffer = scratchGather(candidateCount);
    let n = 0;
    for (let i = from; i < to; i++) {
      const x = values[i] as number;
      if (x >= lo && x <= hi) buffer[n++] = x;
    }
    const sorted = buffer.subarray(0, n).sort();
    for (const r of wanted) result.set(r, sorted[r] as number);
    return result;
  }

  const hist = scratchHistogram();
  const last = BIN_COUNT - 1;
  for (let i = from; i < to; i++) {
    const x = values[i] as number;
    if (x >= lo && x <= hi) {
      const b = ((x - lo) * scale) | 0;
      hist[b < last ? b : last]! += 1;
    }
  }

  // Walk the cumulative counts to find each rank's bin and its rank inside the bin.
  interface Target { bin: number; before: number; count: number; ranks: number[] }
  const targets: Target[] = [];
  let cumulative = 0;
  let bin = 0;
  for (const r of wanted) {
    while (cumulative + (hist[bin] as number) <= r) cumulative += hist[bin++] as number;
    const current = targets[targets.length - 1];
    if (current && current.bin === bin) current.ranks.push(r);
    else targets.push({ bin, before: cumulative, count: hist[bin] as number, ranks: [r] });
  }

  // Gather the values of the target bins (up to GATHER_LIMIT each) and their exact min/max.
  const slots = scratchBinSlots();
  const offsets: number[] = [];
  let size = 0;
  targets.forEach((t, k) => {
    slots[t.bin] = k;
    offsets.push(size);
    size += Math.min(t.count, GATHER_LIMIT);
  });
  const buffer = scratchGather(size);
  const filled = new Int32Array(targets.length);
  const binMin = new Float64Array(targets.length).fill(Number.POSITIVE_INFINITY);
  const binMax = new Float64Array(targets.length).fill(Number.NEGATIVE_INFINITY);
  for (let i = from; i < to; i++) {
    const x = values[i] as number;
    if (x >= lo && x <= hi) {
      const b = ((x - lo) * scale) | 0;
      const k = slots[b < last ? b : last] as number;
      if (k >= 0) {
        const f = filled[k] as number;
        if (f < GATHER_LIMIT) buffer[(offsets[k] as number) + f] = x;
        filled[k] = f + 1;
        if (x < (binMin[k] as number)) binMin[k] = x;
        if (x > (binMax[k] as number)) binMax[k] = x;
      }
    }
  }
  for (const t of targets) slots[t.bin] = -1;

  // Answer from gathered bins first (the buffer is reused by the refinements below).
  const refine: Array<{ target: Target; k: number }> = [];
  targets.forEach((t, k) => {
    if (binMin[k] === binMax[k]) {
      for (const r of t.ranks) result.set(r, binMin[k] as number);
    } else if (t.count <= GATHER_LIMIT) {
      const sorted = buffer.subarray(offsets[k] as number, (offsets[k] as number) + t.count).sort();
      for (const r of t.ranks) result.set(r, sorted[r - t.before] as number);
    } else {
      refine.push({ target: t, k });
    }
  });
  for (const { target, k } of refine) {
    const inner = selectRanks(values, from, to, binMin[k] as number, binMax[k] as number, target.count, target.ranks.map((r) => r - target.before));
    for (const r of target.ranks) result.set(r, inner.get(r - target.before) as number);
  }
  return result;
}
