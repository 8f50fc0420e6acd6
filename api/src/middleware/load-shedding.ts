import type { RequestHandler } from 'express';
import { Problem } from '../errors/problem.js';

export interface LoadSheddingOptions {
  /** Requests worked on at once; the next ones are refused until one ends. */
  maxInFlight: number;
  /** Seconds a refused client is asked to wait (Retry-After). */
  retryAfterS?: number;
}

/**
 * Load shedding: at most `maxInFlight` API requests are in progress at once; any more are answered at
 * once with 503 and `Retry-After` (problem type `unavailable`) instead of queueing behind the database
 * until every answer is late. Mounted before body parsing, so a refused upload is not read. A request
 * leaves the count when its answer is sent or its connection closes, whichever comes first.
 */
export function loadShedding(options: LoadSheddingOptions): RequestHandler & { inFlight(): number } {
  const retryAfterS = options.retryAfterS ?? 1;
  let inFlight = 0;
  const handler: RequestHandler = (_req, res, next) => {
    if (inFlight >= options.maxInFlight) {
      next(
        new Problem('unavailable', `The server is busy with ${options.maxInFlight} requests; try again in ${retryAfterS} s`, {
          headers: { 'Retry-After': String(retryAfterS) },
          extensions: { retryAfterS },
        }),
      );
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
  return Object.assign(handler, { inFlight: () => inFlight });
}
