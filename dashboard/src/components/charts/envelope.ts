/**
 * Turns an envelope (one bucket per pixel or so, each with min, max and mean) into Chart.js points that
 * need no parsing. Buckets without samples (a gap in the recording) become `null`, so the line breaks
 * there instead of bridging the gap.
 */
export interface EnvelopeSeries {
  /** Bucket times, epoch ms, ascending. */
  t: ArrayLike<number>;
  min: ArrayLike<number | null>;
  max: ArrayLike<number | null>;
  mean: ArrayLike<number | null>;
}

export interface XYPoint {
  x: number;
  y: number | null;
}

export interface EnvelopePoints {
  min: XYPoint[];
  max: XYPoint[];
  mean: XYPoint[];
}

/** @throws RangeError when the arrays differ in length. */
export function envelopePoints(series: EnvelopeSeries): EnvelopePoints {
  const n = series.t.length;
  if (series.min.length !== n || series.max.length !== n || series.mean.length !== n) {
    throw new RangeError(
      `envelope arrays differ in length: t ${n}, min ${series.min.length}, max ${series.max.length}, mean ${series.mean.length}`,
    );
  }
  const min: XYPoint[] = new Array(n);
  const max: XYPoint[] = new Array(n);
  const mean: XYPoint[] = new Array(n);
  for (let i = 0; i < n; i++) {
    const x = series.t[i]!;
    min[i] = { x, y: finiteOrNull(series.min[i]) };
    max[i] = { x, y: finiteOrNull(series.max[i]) };
    mean[i] = { x, y: finiteOrNull(series.mean[i]) };
  }
  return { min, max, mean };
}

function finiteOrNull(v: number | null | undefined): number | null {
  return v === null || v === undefined || !Number.isFinite(v) ? null : v;
}

export interface TimeWindow {
  /** Epoch ms. */
  from: number;
  /** Epoch ms. */
  to: number;
}

/** A window around [from, to] with a margin on each side, kept inside the bounds. */
export function paddedWindow(from: number, to: number, bounds: TimeWindow, minSpanMs = 200): TimeWindow {
  const span = Math.max(to - from, minSpanMs);
  const pad = span * 0.6;
  const lo = Math.max(bounds.from, from - pad);
  const hi = Math.min(bounds.to, to + pad);
  return hi > lo ? { from: lo, to: hi } : { ...bounds };
}

/** The window after zooming by `factor` (< 1 zooms in) about its centre, or panning by `shift` spans, kept in bounds. */
export function stepWindow(
  win: TimeWindow,
  bounds: TimeWindow,
  action: { zoom?: number; pan?: number },
  minSpanMs = 50,
): TimeWindow {
  const fullSpan = bounds.to - bounds.from;
  let span = win.to - win.from;
  let centre = (win.from + win.to) / 2;
  if (action.zoom) span = Math.min(fullSpan, Math.max(minSpanMs, span * action.zoom));
  if (action.pan) centre += action.pan * span;
  let from = centre - span / 2;
  let to = centre + span / 2;
  if (from < bounds.from) {
    to += bounds.from - from;
    from = bounds.from;
  }
  if (to > bounds.to) {
    from -= to - bounds.to;
    to = bounds.to;
  }
  return { from: Math.max(bounds.from, from), to: Math.min(bounds.to, to) };
}
