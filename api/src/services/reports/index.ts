import type { Scope } from '../../auth/scope.js';
import { Problem } from '../../errors/problem.js';
import type { Db } from '../../db/open.js';
import type { Mailer } from '../../mail/mailer.js';
import type { ChecksService } from '../checks.js';
import type { CircuitsService } from '../circuits.js';
import type { SitesService } from '../sites.js';
import type { TraceReader } from '../trace-figures.js';
import { renderCsvReport } from './csv-report.js';
import { renderPdfReport } from './pdf-report.js';
import { describePreparer, recordedTracesPlot, stackedStartPlot, type CircuitReportData, type ReportHeader, type SkippedCircuit } from './report-data.js';

export type ReportFormat = 'pdf' | 'csv';

/** A rendered report: its bytes, content type and a file name for Content-Disposition. */
export interface RenderedReport {
  body: Buffer;
  contentType: string;
  filename: string;
}

/** "Kitchen counter, left (K3)" → "kitchen-counter-left-k3": a safe file-name part. */
export function fileSlug(text: string): string {
  const slug = text
    .normalize('NFKD')
    .replace(/[^\w\s-]/g, '')
    .trim()
    .toLowerCase()
    .replace(/[\s_-]+/g, '-')
    .slice(0, 60);
  return slug || 'report';
}

function render(
  format: ReportFormat,
  header: ReportHeader,
  circuits: CircuitReportData[],
  name: string,
  skipped: SkippedCircuit[] = [],
): Promise<RenderedReport> | RenderedReport {
  const date = header.preparedAt.toISOString().slice(0, 10);
  const filename = `headroom-${fileSlug(name)}-${date}.${format}`;
  if (format === 'csv') {
    return { body: Buffer.from(renderCsvReport(header, circuits, skipped), 'utf8'), contentType: 'text/csv; charset=utf-8', filename };
  }
  return renderPdfReport(header, circuits, skipped).then((body) => ({ body, contentType: 'application/pdf', filename }));
}

/** The plain-text body of a report e-mail: the verdict, its reasons and the cautions; the PDF is attached. */
export function reportEmailText(header: ReportHeader, data: CircuitReportData, note: string | undefined): string {
  const { check } = data;
  const lines = [
    ...(note ? [note, ''] : []),
    `${header.title}`,
    `Site: ${header.site.name}${header.site.address ? `, ${header.site.address}` : ''}`,
    '',
    `Verdict: ${check.verdictLabel}`,
    check.summary,
    `Headroom left: ${Math.round(check.headroomA * 100) / 100} A of the ${check.steady.ratingA} A rating.`,
    '',
    ...(check.reasons.length > 0 ? ['Reasons:', ...check.reasons.map((r) => `- ${r.message} (${r.citation.code} ${r.citation.edition} ${r.citation.section})`), ''] : []),
    'Cautions:',
    ...check.cautions.map((c) => `- ${c.text}`),
    '',
    `Prepared by ${header.preparedBy} on ${header.preparedAt.toISOString().slice(0, 16).replace('T', ' ')} UTC. The full report is attached as a PDF.`,
  ];
  return lines.join('\n');
}

export function createReportsService(deps: {
  db: Db;
  sites: SitesService;
  circuits: CircuitsService;
  checks: ChecksService;
  mailer: Mailer;
  traces?: TraceReader | undefined;
}) {
  const { db, sites, circuits, checks, mailer, traces } = deps;

  /** A circuit's check and, for a PDF, its plots (a CSV has no use for the envelopes they read). */
  async function circuitData(scope: Scope, circuitId: string, format: ReportFormat): Promise<CircuitReportData> {
    const run = await checks.run(scope, circuitId);
    const plots = format === 'pdf';
    return {
      circuit: await circuits.get(scope, circuitId),
      check: run.view,
      plot: plots ? stackedStartPlot(run) : { title: '', note: '', series: [], limits: [], xLabel: '' },
      recorded: plots && traces ? await recordedTracesPlot(traces, scope, run) : null,
    };
  }

  async function header(scope: Scope, siteId: string, title: string): Promise<ReportHeader> {
    return { title, site: await sites.get(scope, siteId), preparedBy: await describePreparer(db, scope), preparedAt: new Date() };
  }

  /** Every circuit of a site, in creation order (pages through the circuit list). */
  async function circuitIdsOfSite(scope: Scope, siteId: string): Promise<string[]> {
    const ids: string[] = [];
    let cursor: string | undefined;
    do {
      const page = await circuits.list(scope, { siteId, limit: 500, cursor });
      ids.push(...page.items.map((c) => c.id));
      cursor = page.nextCursor ?? undefined;
    } while (cursor);
    return ids;
  }

  return {
    /** The report of one circuit: its check with the figures behind it. 404 outside the organisation. */
    async circuitReport(scope: Scope, circuitId: string, format: ReportFormat): Promise<RenderedReport> {
      const data = await circuitData(scope, circuitId, format);
      const h = await header(scope, data.circuit.siteId, `Headroom circuit report: ${data.circuit.label}`);
      return render(format, h, [data], data.circuit.label);
    },

    /**
     * Sends the circuit's PDF report to one address through the configured mailer (503 when mail is not
     * set up or the server refuses). Returns what was sent.
     */
    async emailCircuitReport(scope: Scope, circuitId: string, input: { to: string; message?: string | undefined }) {
      const data = await circuitData(scope, circuitId, 'pdf');
      const h = await header(scope, data.circuit.siteId, `Headroom circuit report: ${data.circuit.label}`);
      const pdf = await render('pdf', h, [data], data.circuit.label);
      // A label is one line in the subject whatever it holds.
      const subject = `Headroom report: ${data.circuit.label} (${h.site.name}) - ${data.check.verdictLabel}`.replace(/[\r\n]+/g, ' ');
      await mailer.send({
        to: input.to,
        subject,
        text: reportEmailText(h, data, input.message),
        attachments: [{ filename: pdf.filename, content: pdf.body, contentType: pdf.contentType }],
        // Lets the development mailbox show the message to this organisation only.
        organisationId: scope.organisationId,
      });
      return { to: input.to, subject, filename: pdf.filename, verdict: data.check.verdict };
    },

    /** The report of a site: a summary of every circuit's verdict, then each circuit in full. */
    async siteReport(scope: Scope, siteId: string, format: ReportFormat): Promise<RenderedReport> {
      const h = await header(scope, siteId, '');
      h.title = `Headroom site report: ${h.site.name}`;
      const data: CircuitReportData[] = [];
      const skipped: SkippedCircuit[] = [];
      for (const id of await circuitIdsOfSite(scope, siteId)) {
        try {
          data.push(await circuitData(scope, id, format));
        } catch (err) {
          // One circuit that cannot be judged (409) must not hide the others: it is listed with the reason.
          if (!(err instanceof Problem && err.type === 'conflict')) throw err;
          skipped.push({ label: (await circuits.get(scope, id)).label, reason: err.message });
        }
      }
      return render(format, h, data, h.site.name, skipped);
    },
  };
}

export type ReportsService = ReturnType<typeof createReportsService>;
