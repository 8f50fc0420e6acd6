import { useState } from 'react';
import { Link, useNavigate, useParams } from 'react-router';
import { Button } from '../../components/ui/button';
import { ConfirmDialog } from '../../components/ui/dialog';
import { PageHeader } from '../../components/ui/page-header';
import { ErrorState, LoadingState } from '../../components/ui/states';
import { CircuitFormDialog } from '../../features/circuits/components/circuit-form';
import { ReportButtons } from '../../features/circuits/components/report-actions';
import { useDeleteSite, useSite } from '../../features/sites/api/sites';
import { CircuitTable } from '../../features/sites/components/circuit-table';
import { SiteFormDialog } from '../../features/sites/components/site-form';
import { paths } from '../../lib/paths';
import { useAbilities } from '../../lib/session';

export default function SitePage() {
  const { siteId = '' } = useParams();
  const site = useSite(siteId);
  const { canEdit } = useAbilities();
  const navigate = useNavigate();
  const remove = useDeleteSite();
  const [dialog, setDialog] = useState<'edit' | 'circuit' | 'delete' | null>(null);
  if (site.isPending) return <LoadingState />;
  if (site.isError) return <ErrorState error={site.error} onRetry={() => void site.refetch()} />;
  return (
    <section aria-labelledby="site-title" className="space-y-5">
      <PageHeader
        back={
          <Link to={paths.sites.href()} className="text-sm text-ink-700 hover:underline">
            ← All sites
          </Link>
        }
        title={site.data.name}
        titleId="site-title"
        subtitle={[site.data.address, site.data.clientContact].filter(Boolean).join(' · ')}
        actions={
          <>
            <ReportButtons target={{ siteId }} />
            {canEdit ? (
              <>
                <Button variant="secondary" onClick={() => setDialog('edit')}>
                  Edit site
                </Button>
                <Button variant="secondary" onClick={() => setDialog('delete')}>
                  Delete site
                </Button>
              </>
            ) : null}
          </>
        }
      />
      {site.data.notes ? <p className="max-w-3xl text-sm text-ink-700">{site.data.notes}</p> : null}
      <div className="flex items-center justify-between">
        <h2 className="text-lg font-semibold text-ink-800">Circuits</h2>
        {canEdit ? <Button onClick={() => setDialog('circuit')}>New circuit</Button> : null}
      </div>
      <CircuitTable siteId={siteId} />
      {dialog === 'edit' ? <SiteFormDialog open site={site.data} onClose={() => setDialog(null)} /> : null}
      {dialog === 'circuit' ? <CircuitFormDialog open siteId={siteId} onClose={() => setDialog(null)} /> : null}
      <ConfirmDialog
        open={dialog === 'delete'}
        title={`Delete ${site.data.name}?`}
        confirmLabel="Delete site"
        busy={remove.isPending}
        onCancel={() => setDialog(null)}
        onConfirm={() =>
          remove.mutate(siteId, { onSuccess: () => void navigate(paths.sites.href(), { replace: true }) })
        }
      >
        <p>
          This deletes the site with its circuits and loads. Traces stay, without their site. This cannot be undone.
        </p>
        {remove.isError ? <ErrorState error={remove.error} /> : null}
      </ConfirmDialog>
    </section>
  );
}
