import { useState, type FormEvent } from 'react';
import { AssignmentFields, type Assignment } from '../../../components/assignment-fields';
import { Dialog, FormFooter } from '../../../components/ui/dialog';
import { TextAreaField, TextField } from '../../../components/ui/field';
import { fieldError } from '../../../components/ui/states';
import { useUpdateTrace, type Trace } from '../api/traces';

/** Edit a trace's name, assignment, supply figures, tags and notes (samples never change). */
export function TraceEditDialog({ trace, open, onClose }: { trace: Trace; open: boolean; onClose: () => void }) {
  const update = useUpdateTrace(trace.id);
  const [name, setName] = useState(trace.name);
  const [assignment, setAssignment] = useState<Assignment>({
    siteId: trace.siteId ?? '',
    circuitId: trace.circuitId ?? '',
    loadId: trace.loadId ?? '',
  });
  const [voltage, setVoltage] = useState(trace.nominalVoltageV === null ? '' : String(trace.nominalVoltageV));
  const [hz, setHz] = useState(trace.mainsHz === null ? '' : String(trace.mainsHz));
  const [tags, setTags] = useState(trace.tags.join(', '));
  const [notes, setNotes] = useState(trace.notes ?? '');
  const submit = (e: FormEvent) => {
    e.preventDefault();
    update.mutate(
      {
        name: name.trim(),
        siteId: assignment.siteId || null,
        circuitId: assignment.circuitId || null,
        loadId: assignment.loadId || null,
        nominalVoltageV: voltage.trim() ? Number(voltage) : null,
        mainsHz: hz.trim() ? Number(hz) : null,
        tags: tags
          .split(',')
          .map((t) => t.trim())
          .filter(Boolean),
        notes: notes.trim() || null,
      },
      { onSuccess: onClose },
    );
  };
  return (
    <Dialog size="lg" open={open} onClose={onClose} title="Edit trace">
      <form className="space-y-3" onSubmit={submit}>
        <TextField
          label="Name"
          required
          value={name}
          onChange={(e) => setName(e.target.value)}
          error={fieldError(update.error, '/name')}
          autoFocus
        />
        <AssignmentFields value={assignment} onChange={setAssignment} />
        <div className="grid grid-cols-2 gap-3">
          <TextField
            label="Nominal voltage (V)"
            type="number"
            min={1}
            step="any"
            value={voltage}
            onChange={(e) => setVoltage(e.target.value)}
            hint="For the energy figure; the circuit's when empty"
            error={fieldError(update.error, '/nominalVoltageV')}
          />
          <TextField
            label="Mains frequency (Hz)"
            type="number"
            min={40}
            max={70}
            step="any"
            value={hz}
            onChange={(e) => setHz(e.target.value)}
            error={fieldError(update.error, '/mainsHz')}
          />
        </div>
        <TextField label="Tags" value={tags} onChange={(e) => setTags(e.target.value)} hint="Separated by commas" />
        <TextAreaField label="Notes" rows={3} value={notes} onChange={(e) => setNotes(e.target.value)} />
        <FormFooter mutation={update} onCancel={onClose} submitLabel="Save" canSubmit={name.trim() !== ''} />
      </form>
    </Dialog>
  );
}
