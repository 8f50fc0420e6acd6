import type { Role } from '../models/user.js';
import type { Scope } from './scope.js';

/**
 * The permission matrix: which roles and API-key scopes may do what. Every route names exactly one
 * permission; this table is the one place that says who holds it (mirrored in the README).
 */
export const PERMISSIONS = {
  /** No authentication at all (sign-in, password reset, accepting an invitation). */
  public: { roles: [], keyScopes: [], description: 'anyone, without credentials' },
  read: { roles: ['admin', 'engineer', 'viewer'], keyScopes: ['read'], description: 'read sites, circuits, loads, traces, checks and reports' },
  write: { roles: ['admin', 'engineer'], keyScopes: [], description: 'create, edit and delete sites, circuits, loads and traces' },
  ingest: { roles: ['admin', 'engineer'], keyScopes: ['ingest'], description: 'create traces, append samples, import and close traces' },
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

/**
 * The matrix as a Markdown table, as it appears in the README ("Accounts, roles and API keys"); a test
 * keeps the two identical.
 */
export function permissionTableMarkdown(): string {
  const mark = (yes: boolean) => (yes ? 'yes' : '—');
  const rows = (Object.entries(PERMISSIONS) as Array<[Permission, (typeof PERMISSIONS)[Permission]]>).map(([name, rule]) => {
    const roles = rule.roles as readonly string[];
    const scopes = rule.keyScopes as readonly string[];
    const everyone = name === 'public';
    const cells = [...(['admin', 'engineer', 'viewer'] as const).map((r) => mark(everyone || roles.includes(r))), ...(['read', 'ingest'] as const).map((s) => mark(everyone || scopes.includes(s)))];
    return `| \`${name}\` | ${cells.join(' | ')} | ${rule.description} |`;
  });
  return ['| permission | admin | engineer | viewer | key `read` | key `ingest` | what it allows |', '| --- | --- | --- | --- | --- | --- | --- |', ...rows].join('\n');
}
