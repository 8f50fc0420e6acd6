import { randomUUID } from 'node:crypto';
import { Op, type WhereOptions } from 'sequelize';
import type { Scope } from '../auth/scope.js';
import type { Config } from '../config/config.js';
import type { Db } from '../db/open.js';
import { conflict, notFound } from '../errors/problem.js';
import { invitationMessage, linkTo } from '../mail/account-messages.js';
import type { Mailer } from '../mail/mailer.js';
import type { Role, User } from '../models/user.js';
import type { AuditService } from './audit.js';
import type { OneTimeTokensService } from './one-time-tokens.js';
import { afterCursor, toPage, type Page } from './pagination.js';
import type { SessionsService } from './sessions.js';

export interface UserView {
  id: string;
  email: string;
  name: string;
  role: Role;
  /** `invited` until the invitation is accepted; `deactivated` users cannot sign in. */
  status: 'invited' | 'active' | 'deactivated';
  createdAt: string;
  updatedAt: string;
}

export function toUserView(u: User): UserView {
  return {
    id: u.id,
    email: u.email,
    name: u.name,
    role: u.role,
    status: !u.active ? 'deactivated' : u.passwordHash === null ? 'invited' : 'active',
    createdAt: u.createdAt.toISOString(),
    updatedAt: u.updatedAt.toISOString(),
  };
}

/** E-mail addresses are compared without case. */
export const normaliseEmail = (email: string) => email.trim().toLowerCase();

export function createUsersService(deps: { db: Db; config: Config; mailer: Mailer; audit: AuditService; sessions: SessionsService; tokens: OneTimeTokensService }) {
  const { db, config, mailer, audit, sessions, tokens } = deps;
  const { User, Organisation } = db.models;

  async function find(scope: Scope, id: string): Promise<User> {
    const user = await User.findOne({ where: { id, organisationId: scope.organisationId } });
    if (!user) throw notFound(`User ${id}`);
    return user;
  }

  /** Admins left in the organisation after excluding one user (a team never loses its last admin). */
  async function otherActiveAdmins(scope: Scope, exceptUserId: string) {
    return User.count({ where: { organisationId: scope.organisationId, role: 'admin', active: true, id: { [Op.ne]: exceptUserId } } });
  }

  return {
    find,

    /**
     * The part of the development mailbox an organisation may see: mail tagged with the organisation, or
     * untagged mail addressed to one of its users.
     */
    async visibleMail<M extends { organisationId: string | null; to: string[] }>(scope: Scope, messages: M[]): Promise<M[]> {
      const members = new Set((await User.findAll({ where: { organisationId: scope.organisationId }, attributes: ['email'] })).map((u) => u.email));
      return messages.filter((m) => (m.organisationId ? m.organisationId === scope.organisationId : m.to.some((to) => members.has(normaliseEmail(to)))));
    },

    async list(scope: Scope, opts: { limit: number; cursor?: string | undefined; q?: string | undefined }): Promise<Page<UserView>> {
      const where: WhereOptions = {
        organisationId: scope.organisationId,
        ...(opts.q ? { [Op.or]: [{ email: { [Op.like]: `%${opts.q.toLowerCase()}%` } }, { name: { [Op.like]: `%${opts.q}%` } }] } : {}),
      };
      const rows = await User.findAll({ where: { ...where, ...afterCursor(opts.cursor) }, order: [['createdAt', 'ASC'], ['id', 'ASC']], limit: opts.limit + 1 });
      return toPage(rows, opts.limit, await User.count({ where }), toUserView);
    },

    async get(scope: Scope, id: string): Promise<UserView> {
      return toUserView(await find(scope, id));
    },

    /**
     * Invites a person: creates the user (status `invited`) and e-mails a one-time link to choose a
     * password. Inviting someone whose invitation is still pending sends a fresh link (the old one stops
     * working). If the mail cannot be sent, nothing is kept and the answer is 503.
     */
    async invite(scope: Scope, input: { email: string; name: string; role: Role }): Promise<{ user: UserView; created: boolean }> {
      const email = normaliseEmail(input.email);
      const existing = await User.findOne({ where: { email } });
      if (existing && (existing.organisationId !== scope.organisationId || existing.passwordHash !== null || !existing.active)) {
        throw conflict('A user with this e-mail address already exists');
      }
      const organisation = await Organisation.findByPk(scope.organisationId);
      const inviter = await audit.actorOf(scope);
      const { user, token, expiresAt } = await db.sequelize.transaction(async (transaction) => {
        const u = existing
          ? await existing.update({ name: input.name, role: input.role }, { transaction })
          : await User.create({ id: randomUUID(), organisationId: scope.organisationId, email, name: input.name, role: input.role, passwordHash: null }, { transaction });
        return { user: u, ...(await tokens.issue(u, 'invitation', transaction)) };
      });
      try {
        await mailer.send({
          ...invitationMessage({
            to: email,
            inviteeName: user.name,
            organisationName: organisation?.name ?? 'your organisation',
            invitedBy: inviter.kind === 'user' ? inviter.label : null,
            link: linkTo(config.publicUrl, '/accept-invitation', token),
            expiresAt,
          }),
          organisationId: scope.organisationId,
        });
      } catch (err) {
        if (!existing) await User.destroy({ where: { id: user.id } });
        throw err;
      }
      await audit.recordFor(scope, 'user.invited', { kind: 'user', id: user.id, label: email }, { role: user.role, resent: Boolean(existing) });
      return { user: toUserView(user), created: !existing };
    },

    /**
     * Changes a user's role or deactivates/reactivates them. Deactivation ends every session of the user
     * at once. The organisation's last active admin cannot be demoted or deactivated.
     */
    async update(scope: Scope, id: string, patch: { role?: Role | undefined; active?: boolean | undefined }): Promise<UserView> {
      const user = await find(scope, id);
      const losesAdmin = user.role === 'admin' && user.active && ((patch.role !== undefined && patch.role !== 'admin') || patch.active === false);
      if (losesAdmin && (await otherActiveAdmins(scope, user.id)) === 0) {
        throw conflict('The organisation needs at least one active admin; make someone else admin first');
      }
      const target = { kind: 'user' as const, id: user.id, label: user.email };
      const origin = await audit.originOf(scope);
      await db.sequelize.transaction(async (transaction) => {
        if (patch.role !== undefined && patch.role !== user.role) {
          await audit.record({ ...origin, action: 'user.role-changed', target, details: { from: user.role, to: patch.role } }, transaction);
          user.role = patch.role;
        }
        if (patch.active !== undefined && patch.active !== user.active) {
          user.active = patch.active;
          const ended = patch.active ? 0 : await sessions.revokeAllOf(user.id, transaction);
          const action = patch.active ? 'user.reactivated' : 'user.deactivated';
          await audit.record({ ...origin, action, target, details: patch.active ? undefined : { sessionsEnded: ended } }, transaction);
        }
        await user.save({ transaction });
      });
      return toUserView(user);
    },
  };
}

export type UsersService = ReturnType<typeof createUsersService>;
