import { unwrap, type HeadroomClient } from '../client.js';
import type { components, operations } from '../generated/openapi.js';
import { pageThrough, type PageIterator } from '../paginate.js';
import { callInit, type ListFilters, type RequestOptions } from './request-options.js';

type Schemas = components['schemas'];
export type Circuit = Schemas['Circuit'];
export type CircuitCreate = Schemas['CircuitCreate'];
export type CircuitUpdate = Schemas['CircuitUpdate'];
export type CircuitFilters = ListFilters<operations['listCircuits']['parameters']['query']>;

/** Branch circuits at a site. */
export function circuitsResource(client: HeadroomClient) {
  return {
    /** Every circuit (of one site with `{ siteId }`), page by page. */
    list(filters: CircuitFilters = {}, options?: RequestOptions): PageIterator<Circuit> {
      return pageThrough((cursor) => unwrap(client.GET('/circuits', { params: { query: { ...filters, cursor } }, ...callInit(options) })));
    },
    get(circuitId: string, options?: RequestOptions): Promise<Circuit> {
      return unwrap(client.GET('/circuits/{circuitId}', { params: { path: { circuitId } }, ...callInit(options) }));
    },
    create(siteId: string, circuit: CircuitCreate, options?: RequestOptions): Promise<Circuit> {
      return unwrap(client.POST('/sites/{siteId}/circuits', { params: { path: { siteId } }, body: circuit, ...callInit(options) }));
    },
    update(circuitId: string, changes: CircuitUpdate, options?: RequestOptions): Promise<Circuit> {
      return unwrap(client.PATCH('/circuits/{circuitId}', { params: { path: { circuitId } }, body: changes, ...callInit(options) }));
    },
    /** Deletes the circuit with its loads. */
    async delete(circuitId: string, options?: RequestOptions): Promise<void> {
      await unwrap(client.DELETE('/circuits/{circuitId}', { params: { path: { circuitId } }, ...callInit(options) }));
    },
  };
}
