import type { Role } from '../models/user.js';

/** Who is calling, on behalf of which organisation. Every service call takes one. */
export interface Scope {
  organisationId: string;
  actor:
    | { kind: 'user'; id: string; role: Role; sessionId?: string }
    | { kind: 'key'; id: string; scopes: string[]; createdByUserId?: string }
    | { kind: 'system'; id: 'system' };
  /** The caller's network address, for the audit log. */
  address?: string;
}

declare module 'express-serve-static-core' {
  interface Request {
    /** Set by authentication; absent on public routes. */
    scope?: Scope;
  }
}
