import { describe, expect, it } from 'vitest';
import { newIdempotencyKey, serverKeepsIdempotencyKey } from './idempotency.js';

describe('idempotency keys', () => {
  it('when a key is made, then it is a random version-4 UUID', () => {
    // source: RFC 9562 §5.4 (version 4: version nibble 4, variant bits 10)
    const keys = Array.from({ length: 50 }, newIdempotencyKey);
    for (const key of keys) expect(key).toMatch(/^[0-9a-f]{8}-[0-9a-f]{4}-4[0-9a-f]{3}-[89ab][0-9a-f]{3}-[0-9a-f]{12}$/);
    expect(new Set(keys).size).toBe(50);
  });

  it.each([
    ['POST', 'http://127.0.0.1:3000/api/v1/traces', true],
    ['POST', 'http://127.0.0.1:3000/api/v1/traces/7f3a/samples?rate=10000&valueType=float32', true],
    ['POST', 'https://headroom.example/api/v1/traces/7f3a/close', true],
    ['POST', 'http://127.0.0.1:3000/api/v1/traces/import', true],
    ['POST', 'http://127.0.0.1:3000/api/v1/sites', false],
    ['POST', 'http://127.0.0.1:3000/api/v1/traces/7f3a/samples/more', false],
    ['GET', 'http://127.0.0.1:3000/api/v1/traces', false],
  ])('when %s %s, then the server keeps its key: %s', (method, url, kept) => {
    expect(serverKeepsIdempotencyKey(method, url)).toBe(kept);
  });
});
