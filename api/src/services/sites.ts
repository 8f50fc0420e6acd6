import { randomUUID } from 'node:crypto';
import type { Scope } from '../auth/scope.js';
import type { Db } from '../db/open.js';
import { notFound } from '../errors/problem.js';
import type { Site } from '../models/site.js';
import { afterCursor, toPage, type Page } from './pagination.js';

export interface SiteInput {
  name: string;
  address?: string | null | undefined;
  clientContact?: string | null | undefined;
  notes?: string | null | undefined;
}

export interface SiteView {
  id: string;
  name: string;
  address: string | null;
  clientContact: string | null;
  notes: string | null;
  circuitCount: number;
  createdAt: string;
  updatedAt: string;
}

function toView(site: Site, circuitCount: number): SiteView {
  return {
    id: site.id,
    name: site.name,
    address: site.address,
    clientContact: site.clientContact,
    notes: site.notes,
    circuitCount,
    createdAt: site.createdAt.toISOString(),
    updatedAt: site.updatedAt.toISOString(),
  };
}

export function createSitesService(db: Db) {
  const { Site, Circuit } = db.models;

  async function countCircuits(scope: Scope, siteId: string) {
    return Circuit.count({ where: { organisationId: scope.organisationId, siteId } });
  }

  /** The site, or a 404 when it does not exist in the caller's organisation. */
  async function find(scope: Scope, id: string): Promise<Site> {
    const site = await Site.findOne({ where: { id, organisationId: scope.organisationId } });
    if (!site) throw notFound(`Site ${id}`);
    return site;
  }

  return {
    find,

    async list(scope: Scope, opts: { limit: number; cursor?: string | undefined; q?: string | undefined }): Promise<Page<SiteView>> {
      const where = { organisationId: scope.organisationId };
      const rows = await Site.findAll({
        where: { ...where, ...afterCursor(opts.cursor) },
        order: [['createdAt', 'ASC'], ['id', 'ASC']],
        limit: opts.limit + 1,
      });
      const total = await Site.count({ where });
      const counts = await Promise.all(rows.map((r) => countCircuits(scope, r.id)));
      const byId = new Map(rows.map((r, i) => [r.id, counts[i] ?? 0]));
      return toPage(rows, opts.limit, total, (r) => toView(r, byId.get(r.id) ?? 0));
    },

    async get(scope: Scope, id: string): Promise<SiteView> {
      const site = await find(scope, id);
      return toView(site, await countCircuits(scope, id));
    },

    async create(scope: Scope, input: SiteInput): Promise<SiteView> {
      const site = await Site.create({
        id: randomUUID(),
        organisationId: scope.organisationId,
        name: input.name,
        address: input.address ?? null,
        clientContact: input.clientContact ?? null,
        notes: input.notes ?? null,
      });
      return toView(site, 0);
    },

    async update(scope: Scope, id: string, patch: Partial<SiteInput>): Promise<SiteView> {
      const site = await find(scope, id);
      await site.update(patch);
      return toView(site, await countCircuits(scope, id));
    },

    async remove(scope: Scope, id: string): Promise<void> {
      const site = await find(scope, id);
      await site.destroy();
    },
  };
}

export type SitesService = ReturnType<typeof createSitesService>;
