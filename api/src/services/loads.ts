import { randomUUID } from 'node:crypto';
import { Op, type Transaction } from 'sequelize';
import type { Scope } from '../auth/scope.js';
import type { Db } from '../db/open.js';
import { invalid, notFound } from '../errors/problem.js';
import type { Load } from '../models/load.js';
import type { CircuitsService } from './circuits.js';
import { loadFigureProblems, type LoadFigures } from './load-figures.js';
import { afterCursor, toPage, type Page } from './pagination.js';

export interface LoadInput extends LoadFigures {
  notes?: string | null | undefined;
  /** Traces recorded on this load; replaces the previous links when given. */
  traceIds?: string[] | undefined;
}

export interface LoadView {
  id: string;
  circuitId: string;
  name: string;
  nameplateA: number | null;
  nameplateW: number | null;
  powerFactor: number | null;
  connection: Load['connection'];
  continuous: boolean;
  motorHp: number | null;
  lockedRotorCode: string | null;
  startPeakA: number | null;
  startDurationS: number | null;
  notes: string | null;
  traceIds: string[];
  createdAt: string;
  updatedAt: string;
}

function toView(load: Load, traceIds: string[]): LoadView {
  return {
    id: load.id,
    circuitId: load.circuitId,
    name: load.name,
    nameplateA: load.nameplateA,
    nameplateW: load.nameplateW,
    powerFactor: load.powerFactor,
    connection: load.connection,
    continuous: load.continuous,
    motorHp: load.motorHp,
    lockedRotorCode: load.lockedRotorCode,
    startPeakA: load.startPeakA ?? null,
    startDurationS: load.startDurationS ?? null,
    notes: load.notes,
    traceIds,
    createdAt: load.createdAt.toISOString(),
    updatedAt: load.updatedAt.toISOString(),
  };
}

/** Stored columns of a patch: fields present in the patch, with null for cleared ones. */
function patchColumns(input: Partial<LoadInput>) {
  const columns: Record<string, unknown> = {};
  for (const key of [
    'name', 'nameplateA', 'nameplateW', 'powerFactor', 'connection', 'continuous', 'motorHp', 'lockedRotorCode',
    'startPeakA', 'startDurationS', 'notes',
  ] as const) {
    if (key in input) columns[key] = input[key] ?? null;
  }
  return columns;
}

export function createLoadsService(db: Db, circuits: CircuitsService) {
  const { Load, Trace } = db.models;

  async function find(scope: Scope, id: string): Promise<Load> {
    const load = await Load.findOne({ where: { id, organisationId: scope.organisationId } });
    if (!load) throw notFound(`Load ${id}`);
    return load;
  }

  /** Ids of the traces linked to each load, in creation order. */
  async function traceIdsByLoad(scope: Scope, loadIds: string[]): Promise<Map<string, string[]>> {
    const byLoad = new Map<string, string[]>(loadIds.map((id) => [id, []]));
    if (loadIds.length === 0) return byLoad;
    const traces = await Trace.findAll({
      attributes: ['id', 'loadId'],
      where: { organisationId: scope.organisationId, loadId: { [Op.in]: loadIds } },
      order: [['createdAt', 'ASC'], ['id', 'ASC']],
    });
    for (const t of traces) if (t.loadId) byLoad.get(t.loadId)?.push(t.id);
    return byLoad;
  }

  /** 400 naming each trace id that is not a trace of the caller's organisation. */
  async function assertTracesExist(scope: Scope, traceIds: string[], transaction: Transaction): Promise<void> {
    const found = await Trace.findAll({
      attributes: ['id'],
      where: { organisationId: scope.organisationId, id: { [Op.in]: traceIds } },
      transaction,
    });
    const known = new Set(found.map((t) => t.id));
    const problems = traceIds.flatMap((id, i) => (known.has(id) ? [] : [{ pointer: `/traceIds/${i}`, detail: `no trace ${id} in your organisation` }]));
    if (problems.length > 0) throw invalid(problems);
  }

  /**
   * Makes exactly `traceIds` the traces linked to the load. A linked trace moves to the load's circuit and site
   * too, so a trace never names a load on another circuit (unlinked traces keep their circuit).
   */
  async function linkTraces(
    scope: Scope,
    load: { id: string; circuitId: string; siteId: string },
    traceIds: string[],
    transaction: Transaction,
  ): Promise<void> {
    const org = scope.organisationId;
    await Trace.update(
      { loadId: null },
      { where: { organisationId: org, loadId: load.id, ...(traceIds.length ? { id: { [Op.notIn]: traceIds } } : {}) }, transaction },
    );
    if (traceIds.length > 0) {
      await Trace.update(
        { loadId: load.id, circuitId: load.circuitId, siteId: load.siteId },
        { where: { organisationId: org, id: { [Op.in]: traceIds } }, transaction },
      );
    }
  }

  async function view(scope: Scope, load: Load): Promise<LoadView> {
    return toView(load, (await traceIdsByLoad(scope, [load.id])).get(load.id) ?? []);
  }

  return {
    find,

    async list(scope: Scope, circuitId: string, opts: { limit: number; cursor?: string | undefined }): Promise<Page<LoadView>> {
      await circuits.find(scope, circuitId);
      const where = { organisationId: scope.organisationId, circuitId };
      const rows = await Load.findAll({
        where: { ...where, ...afterCursor(opts.cursor) },
        order: [['createdAt', 'ASC'], ['id', 'ASC']],
        limit: opts.limit + 1,
      });
      const total = await Load.count({ where });
      const traces = await traceIdsByLoad(scope, rows.map((r) => r.id));
      return toPage(rows, opts.limit, total, (r) => toView(r, traces.get(r.id) ?? []));
    },

    /** Every load of a circuit with its linked traces (for the headroom check and reports). */
    async allOfCircuit(scope: Scope, circuitId: string): Promise<LoadView[]> {
      const rows = await Load.findAll({
        where: { organisationId: scope.organisationId, circuitId },
        order: [['createdAt', 'ASC'], ['id', 'ASC']],
      });
      const traces = await traceIdsByLoad(scope, rows.map((r) => r.id));
      return rows.map((r) => toView(r, traces.get(r.id) ?? []));
    },

    async get(scope: Scope, id: string): Promise<LoadView> {
      return view(scope, await find(scope, id));
    },

    async create(scope: Scope, circuitId: string, input: LoadInput): Promise<LoadView> {
      const circuit = await circuits.find(scope, circuitId);
      const traceIds = input.traceIds ?? [];
      const problems = loadFigureProblems(input, circuit.nominalVoltageV, { hasTraces: traceIds.length > 0 });
      if (problems.length > 0) throw invalid(problems);
      const id = randomUUID();
      const load = await db.sequelize.transaction(async (transaction) => {
        if (traceIds.length > 0) await assertTracesExist(scope, traceIds, transaction);
        const created = await Load.create(
          {
            id,
            organisationId: scope.organisationId,
            circuitId,
            name: input.name,
            nameplateA: input.nameplateA ?? null,
            nameplateW: input.nameplateW ?? null,
            powerFactor: input.powerFactor ?? null,
            connection: input.connection,
            continuous: input.continuous,
            motorHp: input.motorHp ?? null,
            lockedRotorCode: input.lockedRotorCode ?? null,
            startPeakA: input.startPeakA ?? null,
            startDurationS: input.startDurationS ?? null,
            notes: input.notes ?? null,
          },
          { transaction },
        );
        if (traceIds.length > 0) await linkTraces(scope, { id, circuitId, siteId: circuit.siteId }, traceIds, transaction);
        return created;
      });
      return view(scope, load);
    },

    async update(scope: Scope, id: string, patch: Partial<LoadInput>): Promise<LoadView> {
      const load = await find(scope, id);
      const circuit = await circuits.find(scope, load.circuitId);
      const current = await view(scope, load);
      const merged = { ...current, ...patch } as LoadInput;
      const traceIds = patch.traceIds ?? current.traceIds;
      const problems = loadFigureProblems(merged, circuit.nominalVoltageV, { hasTraces: traceIds.length > 0 });
      if (problems.length > 0) throw invalid(problems);
      await db.sequelize.transaction(async (transaction) => {
        if (patch.traceIds !== undefined) {
          if (patch.traceIds.length > 0) await assertTracesExist(scope, patch.traceIds, transaction);
          await linkTraces(scope, { id, circuitId: load.circuitId, siteId: circuit.siteId }, patch.traceIds, transaction);
        }
        await load.update(patchColumns(patch), { transaction });
      });
      return view(scope, load);
    },

    async remove(scope: Scope, id: string): Promise<void> {
      const load = await find(scope, id);
      await db.sequelize.transaction(async (transaction) => {
        // Traces outlive their load (recordings are evidence); they only lose the link.
        await Trace.update({ loadId: null }, { where: { organisationId: scope.organisationId, loadId: id }, transaction });
        await load.destroy({ transaction });
      });
    },
  };
}

export type LoadsService = ReturnType<typeof createLoadsService>;
