import { defineRoute, type RouteDefinition } from '../define-route.js';
import { AuditEventPage, AuditListQuery } from './schemas/accounts.js';

export const auditRoutes: RouteDefinition[] = [
  defineRoute(
    {
      method: 'get',
      path: '/audit-events',
      operationId: 'listAuditEvents',
      summary: 'The organisation\'s audit log, newest first',
      description: 'Sign-ins (success and failure), sign-outs, API keys created, revoked, rotated or used from a new address, users invited, role changes, deactivations, and password resets.',
      tags: ['Audit log'],
      permission: 'admin',
      query: AuditListQuery,
      responses: { 200: { description: 'A page of audit events', schema: AuditEventPage } },
    },
    async ({ services, scope, query }) => ({ status: 200, body: await services.audit.list(scope, query) }),
  ),
];
