import { useState, type FormEvent } from 'react';
import type { UploadProgress } from '@headroom/sdk';
import { AssignmentFields, noAssignment, type Assignment } from '../../../components/assignment-fields';
import { Button } from '../../../components/ui/button';
import { CheckboxField, SelectField, TextAreaField, TextField } from '../../../components/ui/field';
import { Panel } from '../../../components/ui/page-header';
import { ErrorState } from '../../../components/ui/states';
import { formatBytes, formatValue } from '../../../lib/format';
import { useImportTrace, type ImportFields, type ImportResult } from '../api/import-trace';
import { guessMapping, type CsvPreview } from '../utils/csv-preview';
import { readPreview } from '../utils/read-preview';

const TIME_FORMATS = [
  { value: '', label: 'Detect from the first row' },
  { value: 'iso', label: 'Date and time (ISO 8601, e.g. 2026-03-01 10:00:00.250)' },
  { value: 'd/m/y', label: 'Day/month/year with time' },
  { value: 'm/d/y', label: 'Month/day/year with time' },
  { value: 'y/m/d', label: 'Year/month/day with time' },
  { value: 'epoch-ms', label: 'Epoch milliseconds' },
  { value: 'epoch-s', label: 'Epoch seconds' },
  { value: 'seconds', label: 'Seconds from the start' },
] as const;

const DELIMITER_NAMES: Record<string, string> = { ',': 'comma', ';': 'semicolon', '\t': 'tab', '|': 'pipe' };

/** The browser's current offset from UTC as ±hh:mm (the logger most likely wrote local clock time). */
function localUtcOffset(): string {
  const minutes = -new Date().getTimezoneOffset();
  const sign = minutes >= 0 ? '+' : '-';
  return `${sign}${String(Math.floor(Math.abs(minutes) / 60)).padStart(2, '0')}:${String(Math.abs(minutes) % 60).padStart(2, '0')}`;
}

/** datetime-local input value → epoch ms (the user's zone). */
const localToEpochMs = (value: string) => new Date(value).getTime();

interface Mapping {
  timeColumn: string; // 1-based position, or '' for none (uniform rate)
  valueColumn: string;
  timeFormat: string;
  utcOffset: string;
  startLocal: string;
  rateHz: string;
  decimal: '' | 'point' | 'comma';
  unit: 'A' | 'mA' | 'mV';
  sensitivityPerA: string;
  loops: string;
}

function initialMapping(preview: CsvPreview): Mapping {
  const guess = guessMapping(preview);
  return {
    timeColumn: guess.timeColumn === null ? '' : String(guess.timeColumn + 1),
    valueColumn: guess.currentColumn === null ? '' : String(guess.currentColumn + 1),
    timeFormat: '',
    utcOffset: localUtcOffset(),
    startLocal: '',
    rateHz: '',
    decimal: preview.decimalComma ? 'comma' : '',
    unit: guess.unit,
    sensitivityPerA: guess.unit === 'mV' ? '10' : '1',
    loops: '1',
  };
}

function ProgressBar({ progress, stage }: { progress: UploadProgress | null; stage: 'uploading' | 'analysing' }) {
  const percent =
    progress && progress.totalBytes > 0
      ? Math.min(100, Math.round((progress.loadedBytes / progress.totalBytes) * 100))
      : 0;
  return (
    <div className="space-y-1.5">
      <div className="flex justify-between text-sm">
        <span className="font-medium text-ink-900">
          {stage === 'uploading' ? 'Uploading' : 'Upload complete — analysing the trace…'}
        </span>
        <span className="tabular-nums text-ink-700" data-testid="upload-percent">
          {percent} %{progress ? ` · ${formatBytes(progress.loadedBytes)} of ${formatBytes(progress.totalBytes)}` : ''}
        </span>
      </div>
      <div
        role="progressbar"
        aria-label="Upload progress"
        aria-valuemin={0}
        aria-valuemax={100}
        aria-valuenow={percent}
        className="h-3 overflow-hidden rounded-full bg-ink-100"
      >
        <div
          className="h-full rounded-full bg-amber-500 transition-[width] duration-150"
          style={{ width: `${percent}%` }}
        />
      </div>
    </div>
  );
}

/**
 * Upload of a CSV export: choose the file, see its first rows, map the columns, say how to read them
 * and where the trace belongs, then send it with a real byte progress bar.
 */
export function UploadForm({ onDone }: { onDone: (result: ImportResult) => void }) {
  const [file, setFile] = useState<File | null>(null);
  const [preview, setPreview] = useState<CsvPreview | null>(null);
  const [previewError, setPreviewError] = useState<string | null>(null);
  const [mapping, setMapping] = useState<Mapping | null>(null);
  const [name, setName] = useState('');
  const [kind, setKind] = useState<'rms' | 'waveform'>('rms');
  const [voltage, setVoltage] = useState('');
  const [hz, setHz] = useState('');
  const [assignment, setAssignment] = useState<Assignment>(noAssignment);
  const [tags, setTags] = useState('');
  const [notes, setNotes] = useState('');
  const [closeAfter, setCloseAfter] = useState(true);
  const [progress, setProgress] = useState<UploadProgress | null>(null);
  const upload = useImportTrace(setProgress);

  const choose = async (chosen: File | null) => {
    setFile(chosen);
    setPreview(null);
    setMapping(null);
    setPreviewError(null);
    upload.reset();
    setProgress(null);
    if (!chosen) return;
    setName((current) => current || chosen.name.replace(/\.[^.]+$/, ''));
    try {
      const p = await readPreview(chosen);
      setPreview(p);
      setMapping(initialMapping(p));
    } catch (e) {
      setPreviewError(e instanceof Error ? e.message : String(e));
    }
  };

  const set = <K extends keyof Mapping>(key: K, value: Mapping[K]) =>
    setMapping((m) => (m ? { ...m, [key]: value } : m));
  const usesClockTimes =
    mapping !== null &&
    mapping.timeColumn !== '' &&
    mapping.timeFormat !== 'seconds' &&
    mapping.timeFormat !== 'epoch-ms' &&
    mapping.timeFormat !== 'epoch-s';
  const needsStart = mapping !== null && (mapping.timeColumn === '' || mapping.timeFormat === 'seconds');
  const needsRate = mapping !== null && mapping.timeColumn === '';

  const submit = (e: FormEvent) => {
    e.preventDefault();
    if (!file || !mapping || !preview) return;
    const fields: ImportFields = {
      name: name.trim(),
      kind,
      inputUnit: mapping.unit,
      unit: mapping.unit,
      sensitivityPerA: mapping.sensitivityPerA,
      loops: mapping.loops,
      nominalVoltageV: voltage.trim() || undefined,
      mainsHz: hz.trim() || undefined,
      siteId: assignment.siteId || undefined,
      circuitId: assignment.circuitId || undefined,
      loadId: assignment.loadId || undefined,
      tags: tags.trim() || undefined,
      notes: notes.trim() || undefined,
      valueColumn: mapping.valueColumn,
      timeColumn: mapping.timeColumn || undefined,
      timeFormat: mapping.timeFormat || undefined,
      utcOffset: usesClockTimes ? mapping.utcOffset : undefined,
      delimiter: DELIMITER_NAMES[preview.delimiter],
      decimal: mapping.decimal || undefined,
      startTime: needsStart && mapping.startLocal ? localToEpochMs(mapping.startLocal) : undefined,
      start: needsRate && mapping.startLocal ? String(localToEpochMs(mapping.startLocal)) : undefined,
      rate: needsRate ? mapping.rateHz : undefined,
      sampleRateHz: needsRate ? mapping.rateHz : undefined,
    };
    setProgress({ loadedBytes: 0, totalBytes: file.size });
    upload.mutate({ file, fields, closeAfter }, { onSuccess: ({ result }) => onDone(result) });
  };

  const busy = upload.isPending;
  const uploaded = progress !== null && progress.totalBytes > 0 && progress.loadedBytes >= progress.totalBytes;
  const ready = Boolean(
    file &&
    mapping &&
    mapping.valueColumn &&
    name.trim() &&
    (!needsRate || Number(mapping.rateHz) > 0) &&
    (!needsStart || mapping.startLocal),
  );

  return (
    <form onSubmit={submit} className="space-y-5" aria-label="Upload a CSV export">
      <Panel title="1. Choose the file" titleId="upload-file">
        <div className="space-y-2">
          <label htmlFor="csv-file" className="block text-sm font-medium text-ink-900">
            CSV file
          </label>
          <input
            id="csv-file"
            type="file"
            accept=".csv,.txt,text/csv,text/plain"
            disabled={busy}
            onChange={(e) => void choose(e.target.files?.[0] ?? null)}
            className="block w-full text-sm file:mr-4 file:rounded-md file:border-0 file:bg-ink-800 file:px-4 file:py-2 file:text-sm file:font-medium file:text-white hover:file:bg-ink-700"
          />
          <p className="text-xs text-ink-500">
            An export from a logger, a meter or a script: one row per reading, a time column (or a fixed sample rate),
            and a current column.
          </p>
          {file ? (
            <p className="text-sm text-ink-700">
              {file.name} · {formatBytes(file.size)}
            </p>
          ) : null}
          {previewError ? (
            <p role="alert" className="text-sm text-verdict-over">
              The file could not be read: {previewError}
            </p>
          ) : null}
        </div>
      </Panel>

      {preview && mapping ? (
        <>
          <Panel title="2. Check the first rows and map the columns" titleId="upload-preview">
            <div className="max-h-72 overflow-auto rounded-lg border border-ink-100">
              <table className="w-full text-left font-mono text-xs" data-testid="csv-preview">
                <caption className="sr-only">First rows of the file</caption>
                <thead className="sticky top-0 bg-ink-100">
                  <tr>
                    {preview.columns.map((c, i) => {
                      const role =
                        String(i + 1) === mapping.timeColumn
                          ? 'time'
                          : String(i + 1) === mapping.valueColumn
                            ? 'current'
                            : null;
                      return (
                        <th key={i} scope="col" className="px-3 py-1.5 font-sans font-semibold text-ink-900">
                          {c}
                          {role ? (
                            <span
                              className={`ml-2 rounded px-1.5 py-0.5 text-[10px] uppercase ${role === 'time' ? 'bg-sky-100 text-sky-900' : 'bg-amber-100 text-ink-900'}`}
                            >
                              {role}
                            </span>
                          ) : null}
                        </th>
                      );
                    })}
                  </tr>
                </thead>
                <tbody>
                  {preview.rows.map((row, r) => (
                    <tr key={r} className="border-t border-ink-100">
                      {preview.columns.map((_, i) => (
                        <td key={i} className="whitespace-nowrap px-3 py-1">
                          {row[i] ?? ''}
                        </td>
                      ))}
                    </tr>
                  ))}
                </tbody>
              </table>
            </div>
            <p className="mt-1 text-xs text-ink-500">
              {preview.hasHeader ? 'The first line is a header.' : 'No header line found: columns are numbered.'} Fields
              separated by {DELIMITER_NAMES[preview.delimiter] ?? `"${preview.delimiter}"`}
              {preview.decimalComma ? ', decimal comma.' : '.'}
            </p>
            <div className="mt-4 grid gap-3 md:grid-cols-2 lg:grid-cols-4">
              <SelectField
                label="Time column"
                value={mapping.timeColumn}
                onChange={(e) => set('timeColumn', e.target.value)}
                disabled={busy}
              >
                <option value="">None: readings at a fixed rate</option>
                {preview.columns.map((c, i) => (
                  <option key={i} value={String(i + 1)}>
                    {c}
                  </option>
                ))}
              </SelectField>
              <SelectField
                label="Current column"
                value={mapping.valueColumn}
                onChange={(e) => set('valueColumn', e.target.value)}
                disabled={busy}
                error={mapping.valueColumn ? undefined : 'Choose the column of readings'}
              >
                <option value="">Choose…</option>
                {preview.columns.map((c, i) => (
                  <option key={i} value={String(i + 1)}>
                    {c}
                  </option>
                ))}
              </SelectField>
              {mapping.timeColumn ? (
                <SelectField
                  label="Time format"
                  value={mapping.timeFormat}
                  onChange={(e) => set('timeFormat', e.target.value)}
                  disabled={busy}
                >
                  {TIME_FORMATS.map((f) => (
                    <option key={f.value} value={f.value}>
                      {f.label}
                    </option>
                  ))}
                </SelectField>
              ) : (
                <TextField
                  label="Sample rate (Hz)"
                  type="number"
                  min={0}
                  step="any"
                  required
                  value={mapping.rateHz}
                  onChange={(e) => set('rateHz', e.target.value)}
                  hint="e.g. 2 for a reading every 0.5 s"
                  disabled={busy}
                />
              )}
              {usesClockTimes ? (
                <TextField
                  label="Clock times are at UTC offset"
                  value={mapping.utcOffset}
                  onChange={(e) => set('utcOffset', e.target.value)}
                  hint="For times written without a zone; yours now is shown"
                  disabled={busy}
                />
              ) : null}
              {needsStart ? (
                <TextField
                  label="Recording started at"
                  type="datetime-local"
                  step="0.001"
                  required
                  value={mapping.startLocal}
                  onChange={(e) => set('startLocal', e.target.value)}
                  hint="Your local time"
                  disabled={busy}
                />
              ) : null}
              <SelectField
                label="Decimal mark"
                value={mapping.decimal}
                onChange={(e) => set('decimal', e.target.value as Mapping['decimal'])}
                disabled={busy}
              >
                <option value="">Detect</option>
                <option value="point">Point (1.25)</option>
                <option value="comma">Comma (1,25)</option>
              </SelectField>
            </div>
          </Panel>

          <Panel title="3. Units and probe" titleId="upload-probe">
            <div className="grid gap-3 md:grid-cols-3">
              <SelectField
                label="Readings are in"
                value={mapping.unit}
                onChange={(e) => set('unit', e.target.value as Mapping['unit'])}
                disabled={busy}
              >
                <option value="A">Amperes (A)</option>
                <option value="mA">Milliamperes (mA)</option>
                <option value="mV">Millivolts (mV), from a voltage-output clamp</option>
              </SelectField>
              <TextField
                label={`Probe sensitivity (${mapping.unit} per A)`}
                type="number"
                min={0}
                step="any"
                required
                value={mapping.sensitivityPerA}
                onChange={(e) => set('sensitivityPerA', e.target.value)}
                hint={
                  mapping.unit === 'A'
                    ? '1 for a clamp that reads amperes'
                    : mapping.unit === 'mV'
                      ? 'e.g. 10 for a 10 mV/A clamp, 100 for 100 mV/A'
                      : 'e.g. 1 for a 1 mA/A current output'
                }
                disabled={busy}
              />
              <TextField
                label="Loops through the jaw"
                type="number"
                min={1}
                max={100}
                step={1}
                required
                value={mapping.loops}
                onChange={(e) => set('loops', e.target.value)}
                hint="10 for a ×10 loop on a line splitter: readings are divided by it"
                disabled={busy}
              />
            </div>
            <p className="mt-2 text-xs text-ink-500">
              A reading of 1 {mapping.unit} will be stored as{' '}
              {formatValue(1 / (Number(mapping.sensitivityPerA) || 1) / (Number(mapping.loops) || 1), 'A', 4)}.
            </p>
          </Panel>

          <Panel title="4. The trace" titleId="upload-trace">
            <div className="space-y-3">
              <div className="grid gap-3 md:grid-cols-4">
                <TextField
                  label="Name"
                  className="md:col-span-2"
                  required
                  value={name}
                  onChange={(e) => setName(e.target.value)}
                  disabled={busy}
                />
                <SelectField
                  label="Kind"
                  value={kind}
                  onChange={(e) => setKind(e.target.value as 'rms' | 'waveform')}
                  disabled={busy}
                  hint={
                    kind === 'rms'
                      ? 'Each reading an RMS value over its interval'
                      : 'Instantaneous values at 1 kHz or more'
                  }
                >
                  <option value="rms">RMS readings</option>
                  <option value="waveform">Waveform</option>
                </SelectField>
                <div className="grid grid-cols-2 gap-3">
                  <TextField
                    label="Voltage (V)"
                    type="number"
                    min={1}
                    step="any"
                    value={voltage}
                    onChange={(e) => setVoltage(e.target.value)}
                    hint="Circuit's if empty"
                    disabled={busy}
                  />
                  <TextField
                    label="Mains (Hz)"
                    type="number"
                    min={40}
                    max={70}
                    step="any"
                    value={hz}
                    onChange={(e) => setHz(e.target.value)}
                    disabled={busy}
                  />
                </div>
              </div>
              <AssignmentFields value={assignment} onChange={setAssignment} disabled={busy} />
              <div className="grid gap-3 md:grid-cols-2">
                <TextField
                  label="Tags"
                  value={tags}
                  onChange={(e) => setTags(e.target.value)}
                  hint="Separated by commas"
                  disabled={busy}
                />
                <TextAreaField
                  label="Notes"
                  rows={2}
                  value={notes}
                  onChange={(e) => setNotes(e.target.value)}
                  disabled={busy}
                />
              </div>
              <CheckboxField
                label="Close the trace after the upload"
                hint="Runs the full analysis (inrush events, surges, percentiles) at once; leave open to append more samples later."
                checked={closeAfter}
                onChange={(e) => setCloseAfter(e.target.checked)}
                disabled={busy}
              />
            </div>
          </Panel>

          <div className="space-y-3">
            {progress ? <ProgressBar progress={progress} stage={uploaded && busy ? 'analysing' : 'uploading'} /> : null}
            {upload.isError ? (
              <ErrorState error={upload.error} title="The upload was refused; nothing was stored" />
            ) : null}
            <Button type="submit" disabled={!ready || busy}>
              {busy ? 'Uploading…' : 'Upload'}
            </Button>
          </div>
        </>
      ) : null}
    </form>
  );
}
