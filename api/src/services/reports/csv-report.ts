import { stringify } from 'csv-stringify/sync';
import { headroomCautions } from '../../analysis/check/cautions.js';
import { formatCitation } from '../../analysis/code-rules/citation.js';
import { formatReportDate } from './pdf-report.js';
import type { CircuitReportData, ReportHeader, SkippedCircuit } from './report-data.js';

/** The columns of a CSV report: one figure, event or finding per row ("long" format, easy to filter). */
export const CSV_COLUMNS = ['record', 'site', 'circuit', 'load', 'item', 'value', 'unit', 'detail', 'citation'] as const;

type Row = Record<(typeof CSV_COLUMNS)[number], string | number | null>;

function circuitRows(site: string, data: CircuitReportData): Row[] {
  const { circuit, check } = data;
  const row = (record: string, item: string, value: string | number | null, unit: string | null, extra: Partial<Row> = {}): Row => ({
    record,
    site,
    circuit: circuit.label,
    load: null,
    item,
    value,
    unit,
    detail: null,
    citation: null,
    ...extra,
  });
  const rows: Row[] = [
    row('circuit', 'verdict', check.verdict, null, { detail: check.summary }),
    row('circuit', 'deviceRatingA', circuit.deviceRatingA, 'A', { detail: check.device.label }),
    row('circuit', 'nominalVoltageV', circuit.nominalVoltageV, 'V'),
    row('circuit', 'mainsHz', circuit.mainsHz, 'Hz'),
    row('circuit', 'necEdition', check.parameters.necEdition, null),
    row('circuit', 'runningTotalA', check.steady.runningTotalA, 'A'),
    row('circuit', 'continuousA', check.steady.continuousA, 'A'),
    row('circuit', 'fastenedInPlaceA', check.steady.fastenedInPlaceA, 'A'),
    row('circuit', 'requiredRatingA', check.steady.requiredRatingA, 'A', { detail: 'noncontinuous + 125 % of continuous' }),
    row('circuit', 'headroomA', check.headroomA, 'A'),
    row('circuit', 'startHeadroomA', check.startHeadroomA, 'A', { detail: 'below the instantaneous no-trip edge' }),
  ];
  for (const w of circuit.warnings) {
    rows.push(row('warning', w.ruleId, null, null, { detail: w.message, citation: w.citation ? formatCitation(w.citation) : null }));
  }
  for (const r of check.reasons) {
    rows.push(row('reason', r.ruleId, r.verdict, null, { load: r.loadName ?? null, detail: r.message, citation: `${formatCitation(r.citation)} (${r.citation.tag})` }));
  }
  for (const rule of check.steady.rules) {
    rows.push(row('rule', rule.ruleId, rule.actualA, 'A', { detail: `${rule.passed ? 'passed' : 'failed'}; limit ${rule.limitA} A`, citation: formatCitation(rule.citation) }));
  }
  for (const l of check.loads) {
    const load = { load: l.name };
    rows.push(row('load', 'runningA', l.runningA, 'A', { ...load, detail: l.runningSource }));
    rows.push(row('load', 'startPeakA', l.startPeakA, 'A', { ...load, detail: l.startUpSource }));
    rows.push(row('load', 'continuous', l.continuous ? 'yes' : 'no', null, load));
    rows.push(row('load', 'connection', l.connection, null, load));
    if (l.whatIf) rows.push(row('load', 'whatIf', 'yes', null, load));
    for (const traceId of l.traceIds) rows.push(row('load', 'traceId', traceId, null, load));
    for (const e of l.inrushEvents) {
      const at = { ...load, detail: `trace ${e.traceId} at ${new Date(e.onsetAt).toISOString()}` };
      rows.push(row('inrush', 'peakA', e.peakA, 'A', at));
      rows.push(row('inrush', 'steadyA', e.steadyA, 'A', at));
      rows.push(row('inrush', 'timeToPeakS', e.timeToPeakS, 's', at));
      rows.push(row('inrush', 'settleTimeS', e.settleTimeS, 's', at));
      rows.push(row('inrush', 'i2tA2s', e.i2tA2s, 'A2s', at));
    }
    for (const surge of l.surges) {
      const at = { ...load, detail: `trace ${surge.traceId} at ${new Date(surge.startAt).toISOString()}` };
      rows.push(row('surge', 'peakA', surge.peakA, 'A', at));
      rows.push(row('surge', 'durationS', surge.durationS, 's', at));
    }
  }
  for (const s of check.startUps) {
    const load = { load: s.startingLoad };
    rows.push(row('start-up', 'othersRunningA', s.othersRunningA, 'A', load));
    rows.push(row('start-up', 'stackedPeakA', s.stackedPeakA, 'A', { ...load, detail: s.basis }));
    if (s.instantaneous) {
      rows.push(row('start-up', 'instantaneous', s.instantaneous.outcome, null, { ...load, detail: `no-trip edge ${s.instantaneous.noTripA} A, trip edge ${s.instantaneous.tripA} A` }));
    }
    rows.push(row('start-up', 'thermal', s.thermal.outcome, null, { ...load, detail: `typical trip after ${s.thermal.estimatedTripS ?? 'never'} s` }));
  }
  rows.push(row('thermal', 'allRunning', check.thermal.allRunning.outcome, null, { detail: `earliest trip ${check.thermal.allRunning.earliestTripS ?? 'never'} s` }));
  for (const a of check.assumptions) rows.push(row('assumption', 'assumption', null, null, { detail: a }));
  return rows;
}

/**
 * A CSV report (RFC 4180 quoting, header row) of the figures and findings of one or more circuits, with the
 * cautions at the end. Text cells that begin with = + - @, tab or carriage return get a leading apostrophe
 * so a spreadsheet shows them as text instead of running them as formulas — source: OWASP "CSV Injection"
 * guidance; numbers are written as numbers and left alone. Escaping by csv-stringify's `escape_formulas`.
 */
export function renderCsvReport(header: ReportHeader, circuits: CircuitReportData[], skipped: SkippedCircuit[] = []): string {
  const site = header.site.name;
  const rows: Row[] = [
    { record: 'report', site, circuit: null, load: null, item: 'title', value: header.title, unit: null, detail: null, citation: null },
    { record: 'report', site, circuit: null, load: null, item: 'preparedBy', value: header.preparedBy, unit: null, detail: null, citation: null },
    { record: 'report', site, circuit: null, load: null, item: 'preparedAt', value: header.preparedAt.toISOString(), unit: null, detail: formatReportDate(header.preparedAt), citation: null },
    ...circuits.flatMap((c) => circuitRows(site, c)),
    ...skipped.map((s): Row => ({ record: 'circuit', site, circuit: s.label, load: null, item: 'verdict', value: 'not judged', unit: null, detail: s.reason, citation: null })),
  ];
  // Each circuit names its own NEC edition in its cautions: keep every distinct text once.
  const cautions = [...new Map(circuits.flatMap((c) => c.check.cautions).map((c) => [c.text, c])).values()];
  for (const c of cautions.length > 0 ? cautions : headroomCautions(2023)) rows.push({ record: 'caution', site, circuit: null, load: null, item: c.id, value: null, unit: null, detail: c.text, citation: null });
  return stringify(rows, { header: true, columns: [...CSV_COLUMNS], escape_formulas: true, record_delimiter: 'windows' });
}
