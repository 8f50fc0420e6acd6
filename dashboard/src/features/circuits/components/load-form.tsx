import { useState, type FormEvent } from 'react';
import { Dialog, FormFooter } from '../../../components/ui/dialog';
import { TextAreaField } from '../../../components/ui/field';
import { useSaveLoad, type Load } from '../api/loads';
import { draftFromLoad, emptyLoadDraft, LoadFigureFields, loadFiguresFromDraft } from './load-fields';

export function LoadFormDialog({
  open,
  onClose,
  circuitId,
  load,
}: {
  open: boolean;
  onClose: () => void;
  circuitId: string;
  load?: Load;
}) {
  const save = useSaveLoad({ circuitId, ...(load ? { loadId: load.id } : {}) });
  const [draft, setDraft] = useState(load ? draftFromLoad(load) : emptyLoadDraft);
  const [notes, setNotes] = useState(load?.notes ?? '');
  const submit = (e: FormEvent) => {
    e.preventDefault();
    save.mutate({ ...loadFiguresFromDraft(draft), notes: notes.trim() || null }, { onSuccess: onClose });
  };
  return (
    <Dialog size="lg" open={open} onClose={onClose} title={load ? `Edit ${load.name}` : 'New load'}>
      <form className="space-y-3" onSubmit={submit}>
        <LoadFigureFields draft={draft} onChange={setDraft} error={save.error} />
        <TextAreaField label="Notes" rows={2} value={notes} onChange={(e) => setNotes(e.target.value)} />
        <FormFooter mutation={save} onCancel={onClose} submitLabel="Save load" canSubmit={draft.name.trim() !== ''} />
      </form>
    </Dialog>
  );
}
