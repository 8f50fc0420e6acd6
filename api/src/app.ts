import cors from 'cors';
import express, { type Express } from 'express';
import helmet from 'helmet';
import { existsSync } from 'node:fs';
import path from 'node:path';
import pino, { type Logger } from 'pino';
import swaggerUi from 'swagger-ui-express';
import { authenticate } from './auth/authenticate.js';
import { rateLimits } from './auth/rate-limits.js';
import type { Config } from './config/config.js';
import type { Db } from './db/open.js';
import type { FakeMailbox } from './mail/fake-smtp-server.js';
import { loadShedding } from './middleware/load-shedding.js';
import { notFoundHandler, problemDetails } from './middleware/problem-details.js';
import { requestLogging } from './middleware/request-logging.js';
import { buildOpenApiDocument } from './openapi/document.js';
import { mountRoutes } from './routes/define-route.js';
import { v1Routes } from './routes/v1/index.js';
import { streamsOwnBody } from './routes/v1/traces.js';
import { createServices, type Services } from './services/index.js';

export interface AppDeps {
  logger?: Logger;
  /** The local fake SMTP server's inbox, when it runs (no SMTP_URL): mail goes there, /dev/mailbox shows it. */
  mailbox?: FakeMailbox;
}

export interface HeadroomApp extends Express {
  locals: Express['locals'] & { services: Services; config: Config; logger: Logger };
}

/**
 * Builds the Express app on an open database. Never listens: the process entry (server.ts) or a test
 * does that, so every test can build its own app on its own database.
 */
export function createApp(config: Config, db: Db, deps: AppDeps = {}): HeadroomApp {
  const logger = deps.logger ?? pino({ level: config.logLevel });
  const services = createServices(db, config, { mailbox: deps.mailbox, logger });
  const app = express() as HeadroomApp;
  Object.assign(app.locals, { services, config, logger });

  app.disable('x-powered-by');
  // Client addresses (rate limits, audit log) come from the socket unless TRUST_PROXY names the proxies.
  app.set('trust proxy', config.trustProxy);
  app.set('query parser', 'simple');
  // API answers are `Cache-Control: no-store`, so an ETag would never be used, yet Express hashes every
  // body for one (a chart envelope is 60 KB). Static files keep theirs (serve-static sets its own).
  app.set('etag', false);
  // More API requests at once than the server can work on are refused first of all, cheaply, with 503.
  app.use('/api/v1', loadShedding({ maxInFlight: config.maxConcurrentRequests, logger }));
  app.use(requestLogging(logger));
  // CORS is off unless CORS_ORIGINS lists the browser origins allowed to call the API (bearer tokens,
  // no cookies, so no credentials mode).
  if (config.corsOrigins.length > 0) {
    app.use('/api', cors({ origin: config.corsOrigins, exposedHeaders: ['Retry-After', 'X-Request-Id', 'RateLimit', 'RateLimit-Policy', 'Location', 'WWW-Authenticate'], maxAge: 600 }));
  }
  app.use(
    helmet({
      contentSecurityPolicy: {
        directives: {
          // Swagger UI and the dashboard are served from this origin only; no CDN.
          'script-src': ["'self'"],
          'img-src': ["'self'", 'data:'],
          'style-src': ["'self'", "'unsafe-inline'"],
        },
      },
    }),
  );

  app.get('/healthz', (_req, res) => {
    res.json({ status: 'ok' });
  });
  app.get('/readyz', async (_req, res) => {
    try {
      await db.sequelize.query('SELECT 1');
      res.json({ status: 'ready' });
    } catch {
      res.status(503).type('application/problem+json').json({ type: '/problems/unavailable', title: 'Service unavailable', status: 503, detail: 'The database does not answer', instance: '/readyz' });
    }
  });

  const document = buildOpenApiDocument();
  app.get('/api/openapi.json', (_req, res) => {
    res.json(document);
  });
  app.use('/api/docs', swaggerUi.serve, swaggerUi.setup(document, { customSiteTitle: 'Headroom API' }));

  const v1 = express.Router();
  // Answers carry sessions, API key secrets and private data: no browser or proxy may keep them.
  v1.use((_req, res, next) => {
    res.setHeader('Cache-Control', 'no-store');
    next();
  });
  const limits = rateLimits(config);
  v1.use(limits.perAddress);
  // Account routes take small bodies; a body parsed here is not parsed again below.
  v1.use('/auth', express.json({ limit: '16kb', type: ['application/json', 'application/*+json'] }));
  const jsonBody = express.json({ limit: config.jsonBodyLimit, type: ['application/json', 'application/*+json'] });
  // Sample uploads stream their own body, whatever its size (services/traces-ingest.ts).
  v1.use((req, res, next) => (streamsOwnBody(req) ? next() : jsonBody(req, res, next)));
  v1.use(authenticate(services));
  v1.use(limits.perCaller);
  v1.post('/auth/sign-in', limits.signIn);
  v1.post('/auth/password-reset', limits.passwordReset);
  v1.post(['/auth/password-reset/complete', '/auth/invitations/accept'], limits.linkUse);
  mountRoutes(v1, v1Routes, { services, config });
  app.use('/api/v1', v1);
  app.use('/api', notFoundHandler);

  // The built dashboard, with client-side routing: unknown non-API paths get index.html.
  if (existsSync(path.join(config.dashboardDir, 'index.html'))) {
    app.use(express.static(config.dashboardDir, { index: 'index.html', maxAge: '1h' }));
    app.get(/^\/(?!api\/|healthz|readyz).*/, (_req, res) => {
      res.sendFile(path.join(config.dashboardDir, 'index.html'));
    });
  }

  app.use(notFoundHandler);
  app.use(problemDetails);
  return app;
}
