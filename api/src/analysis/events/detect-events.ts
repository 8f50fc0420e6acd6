/**
 * Inrush events and surges of a whole RMS series in one call, with every parameter echoed.
 *
 * Steps: resolve the on/off levels (on-threshold.ts), find the on-periods (on-periods.ts), analyse
 * the inrush of every period with a recorded switch-on (inrush.ts), and look for surges in every
 * period after its inrush (surges.ts). Parameters not given take the DEFAULT_EVENT_PARAMS values.
 * Source: see the files named above; all thresholds are our design choice.
 */

import { assertInteger, type SampleArray } from '../validation/assert-input.js';
import { indexAfterTime, timeAt, type TimeAxis } from '../time/time-axis.js';
import type { HalfCycleBlocks } from '../waveform/half-cycle-blocks.js';
import { DEFAULT_INRUSH_PARAMS, analyseInrush, assertInrushParams, steadyCurrent, type InrushEvent, type InrushParams } from './inrush.js';
import { findOnPeriods } from './on-periods.js';
import {
  DEFAULT_ON_THRESHOLD_PARAMS,
  assertOnThresholdParams,
  resolveOnThreshold,
  type OnThresholdParams,
  type ResolvedOnThreshold,
} from './on-threshold.js';
import { DEFAULT_SURGE_PARAMS, assertSurgeParams, findSurges, type Surge, type SurgeParams } from './surges.js';

/** Cap on the events reported. */
export interface EventLimitParams {
  /**
   * Most inrush events, and most surges, reported (default 1000). A noisy trace hovering at the
   * on-threshold could otherwise produce millions; the output says when the list was cut.
   */
  maxEvents: number;
}

/** All event-detection parameters, flat (the names say which step uses them). */
export type EventParams = OnThresholdParams & InrushParams & SurgeParams & EventLimitParams;

/** Defaults of every event parameter. Our design choice; see each step's file for the reasoning. */
export const DEFAULT_EVENT_PARAMS: Readonly<EventParams> = Object.freeze({
  ...DEFAULT_ON_THRESHOLD_PARAMS,
  ...DEFAULT_INRUSH_PARAMS,
  ...DEFAULT_SURGE_PARAMS,
  maxEvents: 1000,
});

/** The parameters used, as echoed in results: every value, plus the resolved levels. */
export type EventParamsUsed = EventParams & ResolvedOnThreshold;

/** Result of event detection. */
export interface DetectedEvents {
  inrushEvents: InrushEvent[];
  surges: Surge[];
  /** Number of on-periods (including one already on at the start of the series). */
  onPeriodCount: number;
  /** True when events or surges beyond maxEvents were left out (analysis stops at the cap). */
  eventsTruncated: boolean;
  params: EventParamsUsed;
}

/**
 * Merges the given parameters over DEFAULT_EVENT_PARAMS (undefined fields take the default) and
 * checks them; RangeError naming a bad field.
 */
export function resolveEventParams(given: Partial<EventParams> = {}): EventParams {
  const params = { ...DEFAULT_EVENT_PARAMS } as EventParams;
  for (const key of Object.keys(DEFAULT_EVENT_PARAMS) as Array<keyof EventParams>) {
    const value = given[key];
    if (value !== undefined) (params as unknown as Record<string, unknown>)[key] = value;
  }
  assertOnThresholdParams(params);
  assertInrushParams(params);
  assertSurgeParams(params);
  assertInteger(params.maxEvents, 0, 'maxEvents');
  return params;
}

/**
 * Context that sharpens or speeds up the results: the half-cycle blocks of a waveform (for
 * firstCyclesPeakA), a known minimum of the series, or on/off levels already resolved with
 * `resolveOnThreshold` from the same parameters (so statistics and events share them).
 */
export interface EventContext {
  blocks?: HalfCycleBlocks;
  minA?: number;
  levels?: ResolvedOnThreshold;
}

/**
 * Inrush events and surges of series a[0, n) at times `axis` (the series must be validated:
 * finite values, increasing times). See the file comment.
 */
export function detectEvents(
  axis: TimeAxis,
  a: SampleArray,
  given: Partial<EventParams> = {},
  context: EventContext = {},
): DetectedEvents {
  const params = resolveEventParams(given);
  const levels = context.levels ?? resolveOnThreshold(a, params, 0, a.length, context.minA);
  const periods = findOnPeriods(a, levels.onThresholdA, levels.offThresholdA);
  const inrushEvents: InrushEvent[] = [];
  const surges: Surge[] = [];
  let eventsTruncated = false;
  for (const period of periods) {
    if (inrushEvents.length >= params.maxEvents && surges.length >= params.maxEvents) {
      eventsTruncated = true;
      break;
    }
    let runningA: number;
    let surgeFrom: number;
    if (period.startsAtSeriesStart) {
      runningA = steadyCurrent(axis, a, period, period.startIndex);
      surgeFrom = period.startIndex;
    } else {
      const event = analyseInrush(axis, a, period, params, context.blocks);
      if (inrushEvents.length < params.maxEvents) inrushEvents.push(event);
      else eventsTruncated = true;
      runningA = event.steadyA;
      const afterS = event.settledAtS ?? event.onsetTimeS + params.maxInrushS;
      surgeFrom = Math.max(period.startIndex, indexAfterTime(axis, period.startIndex, period.endIndex, afterS));
      // A sample exactly at the settling time belongs to the running phase.
      if (surgeFrom > period.startIndex && timeAt(axis, surgeFrom - 1) === afterS) surgeFrom -= 1;
    }
    if (surgeFrom < period.endIndex) {
      for (const surge of findSurges(axis, a, surgeFrom, period.endIndex, runningA, params)) {
        if (surges.length < params.maxEvents) surges.push(surge);
        else eventsTruncated = true;
      }
    }
  }
  return { inrushEvents, surges, onPeriodCount: periods.length, eventsTruncated, params: { ...params, ...levels } };
}
