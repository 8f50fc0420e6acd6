import { useState, type FormEvent } from 'react';
import { Dialog, FormFooter } from '../../../components/ui/dialog';
import { CheckboxField, SelectField, TextAreaField, TextField } from '../../../components/ui/field';
import { fieldError } from '../../../components/ui/states';
import { deviceKindLabels } from '../../../lib/labels';
import { useSaveCircuit, type Circuit, type CircuitCreate } from '../api/circuits';

/** Standard ratings offered first (NEC 240.6(A) and IEC 60898-1 preferred values); any value may be typed. */
const COMMON_RATINGS_A = [6, 10, 13, 15, 16, 20, 25, 30, 32, 40, 50];

type DeviceKind = CircuitCreate['deviceKind'];

/** Create a circuit at a site, or edit one when `circuit` is given. */
export function CircuitFormDialog({
  open,
  onClose,
  siteId,
  circuit,
}: {
  open: boolean;
  onClose: () => void;
  siteId: string;
  circuit?: Circuit;
}) {
  const save = useSaveCircuit({ siteId, ...(circuit ? { circuitId: circuit.id } : {}) });
  const [label, setLabel] = useState(circuit?.label ?? '');
  const [voltage, setVoltage] = useState(String(circuit?.nominalVoltageV ?? 120));
  const [hz, setHz] = useState<50 | 60>(circuit?.mainsHz === 50 ? 50 : 60);
  const [rating, setRating] = useState(String(circuit?.deviceRatingA ?? 20));
  const [kind, setKind] = useState<DeviceKind>(circuit?.deviceKind ?? 'na-thermal-magnetic');
  const [conductorSize, setConductorSize] = useState(circuit?.conductorSize ?? '');
  const [material, setMaterial] = useState<'' | 'cu' | 'al'>(circuit?.conductorMaterial ?? 'cu');
  const [feedsOther, setFeedsOther] = useState(circuit?.feedsOtherOutlets ?? true);
  const [edition, setEdition] = useState<2020 | 2023>(circuit?.necEdition === 2020 ? 2020 : 2023);
  const [notes, setNotes] = useState(circuit?.notes ?? '');

  const submit = (e: FormEvent) => {
    e.preventDefault();
    save.mutate(
      {
        label: label.trim(),
        nominalVoltageV: Number(voltage),
        mainsHz: hz,
        deviceRatingA: Number(rating),
        deviceKind: kind,
        conductorSize: conductorSize.trim() || null,
        conductorMaterial: material || null,
        feedsOtherOutlets: feedsOther,
        necEdition: edition,
        notes: notes.trim() || null,
      },
      { onSuccess: onClose },
    );
  };
  const err = (p: string) => fieldError(save.error, p);
  return (
    <Dialog size="lg" open={open} onClose={onClose} title={circuit ? 'Edit circuit' : 'New circuit'}>
      <form className="space-y-3" onSubmit={submit}>
        <TextField
          label="Label"
          required
          value={label}
          onChange={(e) => setLabel(e.target.value)}
          error={err('/label')}
          hint="As written in the panel schedule, e.g. Kitchen counter, left (K3)"
          autoFocus
        />
        <div className="grid grid-cols-2 gap-3">
          <TextField
            label="Nominal voltage (V)"
            type="number"
            min={1}
            step="any"
            required
            value={voltage}
            onChange={(e) => setVoltage(e.target.value)}
            error={err('/nominalVoltageV')}
          />
          <SelectField label="Mains frequency" value={hz} onChange={(e) => setHz(e.target.value === '50' ? 50 : 60)}>
            <option value={60}>60 Hz</option>
            <option value={50}>50 Hz</option>
          </SelectField>
          <TextField
            label="Device rating (A)"
            type="number"
            min={1}
            step="any"
            list="common-ratings"
            required
            value={rating}
            onChange={(e) => setRating(e.target.value)}
            error={err('/deviceRatingA')}
          />
          <datalist id="common-ratings">
            {COMMON_RATINGS_A.map((r) => (
              <option key={r} value={r} />
            ))}
          </datalist>
          <SelectField
            label="Device"
            value={kind}
            onChange={(e) => setKind(e.target.value as DeviceKind)}
            error={err('/deviceKind')}
          >
            {Object.entries(deviceKindLabels).map(([value, text]) => (
              <option key={value} value={value}>
                {text}
              </option>
            ))}
          </SelectField>
          <TextField
            label="Conductor size"
            value={conductorSize}
            onChange={(e) => setConductorSize(e.target.value)}
            hint='e.g. "12 AWG" or "2.5 mm2"'
            error={err('/conductorSize')}
          />
          <SelectField
            label="Conductor material"
            value={material}
            onChange={(e) => setMaterial(e.target.value as '' | 'cu' | 'al')}
          >
            <option value="cu">Copper</option>
            <option value="al">Aluminium</option>
            <option value="">Not recorded</option>
          </SelectField>
        </div>
        <CheckboxField
          label="Also feeds lighting or other outlets"
          hint="Changes the limits for fastened-in-place equipment (NEC 210.23)"
          checked={feedsOther}
          onChange={(e) => setFeedsOther(e.target.checked)}
        />
        <SelectField
          label="NEC edition cited"
          value={edition}
          onChange={(e) => setEdition(e.target.value === '2020' ? 2020 : 2023)}
          hint="Clause numbers differ between editions"
        >
          <option value={2023}>NFPA 70, 2023</option>
          <option value={2020}>NFPA 70, 2020</option>
        </SelectField>
        <TextAreaField label="Notes" rows={2} value={notes} onChange={(e) => setNotes(e.target.value)} />
        <FormFooter mutation={save} onCancel={onClose} submitLabel="Save circuit" canSubmit={label.trim() !== ''} />
      </form>
    </Dialog>
  );
}
