import { useState, type FormEvent } from 'react';
import { Badge, type BadgeTone } from '../../../components/ui/badge';
import { Button } from '../../../components/ui/button';
import { ConfirmDialog, Dialog, FormFooter } from '../../../components/ui/dialog';
import { inputClass, SelectField, TextField } from '../../../components/ui/field';
import { EmptyState, ErrorState, fieldError, LoadingState } from '../../../components/ui/states';
import { formatDateTime } from '../../../lib/format';
import { useSession } from '../../../lib/session';
import { useInviteUser, useUpdateUser, useUsers, type Role, type User } from '../api/users';
import { TableFrame } from '../../../components/ui/table';

const roleHelp: Record<Role, string> = {
  admin: 'everything, plus users, API keys and the audit log',
  engineer: 'review, upload, edit and send reports',
  viewer: 'read only (a client or an inspector)',
};

const statusTone: Record<User['status'], BadgeTone> = { active: 'fine', invited: 'info', deactivated: 'muted' };

function InviteDialog({ open, onClose }: { open: boolean; onClose: () => void }) {
  const invite = useInviteUser();
  const [email, setEmail] = useState('');
  const [name, setName] = useState('');
  const [role, setRole] = useState<Role>('engineer');
  const submit = (e: FormEvent) => {
    e.preventDefault();
    invite.mutate({ email: email.trim(), name: name.trim(), role }, { onSuccess: onClose });
  };
  return (
    <Dialog open={open} onClose={onClose} title="Invite a user">
      <form className="space-y-3" onSubmit={submit}>
        <TextField
          label="Name"
          required
          value={name}
          onChange={(e) => setName(e.target.value)}
          error={fieldError(invite.error, '/name')}
          autoFocus
        />
        <TextField
          label="E-mail"
          type="email"
          required
          value={email}
          onChange={(e) => setEmail(e.target.value)}
          error={fieldError(invite.error, '/email')}
          hint="The invitation link goes to this address"
        />
        <SelectField label="Role" value={role} onChange={(e) => setRole(e.target.value as Role)} hint={roleHelp[role]}>
          <option value="viewer">Viewer</option>
          <option value="engineer">Engineer</option>
          <option value="admin">Admin</option>
        </SelectField>
        <FormFooter
          mutation={invite}
          onCancel={onClose}
          submitLabel="Send invitation"
          pendingLabel="Sending…"
          canSubmit={email.trim() !== '' && name.trim() !== ''}
        />
      </form>
    </Dialog>
  );
}

/** The organisation's users: invite, change role, deactivate or reactivate. */
export function UsersPanel() {
  const [q, setQ] = useState('');
  const users = useUsers(q.trim());
  const update = useUpdateUser();
  const me = useSession()?.user;
  const [inviting, setInviting] = useState(false);
  const [confirm, setConfirm] = useState<User | null>(null);

  return (
    <div className="space-y-4">
      <div className="flex flex-wrap items-end justify-between gap-3">
        <div className="w-72">
          <label htmlFor="user-search" className="block text-sm font-medium text-ink-900">
            Search
          </label>
          <input
            id="user-search"
            type="search"
            className={inputClass}
            placeholder="Name or e-mail"
            value={q}
            onChange={(e) => setQ(e.target.value)}
          />
        </div>
        <Button onClick={() => setInviting(true)}>Invite user</Button>
      </div>
      {update.isError && !confirm ? <ErrorState error={update.error} /> : null}
      {users.isPending ? (
        <LoadingState label="Loading users…" />
      ) : users.isError ? (
        <ErrorState error={users.error} onRetry={() => void users.refetch()} />
      ) : users.data.items.length === 0 ? (
        <EmptyState title={q ? 'No user matches' : 'No users yet'} />
      ) : (
        <TableFrame
          caption="Users"
          columns={[
            { label: 'Name' },
            { label: 'Role' },
            { label: 'Status' },
            { label: 'Since' },
            { label: 'Actions', hidden: true },
          ]}
        >
          {users.data.items.map((u) => {
            const self = u.id === me?.id;
            return (
              <tr key={u.id} className="border-t border-ink-100">
                <td className="px-3 py-2">
                  <p className="font-medium text-ink-900">
                    {u.name}
                    {self ? <span className="ml-1 text-xs font-normal text-ink-500">(you)</span> : null}
                  </p>
                  <p className="text-xs text-ink-500">{u.email}</p>
                </td>
                <td className="px-3 py-2">
                  <label className="sr-only" htmlFor={`role-${u.id}`}>
                    Role of {u.name}
                  </label>
                  <select
                    id={`role-${u.id}`}
                    className={`${inputClass} w-36 py-1`}
                    value={u.role}
                    disabled={self || u.status === 'deactivated' || update.isPending}
                    title={self ? 'You cannot change your own role' : undefined}
                    onChange={(e) => update.mutate({ userId: u.id, role: e.target.value as Role })}
                  >
                    <option value="viewer">Viewer</option>
                    <option value="engineer">Engineer</option>
                    <option value="admin">Admin</option>
                  </select>
                </td>
                <td className="px-3 py-2">
                  <Badge tone={statusTone[u.status]}>{u.status}</Badge>
                </td>
                <td className="px-3 py-2">{formatDateTime(u.createdAt, true)}</td>
                <td className="px-3 py-2 text-right">
                  {self ? null : u.status === 'deactivated' ? (
                    <Button
                      variant="ghost"
                      className="px-2 py-1"
                      onClick={() => update.mutate({ userId: u.id, active: true })}
                    >
                      Reactivate
                    </Button>
                  ) : (
                    <Button
                      variant="ghost"
                      className="px-2 py-1 text-verdict-over"
                      onClick={() => setConfirm(u)}
                      aria-label={`Deactivate ${u.name}`}
                    >
                      Deactivate
                    </Button>
                  )}
                </td>
              </tr>
            );
          })}
        </TableFrame>
      )}
      {inviting ? <InviteDialog open onClose={() => setInviting(false)} /> : null}
      <ConfirmDialog
        open={confirm !== null}
        title={`Deactivate ${confirm?.name ?? ''}?`}
        confirmLabel="Deactivate"
        busy={update.isPending}
        onCancel={() => setConfirm(null)}
        onConfirm={() =>
          confirm && update.mutate({ userId: confirm.id, active: false }, { onSuccess: () => setConfirm(null) })
        }
      >
        <p>
          They are signed out everywhere at once and cannot sign in until reactivated. Their traces and reports stay.
        </p>
        {update.isError ? <ErrorState error={update.error} /> : null}
      </ConfirmDialog>
    </div>
  );
}
