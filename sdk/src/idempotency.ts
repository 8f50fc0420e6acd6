import type { Middleware } from 'openapi-fetch';

/**
 * A random RFC 9562 version-4 UUID. Uses `crypto.getRandomValues`, which browsers offer on plain-http
 * pages too (unlike `crypto.randomUUID`, which needs a secure context).
 */
export function newIdempotencyKey(): string {
  const bytes = new Uint8Array(16);
  globalThis.crypto.getRandomValues(bytes);
  bytes[6] = ((bytes[6] ?? 0) & 0x0f) | 0x40;
  bytes[8] = ((bytes[8] ?? 0) & 0x3f) | 0x80;
  const hex = Array.from(bytes, (b) => b.toString(16).padStart(2, '0')).join('');
  return `${hex.slice(0, 8)}-${hex.slice(8, 12)}-${hex.slice(12, 16)}-${hex.slice(16, 20)}-${hex.slice(20)}`;
}

/** Methods that get an automatic key: the ones that could write twice when a retry repeats them. */
export const KEYED_METHODS = new Set(['POST', 'PATCH']);

/**
 * Gives every POST and PATCH an `Idempotency-Key` unless the caller set one, so that a retry of the
 * same call carries the same key and the server can answer it without writing twice.
 */
export function idempotencyKeys(): Middleware {
  return {
    onRequest({ request }) {
      if (KEYED_METHODS.has(request.method) && !request.headers.has('Idempotency-Key')) {
        request.headers.set('Idempotency-Key', newIdempotencyKey());
      }
      return request;
    },
  };
}
