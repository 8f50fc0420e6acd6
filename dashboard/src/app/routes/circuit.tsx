import { lazy, Suspense, useState } from 'react';
import { Link, useNavigate, useParams } from 'react-router';
import { Button } from '../../components/ui/button';
import { ConfirmDialog } from '../../components/ui/dialog';
import { PageHeader, Panel } from '../../components/ui/page-header';
import { ErrorState, LoadingState } from '../../components/ui/states';
import { useCircuitCheck } from '../../features/circuits/api/check';
import { useCircuit, useDeleteCircuit } from '../../features/circuits/api/circuits';
import { useCircuitLoads } from '../../features/circuits/api/loads';
import { CircuitFormDialog } from '../../features/circuits/components/circuit-form';
import { LoadsTable } from '../../features/circuits/components/loads-table';
import { EmailReportForm, ReportButtons } from '../../features/circuits/components/report-actions';
import { StartUpsTable } from '../../features/circuits/components/start-ups-table';
import { VerdictPanel } from '../../features/circuits/components/verdict';
import { WhatIfForm } from '../../features/circuits/components/what-if-form';
import { deviceKindLabel } from '../../lib/labels';
import { paths } from '../../lib/paths';
import { useAbilities } from '../../lib/session';

// The charts bring Chart.js; the verdict and tables show before it has loaded.
const CircuitCharts = lazy(() => import('../../features/circuits/components/circuit-charts'));

export default function CircuitPage() {
  const { circuitId = '' } = useParams();
  const circuit = useCircuit(circuitId);
  const loads = useCircuitLoads(circuitId);
  const check = useCircuitCheck(circuitId);
  const { canEdit, canSendReports } = useAbilities();
  const navigate = useNavigate();
  const remove = useDeleteCircuit();
  const [dialog, setDialog] = useState<'edit' | 'delete' | null>(null);

  if (circuit.isPending) return <LoadingState />;
  if (circuit.isError) return <ErrorState error={circuit.error} onRetry={() => void circuit.refetch()} />;
  const c = circuit.data;
  return (
    <section aria-labelledby="circuit-title" className="space-y-5">
      <PageHeader
        back={
          <Link to={paths.site.href(c.siteId)} className="text-sm text-ink-700 hover:underline">
            ← Back to the site
          </Link>
        }
        title={c.label}
        titleId="circuit-title"
        subtitle={`${c.deviceRatingA} A · ${deviceKindLabel(c.deviceKind)} · ${c.nominalVoltageV} V ${c.mainsHz} Hz · ${[c.conductorSize, c.conductorMaterial?.toUpperCase()].filter(Boolean).join(' ') || 'conductor not recorded'}${c.feedsOtherOutlets ? ' · also feeds other outlets' : ''}`}
        actions={
          <>
            <ReportButtons target={{ circuitId }} />
            {canEdit ? (
              <>
                <Button variant="secondary" onClick={() => setDialog('edit')}>
                  Edit circuit
                </Button>
                <Button variant="secondary" onClick={() => setDialog('delete')}>
                  Delete circuit
                </Button>
              </>
            ) : null}
          </>
        }
      />

      {check.isPending ? (
        <LoadingState label="Checking the circuit…" />
      ) : check.isError ? (
        <ErrorState error={check.error} title="The circuit could not be checked" onRetry={() => void check.refetch()} />
      ) : (
        <VerdictPanel check={check.data} />
      )}

      <Panel title="Loads" titleId="loads-title">
        {loads.isPending ? (
          <LoadingState label="Loading loads…" />
        ) : loads.isError ? (
          <ErrorState error={loads.error} onRetry={() => void loads.refetch()} />
        ) : (
          <LoadsTable circuitId={circuitId} loads={loads.data.items} check={check.data} canEdit={canEdit} />
        )}
      </Panel>

      {check.data ? (
        <Panel title="Start-ups, one load at a time with the others running" titleId="startups-title">
          <StartUpsTable check={check.data} />
        </Panel>
      ) : null}

      {check.data ? (
        <Suspense fallback={<LoadingState label="Loading charts…" />}>
          <CircuitCharts circuit={c} check={check.data} />
        </Suspense>
      ) : null}

      <div className="grid gap-5 lg:grid-cols-2">
        <Panel title="What if another load is added?" titleId="whatif-title">
          <WhatIfForm circuitId={circuitId} />
        </Panel>
        {canSendReports ? (
          <Panel title="Send the report" titleId="email-title">
            <EmailReportForm circuitId={circuitId} />
          </Panel>
        ) : null}
      </div>

      {dialog === 'edit' ? (
        <CircuitFormDialog open siteId={c.siteId} circuit={c} onClose={() => setDialog(null)} />
      ) : null}
      <ConfirmDialog
        open={dialog === 'delete'}
        title={`Delete ${c.label}?`}
        confirmLabel="Delete circuit"
        busy={remove.isPending}
        onCancel={() => setDialog(null)}
        onConfirm={() =>
          remove.mutate(circuitId, { onSuccess: () => void navigate(paths.site.href(c.siteId), { replace: true }) })
        }
      >
        <p>This deletes the circuit and its loads. Traces stay, without their circuit. This cannot be undone.</p>
        {remove.isError ? <ErrorState error={remove.error} /> : null}
      </ConfirmDialog>
    </section>
  );
}
