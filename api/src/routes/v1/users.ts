import { defineRoute, type RouteDefinition } from '../define-route.js';
import { User, UserInvite, UserListQuery, UserPage, UserParams, UserUpdate } from './schemas/accounts.js';

const tags = ['Users'];

export const userRoutes: RouteDefinition[] = [
  defineRoute(
    {
      method: 'get',
      path: '/users',
      operationId: 'listUsers',
      summary: 'List the organisation\'s users',
      tags,
      permission: 'admin',
      query: UserListQuery,
      responses: { 200: { description: 'A page of users', schema: UserPage } },
    },
    async ({ services, scope, query }) => ({ status: 200, body: await services.users.list(scope, query) }),
  ),
  defineRoute(
    {
      method: 'post',
      path: '/users',
      operationId: 'inviteUser',
      summary: 'Invite a user by e-mail',
      description:
        'Creates the user (status `invited`) and e-mails a one-time link (`/accept-invitation?token=…`, valid seven days) to choose a password. Inviting a still-pending address again sends a fresh link (200). 503 when the mail cannot be sent (nothing is kept).',
      tags,
      permission: 'admin',
      body: UserInvite,
      responses: {
        201: { description: 'Invited', schema: User },
        200: { description: 'Invitation sent again', schema: User },
        409: { description: 'The e-mail address already has an account' },
        503: { description: 'The mail server is not configured or refused the message' },
      },
    },
    async ({ services, scope, body }) => {
      const { user, created } = await services.users.invite(scope, body);
      return { status: created ? 201 : 200, body: user };
    },
  ),
  defineRoute(
    {
      method: 'get',
      path: '/users/{userId}',
      operationId: 'getUser',
      summary: 'Get a user',
      tags,
      permission: 'admin',
      params: UserParams,
      responses: { 200: { description: 'The user', schema: User } },
    },
    async ({ services, scope, params }) => ({ status: 200, body: await services.users.get(scope, params.userId) }),
  ),
  defineRoute(
    {
      method: 'patch',
      path: '/users/{userId}',
      operationId: 'updateUser',
      summary: 'Change a user\'s role, or deactivate or reactivate them',
      description: 'Deactivation ends every session of the user at once. The last active admin cannot be demoted or deactivated (409).',
      tags,
      permission: 'admin',
      params: UserParams,
      body: UserUpdate,
      responses: { 200: { description: 'The updated user', schema: User }, 409: { description: 'It would leave no active admin' } },
    },
    async ({ services, scope, params, body }) => ({ status: 200, body: await services.users.update(scope, params.userId, body) }),
  ),
];
