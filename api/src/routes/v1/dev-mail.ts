import { Problem } from '../../errors/problem.js';
import { defineRoute, type RouteDefinition } from '../define-route.js';
import { Mailbox } from './schemas/accounts.js';

export const devMailRoutes: RouteDefinition[] = [
  defineRoute(
    {
      method: 'get',
      path: '/dev/mailbox',
      operationId: 'getDevMailbox',
      summary: 'Mail received by the local fake SMTP server (development only)',
      description:
        'Only when Headroom runs its own fake SMTP server (no SMTP_URL configured): the messages about the caller\'s organisation (or addressed to its users), newest first, without attachment contents. 404 otherwise.',
      tags: ['Development'],
      permission: 'admin',
      responses: { 200: { description: 'The fake inbox', schema: Mailbox } },
    },
    async ({ services, scope }) => {
      if (!services.mailbox) throw new Problem('not-found', 'No local fake mail server runs (SMTP_URL is configured)');
      const items = (await services.users.visibleMail(scope, services.mailbox.messages()))
        .reverse()
        .map(({ attachments, organisationId: _organisationId, ...m }) => ({ ...m, attachments: attachments.map(({ content: _content, ...a }) => a) }));
      return { status: 200, body: { items } };
    },
  ),
];
