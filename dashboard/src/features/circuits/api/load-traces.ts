import { useQueries } from '@tanstack/react-query';
import { unwrap, type components } from '@headroom/sdk';
import { sdk } from '../../../lib/sdk';

type Series = components['schemas']['TraceSeries'];
type Events = components['schemas']['TraceEvents'];

/** Points per load in the stacked view: enough for its shape, small for many loads. */
const STACK_POINTS = 400;

export interface LoadTraceData {
  traceId: string;
  series: Series | undefined;
  events: Events | undefined;
}

/**
 * The envelope and the events of the first trace of each load, for the stacked view and the
 * time-current chart (same cache entries as the trace page's events).
 */
export function useLoadTraces(traceIds: string[]) {
  const series = useQueries({
    queries: traceIds.map((traceId) => ({
      queryKey: ['traces', 'detail', traceId, 'series', { window: null, points: STACK_POINTS }],
      queryFn: () =>
        unwrap(sdk.GET('/traces/{traceId}/series', { params: { path: { traceId }, query: { points: STACK_POINTS } } })),
      staleTime: 60_000,
    })),
  });
  const events = useQueries({
    queries: traceIds.map((traceId) => ({
      queryKey: ['traces', 'detail', traceId, 'events'],
      queryFn: () => unwrap(sdk.GET('/traces/{traceId}/events', { params: { path: { traceId }, query: {} } })),
      staleTime: 60_000,
    })),
  });
  const data: LoadTraceData[] = traceIds.map((traceId, i) => ({
    traceId,
    series: series[i]?.data,
    events: events[i]?.data,
  }));
  const pending = series.some((q) => q.isPending) || events.some((q) => q.isPending);
  const error = series.find((q) => q.error)?.error ?? events.find((q) => q.error)?.error ?? null;
  return { data, pending, error };
}
