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

/** Four interleaved histograms (counts of one bin land in four places), summed after the pass. */
let histogram = new Uint32Array(0);
let binSlot = new Int8Array(0);
let gatherBuffer = new Float64Array(0);

function scratchHistogram(): Uint32Array {
  if (histogram.length === 0) histogram = new Uint32Array(4 * BIN_COUNT);
  else histogram.fill(0);
  return histogram;
}

/**
 * Counts per bin of the candidates in values[from, to), bin = ⌊(x − lo)·scale⌋ (scale keeps every
 * candidate below BIN_COUNT). When every value is a candidate the range test is skipped and four
 * interleaved histograms take consecutive values, so that runs of equal bins do not serialise on one
 * counter (a store-to-load dependency). Returns the counts in the first BIN_COUNT entries.
 */
function countBins(values: SampleArray, from: number, to: number, lo: number, hi: number, scale: number, all: boolean): Uint32Array {
  const hist = scratchHistogram();
  if (all) {
    const end4 = from + ((to - from) & ~3);
    for (let i = from; i < end4; i += 4) {
      hist[(((values[i] as number) - lo) * scale) | 0]! += 1;
      hist[BIN_COUNT + ((((values[i + 1] as number) - lo) * scale) | 0)]! += 1;
      hist[2 * BIN_COUNT + ((((values[i + 2] as number) - lo) * scale) | 0)]! += 1;
      hist[3 * BIN_COUNT + ((((values[i + 3] as number) - lo) * scale) | 0)]! += 1;
    }
    for (let i = end4; i < to; i++) hist[(((values[i] as number) - lo) * scale) | 0]! += 1;
    for (let b = 0; b < BIN_COUNT; b++) {
      hist[b] = (hist[b] as number) + (hist[BIN_COUNT + b] as number) + (hist[2 * BIN_COUNT + b] as number) + (hist[3 * BIN_COUNT + b] as number);
    }
  } else {
    for (let i = from; i < to; i++) {
      const x = values[i] as number;
      if (x >= lo && x <= hi) hist[((x - lo) * scale) | 0]! += 1;
    }
  }
  return hist;
}

/** Bin → index of the target it belongs to, or −1 (at most 2 targets per rank asked for; < 128). */
function scratchBinSlots(): Int8Array {
  if (binSlot.length === 0) binSlot = new Int8Array(BIN_COUNT).fill(-1);
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
  // (BIN_COUNT − 0.5)/(hi − lo): even with rounding, hi maps below BIN_COUNT, so no clamp is needed.
  const scale = (BIN_COUNT - 0.5) / (hi - lo);
  const all = candidateCount === to - from;
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

  const hist = countBins(values, from, to, lo, hi, scale, all);

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
    if (all || (x >= lo && x <= hi)) {
      const k = slots[((x - lo) * scale) | 0] as number;
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
