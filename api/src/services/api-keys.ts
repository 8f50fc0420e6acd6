import type { Logger } from 'pino';
import { Op, UniqueConstraintError } from 'sequelize';
import type { Scope } from '../auth/scope.js';
import { formatApiKey, hashSecret, newApiKeyId, parseApiKey, randomSecret, sameHash } from '../auth/secrets.js';
import type { Db } from '../db/open.js';
import { conflict, invalid, notFound } from '../errors/problem.js';
import type { ApiKey, KeyScope } from '../models/api-key.js';
import type { AuditService } from './audit.js';
import { afterCursor, toPage, type Page } from './pagination.js';
import type { RefusalReason } from './sessions.js';

/** `lastUsedAt` is written at most this often per key, so busy ingest keys do not write on every request. */
const LAST_USED_RESOLUTION_MS = 60_000;
/**
 * A key found valid is trusted for this long without reading it again, so a busy ingest key costs no
 * database read per request. Revoking or rotating through this process takes effect at once; through
 * another process (several servers on one PostgreSQL database) within this time.
 */
const VERIFIED_KEY_TTL_MS = 5_000;
const VERIFIED_KEYS_KEPT = 10_000;

export interface ApiKeyInput {
  name: string;
  scopes: KeyScope[];
  expiresAt?: Date | null | undefined;
}

export interface ApiKeyView {
  id: string;
  name: string;
  scopes: KeyScope[];
  /** The start of the key as shown once (`hrk_<id>_`), to recognise it. */
  prefix: string;
  status: 'active' | 'revoked' | 'expired';
  createdBy: { id: string; name: string; email: string } | null;
  createdAt: string;
  expiresAt: string | null;
  lastUsedAt: string | null;
  lastUsedFrom: string | null;
  revokedAt: string | null;
  rotatedAt: string | null;
}

const iso = (d: Date | null) => (d ? d.toISOString() : null);

function statusOf(key: ApiKey, now: Date): ApiKeyView['status'] {
  if (key.revokedAt) return 'revoked';
  if (key.expiresAt && key.expiresAt.getTime() <= now.getTime()) return 'expired';
  return 'active';
}

export function createApiKeysService(db: Db, audit: AuditService, logger?: Logger) {
  const { ApiKey, ApiKeyAddress, User } = db.models;
  /** Recently verified keys: the row as read, the addresses known to be recorded, and until when to trust it. */
  const verified = new Map<string, { key: ApiKey; addresses: Set<string>; until: number }>();

  async function loadKey(keyId: string, now: Date): Promise<{ key: ApiKey; addresses: Set<string> } | null> {
    const cached = verified.get(keyId);
    if (cached && cached.until > now.getTime()) return cached;
    verified.delete(keyId);
    const key = await ApiKey.findByPk(keyId);
    if (!key) return null;
    const entry = { key, addresses: new Set<string>(), until: now.getTime() + VERIFIED_KEY_TTL_MS };
    if (!key.revokedAt) {
      if (verified.size >= VERIFIED_KEYS_KEPT) verified.delete(verified.keys().next().value as string);
      verified.set(keyId, entry);
    }
    return entry;
  }

  async function views(keys: ApiKey[], now = new Date()): Promise<ApiKeyView[]> {
    const creatorIds = [...new Set(keys.map((k) => k.createdByUserId).filter((id): id is string => id !== null))];
    const creators = creatorIds.length ? await User.findAll({ where: { id: creatorIds }, attributes: ['id', 'name', 'email'] }) : [];
    const byId = new Map(creators.map((u) => [u.id, { id: u.id, name: u.name, email: u.email }]));
    return keys.map((k) => ({
      id: k.id,
      name: k.name,
      scopes: k.scopes,
      prefix: formatApiKey(k.id, ''),
      status: statusOf(k, now),
      createdBy: k.createdByUserId ? (byId.get(k.createdByUserId) ?? null) : null,
      createdAt: k.createdAt.toISOString(),
      expiresAt: iso(k.expiresAt),
      lastUsedAt: iso(k.lastUsedAt),
      lastUsedFrom: k.lastUsedFrom,
      revokedAt: iso(k.revokedAt),
      rotatedAt: iso(k.rotatedAt),
    }));
  }

  async function view(key: ApiKey): Promise<ApiKeyView> {
    const [v] = await views([key]);
    return v!;
  }

  async function find(scope: Scope, id: string): Promise<ApiKey> {
    const key = await ApiKey.findOne({ where: { id, organisationId: scope.organisationId } });
    if (!key) throw notFound(`API key ${id}`);
    return key;
  }

  /** Records the address a key is used from; the first use from each address goes to the audit log. */
  async function noteAddress(key: ApiKey, addresses: Set<string>, address: string, now: Date): Promise<void> {
    const stale = !key.lastUsedAt || now.getTime() - key.lastUsedAt.getTime() >= LAST_USED_RESOLUTION_MS;
    if (addresses.has(address) && !stale && key.lastUsedFrom === address) return;
    const known = addresses.has(address) || (await ApiKeyAddress.findOne({ where: { apiKeyId: key.id, address } })) !== null;
    if (!known) {
      try {
        await ApiKeyAddress.create({ apiKeyId: key.id, address, firstSeenAt: now });
        await audit.record({
          organisationId: key.organisationId,
          action: 'api-key.used-from-new-address',
          actor: { kind: 'key', id: key.id, label: key.name },
          target: { kind: 'api-key', id: key.id, label: key.name },
          address,
        });
      } catch (err) {
        // A concurrent request from the same new address recorded it first.
        if (!(err instanceof UniqueConstraintError)) throw err;
      }
    }
    addresses.add(address);
    if (stale || key.lastUsedFrom !== address) {
      await ApiKey.update({ lastUsedAt: now, lastUsedFrom: address }, { where: { id: key.id } });
      // The cached row follows what was written (it is never saved itself).
      key.lastUsedAt = now;
      key.lastUsedFrom = address;
    }
  }

  return {
    async list(scope: Scope, opts: { limit: number; cursor?: string | undefined }): Promise<Page<ApiKeyView>> {
      const where = { organisationId: scope.organisationId };
      const rows = await ApiKey.findAll({ where: { ...where, ...afterCursor(opts.cursor) }, order: [['createdAt', 'ASC'], ['id', 'ASC']], limit: opts.limit + 1 });
      const total = await ApiKey.count({ where });
      const page = toPage(rows, opts.limit, total, (r) => r);
      return { ...page, items: await views(page.items) };
    },

    async get(scope: Scope, id: string): Promise<ApiKeyView> {
      return view(await find(scope, id));
    },

    /** Creates a key; the returned secret is the only time the full key is ever shown. */
    async create(scope: Scope, input: ApiKeyInput, now = new Date()): Promise<{ apiKey: ApiKeyView; secret: string }> {
      if (input.expiresAt && input.expiresAt.getTime() <= now.getTime()) {
        throw invalid([{ pointer: '/expiresAt', detail: 'The expiry must be in the future' }]);
      }
      const id = newApiKeyId();
      const secret = randomSecret();
      const key = await ApiKey.create({
        id,
        organisationId: scope.organisationId,
        name: input.name,
        scopes: [...new Set(input.scopes)].sort(),
        secretHash: hashSecret(secret),
        createdByUserId: scope.actor.kind === 'user' ? scope.actor.id : null,
        expiresAt: input.expiresAt ?? null,
        revokedAt: null,
        rotatedAt: null,
        lastUsedAt: null,
        lastUsedFrom: null,
        createdAt: now,
      });
      await audit.recordFor(scope, 'api-key.created', { kind: 'api-key', id, label: key.name }, { scopes: key.scopes, expiresAt: iso(key.expiresAt) });
      return { apiKey: await view(key), secret: formatApiKey(id, secret) };
    },

    /** Revokes a key; the next request with it is refused. Revoking a revoked key changes nothing. */
    async revoke(scope: Scope, id: string, now = new Date()): Promise<void> {
      const key = await find(scope, id);
      if (key.revokedAt) return;
      await key.update({ revokedAt: now });
      verified.delete(id);
      await audit.recordFor(scope, 'api-key.revoked', { kind: 'api-key', id, label: key.name });
    },

    /** Replaces the secret of a key (same id, name, scopes and expiry); the old secret stops working at once. */
    async rotate(scope: Scope, id: string, now = new Date()): Promise<{ apiKey: ApiKeyView; secret: string }> {
      const key = await find(scope, id);
      const status = statusOf(key, now);
      if (status !== 'active') throw conflict(`The API key is ${status}; create a new key instead`);
      const secret = randomSecret();
      await key.update({ secretHash: hashSecret(secret), rotatedAt: now });
      verified.delete(id);
      await audit.recordFor(scope, 'api-key.rotated', { kind: 'api-key', id, label: key.name });
      return { apiKey: await view(key), secret: formatApiKey(id, secret) };
    },

    /**
     * The caller's scope for an API key, or the reason it is refused. The key is found by its id part and
     * its secret compared in constant time; revoked and expired are only told to holders of the secret.
     */
    async verify(token: string, address: string | undefined, now = new Date()): Promise<{ scope: Scope } | { refused: RefusalReason | 'malformed' }> {
      const parsed = parseApiKey(token);
      if (!parsed) return { refused: 'malformed' };
      const found = await loadKey(parsed.keyId, now);
      const key = found?.key;
      if (!found || !key || !sameHash(hashSecret(parsed.secret), key.secretHash)) return { refused: 'unknown' };
      if (key.revokedAt) return { refused: 'revoked' };
      if (key.expiresAt && key.expiresAt.getTime() <= now.getTime()) return { refused: 'expired' };
      // Bookkeeping only: if it cannot be written (e.g. the database is busy), the key still works.
      if (address) await noteAddress(key, found.addresses, address, now).catch((err: unknown) => logger?.warn({ err, keyId: key.id }, 'API key use not recorded'));
      return {
        scope: {
          organisationId: key.organisationId,
          actor: { kind: 'key', id: key.id, scopes: key.scopes, ...(key.createdByUserId ? { createdByUserId: key.createdByUserId } : {}) },
          ...(address ? { address } : {}),
        },
      };
    },

    /** Keys still usable, for the start-up banner. */
    async isActive(id: string, now = new Date()): Promise<boolean> {
      return (await ApiKey.count({ where: { id, revokedAt: null, [Op.or]: [{ expiresAt: null }, { expiresAt: { [Op.gt]: now } }] } })) > 0;
    },
  };
}

export type ApiKeysService = ReturnType<typeof createApiKeysService>;
