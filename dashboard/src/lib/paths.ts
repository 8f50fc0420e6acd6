/** Every dashboard route in one place: the pattern for the router and a builder for links. */
const enc = encodeURIComponent;

export const paths = {
  home: { path: '/', href: () => '/' },
  signIn: {
    path: '/sign-in',
    /** `next` is where to return after signing in (a path inside the dashboard). */
    href: (next?: string) => (next && next !== '/' ? `/sign-in?next=${enc(next)}` : '/sign-in'),
  },
  acceptInvitation: { path: '/accept-invitation', href: (token: string) => `/accept-invitation?token=${enc(token)}` },
  resetPassword: {
    path: '/reset-password',
    href: (token?: string) => (token ? `/reset-password?token=${enc(token)}` : '/reset-password'),
  },
  traces: { path: '/traces', href: () => '/traces' },
  trace: { path: '/traces/:traceId', href: (traceId: string) => `/traces/${enc(traceId)}` },
  upload: { path: '/upload', href: () => '/upload' },
  sites: { path: '/sites', href: () => '/sites' },
  site: { path: '/sites/:siteId', href: (siteId: string) => `/sites/${enc(siteId)}` },
  circuit: { path: '/circuits/:circuitId', href: (circuitId: string) => `/circuits/${enc(circuitId)}` },
  adminKeys: { path: '/admin/api-keys', href: () => '/admin/api-keys' },
  adminUsers: { path: '/admin/users', href: () => '/admin/users' },
  adminAudit: { path: '/admin/audit', href: () => '/admin/audit' },
} as const;

/**
 * A safe place to go after signing in: only paths inside the dashboard (never another origin, never
 * the sign-in page itself, which would loop).
 */
export function safeNextPath(next: string | null | undefined): string {
  if (!next || !next.startsWith('/') || next.startsWith('//') || next.startsWith('/\\')) return paths.home.href();
  if (next.startsWith(paths.signIn.path)) return paths.home.href();
  return next;
}
