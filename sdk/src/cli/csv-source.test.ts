import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { UCI_FILE, UCI_PRESENT } from '../../test/reference-data.js';
import { InputFileError, planCsv, readCsvBatches, type CsvOptions, type CsvTotals } from './csv-source.js';

function tempCsv(text: string): string {
  const file = path.join(mkdtempSync(path.join(tmpdir(), 'headroom-csv-')), 'trace.csv');
  writeFileSync(file, text);
  return file;
}

async function readAll(file: string, options: CsvOptions = {}) {
  const plan = await planCsv(file, options);
  const totals: CsvTotals = { readings: 0, missing: 0, alreadyStored: 0 };
  const t: number[] = [];
  const a: number[] = [];
  let batches = 0;
  for await (const batch of readCsvBatches(file, plan, options, totals)) {
    batches += 1;
    t.push(...batch.t);
    a.push(...batch.a);
  }
  return { plan, totals, t, a, batches };
}

describe('reading a CSV export', () => {
  it.skipIf(!UCI_PRESENT)('when the UCI household file is read, then it finds its columns and gives the published figures', async () => {
    const { plan, totals, t, a, batches } = await readAll(UCI_FILE, { currentColumn: 'Global_intensity', missing: ['?'], batchSize: 10_000 });
    expect(plan).toEqual({ delimiter: ';', timeColumns: ['Date', 'Time'], currentColumn: 'Global_intensity', timeFormat: 'd/m/y' });
    // source: shared/reference-data/README.md, UCI household power subset: 48,424 rows, 48,419 readings,
    // 5 missing, 16/12/2006 17:24 to 19/01/2007 08:27, min 0.800 A, max 40.400 A, mean 7.1481 A
    expect(totals).toEqual({ readings: 48_419, missing: 5, alreadyStored: 0 });
    expect(batches).toBe(5);
    expect(t[0]).toBe(Date.UTC(2006, 11, 16, 17, 24));
    expect(t.at(-1)).toBe(Date.UTC(2007, 0, 19, 8, 27));
    expect(Math.min(...a)).toBe(0.8);
    expect(Math.max(...a)).toBe(40.4);
    expect(a.reduce((s, x) => s + x, 0) / a.length).toBeCloseTo(7.1481, 4);
  });

  it.skipIf(!UCI_PRESENT)('when resuming after a stored time, then earlier rows are counted as stored and skipped', async () => {
    const afterMs = Date.UTC(2006, 11, 16, 18, 23); // the 60th minute
    const { totals, t } = await readAll(UCI_FILE, { currentColumn: 'Global_intensity', missing: ['?'], afterMs });
    expect(totals.alreadyStored).toBe(60);
    expect(t[0]).toBe(Date.UTC(2006, 11, 16, 18, 24));
  });

  it('when the header names a time and a current column, then they are found; decimal commas are read', async () => {
    const file = tempCsv('timestamp;current (A)\n2024-03-01T08:00:00Z;1,5\n2024-03-01T08:00:01Z;2,25\n');
    const { plan, t, a } = await readAll(file, { decimalComma: true });
    expect(plan.timeColumns).toEqual(['timestamp']);
    expect(plan.currentColumn).toBe('current (A)');
    expect(t).toEqual([Date.UTC(2024, 2, 1, 8), Date.UTC(2024, 2, 1, 8, 0, 1)]);
    expect(a).toEqual([1.5, 2.25]);
  });

  it('when a current cell is not a number, then the error names its line', async () => {
    const file = tempCsv('time,amps\n0,1\n0.1,x\n');
    await expect(readAll(file, { startMs: 0 })).rejects.toThrow(new InputFileError('current "x" in column "amps" is not a number (use --missing to skip such rows)', 3));
  });

  it('when times go backwards, then the error names the line', async () => {
    const file = tempCsv('time,amps\n0,1\n0.2,1\n0.1,1\n');
    await expect(readAll(file, { startMs: 0 })).rejects.toThrow(/line 4: time "0.1" does not come after/);
  });

  it('when no current column can be found, then the error lists the columns', async () => {
    const file = tempCsv('time,volts\n0,230\n');
    await expect(planCsv(file)).rejects.toThrow(/no current column found \(columns: time, volts\)/);
  });

  it('when seconds from the start are read, then the start is required and added', async () => {
    const file = tempCsv('t,a\n0,1\n0.5,2\n');
    await expect(readAll(file)).rejects.toThrow(/give --start/);
    const { t } = await readAll(file, { startMs: 1_000 });
    expect(t).toEqual([1_000, 1_500]);
  });
});
