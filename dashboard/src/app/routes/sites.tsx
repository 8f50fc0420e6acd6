import { SiteList } from '../../features/sites/components/site-list';

export function SitesPage() {
  return (
    <section aria-labelledby="sites-title" className="space-y-4">
      <h1 id="sites-title" className="text-2xl font-semibold text-ink-900">Sites</h1>
      <SiteList />
    </section>
  );
}
