import { clientContext, createClient, type ClientOptions } from './client.js';
import { accountResource } from './resources/account.js';
import { apiKeysResource, auditEventsResource, usersResource } from './resources/admin.js';
import { analyzeCall } from './resources/analyze.js';
import { checksResource } from './resources/checks.js';
import { circuitsResource } from './resources/circuits.js';
import { loadsResource } from './resources/loads.js';
import { reportsResource } from './resources/reports.js';
import { sitesResource } from './resources/sites.js';
import { tracesResource } from './resources/traces.js';

export type HeadroomOptions = ClientOptions;

/**
 * The ergonomic SDK: one object per resource, typed from openapi.yaml, with retries, idempotency keys,
 * async-iterator lists and typed errors. `headroom.client` is the underlying typed client for any
 * route without a helper.
 *
 * ```ts
 * const headroom = createHeadroom({ baseUrl: 'http://localhost:3000', token: process.env.HEADROOM_KEY });
 * for await (const site of headroom.sites.list()) console.log(site.name);
 * ```
 */
export function createHeadroom(options: HeadroomOptions) {
  const client = createClient(options);
  const context = clientContext(options);
  return {
    client,
    context,
    /** Traces: create, append samples (batched, binary for uniform series), close, stats, series, events, export, CSV import. */
    traces: tracesResource(client, context),
    sites: sitesResource(client),
    circuits: circuitsResource(client),
    loads: loadsResource(client),
    /** The headroom check of a circuit, and what-if checks with extra loads. */
    checks: checksResource(client),
    /** Reports of a circuit or a site as PDF or CSV bytes. */
    reports: reportsResource(client),
    analyze: analyzeCall(client),
    account: accountResource(client),
    users: usersResource(client),
    apiKeys: apiKeysResource(client),
    auditEvents: auditEventsResource(client),
  };
}

export type Headroom = ReturnType<typeof createHeadroom>;
