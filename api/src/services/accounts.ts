import type { Logger } from 'pino';
import { PERMISSIONS, holds, type Permission } from '../auth/permissions.js';
import { hashPassword, verifyPassword } from '../auth/passwords.js';
import type { Scope } from '../auth/scope.js';
import type { Config } from '../config/config.js';
import type { Db } from '../db/open.js';
import { Problem } from '../errors/problem.js';
import { linkTo, passwordResetMessage } from '../mail/account-messages.js';
import type { Mailer } from '../mail/mailer.js';
import type { Role, User } from '../models/user.js';
import type { AuditService } from './audit.js';
import type { OneTimeTokensService } from './one-time-tokens.js';
import type { SessionsService } from './sessions.js';
import { normaliseEmail } from './users.js';

export interface SignedIn {
  token: string;
  expiresAt: string;
  user: { id: string; email: string; name: string; role: Role };
  organisation: { id: string; name: string };
}

export interface Me {
  user: { id: string; email: string; name: string; role: Role } | null;
  organisation: { id: string; name: string };
  apiKey: { id: string; name: string; scopes: string[] } | null;
  /** Every permission the caller holds (the dashboard hides what it may not do). */
  permissions: Permission[];
  /** When the caller's session ends (null for API keys). */
  sessionExpiresAt: string | null;
}

const WRONG_CREDENTIALS = 'The e-mail address or the password is wrong';

/** Sign-in and sign-out, the caller's identity, invitation acceptance and password reset. */
export function createAccountsService(deps: {
  db: Db;
  config: Config;
  mailer: Mailer;
  audit: AuditService;
  sessions: SessionsService;
  tokens: OneTimeTokensService;
  logger: Logger | undefined;
}) {
  const { db, config, mailer, audit, sessions, tokens, logger } = deps;
  const { User, Organisation, ApiKey, Session } = db.models;

  async function signedIn(user: User, session: { token: string; expiresAt: Date }): Promise<SignedIn> {
    const organisation = await Organisation.findByPk(user.organisationId);
    return {
      token: session.token,
      expiresAt: session.expiresAt.toISOString(),
      user: { id: user.id, email: user.email, name: user.name, role: user.role },
      organisation: { id: user.organisationId, name: organisation?.name ?? '' },
    };
  }

  const userActor = (user: User) => ({ kind: 'user' as const, id: user.id, label: user.email });

  return {
    /**
     * Checks e-mail and password and starts a session. A wrong e-mail and a wrong password give the same
     * answer in about the same time; failures on known accounts go to that organisation's audit log.
     */
    async signIn(input: { email: string; password: string }, address: string | undefined): Promise<SignedIn> {
      const email = normaliseEmail(input.email);
      const user = await User.findOne({ where: { email } });
      const matches = await verifyPassword(input.password, user?.passwordHash ?? null);
      if (!user) throw new Problem('unauthenticated', WRONG_CREDENTIALS);
      const failed = !matches ? 'wrong password' : !user.active ? 'account deactivated' : null;
      if (failed) {
        await audit.record({ organisationId: user.organisationId, action: 'sign-in.failed', actor: userActor(user), address, details: { reason: failed } });
        throw new Problem('unauthenticated', matches ? 'The account has been deactivated; ask an admin' : WRONG_CREDENTIALS);
      }
      const session = await sessions.create(user);
      await audit.record({ organisationId: user.organisationId, action: 'sign-in.succeeded', actor: userActor(user), address });
      return signedIn(user, session);
    },

    /** Ends the caller's session (API keys have no session to end). */
    async signOut(scope: Scope): Promise<void> {
      if (scope.actor.kind !== 'user' || !scope.actor.sessionId) throw new Problem('forbidden', 'Only a signed-in session can sign out; revoke API keys instead');
      await sessions.revoke(scope.actor.sessionId);
      await audit.recordFor(scope, 'sign-out');
    },

    async me(scope: Scope): Promise<Me> {
      const organisation = await Organisation.findByPk(scope.organisationId);
      const permissions = (Object.keys(PERMISSIONS) as Permission[]).filter((p) => p !== 'public' && holds(scope, p));
      const base = { organisation: { id: scope.organisationId, name: organisation?.name ?? '' }, permissions };
      if (scope.actor.kind === 'user') {
        const user = await User.findByPk(scope.actor.id);
        const session = scope.actor.sessionId ? await Session.findByPk(scope.actor.sessionId) : null;
        return {
          ...base,
          user: user ? { id: user.id, email: user.email, name: user.name, role: user.role } : null,
          apiKey: null,
          sessionExpiresAt: session ? session.expiresAt.toISOString() : null,
        };
      }
      if (scope.actor.kind === 'key') {
        const key = await ApiKey.findByPk(scope.actor.id);
        return { ...base, user: null, apiKey: key ? { id: key.id, name: key.name, scopes: key.scopes } : null, sessionExpiresAt: null };
      }
      return { ...base, user: null, apiKey: null, sessionExpiresAt: null };
    },

    /** Sets the invitee's name and password from an invitation link and signs them in. */
    async acceptInvitation(input: { token: string; name: string; password: string }, address: string | undefined): Promise<SignedIn> {
      const passwordHash = await hashPassword(input.password);
      const { user, session } = await db.sequelize.transaction(async (transaction) => {
        const used = await tokens.consume(input.token, 'invitation', transaction);
        const u = await User.findOne({ where: { id: used.userId, organisationId: used.organisationId }, transaction });
        if (!u?.active) throw new Problem('validation', 'The invitation is no longer valid', { errors: [{ pointer: '/token', detail: 'the account was deactivated' }] });
        await u.update({ name: input.name, passwordHash }, { transaction });
        const s = await sessions.create(u, new Date(), transaction);
        await audit.record({ organisationId: u.organisationId, action: 'invitation.accepted', actor: userActor(u), target: { kind: 'user', id: u.id, label: u.email }, address }, transaction);
        return { user: u, session: s };
      });
      return signedIn(user, session);
    },

    /**
     * E-mails a password-reset link when the address belongs to an active account. Always answers the
     * same way, and sends in the background, so the answer does not tell which addresses have accounts.
     */
    async requestPasswordReset(input: { email: string }, address: string | undefined): Promise<void> {
      const user = await User.findOne({ where: { email: normaliseEmail(input.email) } });
      if (!user?.active || user.passwordHash === null) return;
      const { token, expiresAt } = await db.sequelize.transaction((transaction) => tokens.issue(user, 'password-reset', transaction));
      await audit.record({ organisationId: user.organisationId, action: 'password-reset.requested', actor: userActor(user), target: { kind: 'user', id: user.id, label: user.email }, address });
      const message = passwordResetMessage({ to: user.email, name: user.name, link: linkTo(config.publicUrl, '/reset-password', token), expiresAt });
      mailer.send({ ...message, organisationId: user.organisationId }).catch((err: unknown) => logger?.error({ err }, 'password-reset mail was not sent'));
    },

    /** Sets a new password from a reset link and ends every session of the user. */
    async completePasswordReset(input: { token: string; password: string }, address: string | undefined): Promise<void> {
      const passwordHash = await hashPassword(input.password);
      await db.sequelize.transaction(async (transaction) => {
        const used = await tokens.consume(input.token, 'password-reset', transaction);
        const user = await User.findOne({ where: { id: used.userId, organisationId: used.organisationId }, transaction });
        if (!user?.active) throw new Problem('validation', 'The link is no longer valid', { errors: [{ pointer: '/token', detail: 'the account was deactivated' }] });
        await user.update({ passwordHash }, { transaction });
        const ended = await sessions.revokeAllOf(user.id, transaction);
        await audit.record(
          { organisationId: user.organisationId, action: 'password-reset.completed', actor: userActor(user), target: { kind: 'user', id: user.id, label: user.email }, address, details: { sessionsEnded: ended } },
          transaction,
        );
      });
    },
  };
}

export type AccountsService = ReturnType<typeof createAccountsService>;
