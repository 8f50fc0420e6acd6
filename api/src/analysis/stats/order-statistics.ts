/**
 * Exact order statistics (the k-th smallest values) of a typed array without sorting it or copying it.
 *
 * Method: a histogram pass over the candidate value range finds the bin holding each wanted rank;
 * a second pass notes the positions of the values in those few bins, whose values are then sorted.
 * A bin too crowded to gather is refined by recursing on its exact [min, max] (a bin whose values
 * are all equal answers directly, so heavily repeated values cost one more pass at most). Because
 * binning by ⌊(x − lo) · scale⌋ is monotone in x, the bins preserve order and the result is exact.
 * Typical cost: two streaming passes. Extra memory: a 1 MiB histogram, a 64 KiB bin table and a
 * position buffer of at most 768 KiB, kept between calls. The hot loops are kept minimal on purpose
 * (rare work happens after them), which V8 compiles far better. Source: selection by bucketing (a
 * radix-select variant); our implementation.
 */

import type { SampleArray } from '../validation/assert-input.js';

const BIN_COUNT = 1 << 16;
/** Largest number of values gathered from one bin before it is refined instead. */
const GATHER_LIMIT = 1 << 15;
/** Ranges with at most this many candidates are gathered and sorted directly. */
const SMALL_RANGE = 2048;

/** Four interleaved histograms (consecutive values count in different copies), summed after the pass. */
let histogram = new Uint32Array(0);
/** Bin → index of the target to gather (≥ 0), or −1. */
let binSlot = new Int8Array(0);
let positions = new Int32Array(0);

function scratchHistogram(): Uint32Array {
  if (histogram.length === 0) histogram = new Uint32Array(4 * BIN_COUNT);
  else histogram.fill(0);
  return histogram;
}

function scratchBinSlots(): Int8Array {
  if (binSlot.length === 0) binSlot = new Int8Array(BIN_COUNT).fill(-1);
  return binSlot;
}

function scratchPositions(size: number): Int32Array {
  if (positions.length < size) positions = new Int32Array(Math.max(size, 1024));
  return positions;
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

/** Positions in values[from, to) of the candidates whose bin is marked in `slots`; returns how many. */
function notePositions(
  values: SampleArray,
  from: number,
  to: number,
  lo: number,
  hi: number,
  scale: number,
  all: boolean,
  slots: Int8Array,
  out: Int32Array,
): number {
  let m = 0;
  if (all) {
    for (let i = from; i < to; i++) if ((slots[(((values[i] as number) - lo) * scale) | 0] as number) >= 0) out[m++] = i;
  } else {
    for (let i = from; i < to; i++) {
      const x = values[i] as number;
      if (x >= lo && x <= hi && (slots[((x - lo) * scale) | 0] as number) >= 0) out[m++] = i;
    }
  }
  return m;
}

/** Exact min and max of the candidates that fall in `bin`. */
function binExtremes(values: SampleArray, from: number, to: number, lo: number, hi: number, scale: number, bin: number): [number, number] {
  let min = Number.POSITIVE_INFINITY;
  let max = Number.NEGATIVE_INFINITY;
  for (let i = from; i < to; i++) {
    const x = values[i] as number;
    if (x >= lo && x <= hi && (((x - lo) * scale) | 0) === bin) {
      if (x < min) min = x;
      if (x > max) max = x;
    }
  }
  return [min, max];
}

/** Sorted copy of the candidates in values[from, to) (for small candidate sets). */
function sortedCandidates(values: SampleArray, from: number, to: number, lo: number, hi: number, count: number): Float64Array {
  const sorted = new Float64Array(count);
  let n = 0;
  for (let i = from; i < to; i++) {
    const x = values[i] as number;
    if (x >= lo && x <= hi) sorted[n++] = x;
  }
  return sorted.subarray(0, n).sort();
}

interface Target {
  bin: number;
  /** Candidates in bins before this one. */
  before: number;
  count: number;
  ranks: number[];
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
  if (candidateCount <= SMALL_RANGE || !Number.isFinite(scale)) {
    const sorted = sortedCandidates(values, from, to, lo, hi, candidateCount);
    for (const r of wanted) result.set(r, sorted[r] as number);
    return result;
  }
  const all = candidateCount === to - from;
  const hist = countBins(values, from, to, lo, hi, scale, all);

  // Walk the cumulative counts to find each rank's bin and its rank inside the bin.
  const targets: Target[] = [];
  let cumulative = 0;
  let bin = 0;
  for (const r of wanted) {
    while (cumulative + (hist[bin] as number) <= r) cumulative += hist[bin++] as number;
    const current = targets[targets.length - 1];
    if (current && current.bin === bin) current.ranks.push(r);
    else targets.push({ bin, before: cumulative, count: hist[bin] as number, ranks: [r] });
  }

  // Gather the values of the bins small enough, in one tight pass noting their positions.
  const gathered = targets.filter((t) => t.count <= GATHER_LIMIT);
  const crowded = targets.filter((t) => t.count > GATHER_LIMIT);
  if (gathered.length > 0) {
    const slots = scratchBinSlots();
    const size = gathered.reduce((n, t) => n + t.count, 0);
    const offsets: number[] = [];
    let offset = 0;
    gathered.forEach((t, k) => {
      slots[t.bin] = k;
      offsets.push(offset);
      offset += t.count;
    });
    const found = scratchPositions(size);
    const m = notePositions(values, from, to, lo, hi, scale, all, slots, found);
    const bins = new Float64Array(size);
    const filled = new Int32Array(gathered.length);
    for (let j = 0; j < m; j++) {
      const x = values[found[j] as number] as number;
      const k = slots[((x - lo) * scale) | 0] as number;
      bins[(offsets[k] as number) + (filled[k] as number)] = x;
      filled[k] = (filled[k] as number) + 1;
    }
    for (const t of gathered) slots[t.bin] = -1;
    gathered.forEach((t, k) => {
      const sorted = bins.subarray(offsets[k] as number, (offsets[k] as number) + t.count).sort();
      for (const r of t.ranks) result.set(r, sorted[r - t.before] as number);
    });
  }
  // Crowded bins: all equal answers at once; otherwise refine on the bin's exact range.
  for (const t of crowded) {
    const [min, max] = binExtremes(values, from, to, lo, hi, scale, t.bin);
    const inner = selectRanks(values, from, to, min, max, t.count, t.ranks.map((r) => r - t.before));
    for (const r of t.ranks) result.set(r, inner.get(r - t.before) as number);
  }
  return result;
}
