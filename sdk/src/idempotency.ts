import type { Middleware } from 'openapi-fetch';
import { IDEMPOTENT_OPERATIONS } from './generated/idempotent-operations.js';

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

/** `POST /traces/{traceId}/samples` -> a matcher of the method and the path after `/api/v1`. */
const KEPT = IDEMPOTENT_OPERATIONS.map((operation) => {
  const [method = '', template = ''] = operation.split(' ');
  const pattern = template.replace(/[.*+?^$()|[\]\\]/g, '\\$&').replace(/\{[^}]+\}/g, '[^/]+');
  return { method, path: new RegExp(`/api/v1${pattern}/?$`) };
});

/**
 * Whether the server keeps the first answer for an Idempotency-Key on this call (the operation declares
 * the header in openapi.yaml), so that repeating it after an unclear failure cannot write twice.
 */
export function serverKeepsIdempotencyKey(method: string, url: string): boolean {
  const { pathname } = new URL(url, 'http://localhost');
  return KEPT.some((k) => k.method === method.toUpperCase() && k.path.test(pathname));
}
