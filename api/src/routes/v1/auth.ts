import { defineRoute, type RouteDefinition } from '../define-route.js';
import { InvitationAcceptBody, Me, PasswordResetBody, PasswordResetCompleteBody, SignedIn, SignInBody } from './schemas/accounts.js';

const tags = ['Accounts'];

export const authRoutes: RouteDefinition[] = [
  defineRoute(
    {
      method: 'post',
      path: '/auth/sign-in',
      operationId: 'signIn',
      summary: 'Sign in with e-mail and password',
      description: 'Starts a session of 12 hours (fixed, not extended by use). Failed attempts are limited per address (429 with Retry-After).',
      tags,
      permission: 'public',
      body: SignInBody,
      responses: { 200: { description: 'Signed in', schema: SignedIn }, 401: { description: 'Wrong e-mail or password, or a deactivated account' } },
    },
    async ({ services, body, req }) => ({ status: 200, body: await services.accounts.signIn(body, req.ip) }),
  ),
  defineRoute(
    {
      method: 'post',
      path: '/auth/sign-out',
      operationId: 'signOut',
      summary: 'End the current session',
      description: 'The session token stops working at once.',
      tags,
      permission: 'session',
      responses: { 204: { description: 'Signed out' } },
    },
    async ({ services, scope }) => {
      await services.accounts.signOut(scope);
    },
  ),
  defineRoute(
    {
      method: 'post',
      path: '/auth/password-reset',
      operationId: 'requestPasswordReset',
      summary: 'E-mail a password-reset link',
      description:
        'Always answers 202, whether or not the address has an account. The link (`/reset-password?token=…` on the dashboard) works once, for one hour. Limited per address (429 with Retry-After).',
      tags,
      permission: 'public',
      body: PasswordResetBody,
      responses: { 202: { description: 'If the address has an account, a link is on its way' } },
    },
    async ({ services, body, req }) => {
      await services.accounts.requestPasswordReset(body, req.ip);
      return { status: 202 };
    },
  ),
  defineRoute(
    {
      method: 'post',
      path: '/auth/password-reset/complete',
      operationId: 'completePasswordReset',
      summary: 'Set a new password with a reset link\'s token',
      description: 'Ends every session of the user.',
      tags,
      permission: 'public',
      body: PasswordResetCompleteBody,
      responses: { 204: { description: 'Password changed; sign in with it' } },
    },
    async ({ services, body, req }) => {
      await services.accounts.completePasswordReset(body, req.ip);
    },
  ),
  defineRoute(
    {
      method: 'post',
      path: '/auth/invitations/accept',
      operationId: 'acceptInvitation',
      summary: 'Accept an invitation: choose a name and password, and sign in',
      description: 'The token comes from the invitation link (`/accept-invitation?token=…`); it works once, for seven days.',
      tags,
      permission: 'public',
      body: InvitationAcceptBody,
      responses: { 200: { description: 'Signed in', schema: SignedIn } },
    },
    async ({ services, body, req }) => ({ status: 200, body: await services.accounts.acceptInvitation(body, req.ip) }),
  ),
  defineRoute(
    {
      method: 'get',
      path: '/me',
      operationId: 'getMe',
      summary: 'Who is calling: the user or API key, the organisation and the permissions held',
      tags,
      permission: 'self',
      responses: { 200: { description: 'The caller', schema: Me } },
    },
    async ({ services, scope }) => ({ status: 200, body: await services.accounts.me(scope) }),
  ),
];
