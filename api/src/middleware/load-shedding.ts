import type { RequestHandler } from 'express';
import type { Logger } from 'pino';
import { PROBLEM_TYPES } from '../errors/problem.js';

export interface LoadSheddingOptions {
  /** Requests worked on at once; the next ones are refused until one ends. */
  maxInFlight: number;
  /** Seconds a refused client is asked to wait (Retry-After). */
  retryAfterS?: number;
  /** Gets one summary line per `summaryEveryMs` while requests are being refused (not one per request). */
  logger?: Logger | undefined;
  summaryEveryMs?: number;
}

/**
 * Load shedding: at most `maxInFlight` API requests are in progress at once; any more are answered at
 * once with 503 and `Retry-After` (problem type `unavailable`) instead of queueing behind the database
 * until every answer is late. It runs first, before logging and body parsing, and writes its short answer
 * itself, so that refusing costs far less than working: a burst of refused requests (or clients retrying
 * without waiting) cannot starve the accepted ones. Refusals are logged as one summary line at a time.
 * A request leaves the count when its answer is sent or its connection closes, whichever comes first.
 */
export function loadShedding(options: LoadSheddingOptions): RequestHandler & { inFlight(): number; refused(): number } {
  const retryAfterS = options.retryAfterS ?? 1;
  const summaryEveryMs = options.summaryEveryMs ?? 10_000;
  const { status, title } = PROBLEM_TYPES.unavailable;
  const detail = `The server is busy with ${options.maxInFlight} requests; try again in ${retryAfterS} s`;
  let inFlight = 0;
  let refusedTotal = 0;
  let refusedSinceSummary = 0;
  let lastSummary = 0;

  const handler: RequestHandler = (req, res, next) => {
    if (inFlight >= options.maxInFlight) {
      refusedTotal += 1;
      refusedSinceSummary += 1;
      const now = Date.now();
      if (options.logger && now - lastSummary >= summaryEveryMs) {
        options.logger.warn({ refused: refusedSinceSummary, maxInFlight: options.maxInFlight }, 'load shedding: requests refused with 503');
        lastSummary = now;
        refusedSinceSummary = 0;
      }
      const body = JSON.stringify({ type: '/problems/unavailable', title, status, detail, instance: req.originalUrl.split('?')[0], retryAfterS });
      res.writeHead(status, {
        'Content-Type': 'application/problem+json; charset=utf-8',
        'Content-Length': Buffer.byteLength(body),
        'Retry-After': String(retryAfterS),
        'Cache-Control': 'no-store',
        'X-Content-Type-Options': 'nosniff',
        // The body is not read, and a client that retries at once pays for a new connection each time.
        Connection: 'close',
      });
      res.end(body);
      return;
    }
    inFlight += 1;
    let released = false;
    const release = () => {
      if (released) return;
      released = true;
      inFlight -= 1;
    };
    res.once('finish', release);
    res.once('close', release);
    next();
  };
  return Object.assign(handler, { inFlight: () => inFlight, refused: () => refusedTotal });
}
