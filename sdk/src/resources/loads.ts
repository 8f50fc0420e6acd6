import { unwrap, type HeadroomClient } from '../client.js';
import type { components, operations } from '../generated/openapi.js';
import { pageThrough, type PageIterator } from '../paginate.js';
import { callInit, type ListFilters, type RequestOptions } from './request-options.js';

type Schemas = components['schemas'];
export type Load = Schemas['Load'];
export type LoadCreate = Schemas['LoadCreate'];
export type LoadUpdate = Schemas['LoadUpdate'];
export type LoadFilters = ListFilters<operations['listLoads']['parameters']['query']>;

/** Loads: equipment on a circuit. */
export function loadsResource(client: HeadroomClient) {
  return {
    /** The loads on a circuit, page by page. */
    list(circuitId: string, filters: LoadFilters = {}, options?: RequestOptions): PageIterator<Load> {
      return pageThrough((cursor) =>
        unwrap(client.GET('/circuits/{circuitId}/loads', { params: { path: { circuitId }, query: { ...filters, cursor } }, ...callInit(options) })),
      );
    },
    get(loadId: string, options?: RequestOptions): Promise<Load> {
      return unwrap(client.GET('/loads/{loadId}', { params: { path: { loadId } }, ...callInit(options) }));
    },
    create(circuitId: string, load: LoadCreate, options?: RequestOptions): Promise<Load> {
      return unwrap(client.POST('/circuits/{circuitId}/loads', { params: { path: { circuitId } }, body: load, ...callInit(options) }));
    },
    update(loadId: string, changes: LoadUpdate, options?: RequestOptions): Promise<Load> {
      return unwrap(client.PATCH('/loads/{loadId}', { params: { path: { loadId } }, body: changes, ...callInit(options) }));
    },
    async delete(loadId: string, options?: RequestOptions): Promise<void> {
      await unwrap(client.DELETE('/loads/{loadId}', { params: { path: { loadId } }, ...callInit(options) }));
    },
  };
}
