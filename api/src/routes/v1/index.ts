import type { RouteDefinition } from '../define-route.js';
import { analyzeRoutes } from './analyze.js';
import { apiKeyRoutes } from './api-keys.js';
import { auditRoutes } from './audit.js';
import { authRoutes } from './auth.js';
import { checkRoutes } from './checks.js';
import { circuitRoutes } from './circuits.js';
import { devMailRoutes } from './dev-mail.js';
import { loadRoutes } from './loads.js';
import { reportRoutes } from './reports.js';
import { siteRoutes } from './sites.js';
import { traceRoutes } from './traces.js';
import { userRoutes } from './users.js';

/** Every /api/v1 route, in the order of the OpenAPI document. Add a new resource's routes here. */
export const v1Routes: RouteDefinition[] = [...siteRoutes, ...circuitRoutes, ...loadRoutes, ...traceRoutes, ...checkRoutes, ...reportRoutes, ...analyzeRoutes, ...authRoutes, ...userRoutes, ...apiKeyRoutes, ...auditRoutes, ...devMailRoutes];
