import { keepPreviousData, queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { unwrap, type components, type operations } from '@headroom/sdk';
import { saveBlob } from '../../../lib/download';
import { sdk } from '../../../lib/sdk';

export type Trace = components['schemas']['Trace'];
export type TraceUpdate = components['schemas']['TraceUpdate'];
export type TraceListQuery = NonNullable<operations['listTraces']['parameters']['query']>;
export type TraceSort = NonNullable<TraceListQuery['sort']>;

export const tracesListOptions = (query: TraceListQuery) =>
  queryOptions({
    queryKey: ['traces', 'list', query],
    queryFn: () => unwrap(sdk.GET('/traces', { params: { query } })),
  });

/** The old page stays on screen while the next one (or a new filter) loads. */
export const useTraces = (query: TraceListQuery) =>
  useQuery({ ...tracesListOptions(query), placeholderData: keepPreviousData });

export const traceOptions = (traceId: string) =>
  queryOptions({
    queryKey: ['traces', 'detail', traceId],
    queryFn: () => unwrap(sdk.GET('/traces/{traceId}', { params: { path: { traceId } } })),
  });

export const useTrace = (traceId: string) => useQuery(traceOptions(traceId));

export function useUpdateTrace(traceId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (body: TraceUpdate) => unwrap(sdk.PATCH('/traces/{traceId}', { params: { path: { traceId } }, body })),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: ['traces'] }),
  });
}

/** Closing runs the full analysis (statistics with percentiles, inrush events, surges) and stores it. */
export function useCloseTrace(traceId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: () => unwrap(sdk.POST('/traces/{traceId}/close', { params: { path: { traceId } } })),
    onSuccess: async () => {
      await Promise.all([
        queryClient.invalidateQueries({ queryKey: ['traces'] }),
        queryClient.invalidateQueries({ queryKey: ['checks'] }),
      ]);
    },
  });
}

export function useDeleteTrace() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (traceId: string) => unwrap(sdk.DELETE('/traces/{traceId}', { params: { path: { traceId } } })),
    onSuccess: (_data, traceId) => {
      queryClient.removeQueries({ queryKey: ['traces', 'detail', traceId] });
      return Promise.all([
        queryClient.invalidateQueries({ queryKey: ['traces', 'list'] }),
        queryClient.invalidateQueries({ queryKey: ['checks'] }),
      ]);
    },
  });
}

/** Downloads the samples (the whole trace, or a window) as CSV through the SDK, and saves the file. */
export function useDownloadSamples() {
  return useMutation({
    mutationFn: async ({
      trace,
      window,
      values,
    }: {
      trace: Trace;
      window?: { from: number; to: number } | null;
      values: 'raw' | 'amps';
    }) => {
      const result = await sdk.GET('/traces/{traceId}/samples', {
        params: {
          path: { traceId: trace.id },
          query: { format: 'csv', values, ...(window ? { from: window.from, to: window.to } : {}) },
        },
        parseAs: 'blob',
      });
      const blob = (await unwrap(Promise.resolve(result))) as unknown as Blob;
      const safeName = trace.name.replace(/[^\w.-]+/g, '-').replace(/^-|-$/g, '') || trace.id;
      saveBlob(blob, `${safeName}.csv`, result.response);
    },
  });
}

/** The trace's circuit, for its rating and 80 % lines (same cache entry as the circuit page's). */
export const useTraceCircuit = (circuitId: string | null) =>
  useQuery({
    queryKey: ['circuits', 'detail', circuitId ?? ''],
    queryFn: () => unwrap(sdk.GET('/circuits/{circuitId}', { params: { path: { circuitId: circuitId ?? '' } } })),
    enabled: Boolean(circuitId),
  });
