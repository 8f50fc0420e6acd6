import { randomUUID } from 'node:crypto';
import { Op, type Transaction, type WhereOptions } from 'sequelize';
import type { Scope } from '../auth/scope.js';
import type { Db } from '../db/open.js';
import type { AuditEvent } from '../models/audit-event.js';
import { decodeCursor, encodeCursor, type Page } from './pagination.js';

/** Everything the audit log records. */
export const AUDIT_ACTIONS = [
  'sign-in.succeeded',
  'sign-in.failed',
  'sign-out',
  'api-key.created',
  'api-key.revoked',
  'api-key.rotated',
  'api-key.used-from-new-address',
  'user.invited',
  'user.role-changed',
  'user.deactivated',
  'user.reactivated',
  'invitation.accepted',
  'password-reset.requested',
  'password-reset.completed',
] as const;
export type AuditAction = (typeof AUDIT_ACTIONS)[number];

export interface AuditActor {
  kind: AuditEvent['actorKind'];
  id: string | null;
  label: string | null;
}

export interface AuditTarget {
  kind: 'user' | 'api-key';
  id: string;
  label: string | null;
}

export interface AuditEntry {
  organisationId: string;
  action: AuditAction;
  actor: AuditActor;
  target?: AuditTarget | undefined;
  address?: string | null | undefined;
  details?: Record<string, unknown> | undefined;
}

export interface AuditEventView {
  id: string;
  action: string;
  actor: AuditActor;
  target: AuditTarget | null;
  address: string | null;
  details: Record<string, unknown> | null;
  createdAt: string;
}

function toView(e: AuditEvent): AuditEventView {
  return {
    id: e.id,
    action: e.action,
    actor: { kind: e.actorKind, id: e.actorId, label: e.actorLabel },
    target: e.targetKind && e.targetId ? { kind: e.targetKind as AuditTarget['kind'], id: e.targetId, label: e.targetLabel } : null,
    address: e.address,
    details: e.details,
    createdAt: e.createdAt.toISOString(),
  };
}

export function createAuditService(db: Db) {
  const { AuditEvent, User, ApiKey } = db.models;

  /** The actor of a scope, with a readable label (the user's e-mail or the key's name). */
  async function actorOf(scope: Scope): Promise<AuditActor> {
    switch (scope.actor.kind) {
      case 'user': {
        const user = await User.findByPk(scope.actor.id, { attributes: ['email'] });
        return { kind: 'user', id: scope.actor.id, label: user?.email ?? null };
      }
      case 'key': {
        const key = await ApiKey.findByPk(scope.actor.id, { attributes: ['name'] });
        return { kind: 'key', id: scope.actor.id, label: key?.name ?? null };
      }
      case 'system':
        return { kind: 'system', id: null, label: 'system' };
    }
  }

  async function record(entry: AuditEntry, transaction?: Transaction): Promise<void> {
    await AuditEvent.create(
      {
        id: randomUUID(),
        organisationId: entry.organisationId,
        action: entry.action,
        actorKind: entry.actor.kind,
        actorId: entry.actor.id,
        actorLabel: entry.actor.label,
        targetKind: entry.target?.kind ?? null,
        targetId: entry.target?.id ?? null,
        targetLabel: entry.target?.label ?? null,
        address: entry.address ?? null,
        details: entry.details ?? null,
      },
      { transaction },
    );
  }

  return {
    actorOf,
    record,

    /** Organisation, actor and address of a scope, to record inside a transaction (look it up before). */
    async originOf(scope: Scope): Promise<Pick<AuditEntry, 'organisationId' | 'actor' | 'address'>> {
      return { organisationId: scope.organisationId, actor: await actorOf(scope), address: scope.address };
    },

    /** Records an action taken by the caller of `scope` (actor and address from the scope). */
    async recordFor(scope: Scope, action: AuditAction, target?: AuditTarget, details?: Record<string, unknown>) {
      await record({ organisationId: scope.organisationId, action, actor: await actorOf(scope), target, address: scope.address, details });
    },

    /** The organisation's audit log, newest first. */
    async list(scope: Scope, opts: { limit: number; cursor?: string | undefined; action?: string | undefined }): Promise<Page<AuditEventView>> {
      const where: WhereOptions = { organisationId: scope.organisationId, ...(opts.action ? { action: opts.action } : {}) };
      const before: WhereOptions = opts.cursor
        ? (() => {
            const c = decodeCursor(opts.cursor);
            return { [Op.or]: [{ createdAt: { [Op.lt]: c.createdAt } }, { createdAt: c.createdAt, id: { [Op.lt]: c.id } }] };
          })()
        : {};
      const rows = await AuditEvent.findAll({
        where: { ...where, ...before },
        order: [['createdAt', 'DESC'], ['id', 'DESC']],
        limit: opts.limit + 1,
      });
      const total = await AuditEvent.count({ where });
      const more = rows.length > opts.limit;
      const kept = more ? rows.slice(0, opts.limit) : rows;
      const last = kept[kept.length - 1];
      return { items: kept.map(toView), nextCursor: more && last ? encodeCursor(last) : null, total };
    },
  };
}

export type AuditService = ReturnType<typeof createAuditService>;
