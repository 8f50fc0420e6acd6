import type { QueryClient } from '@tanstack/react-query';
import { CHART_POINTS, traceEventsOptions, traceSeriesOptions, windowFromSearch } from './trace-data';
import { traceOptions } from './traces';

/**
 * Starts the trace page's requests (the trace, the envelope of the window in the address, the events) as
 * soon as the route is entered, in parallel with the download of the page's code, so the chart waits for
 * one round of requests and not for two. Not awaited: navigation never waits on it.
 */
export function prefetchTracePage(queryClient: QueryClient, traceId: string, search: URLSearchParams): void {
  void queryClient.prefetchQuery(traceOptions(traceId));
  void queryClient.prefetchQuery(traceSeriesOptions(traceId, windowFromSearch(search), CHART_POINTS));
  void queryClient.prefetchQuery(traceEventsOptions(traceId));
}
