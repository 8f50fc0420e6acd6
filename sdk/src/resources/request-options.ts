import type { RetryOptions } from '../retry.js';

/** Options every ergonomic call takes last (like the client's per-request options). */
export interface RequestOptions {
  /** Override the client's retry policy for this call, or `false` for a single attempt. */
  retry?: RetryOptions | false;
  /** Abort the call (and any retry wait). */
  signal?: AbortSignal;
  /** For writes: the `Idempotency-Key` to send instead of a random one (say, to replay a call safely later). */
  idempotencyKey?: string;
}

/** The openapi-fetch options for a call: signal, retry override and Idempotency-Key header. */
export function callInit(options: RequestOptions = {}): { signal?: AbortSignal; retry?: RetryOptions | false; headers?: Record<string, string> } {
  return {
    ...(options.signal ? { signal: options.signal } : {}),
    ...(options.retry !== undefined ? { retry: options.retry } : {}),
    ...(options.idempotencyKey ? { headers: { 'Idempotency-Key': options.idempotencyKey } } : {}),
  };
}

/** List filters without the cursor, which the iterator manages. */
export type ListFilters<Q> = Omit<NonNullable<Q>, 'cursor'>;
