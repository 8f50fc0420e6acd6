/**
 * Typical spacing of a series' timestamps and the gap threshold derived from it.
 *
 * Definition: the typical spacing is the median of the intervals between consecutive timestamps.
 * For a uniform axis it is 1 / rate. For explicit timestamps it is the exact median when the series
 * has at most TYPICAL_SPACING_SAMPLE_INTERVALS intervals; above that, the median of that many intervals
 * taken at evenly spaced positions (deterministic), which keeps it cheap on very long traces.
 * A gap is an interval longer than gapFactor × the typical spacing; gaps are reported and never
 * integrated across. Source: our design choice (the issue asks for "intervals much longer than the
 * typical spacing").
 */

import { assertPositive } from '../validation/assert-input.js';
import { throwTimestampError, type TimeAxis } from './time-axis.js';

/** Number of intervals examined to find the typical spacing of explicit timestamps. */
export const TYPICAL_SPACING_SAMPLE_INTERVALS = 8192;

/**
 * Default gap factor: an interval longer than 2.5 × the typical spacing is a gap. With readings
 * every minute one missed reading (a 2-minute interval) is bridged by interpolation, two missed in a
 * row (3 minutes) make a gap; jitter of ±20 % never does. Source: our design choice.
 */
export const DEFAULT_GAP_FACTOR = 2.5;

/**
 * Typical spacing (s) of samples [from, to) on `axis`: 1/rate for a uniform axis, else the median
 * interval (see the file comment). Returns null for fewer than two samples.
 */
export function typicalSpacingS(axis: TimeAxis, from: number, to: number): number | null {
  if (to - from < 2) return null;
  if (axis.kind === 'uniform') return 1 / axis.rateHz;
  const t = axis.timesS;
  const intervals = to - from - 1;
  const take = Math.min(intervals, TYPICAL_SPACING_SAMPLE_INTERVALS);
  const picked = new Float64Array(take);
  for (let k = 0; k < take; k++) {
    // Evenly spread interval indexes (all of them when intervals <= take).
    const i = from + (take === intervals ? k : Math.floor((k * intervals) / take));
    picked[k] = (t[i + 1] as number) - (t[i] as number);
  }
  picked.sort();
  const mid = take >> 1;
  const median = take % 2 === 1 ? (picked[mid] as number) : ((picked[mid - 1] as number) + (picked[mid] as number)) / 2;
  if (!(median > 0 && median < Number.POSITIVE_INFINITY)) {
    // Only bad timestamps give this; name the first one.
    for (let i = from + 1; i < to; i++) if (!((t[i] as number) > (t[i - 1] as number))) throwTimestampError(t, i);
    throw new RangeError('timestamps must be finite');
  }
  return median;
}

/**
 * Gap threshold (s): gapFactor × typicalSpacingS. Returns null when there is no typical spacing
 * (fewer than two samples: there is no interval that could be a gap). Default gapFactor
 * DEFAULT_GAP_FACTOR; it must be at least 1.
 */
export function gapThresholdFromSpacing(
  typicalS: number | null,
  gapFactor: number = DEFAULT_GAP_FACTOR,
): number | null {
  assertPositive(gapFactor, 'gapFactor');
  if (gapFactor < 1) throw new RangeError(`gapFactor must be at least 1 (got ${gapFactor})`);
  return typicalS === null ? null : gapFactor * typicalS;
}
