import createFetchClient, { type Middleware } from 'openapi-fetch';
import type { paths } from './generated/openapi.js';
import { HeadroomApiError, problemFromResponse } from './errors.js';

export interface ClientOptions {
  /** Origin of the Headroom server, e.g. `http://localhost:3000` (the `/api/v1` prefix is added). */
  baseUrl: string;
  /** A session token or an API key; or a function returning the current one. */
  token?: string | (() => string | undefined);
  /** Injected fetch (tests, custom agents). */
  fetch?: typeof globalThis.fetch;
}

export type HeadroomClient = ReturnType<typeof createClient>;

/** Sends `Authorization: Bearer …` when a token is known. */
function bearerAuth(token: ClientOptions['token']): Middleware {
  return {
    onRequest({ request }) {
      const value = typeof token === 'function' ? token() : token;
      if (value) request.headers.set('Authorization', `Bearer ${value}`);
      return request;
    },
  };
}

/** The typed client: every call names a documented method and path; types come from openapi.yaml. */
export function createClient(options: ClientOptions) {
  const baseUrl = options.baseUrl.replace(/\/+$/, '') + '/api/v1';
  const client = createFetchClient<paths>({ baseUrl, ...(options.fetch ? { fetch: options.fetch } : {}) });
  client.use(bearerAuth(options.token));
  return client;
}

/** The data of a call, or a HeadroomApiError carrying the problem body. */
export async function unwrap<T>(result: Promise<{ data?: T; error?: unknown; response: Response }>): Promise<T> {
  const { data, error, response } = await result;
  if (!response.ok) throw new HeadroomApiError(problemFromResponse(response, error));
  return data as T;
}
