import { unwrap, type HeadroomClient } from '../client.js';
import type { components } from '../generated/openapi.js';
import { callInit, type RequestOptions } from './request-options.js';

export type AnalyzeRequest = components['schemas']['AnalyzeRequest'];
export type AnalyzeResponse = components['schemas']['AnalyzeResponse'];

/**
 * Statistics, inrush events and surges of samples sent in the call, stored nowhere (`POST /analyze`).
 * Typed arrays are accepted and sent as JSON number arrays; the body limit (5 MB by default, about
 * 400,000 samples) applies: store larger traces with `traces.create` and `traces.append`.
 */
export function analyzeCall(client: HeadroomClient) {
  return (request: Omit<AnalyzeRequest, 'a' | 'values'> & { a?: ArrayLike<number>; values?: ArrayLike<number> }, options?: RequestOptions): Promise<AnalyzeResponse> => {
    const { a, values, ...rest } = request;
    const body: AnalyzeRequest = { ...rest, ...(a ? { a: Array.from(a) } : {}), ...(values ? { values: Array.from(values) } : {}) };
    return unwrap(client.POST('/analyze', { body, ...callInit(options) }));
  };
}
