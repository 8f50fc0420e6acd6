import { unwrap, type HeadroomClient } from '../client.js';
import type { components } from '../generated/openapi.js';
import { callInit, type RequestOptions } from './request-options.js';

type Schemas = components['schemas'];
export type HeadroomCheck = Schemas['HeadroomCheck'];
export type WhatIfCheck = Schemas['WhatIfCheck'];
export type WhatIfLoad = Schemas['WhatIfLoad'];

/** The headroom check: the verdict for one circuit from its loads' traces or nameplates. */
export function checksResource(client: HeadroomClient) {
  return {
    /** The check of the circuit with its stored loads. */
    get(circuitId: string, options?: RequestOptions): Promise<HeadroomCheck> {
      return unwrap(client.GET('/circuits/{circuitId}/check', { params: { path: { circuitId } }, ...callInit(options) }));
    },
    /** What if these loads (by nameplate) were added? Nothing is stored. */
    whatIf(circuitId: string, scenario: WhatIfCheck, options?: RequestOptions): Promise<HeadroomCheck> {
      return unwrap(client.POST('/circuits/{circuitId}/check', { params: { path: { circuitId } }, body: scenario, ...callInit(options) }));
    },
  };
}
