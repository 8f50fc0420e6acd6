import { useState, type FormEvent } from 'react';
import { Badge, type BadgeTone } from '../../../components/ui/badge';
import { Button } from '../../../components/ui/button';
import { ConfirmDialog, Dialog, FormFooter } from '../../../components/ui/dialog';
import { CheckboxField, TextField } from '../../../components/ui/field';
import { EmptyState, ErrorState, fieldError, LoadingState } from '../../../components/ui/states';
import { formatDateTime } from '../../../lib/format';
import {
  useApiKeys,
  useCreateApiKey,
  useRevokeApiKey,
  useRotateApiKey,
  type ApiKey,
  type KeyScope,
} from '../api/api-keys';
import { SecretDialog } from './secret-dialog';
import { TableFrame } from '../../../components/ui/table';

const statusTone: Record<ApiKey['status'], BadgeTone> = { active: 'fine', revoked: 'muted', expired: 'tight' };

const scopeHelp: Record<KeyScope, string> = {
  ingest: 'create traces and append samples (for loggers, gateways and scripts)',
  read: 'read everything in the organisation (for reporting tools)',
};

function CreateKeyDialog({
  open,
  onClose,
  onCreated,
}: {
  open: boolean;
  onClose: () => void;
  onCreated: (name: string, secret: string) => void;
}) {
  const create = useCreateApiKey();
  const [name, setName] = useState('');
  const [scopes, setScopes] = useState<KeyScope[]>(['ingest']);
  const [expires, setExpires] = useState('');
  const toggle = (s: KeyScope, on: boolean) =>
    setScopes((prev) => (on ? [...new Set([...prev, s])] : prev.filter((x) => x !== s)));
  const submit = (e: FormEvent) => {
    e.preventDefault();
    // A date input gives a calendar day; the key works until the end of that day in the user's zone.
    const expiresAt = expires ? new Date(`${expires}T23:59:59`).toISOString() : null;
    create.mutate(
      { name: name.trim(), scopes, expiresAt },
      {
        onSuccess: (answer) => {
          onCreated(answer.apiKey.name, answer.secret);
          onClose();
        },
      },
    );
  };
  return (
    <Dialog open={open} onClose={onClose} title="New API key">
      <form className="space-y-3" onSubmit={submit}>
        <TextField
          label="Name"
          required
          value={name}
          onChange={(e) => setName(e.target.value)}
          hint="Where it will be used, e.g. Panel logger, Millbrook hall"
          error={fieldError(create.error, '/name')}
          autoFocus
        />
        <fieldset className="space-y-2">
          <legend className="text-sm font-medium text-ink-900">Scopes</legend>
          {(['ingest', 'read'] as const).map((s) => (
            <CheckboxField
              key={s}
              label={s}
              hint={scopeHelp[s]}
              checked={scopes.includes(s)}
              onChange={(e) => toggle(s, e.target.checked)}
            />
          ))}
          {fieldError(create.error, '/scopes') ? (
            <p className="text-xs text-verdict-over">{fieldError(create.error, '/scopes')}</p>
          ) : null}
        </fieldset>
        <TextField
          label="Expires on (optional)"
          type="date"
          value={expires}
          min={new Date().toISOString().slice(0, 10)}
          onChange={(e) => setExpires(e.target.value)}
          hint="Leave empty for a key that works until revoked"
          error={fieldError(create.error, '/expiresAt')}
        />
        <FormFooter
          mutation={create}
          onCancel={onClose}
          submitLabel="Create key"
          pendingLabel="Creating…"
          canSubmit={name.trim() !== '' && scopes.length > 0}
        />
      </form>
    </Dialog>
  );
}

/** API keys of the organisation: create (secret shown once), rotate, revoke; when and from where each was last used. */
export function ApiKeysPanel() {
  const keys = useApiKeys();
  const revoke = useRevokeApiKey();
  const rotate = useRotateApiKey();
  const [creating, setCreating] = useState(false);
  const [secret, setSecret] = useState<{ name: string; value: string } | null>(null);
  const [confirm, setConfirm] = useState<{ key: ApiKey; action: 'revoke' | 'rotate' } | null>(null);

  const act = () => {
    if (!confirm) return;
    if (confirm.action === 'revoke') revoke.mutate(confirm.key.id, { onSuccess: () => setConfirm(null) });
    else
      rotate.mutate(confirm.key.id, {
        onSuccess: (answer) => {
          setConfirm(null);
          setSecret({ name: answer.apiKey.name, value: answer.secret });
        },
      });
  };
  const actionError = confirm?.action === 'revoke' ? revoke.error : rotate.error;

  return (
    <div className="space-y-4">
      <div className="flex flex-wrap items-center justify-between gap-3">
        <p className="max-w-2xl text-sm text-ink-700">
          Keys let devices and scripts send samples or read data without a user's password. Give each device its own
          key, with only the scope it needs.
        </p>
        <Button onClick={() => setCreating(true)}>New API key</Button>
      </div>
      {keys.isPending ? (
        <LoadingState label="Loading keys…" />
      ) : keys.isError ? (
        <ErrorState error={keys.error} onRetry={() => void keys.refetch()} />
      ) : keys.data.items.length === 0 ? (
        <EmptyState title="No API keys yet">Create one for each logger, gateway or script.</EmptyState>
      ) : (
        <TableFrame
          caption="API keys"
          columns={[
            { label: 'Name' },
            { label: 'Key starts' },
            { label: 'Scopes' },
            { label: 'Status' },
            { label: 'Expires' },
            { label: 'Last used' },
            { label: 'Actions', hidden: true },
          ]}
        >
          {keys.data.items.map((k) => (
            <tr key={k.id} className="border-t border-ink-100" data-testid="api-key-row">
              <td className="px-3 py-2">
                <p className="font-medium text-ink-900">{k.name}</p>
                <p className="text-xs text-ink-500">
                  created {formatDateTime(k.createdAt, true)}
                  {k.createdBy ? ` by ${k.createdBy.name}` : ''}
                </p>
              </td>
              <td className="px-3 py-2 font-mono text-xs">{k.prefix}…</td>
              <td className="px-3 py-2">{k.scopes.join(', ')}</td>
              <td className="px-3 py-2">
                <Badge tone={statusTone[k.status]}>{k.status}</Badge>
              </td>
              <td className="px-3 py-2">{k.expiresAt ? formatDateTime(k.expiresAt, true) : 'never'}</td>
              <td className="px-3 py-2">
                {k.lastUsedAt ? (
                  <>
                    {formatDateTime(k.lastUsedAt, true)}
                    {k.lastUsedFrom ? <span className="block text-xs text-ink-500">from {k.lastUsedFrom}</span> : null}
                  </>
                ) : (
                  <span className="text-ink-500">never</span>
                )}
              </td>
              <td className="whitespace-nowrap px-3 py-2 text-right">
                {k.status === 'active' ? (
                  <>
                    <Button
                      variant="ghost"
                      className="px-2 py-1"
                      onClick={() => setConfirm({ key: k, action: 'rotate' })}
                      aria-label={`Rotate ${k.name}`}
                    >
                      Rotate
                    </Button>
                    <Button
                      variant="ghost"
                      className="px-2 py-1 text-verdict-over"
                      onClick={() => setConfirm({ key: k, action: 'revoke' })}
                      aria-label={`Revoke ${k.name}`}
                    >
                      Revoke
                    </Button>
                  </>
                ) : null}
              </td>
            </tr>
          ))}
        </TableFrame>
      )}
      {creating ? (
        <CreateKeyDialog
          open
          onClose={() => setCreating(false)}
          onCreated={(name, value) => setSecret({ name, value })}
        />
      ) : null}
      <SecretDialog secret={secret?.value ?? null} keyName={secret?.name ?? ''} onClose={() => setSecret(null)} />
      <ConfirmDialog
        open={confirm !== null}
        title={confirm?.action === 'revoke' ? `Revoke ${confirm.key.name}?` : `Rotate ${confirm?.key.name ?? ''}?`}
        confirmLabel={confirm?.action === 'revoke' ? 'Revoke key' : 'Rotate key'}
        busy={revoke.isPending || rotate.isPending}
        onCancel={() => setConfirm(null)}
        onConfirm={act}
      >
        {confirm?.action === 'revoke' ? (
          <p>
            Devices using this key are refused from their next request. This cannot be undone; create a new key to
            restore access.
          </p>
        ) : (
          <p>The current secret stops working at once and a new one is shown once. Update the device that uses it.</p>
        )}
        {actionError ? <ErrorState error={actionError} /> : null}
      </ConfirmDialog>
    </div>
  );
}
