import type { InrushEvent } from '../analysis/events/inrush.js';
import type { Surge } from '../analysis/events/surges.js';
import type { TraceAnalysis } from '../analysis/pipeline/analyze-trace.js';
import type { GapInterval } from '../analysis/stats/sample-summary.js';
import type { Statistics } from '../analysis/stats/statistics.js';

/**
 * The analysis works in seconds from an origin (precise in float64 and free of time zones); the API
 * answers absolute times in epoch milliseconds. These functions turn every point in time (`…TimeS`,
 * `…AtS`, a surge's `startS`/`endS`) into an `…At` field in epoch ms and keep durations in seconds.
 */
const at = (originMs: number, seconds: number) => originMs + seconds * 1000;
const atOrNull = (originMs: number, seconds: number | null) => (seconds === null ? null : at(originMs, seconds));

export function presentInrush(e: InrushEvent, originMs: number) {
  const { onsetTimeS, peakTimeS, settledAtS, firstCyclesPeakTimeS, offTimeS, ...rest } = e;
  return {
    ...rest,
    onsetAt: at(originMs, onsetTimeS),
    peakAt: at(originMs, peakTimeS),
    settledAt: atOrNull(originMs, settledAtS),
    firstCyclesPeakAt: atOrNull(originMs, firstCyclesPeakTimeS),
    offAt: atOrNull(originMs, offTimeS),
  };
}

export function presentSurge(s: Surge, originMs: number) {
  const { startS, endS, peakTimeS, ...rest } = s;
  return { ...rest, startAt: at(originMs, startS), endAt: at(originMs, endS), peakAt: at(originMs, peakTimeS) };
}

function presentGap(g: GapInterval, originMs: number) {
  return { startAt: at(originMs, g.startS), endAt: at(originMs, g.endS), durationS: g.endS - g.startS };
}

export function presentStatistics(s: Statistics, originMs: number) {
  const { firstTimeS, lastTimeS, minTimeS, maxTimeS, gaps, ...rest } = s;
  return {
    ...rest,
    firstAt: at(originMs, firstTimeS),
    lastAt: at(originMs, lastTimeS),
    minAt: at(originMs, minTimeS),
    maxAt: at(originMs, maxTimeS),
    gaps: {
      ...gaps,
      longest: gaps.longest ? presentGap(gaps.longest, originMs) : null,
      listed: gaps.listed.map((g) => presentGap(g, originMs)),
    },
  };
}

export function presentAnalysis(a: TraceAnalysis, originMs: number) {
  const { firstTimeS, lastTimeS, waveform, statistics, inrushEvents, surges, ...rest } = a;
  return {
    ...rest,
    firstAt: at(originMs, firstTimeS),
    lastAt: at(originMs, lastTimeS),
    waveform: waveform ? (({ peakTimeS, ...w }) => ({ ...w, peakAt: at(originMs, peakTimeS) }))(waveform) : null,
    statistics: presentStatistics(statistics, originMs),
    inrushEvents: inrushEvents.map((e) => presentInrush(e, originMs)),
    surges: surges.map((s) => presentSurge(s, originMs)),
  };
}
