import { HeadroomConnectionError, parseRetryAfter } from './errors.js';
import { serverKeepsIdempotencyKey } from './idempotency.js';

/**
 * When and how often a call is tried again. Set per client (`createClient({ retry })`) and override per
 * request (`{ retry: { maxRetries: 5 } }` or `{ retry: false }`).
 */
export interface RetryOptions {
  /** Further attempts after the first. Default 2. */
  maxRetries?: number;
  /** Delay before the first retry, in ms; it doubles with each retry. Default 500. */
  initialDelayMs?: number;
  /** Largest backoff delay, in ms. Default 8000. */
  maxDelayMs?: number;
  /** A `Retry-After` longer than this (ms) is not waited for: the call fails at once. Default 60000. */
  maxRetryAfterMs?: number;
  /**
   * Time one attempt may go without progress, in ms (0: no limit). Default 120000. For ordinary calls
   * it runs until the response headers; for uploads every piece of the body the network takes restarts
   * it, so a large upload is limited only while it stalls.
   */
  attemptTimeoutMs?: number;
}

export type ResolvedRetryOptions = Required<RetryOptions>;

export const DEFAULT_RETRY: ResolvedRetryOptions = {
  maxRetries: 2,
  initialDelayMs: 500,
  maxDelayMs: 8000,
  maxRetryAfterMs: 60_000,
  attemptTimeoutMs: 120_000,
};

/** Merges per-request options over the client's; `false` turns retrying off for that request. */
export function resolveRetry(base: RetryOptions | false | undefined, override?: RetryOptions | false): ResolvedRetryOptions {
  if (override === false || (override === undefined && base === false)) return { ...DEFAULT_RETRY, ...(base || {}), maxRetries: 0 };
  return { ...DEFAULT_RETRY, ...(base || {}), ...(override || {}) };
}

/** Methods that may write twice if repeated; they are retried only when they carry an Idempotency-Key. */
const NEEDS_IDEMPOTENCY_KEY = new Set(['POST', 'PATCH']);

/** Statuses that say "try again later" rather than "this request is wrong". */
const RETRYABLE_STATUSES = new Set([429, 500, 502, 503, 504]);

/**
 * Exponential backoff, capped, with jitter of half to all of the delay (so many clients that failed
 * together do not come back together): retry n (0-based) waits min(max, initial·2ⁿ)·[0.5, 1).
 */
export function backoffDelayMs(retry: number, options: ResolvedRetryOptions, random = Math.random): number {
  const capped = Math.min(options.maxDelayMs, options.initialDelayMs * 2 ** retry);
  return Math.round(capped * (0.5 + random() * 0.5));
}

/** What one attempt came to: an HTTP answer, or an error before any answer arrived. */
export type AttemptOutcome = { response: Response } | { error: unknown };

/** Error codes of a connection that never carried the request (nothing can have been done). */
const NEVER_SENT_CODES = new Set(['ECONNREFUSED', 'ENOTFOUND', 'EAI_AGAIN']);

function neverSent(error: unknown): boolean {
  const cause = error instanceof Error ? (error.cause as { code?: unknown } | undefined) : undefined;
  return typeof cause?.code === 'string' && NEVER_SENT_CODES.has(cause.code);
}

/**
 * Whether to try again, and after how long (ms); undefined means stop.
 * - Nothing is retried when the caller aborted, or for POST/PATCH without an Idempotency-Key.
 * - A POST/PATCH whose server does not keep Idempotency-Keys (`serverKeepsKey` false) is retried only
 *   when it surely did nothing: 429, 503, or a connection refused before the request went out. A lost
 *   connection, a time-out or a 500 could follow a write, so it is not repeated.
 * - Network errors and attempt timeouts are retried.
 * - 429, 500, 502, 503 and 504 are retried, after `Retry-After` when the server sent one (a longer wait
 *   than `maxRetryAfterMs` fails at once).
 * - 409 is retried only when the server marks it transient with `Retry-After` (say, an Idempotency-Key
 *   whose first request is still running); other conflicts (a closed trace, overlapping samples) are final.
 */
export function retryDelayMs(
  outcome: AttemptOutcome,
  context: { method: string; hasIdempotencyKey: boolean; serverKeepsKey: boolean; retriesDone: number; options: ResolvedRetryOptions; callerAborted: boolean },
): number | undefined {
  const { options } = context;
  if (context.callerAborted || context.retriesDone >= options.maxRetries) return undefined;
  const writes = NEEDS_IDEMPOTENCY_KEY.has(context.method.toUpperCase());
  if (writes && !context.hasIdempotencyKey) return undefined;
  const onlyIfNothingDone = writes && !context.serverKeepsKey;
  const backoff = backoffDelayMs(context.retriesDone, options);
  if ('error' in outcome) return onlyIfNothingDone && !neverSent(outcome.error) ? undefined : backoff;
  const { response } = outcome;
  const retryAfter = parseRetryAfter(response.headers.get('Retry-After'));
  const retryable = RETRYABLE_STATUSES.has(response.status) || (response.status === 409 && retryAfter !== undefined);
  if (!retryable) return undefined;
  if (onlyIfNothingDone && response.status !== 429 && response.status !== 503) return undefined;
  if (retryAfter === undefined) return backoff;
  return retryAfter > options.maxRetryAfterMs ? undefined : retryAfter;
}

function abortError(signal: AbortSignal): unknown {
  return signal.reason ?? new DOMException('The operation was aborted', 'AbortError');
}

/** Waits `ms`, or rejects as soon as the signal aborts. */
export function sleep(ms: number, signal?: AbortSignal | null): Promise<void> {
  return new Promise((resolve, reject) => {
    if (signal?.aborted) return reject(abortError(signal));
    const onAbort = () => {
      clearTimeout(timer);
      reject(abortError(signal as AbortSignal));
    };
    const timer = setTimeout(() => {
      signal?.removeEventListener('abort', onAbort);
      resolve();
    }, ms);
    signal?.addEventListener('abort', onAbort, { once: true });
  });
}

/**
 * One attempt: sends the request with this signal (the caller's, plus the attempt timeout); calls
 * `progressed()` whenever it makes progress (bytes of the body sent) to restart the timeout.
 */
export type Attempt = (signal: AbortSignal, progressed: () => void) => Promise<Response>;

export interface RetryContext {
  method: string;
  hasIdempotencyKey: boolean;
  /** The server keeps the first answer for the key on this operation (see serverKeepsIdempotencyKey). */
  serverKeepsKey: boolean;
  options: ResolvedRetryOptions;
  /** The caller's signal: aborting it stops the call at once, with no retry. */
  signal?: AbortSignal | null;
  /** Told before each retry (logging, progress bars that restart). */
  onRetry?: (info: { retry: number; delayMs: number; outcome: AttemptOutcome }) => void;
}

/**
 * Runs attempts until one gives an answer that should not be retried, then returns that answer
 * (a failed status is the caller's to turn into a typed error). When every attempt ended without an
 * answer, throws HeadroomConnectionError; a caller's abort is rethrown as is.
 */
export async function withRetries(attempt: Attempt, context: RetryContext): Promise<Response> {
  for (let retriesDone = 0; ; retriesDone += 1) {
    const controller = new AbortController();
    const forwardAbort = () => controller.abort(context.signal?.reason);
    if (context.signal?.aborted) throw abortError(context.signal);
    context.signal?.addEventListener('abort', forwardAbort, { once: true });
    const timeoutMs = context.options.attemptTimeoutMs;
    let timedOut = false;
    let timer: ReturnType<typeof setTimeout> | undefined;
    const arm = () => {
      if (timeoutMs <= 0 || controller.signal.aborted) return;
      clearTimeout(timer);
      timer = setTimeout(() => ((timedOut = true), controller.abort(new DOMException('attempt timed out', 'TimeoutError'))), timeoutMs);
    };
    arm();
    let outcome: AttemptOutcome;
    try {
      outcome = { response: await attempt(controller.signal, arm) };
    } catch (error) {
      if (context.signal?.aborted) throw abortError(context.signal);
      outcome = { error: timedOut ? new Error(`no progress within ${timeoutMs} ms`, { cause: error }) : error };
    } finally {
      // The timeout covers the wait for the headers only: a long download is not cut off.
      clearTimeout(timer);
      context.signal?.removeEventListener('abort', forwardAbort);
    }
    const delayMs = retryDelayMs(outcome, { ...context, retriesDone, callerAborted: Boolean(context.signal?.aborted) });
    if (delayMs === undefined) {
      if ('response' in outcome) return outcome.response;
      throw connectionError(outcome.error, retriesDone + 1);
    }
    if ('response' in outcome) await outcome.response.body?.cancel().catch(() => undefined);
    context.onRetry?.({ retry: retriesDone + 1, delayMs, outcome });
    await sleep(delayMs, context.signal);
  }
}

function connectionError(error: unknown, attempts: number): HeadroomConnectionError {
  const cause = error instanceof Error && error.cause instanceof Error ? error.cause : undefined;
  const message = error instanceof Error ? error.message : String(error);
  const detail = `${message}${cause && cause.message !== message ? ` (${cause.message})` : ''} after ${attempts} attempt${attempts === 1 ? '' : 's'}`;
  return new HeadroomConnectionError(detail, error);
}

/** Per-request options openapi-fetch hands to the fetch function as extra properties of the Request. */
export interface RetryRequestExtras {
  retry?: RetryOptions | false;
}

/**
 * A fetch for openapi-fetch that retries as `withRetries` says. The body is read once into memory so
 * that every attempt sends the same bytes (bodies of ordinary calls are small; large uploads go through
 * `upload.ts`, which resends from a Blob).
 */
export function retryingFetch(baseFetch: typeof globalThis.fetch, clientRetry: RetryOptions | false | undefined) {
  return async (request: Request): Promise<Response> => {
    const extras = request as Request & RetryRequestExtras;
    const options = resolveRetry(clientRetry, extras.retry);
    const body = request.body ? await request.arrayBuffer() : undefined;
    const callerSignal = request.signal;
    return withRetries(
      (signal) => baseFetch(new Request(request.url, { method: request.method, headers: request.headers, body, signal, redirect: request.redirect, credentials: request.credentials })),
      {
        method: request.method,
        hasIdempotencyKey: request.headers.has('Idempotency-Key'),
        serverKeepsKey: serverKeepsIdempotencyKey(request.method, request.url),
        options,
        signal: callerSignal,
      },
    );
  };
}
