import { randomUUID } from 'node:crypto';
import { Op, type Transaction } from 'sequelize';
import type { Scope } from '../auth/scope.js';
import { hashSecret, newSessionToken } from '../auth/secrets.js';
import type { Db } from '../db/open.js';
import type { User } from '../models/user.js';

/**
 * Session lifetime. Fixed (not sliding): a session ends 12 hours after sign-in whatever the activity, so a
 * stolen token is useful for a bounded time and a working day needs one sign-in.
 */
export const SESSION_TTL_MS = 12 * 60 * 60 * 1000;

/** Why a token was refused (the detail of the 401). */
export type RefusalReason = 'unknown' | 'expired' | 'revoked' | 'deactivated';

export function createSessionsService(db: Db) {
  const { Session, User } = db.models;

  return {
    /** Starts a session for the user; the token is returned once and only its hash is kept. */
    async create(user: User, now = new Date(), transaction?: Transaction): Promise<{ token: string; expiresAt: Date; sessionId: string }> {
      const token = newSessionToken();
      const expiresAt = new Date(now.getTime() + SESSION_TTL_MS);
      const id = randomUUID();
      await Session.create({ id, organisationId: user.organisationId, userId: user.id, tokenHash: hashSecret(token), expiresAt, revokedAt: null, createdAt: now }, { transaction });
      return { token, expiresAt, sessionId: id };
    },

    /** The caller's scope for a session token, or the reason it is refused. */
    async verify(token: string, now = new Date()): Promise<{ scope: Scope; expiresAt: Date } | { refused: RefusalReason }> {
      const session = await Session.findOne({ where: { tokenHash: hashSecret(token) } });
      if (!session) return { refused: 'unknown' };
      if (session.revokedAt) return { refused: 'revoked' };
      if (session.expiresAt.getTime() <= now.getTime()) return { refused: 'expired' };
      const user = await User.findOne({ where: { id: session.userId, organisationId: session.organisationId } });
      if (!user?.active) return { refused: 'deactivated' };
      return {
        scope: { organisationId: user.organisationId, actor: { kind: 'user', id: user.id, role: user.role, sessionId: session.id } },
        expiresAt: session.expiresAt,
      };
    },

    /** Ends one session (sign-out). */
    async revoke(sessionId: string, now = new Date()): Promise<void> {
      await Session.update({ revokedAt: now }, { where: { id: sessionId, revokedAt: null } });
    },

    /** Ends every session of a user at once (deactivation, password reset). */
    async revokeAllOf(userId: string, transaction?: Transaction, now = new Date()): Promise<number> {
      const [count] = await Session.update({ revokedAt: now }, { where: { userId, revokedAt: null, expiresAt: { [Op.gt]: now } }, transaction });
      return count;
    },
  };
}

export type SessionsService = ReturnType<typeof createSessionsService>;
