import { useState } from 'react';
import { Button } from '../../../components/ui/button';
import { SelectField } from '../../../components/ui/field';
import { EmptyState, ErrorState, LoadingState } from '../../../components/ui/states';
import { formatDateTime } from '../../../lib/format';
import { useAuditEvents, type AuditAction, type AuditEvent } from '../api/audit';
import { TableFrame } from '../../../components/ui/table';

const actionLabels: Record<AuditAction, string> = {
  'sign-in.succeeded': 'Signed in',
  'sign-in.failed': 'Sign-in failed',
  'sign-out': 'Signed out',
  'api-key.created': 'API key created',
  'api-key.revoked': 'API key revoked',
  'api-key.rotated': 'API key rotated',
  'api-key.used-from-new-address': 'API key used from a new address',
  'user.invited': 'User invited',
  'user.role-changed': 'Role changed',
  'user.deactivated': 'User deactivated',
  'user.reactivated': 'User reactivated',
  'invitation.accepted': 'Invitation accepted',
  'password-reset.requested': 'Password reset requested',
  'password-reset.completed': 'Password reset completed',
};

function detailsText(details: AuditEvent['details']): string {
  if (!details) return '';
  return Object.entries(details)
    .map(([k, v]) => `${k}: ${typeof v === 'string' ? v : JSON.stringify(v)}`)
    .join(' · ');
}

/** Who did what to which user or key, when, and from where; newest first. */
export function AuditLog() {
  const [action, setAction] = useState<AuditAction | ''>('');
  const events = useAuditEvents(action);
  const rows = events.data?.pages.flatMap((p) => p.items) ?? [];
  const total = events.data?.pages[0]?.total;
  return (
    <div className="space-y-4">
      <div className="flex flex-wrap items-end justify-between gap-3">
        <SelectField
          label="Action"
          className="w-72"
          value={action}
          onChange={(e) => setAction(e.target.value as AuditAction | '')}
        >
          <option value="">All actions</option>
          {Object.entries(actionLabels).map(([value, text]) => (
            <option key={value} value={value}>
              {text}
            </option>
          ))}
        </SelectField>
        {total !== undefined ? (
          <p className="text-sm text-ink-500">
            {rows.length} of {total} events
          </p>
        ) : null}
      </div>
      {events.isPending ? (
        <LoadingState label="Loading the audit log…" />
      ) : events.isError ? (
        <ErrorState error={events.error} onRetry={() => void events.refetch()} />
      ) : rows.length === 0 ? (
        <EmptyState title="No events" />
      ) : (
        <TableFrame
          caption="Audit log"
          columns={[
            { label: 'When' },
            { label: 'Action' },
            { label: 'By' },
            { label: 'Target' },
            { label: 'From' },
            { label: 'Details' },
          ]}
        >
          {rows.map((e) => (
            <tr key={e.id} className="border-t border-ink-100 align-top">
              <td className="whitespace-nowrap px-3 py-2">{formatDateTime(e.createdAt)}</td>
              <td className="px-3 py-2 font-medium text-ink-900">{actionLabels[e.action] ?? e.action}</td>
              <td className="px-3 py-2">{e.actor.label ?? e.actor.kind}</td>
              <td className="px-3 py-2">{e.target ? `${e.target.label ?? e.target.id} (${e.target.kind})` : '—'}</td>
              <td className="px-3 py-2 font-mono text-xs">{e.address ?? '—'}</td>
              <td className="max-w-xs break-words px-3 py-2 text-xs text-ink-700">{detailsText(e.details)}</td>
            </tr>
          ))}
        </TableFrame>
      )}
      {events.hasNextPage ? (
        <Button variant="secondary" onClick={() => void events.fetchNextPage()} disabled={events.isFetchingNextPage}>
          {events.isFetchingNextPage ? 'Loading…' : 'Load more'}
        </Button>
      ) : null}
    </div>
  );
}
