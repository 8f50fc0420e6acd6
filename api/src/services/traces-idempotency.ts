/**
 * Idempotency-Key handling for the trace POSTs (create, append samples, import, close): the first
 * request with a key stores its answer in the same transaction as its work; a retry with the same key
 * gets that answer again (status, body and `Idempotent-Replayed: true`) and stores nothing; the same key
 * sent with a different request is refused. Keys belong to the organisation and expire after
 * IDEMPOTENCY_TTL_HOURS.
 */
import { createHash, type Hash } from 'node:crypto';
import { Op } from 'sequelize';
import type { Scope } from '../auth/scope.js';
import type { Db } from '../db/open.js';
import { Problem } from '../errors/problem.js';
import type { IdempotencyRecord } from '../storage/chunk-store.js';

export const IDEMPOTENCY_TTL_HOURS = 24;
/** Longest key accepted (characters). */
export const MAX_IDEMPOTENCY_KEY_LENGTH = 255;

/** An answer given before, to give again. */
export interface Replay {
  status: number;
  body: unknown;
}

/** The key of a request and the running hash of what it asks for. */
export interface IdempotencyContext {
  key: string;
  operation: string;
  /** Running hash: a streamed body is added to it as it goes through. */
  hash: Hash;
  /** The hash's hex digest, taken once: a Hash can be digested only once, and a request may need it twice. */
  fingerprint(): string;
}

export function idempotencyContext(key: string | undefined, operation: string, describe: string): IdempotencyContext | null {
  if (key === undefined) return null;
  if (key.length === 0 || key.length > MAX_IDEMPOTENCY_KEY_LENGTH) {
    throw new Problem('validation', `Idempotency-Key must be 1 to ${MAX_IDEMPOTENCY_KEY_LENGTH} characters`, {
      errors: [{ detail: `1 to ${MAX_IDEMPOTENCY_KEY_LENGTH} characters`, parameter: 'Idempotency-Key' }],
    });
  }
  const hash = createHash('sha256');
  hash.update(`${operation}\n${describe}\n`);
  let digest: string | undefined;
  return { key, operation, hash, fingerprint: () => (digest ??= hash.digest('hex')) };
}

export function createIdempotencyStore(db: Db) {
  const { IdempotencyKey } = db.models;
  let lastSweep = 0;

  return {
    /** The stored answer for this key, or null when the key is new (expired keys are forgotten). */
    async find(scope: Scope, key: string): Promise<{ operation: string; fingerprint: string; replay: Replay } | null> {
      const now = Date.now();
      if (now - lastSweep > 3_600_000) {
        lastSweep = now;
        await IdempotencyKey.destroy({ where: { createdAt: { [Op.lt]: new Date(now - IDEMPOTENCY_TTL_HOURS * 3_600_000) } } });
      }
      const row = await IdempotencyKey.findOne({ where: { organisationId: scope.organisationId, key } });
      if (!row || row.createdAt.getTime() < now - IDEMPOTENCY_TTL_HOURS * 3_600_000) return null;
      return { operation: row.operation, fingerprint: row.fingerprint, replay: { status: row.status, body: JSON.parse(row.response) } };
    },

    /** The stored answer if the request matches the one that first used the key; a 409 when it does not. */
    checkReplay(stored: { operation: string; fingerprint: string; replay: Replay }, ctx: IdempotencyContext, fingerprint: string): Replay {
      if (stored.operation !== ctx.operation || stored.fingerprint !== fingerprint) {
        throw new Problem('conflict', 'This Idempotency-Key was already used for a different request; use a new key for a new request', {
          extensions: { idempotencyKey: ctx.key },
        });
      }
      return stored.replay;
    },

    record(scope: Scope, ctx: IdempotencyContext, fingerprint: string, status: number, body: unknown): IdempotencyRecord {
      return { organisationId: scope.organisationId, key: ctx.key, operation: ctx.operation, fingerprint, status, response: JSON.stringify(body) };
    },
  };
}

export type IdempotencyStore = ReturnType<typeof createIdempotencyStore>;

/** True for a unique-constraint failure on idempotency_keys (two requests raced with one key). */
export function isDuplicateKeyError(err: unknown): boolean {
  const text = `${(err as Error)?.name ?? ''} ${(err as Error)?.message ?? ''} ${JSON.stringify((err as { parent?: unknown })?.parent ?? '')}`;
  return /idempotency_keys/.test(text) && /unique|UNIQUE|duplicate/i.test(text);
}
