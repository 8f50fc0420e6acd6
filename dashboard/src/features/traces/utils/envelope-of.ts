import type { EnvelopeSeries } from '../../../components/charts/envelope';
import type { TraceSeries } from '../api/trace-data';

export type EnvelopeMode = 'rms' | 'instantaneous';

/**
 * The envelope to draw. Zoomed in far, a bucket can be shorter than a half cycle and hold no RMS value
 * although it holds samples: such buckets are skipped (the line joins its neighbours), while buckets with
 * no samples at all stay null so the line breaks at a real gap.
 */
export function envelopeOf(
  series: Pick<TraceSeries, 't' | 'count' | 'min' | 'max' | 'mean' | 'rms'>,
  mode: EnvelopeMode,
): EnvelopeSeries {
  const rms = series.rms;
  if (mode !== 'rms' || !rms) return { t: series.t, min: series.min, max: series.max, mean: series.mean };
  const out = {
    t: [] as number[],
    min: [] as (number | null)[],
    max: [] as (number | null)[],
    mean: [] as (number | null)[],
  };
  for (let i = 0; i < series.t.length; i++) {
    const gap = (series.count[i] ?? 0) === 0;
    if (!gap && rms.mean[i] == null) continue;
    out.t.push(series.t[i]!);
    out.min.push(gap ? null : (rms.min[i] ?? null));
    out.max.push(gap ? null : (rms.max[i] ?? null));
    out.mean.push(gap ? null : (rms.mean[i] ?? null));
  }
  return out;
}
