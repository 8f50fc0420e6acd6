import PDFDocument from 'pdfkit';
import { describe, expect, it } from 'vitest';
import { drawCurrentPlot, minMaxDecimate, niceStep } from './pdf-plot.js';

function pageContent(draw: (doc: PDFKit.PDFDocument) => void): Promise<string> {
  const doc = new PDFDocument({ compress: false });
  const chunks: Buffer[] = [];
  doc.on('data', (c: Buffer) => chunks.push(c));
  const done = new Promise<string>((resolve) => doc.on('end', () => resolve(Buffer.concat(chunks).toString('latin1'))));
  draw(doc);
  doc.end();
  return done;
}

describe('pdf plot', () => {
  it('when ticks are chosen, then steps are 1, 2 or 5 × 10ⁿ', () => {
    // common practice, no source: the 1-2-5 tick series of chart axes
    expect(niceStep(40)).toBe(10);
    expect(niceStep(7)).toBe(1);
    expect(niceStep(0.3)).toBe(0.05);
    expect(niceStep(103)).toBe(20);
  });

  it('when a long trace is decimated, then the short peak survives', () => {
    const n = 10_000;
    const t = Float64Array.from({ length: n }, (_, i) => i * 0.01);
    const a = Float64Array.from({ length: n }, () => 8);
    a[4321] = 31; // a one-sample inrush
    const out = minMaxDecimate(t, a, 100);
    expect(out.t.length).toBeLessThanOrEqual(200);
    expect(Math.max(...out.a)).toBe(31);
    expect(out.t).toContain(t[4321]);
  });

  it('when a step profile is drawn, then it becomes stroked vector path segments, one pair per step', async () => {
    const content = await pageContent((doc) =>
      drawCurrentPlot(
        doc,
        {
          series: [{ label: 'start', timesS: [0, 0.3], currentA: [39, 22], step: true, endS: 2, color: '#1f4e79' }],
          limits: [{ label: 'rating 20 A', amps: 20, color: '#b35900', dashed: false }],
          xLabel: 'time (s)',
          yLabel: 'A',
        },
        { x: 50, y: 50, width: 400, height: 200 },
      ),
    );
    // the series: moveTo, then (step) lineTo ×2 at t = 0.3 and one lineTo to endS, then a stroke
    expect(content).toMatch(/\d+(\.\d+)? \d+(\.\d+)? m\n\d+(\.\d+)? \d+(\.\d+)? l\n\d+(\.\d+)? \d+(\.\d+)? l\n\d+(\.\d+)? \d+(\.\d+)? l\nS/);
    expect(content).not.toMatch(/\/Subtype \/Image/);
  });
});
