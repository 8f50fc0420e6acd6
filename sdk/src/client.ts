import createFetchClient, { type Middleware } from 'openapi-fetch';
import type { paths } from './generated/openapi.js';
import { errorFromResponse } from './errors.js';
import { idempotencyKeys } from './idempotency.js';
import { retryingFetch, type RetryOptions } from './retry.js';

export interface ClientOptions {
  /** Origin of the Headroom server, e.g. `http://localhost:3000` (the `/api/v1` prefix is added). */
  baseUrl: string;
  /** A session token or an API key; or a function returning the current one. */
  token?: string | (() => string | undefined);
  /** Injected fetch (tests, custom agents). */
  fetch?: typeof globalThis.fetch;
  /**
   * Retries on network errors, 429 (after Retry-After), 5xx and transient 409s, with capped exponential
   * backoff and jitter; POST and PATCH only with an Idempotency-Key (added automatically). Default
   * `{ maxRetries: 2 }`; `false` turns retrying off. Override per request with `{ retry: … }`.
   */
  retry?: RetryOptions | false;
}

export type HeadroomClient = ReturnType<typeof createClient>;

/** The resolved pieces of a client that the ergonomic layer and uploads reuse. */
export interface ClientContext {
  /** `baseUrl` + `/api/v1`, without a trailing slash. */
  apiUrl: string;
  token: ClientOptions['token'];
  fetch: typeof globalThis.fetch;
  retry: RetryOptions | false | undefined;
}

/** `Authorization: Bearer …` for the current token, or nothing. */
export function bearerHeader(token: ClientOptions['token']): Record<string, string> {
  const value = typeof token === 'function' ? token() : token;
  return value ? { Authorization: `Bearer ${value}` } : {};
}

/** Sends `Authorization: Bearer …` when a token is known. */
function bearerAuth(token: ClientOptions['token']): Middleware {
  return {
    onRequest({ request }) {
      const header = bearerHeader(token).Authorization;
      if (header) request.headers.set('Authorization', header);
      return request;
    },
  };
}

export function clientContext(options: ClientOptions): ClientContext {
  return {
    apiUrl: options.baseUrl.replace(/\/+$/, '') + '/api/v1',
    token: options.token,
    // Bound lazily so a test can replace globalThis.fetch after the client was made.
    fetch: options.fetch ?? ((input, init) => globalThis.fetch(input, init)),
    retry: options.retry,
  };
}

/**
 * The typed client: every call names a documented method and path; types come from openapi.yaml.
 * Middleware order: bearer token, then the automatic Idempotency-Key; the fetch underneath retries.
 */
export function createClient(options: ClientOptions) {
  const context = clientContext(options);
  const client = createFetchClient<paths>({ baseUrl: context.apiUrl, fetch: retryingFetch(context.fetch, context.retry) });
  client.use(bearerAuth(context.token), idempotencyKeys());
  return client;
}

/**
 * The data of a call, or a typed error carrying the problem body: HeadroomValidationError (400),
 * HeadroomAuthenticationError (401), HeadroomPermissionError (403), HeadroomNotFoundError (404),
 * HeadroomConflictError (409), HeadroomRateLimitError (429), HeadroomServerError (5xx), all subclasses of
 * HeadroomApiError. A call that got no answer at all rejects with HeadroomConnectionError before this.
 */
export async function unwrap<T>(result: Promise<{ data?: T; error?: unknown; response: Response }>): Promise<T> {
  const { data, error, response } = await result;
  if (!response.ok) throw errorFromResponse(response, error);
  return data as T;
}
