import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { unwrap, type components } from '@headroom/sdk';
import { sdk } from '../../../lib/sdk';

export type Load = components['schemas']['Load'];
export type LoadCreate = components['schemas']['LoadCreate'];

export const circuitLoadsOptions = (circuitId: string) =>
  queryOptions({
    queryKey: ['loads', 'list', { circuitId }],
    queryFn: () =>
      unwrap(sdk.GET('/circuits/{circuitId}/loads', { params: { path: { circuitId }, query: { limit: 500 } } })),
  });

export const useCircuitLoads = (circuitId: string) => useQuery(circuitLoadsOptions(circuitId));

/** A load changes the circuit's check and its load count, so both are refreshed. */
function useInvalidateCircuit() {
  const queryClient = useQueryClient();
  return () =>
    Promise.all([
      queryClient.invalidateQueries({ queryKey: ['loads'] }),
      queryClient.invalidateQueries({ queryKey: ['checks'] }),
      queryClient.invalidateQueries({ queryKey: ['circuits'] }),
    ]);
}

export function useSaveLoad(target: { circuitId: string; loadId?: string }) {
  const invalidate = useInvalidateCircuit();
  return useMutation({
    mutationFn: (body: LoadCreate) =>
      target.loadId
        ? unwrap(sdk.PATCH('/loads/{loadId}', { params: { path: { loadId: target.loadId } }, body }))
        : unwrap(sdk.POST('/circuits/{circuitId}/loads', { params: { path: { circuitId: target.circuitId } }, body })),
    onSuccess: invalidate,
  });
}

export function useDeleteLoad() {
  const invalidate = useInvalidateCircuit();
  return useMutation({
    mutationFn: (loadId: string) => unwrap(sdk.DELETE('/loads/{loadId}', { params: { path: { loadId } } })),
    onSuccess: invalidate,
  });
}
