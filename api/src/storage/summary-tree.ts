/**
 * A segment tree over a trace's chunk summaries: the summary of any run of whole chunks in about
 * 2·log2(chunks) merges (the analysis engine's mergeSummaries, in time order) instead of one merge per
 * chunk. Built once per trace state (about one merge per chunk) and kept while the rows are cached.
 * Source: the segment tree (Bentley, 1977; any algorithms text), over an associative merge.
 */
import { mergeSummaries } from '../analysis/stats/merge-summaries.js';
import type { SampleSummary } from '../analysis/stats/sample-summary.js';
import { summaryOfRow, type ChunkSummaryRow } from './summary-rows.js';

export class SummaryTree {
  private readonly size: number;
  /** Node i covers its children 2i and 2i+1; leaves start at `size`. */
  private readonly nodes: Array<SampleSummary | null>;

  constructor(
    rows: readonly ChunkSummaryRow[],
    readonly gapThresholdS: number | null,
  ) {
    let size = 1;
    while (size < rows.length) size *= 2;
    this.size = size;
    this.nodes = new Array<SampleSummary | null>(2 * size).fill(null);
    rows.forEach((row, k) => (this.nodes[size + k] = summaryOfRow(row, gapThresholdS)));
    for (let i = size - 1; i >= 1; i--) this.nodes[i] = join(this.nodes[2 * i] ?? null, this.nodes[2 * i + 1] ?? null);
  }

  /** Summary of rows [from, to) (their index in the rows the tree was built on), or null when empty. */
  query(from: number, to: number): SampleSummary | null {
    let left: SampleSummary | null = null;
    const right: SampleSummary[] = [];
    let lo = from + this.size;
    let hi = to + this.size;
    while (lo < hi) {
      if (lo & 1) left = join(left, this.nodes[lo++] ?? null);
      if (hi & 1) right.push(this.nodes[--hi] as SampleSummary);
      lo >>= 1;
      hi >>= 1;
    }
    for (let k = right.length - 1; k >= 0; k--) left = join(left, right[k] ?? null);
    return left;
  }
}

function join(earlier: SampleSummary | null, later: SampleSummary | null): SampleSummary | null {
  if (!earlier) return later;
  if (!later) return earlier;
  return mergeSummaries(earlier, later);
}
