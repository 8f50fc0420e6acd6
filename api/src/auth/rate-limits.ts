import type { Request, RequestHandler } from 'express';
import { rateLimit, type Options } from 'express-rate-limit';
import type { Config } from '../config/config.js';
import { Problem } from '../errors/problem.js';

const MINUTE_MS = 60_000;

/** Answers 429 as a problem; Retry-After (seconds) is already set by express-rate-limit. */
function limited(what: string): Options['handler'] {
  return (req, _res, next) => {
    const resetTime = (req as Request & { rateLimit?: { resetTime?: Date } }).rateLimit?.resetTime;
    const retryAfterS = resetTime ? Math.max(1, Math.ceil((resetTime.getTime() - Date.now()) / 1000)) : undefined;
    next(new Problem('rate-limited', `${what}; try again${retryAfterS ? ` in ${retryAfterS} s` : ' later'}`, { extensions: retryAfterS ? { retryAfterS } : {} }));
  };
}

const common = { standardHeaders: 'draft-8', legacyHeaders: false } as const;

/**
 * Rate limits (in memory, per process). Per network address on every /api/v1 request, then per caller
 * (API key or user) once authenticated. Stricter, per address: failed sign-ins, failed uses of e-mailed
 * links (invitation, password reset), and password-reset requests (which send mail).
 */
export function rateLimits(config: Config) {
  const limits = config.rateLimits;
  const failedAttempts = (what: string) =>
    rateLimit({ ...common, windowMs: 15 * MINUTE_MS, limit: limits.signInFailuresPer15Min, skipSuccessfulRequests: true, handler: limited(what) });
  return {
    perAddress: rateLimit({ ...common, windowMs: MINUTE_MS, limit: limits.perIpPerMinute, handler: limited('Too many requests from this address') }),
    perCaller: rateLimit({
      ...common,
      windowMs: MINUTE_MS,
      limit: limits.perCallerPerMinute,
      skip: (req) => !req.scope,
      keyGenerator: (req) => `${req.scope?.actor.kind}:${req.scope?.actor.id}`,
      handler: limited('Too many requests with this API key or session'),
    }),
    signIn: failedAttempts('Too many failed sign-in attempts from this address'),
    linkUse: failedAttempts('Too many failed attempts with invitation or password-reset links from this address'),
    passwordReset: rateLimit({ ...common, windowMs: 60 * MINUTE_MS, limit: limits.passwordResetsPerHour, handler: limited('Too many password-reset requests from this address') }),
  } satisfies Record<string, RequestHandler>;
}
