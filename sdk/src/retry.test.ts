import { createServer, type IncomingMessage, type Server, type ServerResponse } from 'node:http';
import type { AddressInfo } from 'node:net';
import { afterEach, describe, expect, it } from 'vitest';
import { createClient, unwrap } from './client.js';
import { HeadroomConnectionError, HeadroomServerError, parseRetryAfter } from './errors.js';
import { backoffDelayMs, DEFAULT_RETRY, resolveRetry, retryDelayMs, retryingFetch, withRetries } from './retry.js';

/** One scripted answer per request: a status (with headers) or a dropped connection. */
type Step = { status: number; headers?: Record<string, string>; body?: unknown } | 'drop' | 'hang';

interface Recorded {
  method: string;
  url: string;
  idempotencyKey: string | undefined;
  body: string;
}

let server: Server | undefined;

afterEach(async () => {
  server?.closeAllConnections();
  await new Promise((resolve) => server?.close(resolve) ?? resolve(undefined));
  server = undefined;
});

/** A scripted server on 127.0.0.1 that answers each request with the next step (the last one repeats). */
async function scriptedServer(steps: Step[]): Promise<{ baseUrl: string; requests: Recorded[] }> {
  const requests: Recorded[] = [];
  server = createServer((req: IncomingMessage, res: ServerResponse) => {
    const chunks: Buffer[] = [];
    req.on('data', (c: Buffer) => chunks.push(c));
    req.on('end', () => {
      requests.push({ method: req.method ?? '', url: req.url ?? '', idempotencyKey: req.headers['idempotency-key'] as string | undefined, body: Buffer.concat(chunks).toString() });
      const step = steps[Math.min(requests.length - 1, steps.length - 1)]!;
      if (step === 'drop') return req.socket.destroy();
      if (step === 'hang') return;
      res.writeHead(step.status, { 'Content-Type': step.status >= 400 ? 'application/problem+json' : 'application/json', ...step.headers });
      res.end(JSON.stringify(step.body ?? (step.status >= 400 ? { type: '/problems/x', title: 'Scripted', status: step.status, detail: `scripted ${step.status}` } : { items: [], nextCursor: null, total: 0 })));
    });
  });
  await new Promise<void>((resolve) => server!.listen(0, '127.0.0.1', resolve));
  return { baseUrl: `http://127.0.0.1:${(server!.address() as AddressInfo).port}`, requests };
}

const fast = { initialDelayMs: 1, maxDelayMs: 5, maxRetries: 3 };
const newSite = { name: 'Quay Road workshop' };
// POST /traces keeps Idempotency-Keys on the server (openapi.yaml declares the header); POST /sites does not.
const newTrace = { name: 'Planer start', kind: 'rms' } as const;

describe('backoff', () => {
  it('when retries go on, then the delay doubles from the initial delay up to the cap, with jitter of half to all of it', () => {
    // common practice, no source: capped exponential backoff with "equal jitter"
    const options = { ...DEFAULT_RETRY, initialDelayMs: 100, maxDelayMs: 1000 };
    expect([0, 1, 2, 3, 4].map((n) => backoffDelayMs(n, options, () => 0.999999))).toEqual([100, 200, 400, 800, 1000]);
    expect([0, 1, 2, 3, 4].map((n) => backoffDelayMs(n, options, () => 0))).toEqual([50, 100, 200, 400, 500]);
  });

  it('when Retry-After is delta-seconds or an HTTP date, then it reads as milliseconds', () => {
    // source: RFC 9110 §10.2.3 (Retry-After = HTTP-date / delay-seconds)
    expect(parseRetryAfter('120')).toBe(120_000);
    expect(parseRetryAfter('Wed, 21 Oct 2015 07:28:30 GMT', Date.parse('Wed, 21 Oct 2015 07:28:00 GMT'))).toBe(30_000);
    expect(parseRetryAfter(null)).toBeUndefined();
    expect(parseRetryAfter('soon')).toBeUndefined();
  });

  it('when per-request options are given, then they override the client options, and false turns retrying off', () => {
    expect(resolveRetry({ maxRetries: 4 }).maxRetries).toBe(4);
    expect(resolveRetry({ maxRetries: 4 }, { maxRetries: 1 }).maxRetries).toBe(1);
    expect(resolveRetry({ maxRetries: 4 }, false).maxRetries).toBe(0);
    expect(resolveRetry(false).maxRetries).toBe(0);
  });
});

describe('retry decision', () => {
  const options = { ...DEFAULT_RETRY, initialDelayMs: 100, maxDelayMs: 100 };
  const base = { method: 'GET', hasIdempotencyKey: false, serverKeepsKey: true, retriesDone: 0, options, callerAborted: false };
  const refused = new TypeError('fetch failed', { cause: Object.assign(new Error('connect ECONNREFUSED 127.0.0.1:9'), { code: 'ECONNREFUSED' }) });
  const notKept = { ...base, method: 'POST', hasIdempotencyKey: true, serverKeepsKey: false };
  const answer = (status: number, headers: Record<string, string> = {}) => ({ response: new Response(null, { status, headers }) });

  it.each([
    ['a network error on GET', true, { error: new TypeError('fetch failed') }, base],
    ['503 on GET', true, answer(503), base],
    ['500, 502, 504', true, answer(502), base],
    ['400', false, answer(400), base],
    ['404', false, answer(404), base],
    ['a conflict without Retry-After (final)', false, answer(409), base],
    ['a conflict with Retry-After (transient)', true, answer(409, { 'Retry-After': '1' }), base],
    ['a network error on POST without an Idempotency-Key', false, { error: new TypeError('fetch failed') }, { ...base, method: 'POST' }],
    ['503 on PATCH without an Idempotency-Key', false, answer(503), { ...base, method: 'PATCH' }],
    ['a network error on POST with an Idempotency-Key', true, { error: new TypeError('fetch failed') }, { ...base, method: 'POST', hasIdempotencyKey: true }],
    ['retries used up', false, answer(503), { ...base, retriesDone: 2 }],
    ['the caller aborted', false, { error: new TypeError('aborted') }, { ...base, callerAborted: true }],
    ['a lost connection on a POST whose server ignores keys', false, { error: new TypeError('fetch failed') }, notKept],
    ['a refused connection on a POST whose server ignores keys', true, { error: refused }, notKept],
    ['500 on a POST whose server ignores keys', false, answer(500), notKept],
    ['503 on a POST whose server ignores keys', true, answer(503), notKept],
    ['429 on a POST whose server ignores keys', true, answer(429), notKept],
  ])('when %s, then retried is %s', (_name, retried, outcome, context) => {
    expect(retryDelayMs(outcome, context) !== undefined).toBe(retried);
  });

  it('when 429 carries Retry-After, then the wait is that long, and a wait beyond the limit is not taken', () => {
    expect(retryDelayMs(answer(429, { 'Retry-After': '3' }), base)).toBe(3000);
    expect(retryDelayMs(answer(429, { 'Retry-After': '3600' }), base)).toBeUndefined();
  });
});

describe('retrying client against a scripted server on 127.0.0.1', () => {
  it('when the connection drops, then 503, then 429, then the POST succeeds with one Idempotency-Key throughout', async () => {
    const { baseUrl, requests } = await scriptedServer(['drop', { status: 503 }, { status: 429, headers: { 'Retry-After': '0' } }, { status: 201, body: { id: 't1' } }]);
    const client = createClient({ baseUrl, retry: fast });
    const trace = await unwrap(client.POST('/traces', { body: newTrace }));
    expect(trace).toEqual({ id: 't1' });
    expect(requests).toHaveLength(4);
    const keys = new Set(requests.map((r) => r.idempotencyKey));
    expect(keys.size).toBe(1);
    expect([...keys][0]).toMatch(/^[0-9a-f]{8}-[0-9a-f]{4}-4[0-9a-f]{3}-[89ab][0-9a-f]{3}-[0-9a-f]{12}$/);
    expect(new Set(requests.map((r) => r.body))).toEqual(new Set([JSON.stringify(newTrace)]));
  });

  it('when the caller supplies an Idempotency-Key, then every attempt carries it', async () => {
    const { baseUrl, requests } = await scriptedServer([{ status: 503 }, { status: 201, body: { id: 's1' } }]);
    const client = createClient({ baseUrl, retry: fast });
    await unwrap(client.POST('/traces', { body: newTrace, headers: { 'Idempotency-Key': 'my-key-1' } }));
    expect(requests.map((r) => r.idempotencyKey)).toEqual(['my-key-1', 'my-key-1']);
  });

  it('when two POSTs are made, then each has its own key', async () => {
    const { baseUrl, requests } = await scriptedServer([{ status: 201, body: { id: 's1' } }]);
    const client = createClient({ baseUrl, retry: fast });
    await unwrap(client.POST('/sites', { body: newSite }));
    await unwrap(client.POST('/sites', { body: newSite }));
    expect(requests[0]!.idempotencyKey).not.toBe(requests[1]!.idempotencyKey);
  });

  it('when the server never recovers, then the call fails with the last answer as a typed error', async () => {
    const { baseUrl, requests } = await scriptedServer([{ status: 503 }]);
    const client = createClient({ baseUrl, retry: fast });
    const error = await unwrap(client.GET('/sites')).catch((e: unknown) => e);
    expect(error).toBeInstanceOf(HeadroomServerError);
    expect((error as HeadroomServerError).problem.detail).toBe('scripted 503');
    expect(requests).toHaveLength(4);
  });

  it('when every attempt loses its connection, then a HeadroomConnectionError with status 0 says how many attempts were made', async () => {
    const { baseUrl, requests } = await scriptedServer(['drop']);
    const client = createClient({ baseUrl, retry: { ...fast, maxRetries: 2 } });
    const error = await client.GET('/sites').catch((e: unknown) => e);
    expect(error).toBeInstanceOf(HeadroomConnectionError);
    expect((error as HeadroomConnectionError).status).toBe(0);
    expect((error as Error).message).toMatch(/after 3 attempts/);
    expect(requests).toHaveLength(3);
  });

  it('when an attempt gets no answer in time, then it is abandoned and retried', async () => {
    const { baseUrl, requests } = await scriptedServer(['hang', { status: 200 }]);
    const client = createClient({ baseUrl, retry: { ...fast, attemptTimeoutMs: 200 } });
    await expect(unwrap(client.GET('/sites'))).resolves.toEqual({ items: [], nextCursor: null, total: 0 });
    expect(requests).toHaveLength(2);
  });

  it('when a request says retry: false, then only one attempt is made', async () => {
    const { baseUrl, requests } = await scriptedServer([{ status: 503 }, { status: 200 }]);
    const client = createClient({ baseUrl, retry: fast });
    await expect(unwrap(client.GET('/sites', { retry: false }))).rejects.toBeInstanceOf(HeadroomServerError);
    expect(requests).toHaveLength(1);
  });

  it('when the server does not keep keys for the route, then a POST is repeated only after an answer that says nothing was done', async () => {
    const dropped = await scriptedServer(['drop', { status: 201 }]);
    const client = createClient({ baseUrl: dropped.baseUrl, retry: fast });
    await expect(unwrap(client.POST('/sites', { body: newSite }))).rejects.toBeInstanceOf(HeadroomConnectionError);
    expect(dropped.requests).toHaveLength(1);
    server?.closeAllConnections();
    server?.close();
    const busy = await scriptedServer([{ status: 503 }, { status: 429, headers: { 'Retry-After': '0' } }, { status: 201, body: { id: 's1' } }]);
    await expect(unwrap(createClient({ baseUrl: busy.baseUrl, retry: fast }).POST('/sites', { body: newSite }))).resolves.toEqual({ id: 's1' });
    expect(busy.requests).toHaveLength(3);
  });

  it('when a 400 comes back, then it is not retried', async () => {
    const { baseUrl, requests } = await scriptedServer([{ status: 400 }, { status: 201 }]);
    const client = createClient({ baseUrl, retry: fast });
    await expect(unwrap(client.POST('/sites', { body: newSite }))).rejects.toMatchObject({ status: 400 });
    expect(requests).toHaveLength(1);
  });

  it('when a POST has no Idempotency-Key (raw retrying fetch), then a dropped connection is not retried', async () => {
    const { baseUrl, requests } = await scriptedServer(['drop', { status: 201 }]);
    const send = retryingFetch(globalThis.fetch, fast);
    await expect(send(new Request(`${baseUrl}/api/v1/sites`, { method: 'POST', body: '{}' }))).rejects.toBeInstanceOf(HeadroomConnectionError);
    expect(requests).toHaveLength(1);
  });

  it('when the caller aborts during the backoff, then the call stops with the abort and no further attempt', async () => {
    const { baseUrl, requests } = await scriptedServer([{ status: 503 }, { status: 200 }]);
    const client = createClient({ baseUrl, retry: { maxRetries: 3, initialDelayMs: 10_000, maxDelayMs: 10_000 } });
    const controller = new AbortController();
    const call = client.GET('/sites', { signal: controller.signal });
    setTimeout(() => controller.abort(), 100);
    await expect(call).rejects.toMatchObject({ name: 'AbortError' });
    expect(requests).toHaveLength(1);
  });
});

describe('attempt timeout counts time without progress', () => {
  const options = { ...DEFAULT_RETRY, maxRetries: 1, initialDelayMs: 1, maxDelayMs: 1, attemptTimeoutMs: 200 };

  /** An attempt that reports progress every `everyMs` for `forMs`, then answers 200 (or fails if aborted first). */
  const slowAttempt = (everyMs: number | null, forMs: number) => (signal: AbortSignal, progressed: () => void) =>
    new Promise<Response>((resolve, reject) => {
      const ticker = everyMs === null ? undefined : setInterval(progressed, everyMs);
      const done = setTimeout(() => (clearInterval(ticker), resolve(new Response('ok'))), forMs);
      signal.addEventListener('abort', () => (clearInterval(ticker), clearTimeout(done), reject(signal.reason)), { once: true });
    });

  it('when an upload keeps making progress for longer than the timeout, then it is not cut off', async () => {
    let attempts = 0;
    const response = await withRetries((signal, progressed) => (attempts++, slowAttempt(40, 700)(signal, progressed)), { method: 'POST', hasIdempotencyKey: true, serverKeepsKey: true, options });
    expect(response.status).toBe(200);
    expect(attempts).toBe(1);
  });

  it('when an attempt stalls, then it is abandoned after the timeout and retried', async () => {
    let attempts = 0;
    const error = await withRetries((signal, progressed) => (attempts++, slowAttempt(null, 10_000)(signal, progressed)), { method: 'POST', hasIdempotencyKey: true, serverKeepsKey: true, options }).catch((e: unknown) => e);
    expect(error).toBeInstanceOf(HeadroomConnectionError);
    expect((error as Error).message).toMatch(/no progress within 200 ms.* after 2 attempts/);
    expect(attempts).toBe(2);
  });
});
