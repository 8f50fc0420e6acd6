import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { unwrap, type components } from '@headroom/sdk';
import { sdk } from '../../../lib/sdk';

export type Site = components['schemas']['Site'];
export type SiteCreate = components['schemas']['SiteCreate'];
export type Circuit = components['schemas']['Circuit'];

export const sitesListOptions = () =>
  queryOptions({
    queryKey: ['sites', 'list'],
    queryFn: () => unwrap(sdk.GET('/sites', { params: { query: { limit: 500 } } })),
  });

export const siteOptions = (siteId: string) =>
  queryOptions({
    queryKey: ['sites', 'detail', siteId],
    queryFn: () => unwrap(sdk.GET('/sites/{siteId}', { params: { path: { siteId } } })),
  });

export const siteCircuitsOptions = (siteId: string) =>
  queryOptions({
    queryKey: ['circuits', 'list', { siteId }],
    queryFn: () => unwrap(sdk.GET('/circuits', { params: { query: { siteId, limit: 500 } } })),
  });

export const useSites = () => useQuery(sitesListOptions());
export const useSite = (siteId: string) => useQuery(siteOptions(siteId));
export const useSiteCircuits = (siteId: string) => useQuery(siteCircuitsOptions(siteId));

export function useSaveSite(siteId?: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (body: SiteCreate) =>
      siteId
        ? unwrap(sdk.PATCH('/sites/{siteId}', { params: { path: { siteId } }, body }))
        : unwrap(sdk.POST('/sites', { body })),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: ['sites'] }),
  });
}

export function useDeleteSite() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (siteId: string) => unwrap(sdk.DELETE('/sites/{siteId}', { params: { path: { siteId } } })),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: ['sites'] }),
  });
}
