import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import { unwrap, type components } from '@headroom/sdk';
import { sdk } from '../../../lib/sdk';

export type TraceSeries = components['schemas']['TraceSeries'];
export type TraceEvents = components['schemas']['TraceEvents'];
export type TraceStats = components['schemas']['TraceStats'];

/** A window in epoch ms; null means the whole trace. */
export type TraceWindow = { from: number; to: number } | null;

/** Buckets asked for: about one per horizontal pixel of the chart at 1280 px (more buys nothing). */
export const CHART_POINTS = 1200;

/** The zoom window kept in the page's address (`?from=…&to=…`, epoch ms), or null for the whole trace. */
export function windowFromSearch(params: URLSearchParams): TraceWindow {
  const from = Number(params.get('from'));
  const to = Number(params.get('to'));
  return params.has('from') && params.has('to') && Number.isFinite(from) && to > from ? { from, to } : null;
}

/**
 * The chart envelope for a window: at most `points` buckets of min/max/mean, built on the server from
 * chunk summaries, so any window of any trace costs the same to draw.
 */
export const traceSeriesOptions = (traceId: string, window: TraceWindow, points: number) =>
  queryOptions({
    queryKey: ['traces', 'detail', traceId, 'series', { window, points }],
    queryFn: () =>
      unwrap(
        sdk.GET('/traces/{traceId}/series', { params: { path: { traceId }, query: { points, ...(window ?? {}) } } }),
      ),
    staleTime: 60_000,
  });

/** Keeps the previous envelope on screen while a zoom's finer one loads (no flash of an empty chart). */
export const useTraceSeries = (traceId: string, window: TraceWindow, points: number, enabled = true) =>
  useQuery({ ...traceSeriesOptions(traceId, window, points), placeholderData: keepPreviousData, enabled });

export const traceEventsOptions = (traceId: string) =>
  queryOptions({
    queryKey: ['traces', 'detail', traceId, 'events'],
    queryFn: () => unwrap(sdk.GET('/traces/{traceId}/events', { params: { path: { traceId }, query: {} } })),
    staleTime: 60_000,
  });

export const useTraceEvents = (traceId: string, enabled = true) =>
  useQuery({ ...traceEventsOptions(traceId), enabled });

/** Exact percentiles read the window's samples; the duty cycle needs the on-threshold of the event detection. */
export interface StatsRequest {
  percentiles: boolean;
  onThresholdA: number | null;
}

/** Statistics of the whole trace or a window. */
export const traceStatsOptions = (traceId: string, window: TraceWindow, request: StatsRequest) =>
  queryOptions({
    queryKey: ['traces', 'detail', traceId, 'stats', { window, ...request }],
    queryFn: () =>
      unwrap(
        sdk.GET('/traces/{traceId}/stats', {
          params: {
            path: { traceId },
            query: {
              ...(window ?? {}),
              ...(request.percentiles ? { percentiles: 'true' as const } : {}),
              ...(request.onThresholdA !== null ? { onThresholdA: request.onThresholdA } : {}),
            },
          },
        }),
      ),
    staleTime: 60_000,
  });

export const useTraceStats = (traceId: string, window: TraceWindow, request: StatsRequest, enabled = true) =>
  useQuery({ ...traceStatsOptions(traceId, window, request), placeholderData: keepPreviousData, enabled });

/** The current above which the event detection counted the load as on (from the events answer), or null. */
export function onThresholdOf(events: TraceEvents | undefined): number | null {
  const detection = events?.params?.['events'];
  const value =
    detection && typeof detection === 'object' ? (detection as Record<string, unknown>)['onThresholdA'] : undefined;
  return typeof value === 'number' && Number.isFinite(value) ? value : null;
}
