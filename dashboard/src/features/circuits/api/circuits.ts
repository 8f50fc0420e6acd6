import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { unwrap, type components } from '@headroom/sdk';
import { sdk } from '../../../lib/sdk';

export type Circuit = components['schemas']['Circuit'];
export type CircuitCreate = components['schemas']['CircuitCreate'];

export const circuitOptions = (circuitId: string) =>
  queryOptions({
    queryKey: ['circuits', 'detail', circuitId],
    queryFn: () => unwrap(sdk.GET('/circuits/{circuitId}', { params: { path: { circuitId } } })),
  });

export const useCircuit = (circuitId: string) => useQuery(circuitOptions(circuitId));

/** Creates a circuit at a site, or updates one; either way the circuit, its check and the site's counts change. */
export function useSaveCircuit(target: { siteId: string; circuitId?: string }) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (body: CircuitCreate) =>
      target.circuitId
        ? unwrap(sdk.PATCH('/circuits/{circuitId}', { params: { path: { circuitId: target.circuitId } }, body }))
        : unwrap(sdk.POST('/sites/{siteId}/circuits', { params: { path: { siteId: target.siteId } }, body })),
    onSuccess: async () => {
      await Promise.all([
        queryClient.invalidateQueries({ queryKey: ['circuits'] }),
        queryClient.invalidateQueries({ queryKey: ['sites'] }),
        queryClient.invalidateQueries({ queryKey: ['checks'] }),
      ]);
    },
  });
}

export function useDeleteCircuit() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (circuitId: string) => unwrap(sdk.DELETE('/circuits/{circuitId}', { params: { path: { circuitId } } })),
    onSuccess: async () => {
      await Promise.all([
        queryClient.invalidateQueries({ queryKey: ['circuits'] }),
        queryClient.invalidateQueries({ queryKey: ['sites'] }),
      ]);
    },
  });
}
