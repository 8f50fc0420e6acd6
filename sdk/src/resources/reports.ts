import { unwrap, type HeadroomClient } from '../client.js';
import { errorFromResponse } from '../errors.js';
import type { components } from '../generated/openapi.js';
import { callInit, type RequestOptions } from './request-options.js';

export type ReportFormat = 'pdf' | 'csv';
export type ReportEmail = components['schemas']['ReportEmail'];
export type ReportEmailSent = components['schemas']['ReportEmailSent'];

/** A downloaded report: its bytes, media type and the file name the server suggests. */
export interface ReportFile {
  bytes: Uint8Array;
  contentType: string;
  filename: string;
}

async function toFile(result: Promise<{ data?: ArrayBuffer; error?: unknown; response: Response }>, fallbackName: string): Promise<ReportFile> {
  const { data, error, response } = await result;
  if (!response.ok || !data) throw errorFromResponse(response, error);
  const disposition = response.headers.get('Content-Disposition') ?? '';
  const filename = /filename="([^"]+)"/.exec(disposition)?.[1] ?? fallbackName;
  return { bytes: new Uint8Array(data), contentType: response.headers.get('Content-Type') ?? 'application/octet-stream', filename };
}

/** Reports of a circuit or a whole site, as PDF or CSV bytes, and sending a circuit's report by e-mail. */
export function reportsResource(client: HeadroomClient) {
  return {
    circuit(circuitId: string, format: ReportFormat = 'pdf', options?: RequestOptions): Promise<ReportFile> {
      return toFile(client.GET('/circuits/{circuitId}/report', { params: { path: { circuitId }, query: { format } }, parseAs: 'arrayBuffer', ...callInit(options) }), `circuit-report.${format}`);
    },
    site(siteId: string, format: ReportFormat = 'pdf', options?: RequestOptions): Promise<ReportFile> {
      return toFile(client.GET('/sites/{siteId}/report', { params: { path: { siteId }, query: { format } }, parseAs: 'arrayBuffer', ...callInit(options) }), `site-report.${format}`);
    },
    /** E-mails the circuit's PDF report to one address (HeadroomServerError 503 when mail is not set up). */
    emailCircuit(circuitId: string, email: ReportEmail, options?: RequestOptions): Promise<ReportEmailSent> {
      return unwrap(client.POST('/circuits/{circuitId}/report/email', { params: { path: { circuitId } }, body: email, ...callInit(options) }));
    },
  };
}
