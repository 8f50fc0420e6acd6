/** Every dashboard route in one place: the pattern for the router and a builder for links. */
export const paths = {
  home: { path: '/', href: () => '/' },
  sites: { path: '/sites', href: () => '/sites' },
  site: { path: '/sites/:siteId', href: (siteId: string) => `/sites/${encodeURIComponent(siteId)}` },
} as const;
