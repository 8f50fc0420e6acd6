import type { Config } from '../config/config.js';
import type { Db } from '../db/open.js';
import { createAnalysisService } from './analysis.js';
import { createApiKeysService } from './api-keys.js';
import { createAuditService } from './audit.js';
import { createChecksService } from './checks.js';
import { createCircuitsService } from './circuits.js';
import { createLoadsService } from './loads.js';
import { createReportsService } from './reports/index.js';
import { createSessionsService } from './sessions.js';
import { createSitesService } from './sites.js';

/** Every service, built once per app. Services are the only users of the models. */
export function createServices(db: Db, _config: Config) {
  const audit = createAuditService(db);
  const sessions = createSessionsService(db);
  const apiKeys = createApiKeysService(db, audit);
  const sites = createSitesService(db);
  const circuits = createCircuitsService(db, sites);
  const loads = createLoadsService(db, circuits);
  const checks = createChecksService({ circuits, loads });
  const reports = createReportsService({ db, sites, circuits, checks });
  const analysis = createAnalysisService();
  return { db, audit, sessions, apiKeys, sites, circuits, loads, checks, reports, analysis };
}

export type Services = ReturnType<typeof createServices>;
