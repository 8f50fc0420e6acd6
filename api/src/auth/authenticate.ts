import type { RequestHandler } from 'express';
import type { Db } from '../db/open.js';
import { Problem } from '../errors/problem.js';

/**
 * TEMPORARY (walking skeleton): every request acts as an engineer of the first organisation.
 * The accounts work (sessions and API keys through passport-http-bearer) replaces this module; the
 * rest of the code only relies on `req.scope` being set, so nothing else changes then.
 */
export function authenticate(db: Db): RequestHandler {
  return async (req, _res, next) => {
    const organisation = await db.models.Organisation.findOne({ order: [['createdAt', 'ASC']] });
    if (!organisation) return next(new Problem('unauthenticated', 'No organisation exists yet'));
    req.scope = { organisationId: organisation.id, actor: { kind: 'system', id: 'system' } };
    next();
  };
}
