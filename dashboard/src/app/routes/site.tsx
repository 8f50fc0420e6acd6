import { Link, useParams } from 'react-router';
import { ErrorState, LoadingState } from '../../components/ui/states';
import { CircuitTable } from '../../features/sites/components/circuit-table';
import { useSite } from '../../features/sites/api/sites';
import { paths } from '../../lib/paths';

export function SitePage() {
  const { siteId = '' } = useParams();
  const site = useSite(siteId);
  if (site.isPending) return <LoadingState />;
  if (site.isError) return <ErrorState error={site.error} onRetry={() => void site.refetch()} />;
  return (
    <section aria-labelledby="site-title" className="space-y-4">
      <Link to={paths.sites.href()} className="text-sm text-ink-700 hover:underline">
        ← All sites
      </Link>
      <div>
        <h1 id="site-title" className="text-2xl font-semibold text-ink-900">{site.data.name}</h1>
        <p className="text-ink-500">{[site.data.address, site.data.clientContact].filter(Boolean).join(' · ')}</p>
        {site.data.notes ? <p className="mt-1 text-sm text-ink-700">{site.data.notes}</p> : null}
      </div>
      <h2 className="text-lg font-semibold text-ink-800">Circuits</h2>
      <CircuitTable siteId={siteId} />
    </section>
  );
}
