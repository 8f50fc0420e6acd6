import { Link } from 'react-router';
import { EmptyState, ErrorState, LoadingState } from '../../../components/ui/states';
import { paths } from '../../../lib/paths';
import { useSites } from '../api/sites';

export function SiteList() {
  const sites = useSites();
  if (sites.isPending) return <LoadingState label="Loading sites…" />;
  if (sites.isError) return <ErrorState error={sites.error} onRetry={() => void sites.refetch()} />;
  if (sites.data.items.length === 0)
    return <EmptyState title="No sites yet">Create a site to add its circuits and loads.</EmptyState>;
  return (
    <ul className="grid gap-4 sm:grid-cols-2 lg:grid-cols-3" aria-label="Sites">
      {sites.data.items.map((site) => (
        <li key={site.id}>
          <Link
            to={paths.site.href(site.id)}
            className="block h-full rounded-xl border border-ink-100 bg-white p-4 shadow-sm transition hover:border-ink-300 hover:shadow"
          >
            <p className="font-semibold text-ink-900">{site.name}</p>
            {site.address ? <p className="text-sm text-ink-500">{site.address}</p> : null}
            {site.clientContact ? <p className="mt-1 truncate text-xs text-ink-500">{site.clientContact}</p> : null}
            <p className="mt-3 text-xs font-medium uppercase tracking-wider text-ink-700">
              {site.circuitCount} circuit{site.circuitCount === 1 ? '' : 's'}
            </p>
          </Link>
        </li>
      ))}
    </ul>
  );
}
