import { unwrap, type HeadroomClient } from '../client.js';
import type { components, operations } from '../generated/openapi.js';
import { pageThrough, type PageIterator } from '../paginate.js';
import { callInit, type ListFilters, type RequestOptions } from './request-options.js';

type Schemas = components['schemas'];
export type Site = Schemas['Site'];
export type SiteCreate = Schemas['SiteCreate'];
export type SiteUpdate = Schemas['SiteUpdate'];
export type SiteFilters = ListFilters<operations['listSites']['parameters']['query']>;

/** Sites: buildings or job locations. */
export function sitesResource(client: HeadroomClient) {
  return {
    /** Every site, page by page (`for await … of`, or `.toArray()`). */
    list(filters: SiteFilters = {}, options?: RequestOptions): PageIterator<Site> {
      return pageThrough((cursor) => unwrap(client.GET('/sites', { params: { query: { ...filters, cursor } }, ...callInit(options) })));
    },
    get(siteId: string, options?: RequestOptions): Promise<Site> {
      return unwrap(client.GET('/sites/{siteId}', { params: { path: { siteId } }, ...callInit(options) }));
    },
    create(site: SiteCreate, options?: RequestOptions): Promise<Site> {
      return unwrap(client.POST('/sites', { body: site, ...callInit(options) }));
    },
    update(siteId: string, changes: SiteUpdate, options?: RequestOptions): Promise<Site> {
      return unwrap(client.PATCH('/sites/{siteId}', { params: { path: { siteId } }, body: changes, ...callInit(options) }));
    },
    /** Deletes the site with its circuits and loads; its traces are kept, unlinked. */
    async delete(siteId: string, options?: RequestOptions): Promise<void> {
      await unwrap(client.DELETE('/sites/{siteId}', { params: { path: { siteId } }, ...callInit(options) }));
    },
  };
}
