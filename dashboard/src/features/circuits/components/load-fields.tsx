import { CheckboxField, SelectField, TextField } from '../../../components/ui/field';
import { fieldError } from '../../../components/ui/states';
import { connectionLabels } from '../../../lib/labels';

/** The nameplate of a load as typed in a form (strings, so half-typed numbers survive). */
export interface LoadFigureDraft {
  name: string;
  nameplateA: string;
  nameplateW: string;
  powerFactor: string;
  connection: 'cord-and-plug' | 'fastened-in-place';
  continuous: boolean;
  motorHp: string;
  lockedRotorCode: string;
  startPeakA: string;
  startDurationS: string;
}

export const emptyLoadDraft: LoadFigureDraft = {
  name: '',
  nameplateA: '',
  nameplateW: '',
  powerFactor: '',
  connection: 'cord-and-plug',
  continuous: false,
  motorHp: '',
  lockedRotorCode: '',
  startPeakA: '',
  startDurationS: '',
};

const num = (v: string) => (v.trim() === '' ? null : Number(v));

/** The draft as the API's load figures (empty fields become null). */
export function loadFiguresFromDraft(d: LoadFigureDraft) {
  return {
    name: d.name.trim(),
    nameplateA: num(d.nameplateA),
    nameplateW: num(d.nameplateW),
    powerFactor: num(d.powerFactor),
    connection: d.connection,
    continuous: d.continuous,
    motorHp: num(d.motorHp),
    lockedRotorCode: d.lockedRotorCode.trim() ? d.lockedRotorCode.trim().toUpperCase() : null,
    startPeakA: num(d.startPeakA),
    startDurationS: num(d.startDurationS),
  };
}

const str = (v: number | null | undefined) => (v === null || v === undefined ? '' : String(v));

export function draftFromLoad(load: {
  name: string;
  nameplateA: number | null;
  nameplateW: number | null;
  powerFactor: number | null;
  connection: LoadFigureDraft['connection'];
  continuous: boolean;
  motorHp: number | null;
  lockedRotorCode: string | null;
  startPeakA: number | null;
  startDurationS: number | null;
}): LoadFigureDraft {
  return {
    name: load.name,
    nameplateA: str(load.nameplateA),
    nameplateW: str(load.nameplateW),
    powerFactor: str(load.powerFactor),
    connection: load.connection,
    continuous: load.continuous,
    motorHp: str(load.motorHp),
    lockedRotorCode: load.lockedRotorCode ?? '',
    startPeakA: str(load.startPeakA),
    startDurationS: str(load.startDurationS),
  };
}

/**
 * The nameplate fields of a load, shared by the load form and the what-if form. `pointerPrefix` maps
 * the server's field problems back to the inputs (e.g. `/extraLoads/0`).
 */
export function LoadFigureFields({
  draft,
  onChange,
  error,
  pointerPrefix = '',
}: {
  draft: LoadFigureDraft;
  onChange: (d: LoadFigureDraft) => void;
  error: unknown;
  pointerPrefix?: string;
}) {
  const set = <K extends keyof LoadFigureDraft>(key: K, value: LoadFigureDraft[K]) =>
    onChange({ ...draft, [key]: value });
  const err = (field: string) => fieldError(error, `${pointerPrefix}/${field}`);
  return (
    <div className="space-y-3">
      <TextField
        label="Name"
        required
        value={draft.name}
        onChange={(e) => set('name', e.target.value)}
        error={err('name')}
        placeholder="e.g. Countertop microwave"
      />
      <div className="grid grid-cols-2 gap-3">
        <TextField
          label="Nameplate current (A)"
          type="number"
          min={0}
          step="any"
          value={draft.nameplateA}
          onChange={(e) => set('nameplateA', e.target.value)}
          error={err('nameplateA')}
          hint="Amps or watts; amps win when both are given"
        />
        <TextField
          label="Nameplate power (W)"
          type="number"
          min={0}
          step="any"
          value={draft.nameplateW}
          onChange={(e) => set('nameplateW', e.target.value)}
          error={err('nameplateW')}
        />
        <TextField
          label="Power factor"
          type="number"
          min={0.01}
          max={1}
          step="0.01"
          value={draft.powerFactor}
          onChange={(e) => set('powerFactor', e.target.value)}
          error={err('powerFactor')}
          hint="For watts → amps; 1 when empty"
        />
        <SelectField
          label="Connection"
          value={draft.connection}
          onChange={(e) => set('connection', e.target.value as LoadFigureDraft['connection'])}
          hint="NEC 210.23 limits differ"
        >
          {Object.entries(connectionLabels).map(([value, text]) => (
            <option key={value} value={value}>
              {text}
            </option>
          ))}
        </SelectField>
        <TextField
          label="Motor horsepower"
          type="number"
          min={0}
          step="any"
          value={draft.motorHp}
          onChange={(e) => set('motorHp', e.target.value)}
          error={err('motorHp')}
          hint="Optional; NEC Table 430.248 when no amps"
        />
        <TextField
          label="Locked-rotor code letter"
          maxLength={1}
          value={draft.lockedRotorCode}
          onChange={(e) => set('lockedRotorCode', e.target.value)}
          error={err('lockedRotorCode')}
          hint="NEC 430.7(B), A–V"
        />
        <TextField
          label="Start-up peak (A)"
          type="number"
          min={0}
          step="any"
          value={draft.startPeakA}
          onChange={(e) => set('startPeakA', e.target.value)}
          error={err('startPeakA')}
          hint="e.g. a compressor's LRA"
        />
        <TextField
          label="Start-up duration (s)"
          type="number"
          min={0}
          step="any"
          value={draft.startDurationS}
          onChange={(e) => set('startDurationS', e.target.value)}
          error={err('startDurationS')}
        />
      </div>
      <CheckboxField
        label="Continuous load"
        hint="Maximum current expected for 3 hours or more (NEC Article 100)"
        checked={draft.continuous}
        onChange={(e) => set('continuous', e.target.checked)}
      />
    </div>
  );
}
