import { randomUUID } from 'node:crypto';
import type { Transaction } from 'sequelize';
import { hashSecret, randomSecret } from '../auth/secrets.js';
import type { Db } from '../db/open.js';
import { invalid } from '../errors/problem.js';
import type { OneTimeToken, OneTimeTokenPurpose } from '../models/one-time-token.js';
import type { User } from '../models/user.js';

/** How long e-mailed links work. */
export const TOKEN_TTL_MS: Record<OneTimeTokenPurpose, number> = {
  invitation: 7 * 24 * 60 * 60 * 1000,
  'password-reset': 60 * 60 * 1000,
};

/** Single-use, expiring tokens for e-mailed links; only their hash is stored. */
export function createOneTimeTokensService(db: Db) {
  const { OneTimeToken } = db.models;

  return {
    /** A new token for the user; earlier unused tokens of the same purpose stop working. */
    async issue(user: User, purpose: OneTimeTokenPurpose, transaction: Transaction, now = new Date()): Promise<{ token: string; expiresAt: Date }> {
      await OneTimeToken.update({ usedAt: now }, { where: { userId: user.id, purpose, usedAt: null }, transaction });
      const token = randomSecret();
      const expiresAt = new Date(now.getTime() + TOKEN_TTL_MS[purpose]);
      await OneTimeToken.create(
        { id: randomUUID(), organisationId: user.organisationId, userId: user.id, purpose, tokenHash: hashSecret(token), expiresAt, usedAt: null, createdAt: now },
        { transaction },
      );
      return { token, expiresAt };
    },

    /**
     * Uses a token up (atomically: of two concurrent uses exactly one wins) and returns it; an unknown,
     * used or expired token is a 400 pointing at `/token`.
     */
    async consume(token: string, purpose: OneTimeTokenPurpose, transaction: Transaction, now = new Date()): Promise<OneTimeToken> {
      const row = await OneTimeToken.findOne({ where: { tokenHash: hashSecret(token), purpose }, transaction });
      const refuse = (why: string) => invalid([{ pointer: '/token', detail: `The link ${why}; ask for a new one` }], `The link ${why}`);
      if (!row) throw refuse('is not valid');
      if (row.usedAt) throw refuse('has already been used');
      if (row.expiresAt.getTime() <= now.getTime()) throw refuse('has expired');
      const [changed] = await OneTimeToken.update({ usedAt: now }, { where: { id: row.id, usedAt: null }, transaction });
      if (changed !== 1) throw refuse('has already been used');
      return row;
    },
  };
}

export type OneTimeTokensService = ReturnType<typeof createOneTimeTokensService>;
