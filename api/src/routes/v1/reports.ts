import type { Response } from 'express';
import type { RenderedReport } from '../../services/reports/index.js';
import { defineRoute, type RouteDefinition } from '../define-route.js';
import { CircuitParams } from './schemas/circuits.js';
import { ReportEmail, ReportEmailSent, ReportQuery } from './schemas/reports.js';
import { SiteParams } from './schemas/sites.js';

const tags = ['Reports'];
const contentTypes = ['application/pdf', 'text/csv'];
const formats =
  'PDF: the verdict, each reason with its rule and NEC edition, the loads and their figures, the stacked start-ups, ' +
  'a plot of the worst aligned start-up drawn as vector paths, the assumptions and cautions, the date and who prepared it. ' +
  'CSV: the same figures and findings, one per row; text cells that could start a spreadsheet formula are prefixed with an apostrophe.';

function send(res: Response, report: RenderedReport): void {
  res
    .status(200)
    .type(report.contentType)
    .setHeader('Content-Disposition', `attachment; filename="${report.filename}"`)
    .setHeader('Cache-Control', 'no-store')
    .send(report.body);
}

export const reportRoutes: RouteDefinition[] = [
  defineRoute(
    {
      method: 'get',
      path: '/circuits/{circuitId}/report',
      operationId: 'getCircuitReport',
      summary: 'Report of one circuit (PDF or CSV)',
      description: formats,
      tags,
      permission: 'read',
      params: CircuitParams,
      query: ReportQuery,
      responses: {
        200: { description: 'The report as an attachment', contentTypes },
        409: { description: 'The circuit as recorded cannot be judged' },
      },
    },
    async ({ services, scope, params, query, res }) => {
      send(res, await services.reports.circuitReport(scope, params.circuitId, query.format));
    },
  ),
  defineRoute(
    {
      method: 'get',
      path: '/sites/{siteId}/report',
      operationId: 'getSiteReport',
      summary: 'Report of every circuit of a site (PDF or CSV)',
      description: `${formats} A summary of the circuits' verdicts comes first; a circuit that cannot be judged is listed with the reason.`,
      tags,
      permission: 'read',
      params: SiteParams,
      query: ReportQuery,
      responses: { 200: { description: 'The report as an attachment', contentTypes } },
    },
    async ({ services, scope, params, query, res }) => {
      send(res, await services.reports.siteReport(scope, params.siteId, query.format));
    },
  ),
  defineRoute(
    {
      method: 'post',
      path: '/circuits/{circuitId}/report/email',
      operationId: 'emailCircuitReport',
      summary: 'E-mail the PDF report of a circuit to one address',
      description:
        'Sends the circuit report (PDF attached, the verdict, reasons and cautions in the text) through the e-mail set-up ' +
        '(SMTP_URL). 503 when mail is not configured or the mail server does not accept the message.',
      tags,
      permission: 'report',
      params: CircuitParams,
      body: ReportEmail,
      responses: {
        200: { description: 'Sent: the address, subject, attachment name and verdict', schema: ReportEmailSent },
        409: { description: 'The circuit as recorded cannot be judged' },
        503: { description: 'E-mail is not configured, or the mail server refused the message' },
      },
    },
    async ({ services, scope, params, body }) => ({
      status: 200,
      body: await services.reports.emailCircuitReport(scope, params.circuitId, body),
    }),
  ),
];
