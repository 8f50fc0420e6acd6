import { parse } from 'csv-parse/sync';
import { describe, expect, it } from 'vitest';
import { renderCsvReport } from './csv-report.js';
import type { ReportHeader } from './report-data.js';

const header = (name: string): ReportHeader => ({
  title: 'Headroom site report',
  site: { id: 's', name, address: null, clientContact: null, notes: null, circuitCount: 0, createdAt: '', updatedAt: '' },
  preparedBy: '@admin',
  preparedAt: new Date('2026-12-02T09:15:00Z'),
});

describe('renderCsvReport', () => {
  it('when text cells start with = + - @ tab or CR, then they get a leading apostrophe', () => {
    // source: OWASP "CSV Injection" guidance: prefix cells beginning with =, +, -, @, tab (0x09) or CR (0x0D) with a single quote
    for (const dangerous of ['=HYPERLINK("http://x")', '+1+2', '-2+3', '@SUM(A1)', '\t=1', '\r=1']) {
      const rows = parse(renderCsvReport(header(dangerous), []), { columns: true, bom: true }) as Record<string, string>[];
      const site = rows[0]!.site;
      expect(site).toBe(`'${dangerous}`);
    }
    const rows = parse(renderCsvReport(header('Hall'), []), { columns: true }) as Record<string, string>[];
    expect(rows.find((r) => r.item === 'preparedBy')!.value).toBe("'@admin");
    expect(rows[0]!.site).toBe('Hall');
  });

  it('when there are no circuits, then the header rows and the cautions are still there', () => {
    const rows = parse(renderCsvReport(header('Hall'), [], [{ label: 'Feeder', reason: 'no trip model' }]), { columns: true }) as Record<string, string>[];
    expect(rows.map((r) => r.record)).toEqual(expect.arrayContaining(['report', 'circuit', 'caution']));
    expect(rows.find((r) => r.circuit === 'Feeder')).toMatchObject({ item: 'verdict', value: 'not judged', detail: 'no trip model' });
  });
});
