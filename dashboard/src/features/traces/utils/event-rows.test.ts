import { describe, expect, it } from 'vitest';
import { eventRows } from './event-rows';

describe('eventRows', () => {
  it('when the answer has inrush events and surges, then rows come in time order with their own labels', () => {
    const rows = eventRows({
      inrushEvents: [
        {
          onsetAt: 1000,
          peakAt: 1050,
          settledAt: 1800,
          peakA: 31,
          steadyA: 8.2,
          durationS: 0.8,
          settleTimeS: 0.8,
          i2tA2s: 215,
        },
      ],
      surges: [
        { startAt: 5000, endAt: 6500, peakAt: 5300, peakA: 12, runningA: 8.2, durationS: 1.5, i2tA2s: 200 },
        { startAt: 500, endAt: 700, peakAt: 600, peakA: 11, runningA: 8, durationS: 0.2, i2tA2s: 20 },
      ],
    });
    expect(rows.map((r) => [r.label, r.startAt])).toEqual([
      ['Surge 2', 500],
      ['Inrush 1', 1000],
      ['Surge 1', 5000],
    ]);
    expect(rows[1]).toMatchObject({ kind: 'inrush', endAt: 1800, baseA: 8.2, settleTimeS: 0.8 });
  });

  it('when an event lacks its times, then it is left out instead of drawn at zero', () => {
    expect(eventRows({ inrushEvents: [{ peakA: 30 }], surges: [{ startAt: 1, peakA: 2 }] })).toEqual([]);
  });

  it('when an inrush never settles, then its span ends after its duration', () => {
    const [row] = eventRows({
      inrushEvents: [{ onsetAt: 1000, peakAt: 1000, peakA: 50, settledAt: null, durationS: 2 }],
      surges: [],
    });
    expect(row?.endAt).toBe(3000);
    expect(row?.settleTimeS).toBeNull();
  });
});
