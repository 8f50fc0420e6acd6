import type { TraceEventRow } from '../components/events-table';

type Loose = Record<string, unknown>;

const num = (o: Loose, key: string): number | null => {
  const v = o[key];
  return typeof v === 'number' && Number.isFinite(v) ? v : null;
};

/**
 * The events answer as table and chart rows, in time order. The answer's event objects are open records
 * (the analysis may add fields), so each field is read and checked here; an event without its times is
 * left out rather than drawn in the wrong place.
 */
export function eventRows(events: { inrushEvents: Loose[]; surges: Loose[] }): TraceEventRow[] {
  const rows: TraceEventRow[] = [];
  events.inrushEvents.forEach((e, i) => {
    const startAt = num(e, 'onsetAt');
    const peakAt = num(e, 'peakAt');
    const peakA = num(e, 'peakA');
    if (startAt === null || peakAt === null || peakA === null) return;
    const durationS = num(e, 'durationS') ?? 0;
    rows.push({
      id: `inrush-${i}`,
      kind: 'inrush',
      label: `Inrush ${i + 1}`,
      startAt,
      endAt: num(e, 'settledAt') ?? startAt + durationS * 1000,
      peakAt,
      peakA,
      baseA: num(e, 'steadyA') ?? 0,
      durationS,
      settleTimeS: num(e, 'settleTimeS'),
      i2tA2s: num(e, 'i2tA2s') ?? 0,
    });
  });
  events.surges.forEach((e, i) => {
    const startAt = num(e, 'startAt');
    const endAt = num(e, 'endAt');
    const peakAt = num(e, 'peakAt');
    const peakA = num(e, 'peakA');
    if (startAt === null || endAt === null || peakAt === null || peakA === null) return;
    rows.push({
      id: `surge-${i}`,
      kind: 'surge',
      label: `Surge ${i + 1}`,
      startAt,
      endAt,
      peakAt,
      peakA,
      baseA: num(e, 'runningA') ?? 0,
      durationS: num(e, 'durationS') ?? (endAt - startAt) / 1000,
      settleTimeS: null,
      i2tA2s: num(e, 'i2tA2s') ?? 0,
    });
  });
  return rows.sort((a, b) => a.startAt - b.startAt);
}
