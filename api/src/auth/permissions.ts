import type { Role } from '../models/user.js';
import type { Scope } from './scope.js';

/**
 * The permission matrix: which roles and API-key scopes may do what. Every route names exactly one
 * permission; this table is the one place that says who holds it (mirrored in the README).
 */
export const PERMISSIONS = {
  /** No authentication at all (sign-in, password reset, accepting an invitation). */
  public: { roles: [], keyScopes: [], description: 'anyone, without credentials' },
  read: { roles: ['admin', 'engineer', 'viewer'], keyScopes: ['read'], description: 'read sites, circuits, loads, traces and checks' },
  write: { roles: ['admin', 'engineer'], keyScopes: [], description: 'create and edit sites, circuits and loads' },
  ingest: { roles: ['admin', 'engineer'], keyScopes: ['ingest'], description: 'create traces and append samples' },
  analyze: { roles: ['admin', 'engineer', 'viewer'], keyScopes: ['read', 'ingest'], description: 'stateless analysis of posted samples' },
  report: { roles: ['admin', 'engineer'], keyScopes: [], description: 'send reports by e-mail' },
  admin: { roles: ['admin'], keyScopes: [], description: 'manage users, API keys and the audit log' },
  self: { roles: ['admin', 'engineer', 'viewer'], keyScopes: ['read', 'ingest'], description: 'the caller\'s own identity' },
  session: { roles: ['admin', 'engineer', 'viewer'], keyScopes: [], description: 'end the caller\'s own session (sign out)' },
} as const satisfies Record<string, { roles: readonly Role[]; keyScopes: readonly string[]; description: string }>;

export type Permission = keyof typeof PERMISSIONS;

/** True when the caller holds the permission. */
export function holds(scope: Scope, permission: Permission): boolean {
  const rule = PERMISSIONS[permission];
  if (permission === 'public') return true;
  switch (scope.actor.kind) {
    case 'system':
      return true;
    case 'user':
      return (rule.roles as readonly string[]).includes(scope.actor.role);
    case 'key': {
      const allowed = rule.keyScopes as readonly string[];
      return scope.actor.scopes.some((s) => allowed.includes(s));
    }
  }
}
