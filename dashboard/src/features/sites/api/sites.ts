import { queryOptions, useQuery } from '@tanstack/react-query';
import { unwrap } from '@headroom/sdk';
import { sdk } from '../../../lib/sdk';

export const sitesListOptions = () =>
  queryOptions({
    queryKey: ['sites', 'list'],
    queryFn: () => unwrap(sdk.GET('/sites', { params: { query: { limit: 200 } } })),
  });

export const siteOptions = (siteId: string) =>
  queryOptions({
    queryKey: ['sites', 'detail', siteId],
    queryFn: () => unwrap(sdk.GET('/sites/{siteId}', { params: { path: { siteId } } })),
  });

export const siteCircuitsOptions = (siteId: string) =>
  queryOptions({
    queryKey: ['circuits', 'list', { siteId }],
    queryFn: () => unwrap(sdk.GET('/circuits', { params: { query: { siteId, limit: 200 } } })),
  });

export const useSites = () => useQuery(sitesListOptions());
export const useSite = (siteId: string) => useQuery(siteOptions(siteId));
export const useSiteCircuits = (siteId: string) => useQuery(siteCircuitsOptions(siteId));
