import type { Request, RequestHandler } from 'express';
import { Passport } from 'passport';
import { Strategy as BearerStrategy } from 'passport-http-bearer';
import { Problem } from '../errors/problem.js';
import type { Services } from '../services/index.js';
import type { Scope } from './scope.js';
import { API_KEY_PREFIX } from './secrets.js';

const REFUSALS = {
  malformed: 'The API key is not in the expected form (hrk_<key id>_<secret>)',
  unknown: 'The token is not valid; sign in again or check the API key',
  expired: 'The token has expired; sign in again, or ask an admin for a new API key',
  revoked: 'The token has been revoked',
  deactivated: 'The account has been deactivated',
} as const;
type Refusal = keyof typeof REFUSALS;

const CHALLENGE = 'Bearer realm="headroom"';

/**
 * Authentication for /api/v1. A bearer token in the Authorization header is either a session token
 * (from sign-in) or an API key (`hrk_…`); either one sets `req.scope`, the only thing the rest of the
 * code reads. Without an Authorization header the request goes on with no scope: public routes answer,
 * every other route answers 401 (see mountRoutes). A token that is sent but not valid is refused here
 * with 401, even on public routes, so a client never silently acts as someone else or as nobody.
 */
export function authenticate(services: Pick<Services, 'sessions' | 'apiKeys'>): RequestHandler {
  const refusals = new WeakMap<Request, Refusal>();
  const passport = new Passport();
  passport.use(
    new BearerStrategy({ passReqToCallback: true, realm: 'headroom' }, (req: Request, token: string, done: (err: unknown, scope?: Scope | false) => void) => {
      const address = req.ip;
      const verification = token.startsWith(API_KEY_PREFIX) ? services.apiKeys.verify(token, address) : services.sessions.verify(token);
      verification.then((result) => {
        if ('scope' in result) return done(null, { ...result.scope, ...(address ? { address } : {}) });
        refusals.set(req, result.refused);
        done(null, false);
      }, done);
    }),
  );

  return (req, res, next) => {
    if (req.headers.authorization === undefined) {
      next();
      return;
    }
    // Tokens are read from the Authorization header only: the strategy would also take `access_token`
    // from the body or query string, which may be logged or be part of the payload.
    const headerOnly = Object.create(req, { body: { value: undefined }, query: { value: {} } }) as Request;
    passport.authenticate('bearer', { session: false }, (err: unknown, scope: Scope | false) => {
      if (err) return next(err);
      if (scope) {
        req.scope = scope;
        return next();
      }
      const refusal = refusals.get(headerOnly);
      const detail = refusal ? REFUSALS[refusal] : 'Send the token as "Authorization: Bearer <token>"';
      const challenge = refusal ? `${CHALLENGE}, error="invalid_token"` : CHALLENGE;
      next(new Problem('unauthenticated', detail, { headers: { 'WWW-Authenticate': challenge } }));
    })(headerOnly, res, next);
  };
}
