/**
 * Merging the summaries of two consecutive runs of samples into the summary of the whole run.
 *
 * The result equals `summarise` over the joined run (up to floating-point rounding): counts add;
 * mean and M2 combine by Chan et al.'s pairwise formula; min/max keep the earliest extreme; the
 * interval joining the last sample of the first run to the first sample of the second is integrated
 * (trapezoid) or counted as a gap, exactly as the direct kernel does.
 * Source: T. F. Chan, G. H. Golub, R. J. LeVeque, The American Statistician 37(3), 1983, eq. 2.1.
 */

import { timeAboveOnSegment } from './linear-segment.js';
import type { GapInterval, SampleSummary } from './sample-summary.js';

function sameThresholds(a: readonly number[], b: readonly number[]): boolean {
  return a.length === b.length && a.every((h, k) => h === b[k]);
}

/**
 * Summary of the run `earlier` followed by the run `later`. Both must share gapThresholdS and
 * thresholdsA, and `later` must start after `earlier` ends (RangeError otherwise).
 */
export function mergeSummaries(earlier: SampleSummary, later: SampleSummary): SampleSummary {
  if (earlier.gapThresholdS !== later.gapThresholdS) {
    throw new RangeError(
      `cannot merge summaries made with different gap thresholds (${String(earlier.gapThresholdS)} s and ${String(later.gapThresholdS)} s)`,
    );
  }
  if (!sameThresholds(earlier.thresholdsA, later.thresholdsA)) {
    throw new RangeError('cannot merge summaries made with different thresholdsA');
  }
  if (earlier.count < 1 || later.count < 1) throw new RangeError('summaries to merge must each hold at least one sample');
  const bridge = later.firstTimeS - earlier.lastTimeS;
  if (!(bridge > 0)) {
    throw new RangeError(
      `summaries must be merged in time order without overlap (later starts at ${later.firstTimeS} s, earlier ends at ${earlier.lastTimeS} s)`,
    );
  }
  const count = earlier.count + later.count;
  const delta = later.meanA - earlier.meanA;
  const meanA = earlier.meanA + (delta * later.count) / count;
  const m2A2 = earlier.m2A2 + later.m2A2 + (delta * delta * earlier.count * later.count) / count;

  let coveredTimeS = earlier.coveredTimeS + later.coveredTimeS;
  let integralAs = earlier.integralAs + later.integralAs;
  let integralA2s = earlier.integralA2s + later.integralA2s;
  let gapCount = earlier.gapCount + later.gapCount;
  let gapTimeS = earlier.gapTimeS + later.gapTimeS;
  const timeAboveS = earlier.timeAboveS.map((s, k) => s + (later.timeAboveS[k] as number));
  const candidates: GapInterval[] = [];
  if (earlier.longestGap) candidates.push(earlier.longestGap);

  const a0 = earlier.lastA;
  const a1 = later.firstA;
  if (earlier.gapThresholdS === null || bridge <= earlier.gapThresholdS) {
    coveredTimeS += bridge;
    integralAs += ((a0 + a1) * bridge) / 2;
    integralA2s += ((a0 * a0 + a1 * a1) * bridge) / 2;
    earlier.thresholdsA.forEach((h, k) => {
      timeAboveS[k] = (timeAboveS[k] as number) + timeAboveOnSegment(a0, a1, bridge, h);
    });
  } else {
    gapCount += 1;
    gapTimeS += bridge;
    candidates.push({ startS: earlier.lastTimeS, endS: later.firstTimeS });
  }
  if (later.longestGap) candidates.push(later.longestGap);
  // Longest gap; the earliest wins a tie, as in the direct kernel.
  let longestGap: GapInterval | null = null;
  for (const g of candidates) {
    if (longestGap === null || g.endS - g.startS > longestGap.endS - longestGap.startS) longestGap = g;
  }

  const minFromLater = later.minA < earlier.minA;
  const maxFromLater = later.maxA > earlier.maxA;
  return {
    count,
    meanA,
    m2A2,
    minA: minFromLater ? later.minA : earlier.minA,
    minTimeS: minFromLater ? later.minTimeS : earlier.minTimeS,
    maxA: maxFromLater ? later.maxA : earlier.maxA,
    maxTimeS: maxFromLater ? later.maxTimeS : earlier.maxTimeS,
    firstTimeS: earlier.firstTimeS,
    firstA: earlier.firstA,
    lastTimeS: later.lastTimeS,
    lastA: later.lastA,
    coveredTimeS,
    integralAs,
    integralA2s,
    gapThresholdS: earlier.gapThresholdS,
    gapCount,
    gapTimeS,
    longestGap: longestGap ? { ...longestGap } : null,
    thresholdsA: [...earlier.thresholdsA],
    timeAboveS,
  };
}

/** Folds `mergeSummaries` over consecutive summaries in time order; RangeError for an empty list. */
export function mergeSummaryList(summaries: readonly SampleSummary[]): SampleSummary {
  const [first, ...rest] = summaries;
  if (!first) throw new RangeError('at least one summary is needed');
  return rest.reduce(mergeSummaries, first);
}
