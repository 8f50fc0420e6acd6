import { useState, type FormEvent } from 'react';
import { Dialog, FormFooter } from '../../../components/ui/dialog';
import { TextAreaField, TextField } from '../../../components/ui/field';
import { fieldError } from '../../../components/ui/states';
import { useSaveSite, type Site } from '../api/sites';

const blankToNull = (v: string) => (v.trim() ? v.trim() : null);

/** Create a site, or edit one when `site` is given. */
export function SiteFormDialog({
  open,
  onClose,
  site,
  onSaved,
}: {
  open: boolean;
  onClose: () => void;
  site?: Site;
  onSaved?: (site: Site) => void;
}) {
  const save = useSaveSite(site?.id);
  const [name, setName] = useState(site?.name ?? '');
  const [address, setAddress] = useState(site?.address ?? '');
  const [clientContact, setClientContact] = useState(site?.clientContact ?? '');
  const [notes, setNotes] = useState(site?.notes ?? '');

  const submit = (e: FormEvent) => {
    e.preventDefault();
    save.mutate(
      {
        name: name.trim(),
        address: blankToNull(address),
        clientContact: blankToNull(clientContact),
        notes: blankToNull(notes),
      },
      {
        onSuccess: (saved) => {
          onSaved?.(saved);
          onClose();
        },
      },
    );
  };
  return (
    <Dialog open={open} onClose={onClose} title={site ? 'Edit site' : 'New site'}>
      <form className="space-y-3" onSubmit={submit}>
        <TextField
          label="Name"
          required
          value={name}
          onChange={(e) => setName(e.target.value)}
          error={fieldError(save.error, '/name')}
          autoFocus
        />
        <TextField
          label="Address"
          value={address}
          onChange={(e) => setAddress(e.target.value)}
          error={fieldError(save.error, '/address')}
        />
        <TextField
          label="Client contact"
          hint="Name, phone or e-mail"
          value={clientContact}
          onChange={(e) => setClientContact(e.target.value)}
        />
        <TextAreaField label="Notes" rows={3} value={notes} onChange={(e) => setNotes(e.target.value)} />
        <FormFooter mutation={save} onCancel={onClose} submitLabel="Save site" canSubmit={name.trim() !== ''} />
      </form>
    </Dialog>
  );
}
