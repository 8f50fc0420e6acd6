import { toWinAnsi } from './pdf-text.js';

/**
 * One current curve: RMS amps over time. `step` draws it as a step function (each sample held until the next,
 * the last until `endS`), as the trip models read a profile; otherwise as a polyline through the samples.
 */
export interface PlotSeries {
  label: string;
  timesS: ArrayLike<number>;
  currentA: ArrayLike<number>;
  step: boolean;
  endS?: number;
  color: string;
}

/** A horizontal limit line (rating, 80 % loading, instantaneous no-trip edge). */
export interface PlotLimit {
  label: string;
  amps: number;
  color: string;
  dashed: boolean;
}

export interface PlotSpec {
  series: PlotSeries[];
  limits: PlotLimit[];
  xLabel: string;
  yLabel: string;
}

export interface PlotBox {
  x: number;
  y: number;
  width: number;
  height: number;
}

/** A tick step of 1, 2 or 5 × 10ⁿ giving about `target` intervals over `range`. */
export function niceStep(range: number, target = 5): number {
  if (!(range > 0) || !Number.isFinite(range)) return 1;
  const raw = range / target;
  const magnitude = 10 ** Math.floor(Math.log10(raw));
  const norm = raw / magnitude;
  return (norm < 1.5 ? 1 : norm < 3 ? 2 : norm < 7 ? 5 : 10) * magnitude;
}

/**
 * Reduces a curve to at most `buckets` min/max pairs so a long trace stays a small path while every peak
 * (an inrush) survives — min/max decimation, never averaging.
 */
export function minMaxDecimate(timesS: ArrayLike<number>, currentA: ArrayLike<number>, buckets: number): { t: number[]; a: number[] } {
  const n = timesS.length;
  if (n <= buckets * 2) return { t: Array.from(timesS), a: Array.from(currentA) };
  const t: number[] = [];
  const a: number[] = [];
  const t0 = timesS[0]!;
  const span = timesS[n - 1]! - t0 || 1;
  let i = 0;
  for (let b = 0; b < buckets; b++) {
    const bucketEnd = t0 + (span * (b + 1)) / buckets;
    let minI = -1;
    let maxI = -1;
    for (; i < n && (timesS[i]! <= bucketEnd || b === buckets - 1); i++) {
      if (minI < 0 || currentA[i]! < currentA[minI]!) minI = i;
      if (maxI < 0 || currentA[i]! > currentA[maxI]!) maxI = i;
    }
    if (minI < 0) continue;
    for (const k of minI <= maxI ? [minI, maxI] : [maxI, minI]) {
      if (t.length === 0 || t[t.length - 1] !== timesS[k]) {
        t.push(timesS[k]!);
        a.push(currentA[k]!);
      }
    }
  }
  return { t, a };
}

function formatTick(value: number, step: number): string {
  const decimals = Math.max(0, -Math.floor(Math.log10(step) + 1e-9));
  return value.toFixed(decimals);
}

/**
 * Draws current curves and limit lines as vector paths in `box` of a pdfkit document: axes with 1/2/5 ticks,
 * light grid, each series as a path, dashed limit lines labelled at the right, and a legend below the box.
 */
export function drawCurrentPlot(doc: PDFKit.PDFDocument, spec: PlotSpec, box: PlotBox): void {
  const left = box.x + 40;
  const right = box.x + box.width - 10;
  const top = box.y + 16;
  const bottom = box.y + box.height - 28;
  let tMin = Infinity;
  let tMax = -Infinity;
  let aMax = 0;
  const curves = spec.series.map((s) => {
    const { t, a } = minMaxDecimate(s.timesS, s.currentA, Math.ceil(right - left));
    const endS = s.endS ?? t[t.length - 1] ?? 0;
    tMin = Math.min(tMin, t[0] ?? 0);
    tMax = Math.max(tMax, endS);
    for (const v of a) aMax = Math.max(aMax, v);
    return { ...s, t, a, endS };
  });
  for (const limit of spec.limits) aMax = Math.max(aMax, limit.amps);
  if (!Number.isFinite(tMin)) [tMin, tMax] = [0, 1];
  if (tMax <= tMin) tMax = tMin + 1;
  const yStep = niceStep(aMax * 1.05 || 1);
  const yTop = Math.ceil((aMax * 1.05 || 1) / yStep) * yStep;
  const xStep = niceStep(tMax - tMin);
  const px = (t: number) => left + ((t - tMin) / (tMax - tMin)) * (right - left);
  const py = (a: number) => bottom - (a / yTop) * (bottom - top);

  doc.save();
  doc.font('Helvetica').fontSize(7).lineWidth(0.3).strokeColor('#d0d0d0').fillColor('#404040');
  for (let v = 0; v <= yTop + 1e-9; v += yStep) {
    doc.moveTo(left, py(v)).lineTo(right, py(v)).stroke();
    doc.text(formatTick(v, yStep), box.x, py(v) - 3, { width: 36, align: 'right', lineBreak: false });
  }
  for (let v = Math.ceil(tMin / xStep) * xStep; v <= tMax + 1e-9; v += xStep) {
    doc.moveTo(px(v), top).lineTo(px(v), bottom).stroke();
    doc.text(formatTick(v, xStep), px(v) - 20, bottom + 3, { width: 40, align: 'center', lineBreak: false });
  }
  doc.lineWidth(0.8).strokeColor('#404040').moveTo(left, top).lineTo(left, bottom).lineTo(right, bottom).stroke();
  doc.text(toWinAnsi(spec.xLabel), left, bottom + 12, { width: right - left, align: 'center', lineBreak: false });
  doc.text(toWinAnsi(spec.yLabel), box.x, box.y, { lineBreak: false });

  const labelYs: number[] = [];
  for (const limit of spec.limits) {
    const y = py(limit.amps);
    doc.lineWidth(0.8).strokeColor(limit.color);
    if (limit.dashed) doc.dash(4, { space: 3 });
    doc.moveTo(left, y).lineTo(right, y).stroke();
    doc.undash();
    // Labels of lines close together go to opposite ends so they never overprint.
    const crowded = labelYs.some((other) => Math.abs(other - y) < 10);
    labelYs.push(y);
    const at = crowded ? { x: left + 4, align: 'left' as const } : { x: right - 200, align: 'right' as const };
    doc.fillColor(limit.color).text(toWinAnsi(limit.label), at.x, y - 9, { width: 198, align: at.align, lineBreak: false });
  }

  for (const c of curves) {
    if (c.t.length === 0) continue;
    doc.lineWidth(1.1).strokeColor(c.color);
    doc.moveTo(px(c.t[0]!), py(c.a[0]!));
    for (let i = 1; i < c.t.length; i++) {
      if (c.step) doc.lineTo(px(c.t[i]!), py(c.a[i - 1]!));
      doc.lineTo(px(c.t[i]!), py(c.a[i]!));
    }
    if (c.step) doc.lineTo(px(c.endS), py(c.a[c.a.length - 1]!));
    doc.stroke();
  }

  let legendX = left;
  const legendY = box.y + box.height - 8;
  for (const c of curves) {
    doc.lineWidth(1.5).strokeColor(c.color).moveTo(legendX, legendY + 3).lineTo(legendX + 14, legendY + 3).stroke();
    const label = toWinAnsi(c.label);
    doc.fillColor('#202020').text(label, legendX + 18, legendY, { lineBreak: false });
    legendX += 30 + doc.widthOfString(label);
  }
  doc.restore();
}
