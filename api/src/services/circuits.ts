import { randomUUID } from 'node:crypto';
import type { Scope } from '../auth/scope.js';
import type { Db } from '../db/open.js';
import { notFound } from '../errors/problem.js';
import type { Circuit, ConductorMaterial, DeviceKind } from '../models/circuit.js';
import { circuitWarnings, type CircuitWarning } from './circuit-warnings.js';
import { afterCursor, toPage, type Page } from './pagination.js';
import type { SitesService } from './sites.js';

export interface CircuitInput {
  label: string;
  nominalVoltageV: number;
  mainsHz: number;
  deviceRatingA: number;
  deviceKind: DeviceKind;
  conductorSize?: string | null | undefined;
  conductorMaterial?: ConductorMaterial | null | undefined;
  feedsOtherOutlets: boolean;
  necEdition: number;
  notes?: string | null | undefined;
}

export interface CircuitView extends Omit<CircuitInput, 'conductorSize' | 'conductorMaterial' | 'notes'> {
  id: string;
  siteId: string;
  conductorSize: string | null;
  conductorMaterial: ConductorMaterial | null;
  notes: string | null;
  loadCount: number;
  /** NEC 240.4(D), 240.6(A) / IEC 60898-1 ratings and trip-model scope; never blocks saving. */
  warnings: CircuitWarning[];
  createdAt: string;
  updatedAt: string;
}

function toView(c: Circuit, loadCount: number): CircuitView {
  return {
    id: c.id,
    siteId: c.siteId,
    label: c.label,
    nominalVoltageV: c.nominalVoltageV,
    mainsHz: c.mainsHz,
    deviceRatingA: c.deviceRatingA,
    deviceKind: c.deviceKind,
    conductorSize: c.conductorSize,
    conductorMaterial: c.conductorMaterial,
    feedsOtherOutlets: c.feedsOtherOutlets,
    necEdition: c.necEdition,
    notes: c.notes,
    loadCount,
    warnings: circuitWarnings(c),
    createdAt: c.createdAt.toISOString(),
    updatedAt: c.updatedAt.toISOString(),
  };
}

export function createCircuitsService(db: Db, sites: SitesService) {
  const { Circuit, Load } = db.models;

  async function countLoads(scope: Scope, circuitId: string) {
    return Load.count({ where: { organisationId: scope.organisationId, circuitId } });
  }

  async function find(scope: Scope, id: string): Promise<Circuit> {
    const circuit = await Circuit.findOne({ where: { id, organisationId: scope.organisationId } });
    if (!circuit) throw notFound(`Circuit ${id}`);
    return circuit;
  }

  return {
    find,

    async list(
      scope: Scope,
      opts: { limit: number; cursor?: string | undefined; siteId?: string | undefined },
    ): Promise<Page<CircuitView>> {
      if (opts.siteId) await sites.find(scope, opts.siteId);
      const where = { organisationId: scope.organisationId, ...(opts.siteId ? { siteId: opts.siteId } : {}) };
      const rows = await Circuit.findAll({
        where: { ...where, ...afterCursor(opts.cursor) },
        order: [['createdAt', 'ASC'], ['id', 'ASC']],
        limit: opts.limit + 1,
      });
      const total = await Circuit.count({ where });
      const counts = await Promise.all(rows.map((r) => countLoads(scope, r.id)));
      const byId = new Map(rows.map((r, i) => [r.id, counts[i] ?? 0]));
      return toPage(rows, opts.limit, total, (r) => toView(r, byId.get(r.id) ?? 0));
    },

    async get(scope: Scope, id: string): Promise<CircuitView> {
      const circuit = await find(scope, id);
      return toView(circuit, await countLoads(scope, id));
    },

    async create(scope: Scope, siteId: string, input: CircuitInput): Promise<CircuitView> {
      await sites.find(scope, siteId);
      const circuit = await Circuit.create({
        id: randomUUID(),
        organisationId: scope.organisationId,
        siteId,
        ...input,
        conductorSize: input.conductorSize ?? null,
        conductorMaterial: input.conductorMaterial ?? null,
        notes: input.notes ?? null,
      });
      return toView(circuit, 0);
    },

    async update(scope: Scope, id: string, patch: Partial<CircuitInput>): Promise<CircuitView> {
      const circuit = await find(scope, id);
      await circuit.update(patch);
      return toView(circuit, await countLoads(scope, id));
    },

    async remove(scope: Scope, id: string): Promise<void> {
      const circuit = await find(scope, id);
      await circuit.destroy();
    },
  };
}

export type CircuitsService = ReturnType<typeof createCircuitsService>;
