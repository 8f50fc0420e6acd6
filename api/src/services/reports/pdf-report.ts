import PDFDocument from 'pdfkit';
import { formatCitation } from '../../analysis/code-rules/citation.js';
import type { Verdict } from '../../analysis/check/verdict.js';
import { VERDICT_LABELS } from '../checks.js';
import { drawCurrentPlot } from './pdf-plot.js';
import { toWinAnsi } from './pdf-text.js';
import type { CircuitReportData, ReportHeader, ReportPlot, SkippedCircuit } from './report-data.js';

/** Banner colours of the verdicts: Headroom's own, readable in greyscale print (dark to light by severity). */
const VERDICT_COLORS: Readonly<Record<Verdict, string>> = {
  fine: '#2e6b30',
  tight: '#8a6d00',
  'dedicated-circuit-advised': '#a04a00',
  'over-the-limit': '#9b1b1b',
};

const MARGIN = 50;
const FONT = 'Helvetica';
const BOLD = 'Helvetica-Bold';

type Doc = PDFKit.PDFDocument;

/** Amps with at most two decimals. */
export function amps(value: number | null | undefined): string {
  if (value === null || value === undefined || !Number.isFinite(value)) return '–';
  return `${Math.round(value * 100) / 100}`;
}

function seconds(value: number | null): string {
  if (value === null) return 'holds';
  if (value < 120) return `${Number(value.toPrecision(2))} s`;
  if (value < 7200) return `${Number((value / 60).toPrecision(2))} min`;
  return `${Number((value / 3600).toPrecision(2))} h`;
}

/** A thermal assessment in words: will not trip, may trip (and when the fastest or a typical device would), will trip. */
function thermalWords(t: CircuitReportData['check']['thermal']['allRunning']): string {
  if (t.outcome === 'will-not-trip') return 'will not trip';
  if (t.outcome === 'will-trip') return `will trip (${seconds(t.earliestTripS)}–${seconds(t.latestTripS)})`;
  return t.estimatedTripS === null
    ? `may trip: fastest devices only, from ${seconds(t.earliestTripS)}`
    : `may trip: typical after ${seconds(t.estimatedTripS)}`;
}

/** "2026-12-02 09:15:07.250" (UTC) for an event at epoch ms. */
function eventTime(epochMs: number): string {
  return new Date(epochMs).toISOString().slice(0, 23).replace('T', ' ');
}

/** "2026-12-02 09:15 UTC": unambiguous in any locale. */
export function formatReportDate(date: Date): string {
  return `${date.toISOString().slice(0, 16).replace('T', ' ')} UTC`;
}

function contentWidth(doc: Doc): number {
  return doc.page.width - 2 * MARGIN;
}

/** Starts a new page when less than `height` points are left. */
function ensureSpace(doc: Doc, height: number): void {
  if (doc.y + height > doc.page.height - MARGIN - 20) doc.addPage();
}

function heading(doc: Doc, text: string, size = 13): void {
  // Room for the heading and a few lines under it, so a heading never ends a page alone.
  ensureSpace(doc, size * 3 + 40);
  doc.moveDown(0.6).font(BOLD).fontSize(size).fillColor('#101010').text(toWinAnsi(text), MARGIN, doc.y);
  doc.moveDown(0.2).font(FONT).fontSize(9);
}

function paragraph(doc: Doc, text: string, options: { size?: number; color?: string; bold?: boolean } = {}): void {
  doc
    .font(options.bold ? BOLD : FONT)
    .fontSize(options.size ?? 9)
    .fillColor(options.color ?? '#202020')
    .text(toWinAnsi(text), MARGIN, doc.y, { width: contentWidth(doc) });
}

function bullets(doc: Doc, items: readonly string[]): void {
  for (const item of items) {
    ensureSpace(doc, 24);
    doc.font(FONT).fontSize(9).fillColor('#202020').text(`•  ${toWinAnsi(item)}`, MARGIN + 6, doc.y, { width: contentWidth(doc) - 6 });
    doc.moveDown(0.15);
  }
}

interface Column {
  header: string;
  width: number;
  align?: 'left' | 'right';
}

/** A table with wrapped cells; rows move to a new page (with the header repeated) when they do not fit. */
function table(doc: Doc, columns: Column[], rows: string[][]): void {
  const total = columns.reduce((s, c) => s + c.width, 0);
  const scale = contentWidth(doc) / total;
  const widths = columns.map((c) => c.width * scale);
  const drawRow = (cells: string[], bold: boolean) => {
    doc.font(bold ? BOLD : FONT).fontSize(8);
    const heights = cells.map((cell, i) => doc.heightOfString(toWinAnsi(cell), { width: widths[i]! - 4 }));
    const height = Math.max(...heights) + 4;
    if (doc.y + height > doc.page.height - MARGIN - 20) {
      doc.addPage();
      if (!bold) drawRow(columns.map((c) => c.header), true);
    }
    const y = doc.y;
    let x = MARGIN;
    cells.forEach((cell, i) => {
      doc.fillColor('#202020').text(toWinAnsi(cell), x + 2, y + 2, { width: widths[i]! - 4, align: columns[i]!.align ?? 'left' });
      x += widths[i]!;
    });
    doc.lineWidth(0.3).strokeColor(bold ? '#606060' : '#c8c8c8').moveTo(MARGIN, y + height).lineTo(MARGIN + contentWidth(doc), y + height).stroke();
    doc.x = MARGIN;
    doc.y = y + height;
  };
  drawRow(columns.map((c) => c.header), true);
  for (const row of rows) drawRow(row, false);
  doc.moveDown(0.3);
}

/** A plot with its heading and note, on a new page when less than its height is left. */
function plot(doc: Doc, p: ReportPlot): void {
  ensureSpace(doc, 250);
  heading(doc, p.title);
  const box = { x: MARGIN, y: doc.y + 4, width: contentWidth(doc), height: 200 };
  drawCurrentPlot(doc, { series: p.series, limits: p.limits, xLabel: p.xLabel, yLabel: 'current (A RMS)' }, box);
  doc.x = MARGIN;
  doc.y = box.y + box.height + 6;
  paragraph(doc, p.note, { size: 8, color: '#505050' });
}

function verdictBanner(doc: Doc, verdict: Verdict): void {
  ensureSpace(doc, 40);
  const y = doc.y + 4;
  doc.rect(MARGIN, y, contentWidth(doc), 26).fill(VERDICT_COLORS[verdict]);
  doc.font(BOLD).fontSize(14).fillColor('#ffffff').text(`Verdict: ${VERDICT_LABELS[verdict]}`, MARGIN + 10, y + 7, { lineBreak: false });
  doc.x = MARGIN;
  doc.y = y + 32;
}

/** One circuit: verdict, reasons with their rules, loads and figures, start-ups, plot, assumptions, cautions. */
function circuitSection(doc: Doc, data: CircuitReportData): void {
  const { circuit, check } = data;
  heading(doc, `Circuit: ${circuit.label}`, 15);
  verdictBanner(doc, check.verdict);
  paragraph(doc, check.summary, { size: 10 });
  doc.moveDown(0.3);
  const worst = check.startUps.reduce((m, s) => Math.max(m, s.stackedPeakA), 0);
  paragraph(
    doc,
    `Running total ${amps(check.steady.runningTotalA)} A on a ${amps(check.steady.ratingA)} A device; headroom ${amps(check.headroomA)} A ` +
      `(rating less noncontinuous load and 125 % of continuous load). Worst aligned start ${amps(worst)} A` +
      (check.startHeadroomA === null ? '.' : `, ${amps(check.startHeadroomA)} A below the instantaneous band.`),
  );

  heading(doc, 'The circuit');
  bullets(doc, [
    `Device: ${check.device.label}.`,
    `Supply ${circuit.nominalVoltageV} V, ${circuit.mainsHz} Hz; conductor ${circuit.conductorSize ?? 'not recorded'}` +
      `${circuit.conductorMaterial ? ` ${circuit.conductorMaterial === 'cu' ? 'copper' : 'aluminum'}` : ''}; ` +
      `${circuit.feedsOtherOutlets ? 'also feeds lighting or other outlets' : 'feeds no other outlets'}.`,
    `Judged against the National Electrical Code (NFPA 70), ${check.parameters.necEdition} edition.`,
    ...circuit.warnings.map((w) => `Warning: ${w.message}${w.citation ? ` (${formatCitation(w.citation)})` : ''}`),
  ]);

  heading(doc, 'Reasons');
  if (check.reasons.length === 0) paragraph(doc, 'Every rule passes with room to spare.');
  bullets(
    doc,
    check.reasons.map((r) => `[${VERDICT_LABELS[r.verdict]}] ${r.message} Rule: ${formatCitation(r.citation)}, ${r.citation.tag}.`),
  );

  heading(doc, 'Loads and their figures');
  table(
    doc,
    [
      { header: 'Load', width: 150 },
      { header: 'Running A', width: 55, align: 'right' },
      { header: 'from', width: 95 },
      { header: 'Duty', width: 70 },
      { header: 'Connection', width: 85 },
      { header: 'Start peak A', width: 60, align: 'right' },
      { header: 'from', width: 90 },
    ],
    check.loads.map((l) => [
      l.name,
      amps(l.runningA),
      l.runningSource,
      l.continuous ? 'continuous' : 'noncontinuous',
      l.connection,
      amps(l.startPeakA),
      l.startUpSource,
    ]),
  );

  const events = check.loads.flatMap((l) => l.inrushEvents.map((e) => ({ load: l.name, ...e })));
  const surges = check.loads.flatMap((l) => l.surges.map((e) => ({ load: l.name, ...e })));
  if (events.length + surges.length > 0) {
    heading(doc, 'Recorded start-ups (inrush) and surges');
    table(
      doc,
      [
        { header: 'Load', width: 130 },
        { header: 'Event', width: 45 },
        { header: 'At (UTC)', width: 105 },
        { header: 'Peak A', width: 50, align: 'right' },
        { header: 'Running A', width: 55, align: 'right' },
        { header: 'Lasts s', width: 50, align: 'right' },
        { header: 'I²t A²s', width: 65, align: 'right' },
      ],
      [
        ...events.map((e) => [e.load, 'inrush', eventTime(e.onsetAt), amps(e.peakA), amps(e.steadyA), amps(e.settleTimeS ?? e.durationS), amps(e.i2tA2s)]),
        ...surges.map((e) => [e.load, 'surge', eventTime(e.startAt), amps(e.peakA), amps(e.runningA), amps(e.durationS), amps(e.i2tA2s)]),
      ],
    );
  }

  heading(doc, 'Start-ups stacked on the running loads (worst-case alignment)');
  table(
    doc,
    [
      { header: 'Starting load', width: 150 },
      { header: 'Others running A', width: 70, align: 'right' },
      { header: 'Stacked peak A', width: 70, align: 'right' },
      { header: '× rating', width: 50, align: 'right' },
      { header: 'Instantaneous', width: 85 },
      { header: 'Thermal', width: 110 },
    ],
    check.startUps.map((s) => [
      s.startingLoad,
      amps(s.othersRunningA),
      amps(s.stackedPeakA),
      (s.stackedPeakA / check.steady.ratingA).toFixed(2),
      s.instantaneous === null ? 'none (fuse)' : s.instantaneous.outcome.replace(/-/g, ' '),
      thermalWords(s.thermal),
    ]),
  );
  const allRunning = check.thermal.allRunning;
  paragraph(
    doc,
    `All loads running together (${amps(check.steady.runningTotalA)} A, held): the thermal element ${thermalWords(allRunning)}.`,
  );

  plot(doc, data.plot);
  if (data.recorded) plot(doc, data.recorded);

  if (check.assumptions.length > 0) {
    heading(doc, 'Assumptions');
    bullets(doc, check.assumptions);
  }
  heading(doc, 'About the trip model');
  bullets(doc, check.device.notes);
  heading(doc, 'Cautions');
  bullets(doc, check.cautions.map((c) => c.text));
}

function titleBlock(doc: Doc, header: ReportHeader): void {
  doc.font(BOLD).fontSize(20).fillColor('#101010').text(toWinAnsi(header.title), MARGIN, MARGIN);
  doc.moveDown(0.3);
  const site = header.site;
  paragraph(doc, `Site: ${site.name}${site.address ? `, ${site.address}` : ''}`, { size: 10 });
  if (site.clientContact) paragraph(doc, `Client: ${site.clientContact}`, { size: 10 });
  paragraph(doc, `Prepared by ${header.preparedBy} on ${formatReportDate(header.preparedAt)}.`, { size: 10 });
  paragraph(
    doc,
    'An engineering estimate from recorded currents and nameplates, not an inspection. Local codes and the authority having jurisdiction decide.',
    { size: 8, color: '#505050' },
  );
}

function footers(doc: Doc, header: ReportHeader): void {
  const range = doc.bufferedPageRange();
  for (let i = range.start; i < range.start + range.count; i++) {
    doc.switchToPage(i);
    const text = toWinAnsi(`Headroom · ${header.site.name} · ${formatReportDate(header.preparedAt)} · page ${i + 1} of ${range.count}`);
    // Writing below the bottom margin would add a page; lift the margin while the footer is written.
    const bottom = doc.page.margins.bottom;
    doc.page.margins.bottom = 0;
    doc.font(FONT).fontSize(7).fillColor('#707070').text(text, MARGIN, doc.page.height - MARGIN + 10, { width: contentWidth(doc), align: 'center', lineBreak: false });
    doc.page.margins.bottom = bottom;
  }
}

/**
 * A PDF report of one or more circuits of a site (pdfkit, standard fonts, vector plots). With several
 * circuits, a summary table of their verdicts comes first and each circuit starts on its own page.
 */
export function renderPdfReport(header: ReportHeader, circuits: CircuitReportData[], skipped: SkippedCircuit[] = []): Promise<Buffer> {
  const doc = new PDFDocument({
    size: 'A4',
    margins: { top: MARGIN, bottom: MARGIN, left: MARGIN, right: MARGIN },
    bufferPages: true,
    info: { Title: header.title, Author: header.preparedBy, Creator: 'Headroom', CreationDate: header.preparedAt },
  });
  const chunks: Buffer[] = [];
  doc.on('data', (chunk: Buffer) => chunks.push(chunk));
  const done = new Promise<Buffer>((resolve, reject) => {
    doc.on('end', () => resolve(Buffer.concat(chunks)));
    doc.on('error', reject);
  });

  titleBlock(doc, header);
  if (circuits.length !== 1 || skipped.length > 0) {
    heading(doc, 'Circuits');
    if (circuits.length + skipped.length === 0) paragraph(doc, 'No circuits are recorded at this site.');
    else {
      table(
        doc,
        [
          { header: 'Circuit', width: 170 },
          { header: 'Device', width: 150 },
          { header: 'Verdict', width: 110 },
          { header: 'Headroom A', width: 60, align: 'right' },
        ],
        [
          ...circuits.map((c) => [c.circuit.label, c.check.device.label, c.check.verdictLabel, amps(c.check.headroomA)]),
          ...skipped.map((s) => [s.label, s.reason, 'not judged', '–']),
        ],
      );
    }
  }
  circuits.forEach((c, i) => {
    if (circuits.length > 1 || skipped.length > 0 || i > 0) doc.addPage();
    circuitSection(doc, c);
  });
  footers(doc, header);
  doc.end();
  return done;
}
