import { OpenApiGeneratorV31, OpenAPIRegistry, type RouteConfig } from '@asteasolutions/zod-to-openapi';
import { z } from 'zod';
import { PERMISSIONS } from '../auth/permissions.js';
import { PROBLEM_TYPE_LIST } from '../middleware/problem-details.js';
import type { RouteDefinition, RouteSpec } from '../routes/define-route.js';
import { ProblemDetails } from '../routes/v1/schemas/common.js';
import { v1Routes } from '../routes/v1/index.js';

const problemContent = { 'application/problem+json': { schema: ProblemDetails } };

/** Problem answers every route may give, added to each operation so clients can type them. */
function problemResponses(spec: RouteSpec): RouteConfig['responses'] {
  const r: RouteConfig['responses'] = {
    400: { description: 'Invalid request (validation or malformed body)', content: problemContent },
    429: { description: 'Too many requests; see Retry-After', content: problemContent },
    500: { description: 'Unexpected error', content: problemContent },
  };
  if (spec.permission !== 'public') {
    r[401] = { description: 'Not signed in, or the key is invalid, revoked or expired', content: problemContent };
    r[403] = { description: 'The role or key scope does not allow this', content: problemContent };
  }
  if (spec.params) r[404] = { description: 'Not found in your organisation', content: problemContent };
  return r;
}

/**
 * Which credentials an operation accepts: none for public routes, a session for permissions no API-key
 * scope holds, otherwise a session or an API key with one of the listed scopes.
 */
function securityOf(spec: RouteSpec): Array<Record<string, string[]>> {
  if (spec.permission === 'public') return [];
  const keyScopes = [...PERMISSIONS[spec.permission].keyScopes];
  return keyScopes.length ? [{ session: [] }, { apiKey: keyScopes }] : [{ session: [] }];
}

function toRouteConfig(spec: RouteSpec): RouteConfig {
  const responses: RouteConfig['responses'] = {};
  for (const [status, res] of Object.entries(spec.responses)) {
    const content: Record<string, { schema: z.ZodType | { type: string; format?: string } }> = {};
    if (res.schema) content['application/json'] = { schema: res.schema };
    for (const ct of res.contentTypes ?? []) content[ct] = { schema: { type: 'string', ...(ct.startsWith('text/') ? {} : { format: 'binary' }) } };
    responses[status] = { description: res.description, ...(Object.keys(content).length ? { content: content as never } : {}) };
  }
  const request: NonNullable<RouteConfig['request']> = {};
  if (spec.params) request.params = spec.params as never;
  if (spec.query) request.query = spec.query as never;
  if (spec.headers) request.headers = spec.headers as never;
  if (spec.body) request.body = { required: true, content: { 'application/json': { schema: spec.body } } };
  if (spec.rawBody) {
    const content: Record<string, { schema: unknown }> = {};
    for (const [ct, v] of Object.entries(spec.rawBody.contentTypes)) {
      content[ct] = { schema: v.schema ?? { type: 'string', ...(v.binary ? { format: 'binary' } : {}) } };
    }
    request.body = { required: true, description: spec.rawBody.description, content: content as never };
  }
  const access = PERMISSIONS[spec.permission];
  const who =
    spec.permission === 'public'
      ? 'No authentication.'
      : `Permission \`${spec.permission}\`: roles ${access.roles.join(', ') || 'none'}; API-key scopes ${access.keyScopes.join(', ') || 'none'}.`;
  return {
    method: spec.method,
    path: spec.path,
    operationId: spec.operationId,
    summary: spec.summary,
    description: [spec.description, who].filter(Boolean).join('\n\n'),
    tags: spec.tags,
    security: securityOf(spec),
    'x-permission': spec.permission,
    request,
    responses: { ...problemResponses(spec), ...responses },
  } as RouteConfig;
}

/** The OpenAPI 3.1 document for a set of routes (by default every /api/v1 route). */
export function buildOpenApiDocument(routes: RouteDefinition[] = v1Routes) {
  const registry = new OpenAPIRegistry();
  registry.registerComponent('securitySchemes', 'session', {
    type: 'http',
    scheme: 'bearer',
    bearerFormat: 'hrs_…',
    description: 'A session token from POST /auth/sign-in (12 hours from sign-in), as `Authorization: Bearer <token>`.',
  });
  registry.registerComponent('securitySchemes', 'apiKey', {
    type: 'http',
    scheme: 'bearer',
    bearerFormat: 'hrk_<key id>_<secret>',
    description: 'An API key made by an admin (POST /api-keys), as `Authorization: Bearer <key>`; the listed scopes are the key scopes that may call the operation.',
  });
  for (const { spec } of routes) registry.registerPath(toRouteConfig(spec));
  const generator = new OpenApiGeneratorV31(registry.definitions);
  return generator.generateDocument({
    openapi: '3.1.0',
    info: {
      title: 'Headroom API',
      version: '1.0.0',
      description: [
        'Current-trace analytics for branch circuits: ingest timed current samples, read statistics, start-up (inrush) events and a headroom check of the circuit.',
        '',
        'Errors are RFC 9457 problem details (`application/problem+json`). Problem types: ' +
          PROBLEM_TYPE_LIST.map((p) => `\`${p.type}\` (${p.status})`).join(', ') +
          '.',
        '',
        'Measurements on energised circuits are for qualified persons. Headroom\'s verdicts are engineering estimates; local codes and the authority having jurisdiction decide.',
      ].join('\n'),
    },
    servers: [{ url: '/api/v1' }],
    security: [{ session: [] }, { apiKey: [] }],
  });
}
