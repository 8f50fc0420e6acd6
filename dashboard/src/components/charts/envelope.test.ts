import { describe, expect, it } from 'vitest';
import { envelopePoints, paddedWindow, stepWindow } from './envelope';

describe('envelopePoints', () => {
  it('when a bucket has no samples, then its points are null so the line breaks at the gap', () => {
    const p = envelopePoints({ t: [0, 10, 20], min: [1, null, 2], max: [3, null, 4], mean: [2, NaN, 3] });
    expect(p.mean).toEqual([
      { x: 0, y: 2 },
      { x: 10, y: null },
      { x: 20, y: 3 },
    ]);
    expect(p.min[1]).toEqual({ x: 10, y: null });
  });

  it('when arrays differ in length, then it throws RangeError', () => {
    expect(() => envelopePoints({ t: [0, 1], min: [1], max: [1, 2], mean: [1, 2] })).toThrow(RangeError);
  });
});

describe('windows', () => {
  const bounds = { from: 0, to: 10_000 };

  it('when zooming to an event, then the window pads it and stays inside the trace', () => {
    expect(paddedWindow(1000, 2000, bounds)).toEqual({ from: 400, to: 2600 });
    expect(paddedWindow(0, 100, bounds, 200)).toEqual({ from: 0, to: 220 });
  });

  it('when zooming in and out, then the centre stays and the span is bounded', () => {
    expect(stepWindow({ from: 4000, to: 6000 }, bounds, { zoom: 0.5 })).toEqual({ from: 4500, to: 5500 });
    expect(stepWindow({ from: 4000, to: 6000 }, bounds, { zoom: 100 })).toEqual(bounds);
  });

  it('when panning past the end, then the window stops at the edge with its span kept', () => {
    expect(stepWindow({ from: 8000, to: 9000 }, bounds, { pan: 2 })).toEqual({ from: 9000, to: 10_000 });
    expect(stepWindow({ from: 1000, to: 2000 }, bounds, { pan: -5 })).toEqual({ from: 0, to: 1000 });
  });
});
