import type { Config } from '../config/config.js';
import type { Logger } from 'pino';
import type { Db } from '../db/open.js';
import type { FakeMailbox } from '../mail/fake-smtp-server.js';
import { createMailer } from '../mail/mailer.js';
import { createAccountsService } from './accounts.js';
import { createAnalysisService } from './analysis.js';
import { createApiKeysService } from './api-keys.js';
import { createAuditService } from './audit.js';
import { createChecksService } from './checks.js';
import { createCircuitsService } from './circuits.js';
import { createLoadsService } from './loads.js';
import { createOneTimeTokensService } from './one-time-tokens.js';
import { createReportsService } from './reports/index.js';
import { createSessionsService } from './sessions.js';
import { createSitesService } from './sites.js';
import { createTracesService } from './traces.js';
import { createUsersService } from './users.js';

/** What services need besides the database and config: the fake mailbox when it runs, a logger. */
export interface ServiceExtras {
  mailbox?: FakeMailbox | undefined;
  logger?: Logger | undefined;
}

/** Every service, built once per app. Services are the only users of the models. */
export function createServices(db: Db, config: Config, extras: ServiceExtras = {}) {
  const mailer = createMailer({ smtpUrl: config.smtpUrl ?? extras.mailbox?.url, from: config.mailFrom });
  const mailbox = extras.mailbox ?? null;
  const audit = createAuditService(db);
  const sessions = createSessionsService(db);
  const tokens = createOneTimeTokensService(db);
  const apiKeys = createApiKeysService(db, audit, extras.logger);
  const users = createUsersService({ db, config, mailer, audit, sessions, tokens });
  const accounts = createAccountsService({ db, config, mailer, audit, sessions, tokens, logger: extras.logger });
  const sites = createSitesService(db);
  const circuits = createCircuitsService(db, sites);
  const loads = createLoadsService(db, circuits);
  const traces = createTracesService(db, config);
  const checks = createChecksService({ circuits, loads, traces });
  const reports = createReportsService({ db, sites, circuits, checks, mailer, traces });
  const analysis = createAnalysisService();
  return { db, mailer, mailbox, audit, sessions, apiKeys, users, accounts, sites, circuits, loads, checks, reports, analysis, traces };
}

export type Services = ReturnType<typeof createServices>;
