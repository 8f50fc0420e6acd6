/**
 * Traces: metadata (create, list, get, update, delete) through the Sequelize models, and the sample
 * path (append, import, close, statistics, envelopes, events, export) through the chunk store
 * (api/src/storage). See traces-ingest.ts, traces-queries.ts and traces-close.ts.
 */
import { randomUUID } from 'node:crypto';
import { Op, type Order, type WhereOptions } from 'sequelize';
import type { Scope } from '../auth/scope.js';
import type { Config } from '../config/config.js';
import type { Db } from '../db/open.js';
import { SqliteRowReader } from '../db/sqlite-row-reader.js';
import { Problem, invalid, notFound } from '../errors/problem.js';
import type { Trace, TraceKind, TraceStatus } from '../models/trace.js';
import { CachedChunkStore } from '../storage/cached-chunk-store.js';
import type { ChunkStore } from '../storage/chunk-store.js';
import { SequelizeChunkStore } from '../storage/sequelize-chunk-store.js';
import { SqliteChunkStore } from '../storage/sqlite-chunk-store.js';
import { createIdempotencyStore, idempotencyContext, isDuplicateKeyError, type Replay } from './traces-idempotency.js';
import { createTraceCloser, type AnalysisSettings } from './traces-close.js';
import { createTraceIngest } from './traces-ingest.js';
import { createTraceQueries } from './traces-queries.js';
import { KeyedQueue } from './traces-queue.js';
import { probeSettings, toTraceView, type ProbeView, type TraceView } from './traces-view.js';

export interface TraceInput {
  name: string;
  kind: TraceKind;
  probe?: ProbeView | undefined;
  nominalVoltageV?: number | null | undefined;
  mainsHz?: number | null | undefined;
  /** Epoch ms. */
  startTime?: number | null | undefined;
  sampleRateHz?: number | null | undefined;
  siteId?: string | null | undefined;
  circuitId?: string | null | undefined;
  loadId?: string | null | undefined;
  tags?: string[] | undefined;
  notes?: string | null | undefined;
}

export type TraceUpdate = Partial<Omit<TraceInput, 'kind'>>;

export const TRACE_SORTS = ['createdAt', '-createdAt', 'name', '-name', 'startTime', '-startTime'] as const;
export type TraceSort = (typeof TRACE_SORTS)[number];

export interface TraceListOptions {
  limit: number;
  cursor?: string | undefined;
  sort?: TraceSort | undefined;
  siteId?: string | undefined;
  circuitId?: string | undefined;
  loadId?: string | undefined;
  kind?: TraceKind | undefined;
  status?: TraceStatus | undefined;
  /** Epoch ms, inclusive. */
  createdFrom?: number | undefined;
  createdTo?: number | undefined;
  q?: string | undefined;
}

const DEFAULT_PROBE_VIEW: ProbeView = { inputUnit: 'A', sensitivityPerA: 1, loops: 1 };
/** A waveform holds instantaneous values sampled at 1 kHz or more (product definition). */
export const MIN_WAVEFORM_RATE_HZ = 1000;

/** Keyset cursor over (sort field, id): stable under inserts, no offsets. */
function encodeCursor(value: string | null, id: string): string {
  return Buffer.from(JSON.stringify([value, id])).toString('base64url');
}

function decodeCursor(cursor: string): [string | null, string] {
  try {
    const parsed = JSON.parse(Buffer.from(cursor, 'base64url').toString('utf8')) as unknown;
    if (Array.isArray(parsed) && parsed.length === 2 && typeof parsed[1] === 'string' && (parsed[0] === null || typeof parsed[0] === 'string')) {
      return [parsed[0], parsed[1]];
    }
  } catch {
    // fall through
  }
  throw new Problem('validation', 'The cursor is not one this API issued', { errors: [{ detail: 'invalid cursor', parameter: 'cursor' }] });
}

export function createTracesService(db: Db, config: Config) {
  const { Trace, Site, Circuit, Load } = db.models;
  const store: ChunkStore = new CachedChunkStore(db.dialect === 'postgres' ? new SequelizeChunkStore(db) : new SqliteChunkStore(db));
  const queue = new KeyedQueue();
  const idempotency = createIdempotencyStore(db);

  // Every sample batch and chart request looks its trace up: on SQLite, without Sequelize's query path.
  const rowReader = db.dialect === 'sqlite' ? new SqliteRowReader(db) : null;

  /** The trace, or a 404 when it does not exist in the caller's organisation. */
  async function find(scope: Scope, id: string): Promise<Trace> {
    const trace = rowReader
      ? await rowReader.findInOrganisation(Trace, id, scope.organisationId)
      : await Trace.findOne({ where: { id, organisationId: scope.organisationId } });
    if (!trace) throw notFound(`Trace ${id}`);
    return trace;
  }

  /** Checks the links to site, circuit and load, and fills the site and circuit from the more specific link. */
  async function resolveLinks(scope: Scope, links: { siteId?: string | null | undefined; circuitId?: string | null | undefined; loadId?: string | null | undefined }) {
    const org = scope.organisationId;
    let { siteId = null, circuitId = null } = links;
    const loadId = links.loadId ?? null;
    const errors: Array<{ detail: string; pointer: string }> = [];
    let circuit: InstanceType<typeof Circuit> | null = null;
    if (loadId) {
      const load = await Load.findOne({ where: { id: loadId, organisationId: org } });
      if (!load) errors.push({ detail: 'no such load in your organisation', pointer: '/loadId' });
      else if (circuitId && circuitId !== load.circuitId) errors.push({ detail: 'the load is on another circuit', pointer: '/circuitId' });
      else circuitId = load.circuitId;
    }
    if (circuitId) {
      circuit = await Circuit.findOne({ where: { id: circuitId, organisationId: org } });
      if (!circuit) errors.push({ detail: 'no such circuit in your organisation', pointer: '/circuitId' });
      else if (siteId && siteId !== circuit.siteId) errors.push({ detail: 'the circuit is at another site', pointer: '/siteId' });
      else siteId = circuit.siteId;
    }
    if (siteId && !circuit && !(await Site.findOne({ where: { id: siteId, organisationId: org } }))) {
      errors.push({ detail: 'no such site in your organisation', pointer: '/siteId' });
    }
    if (errors.length) throw invalid(errors);
    return { siteId, circuitId, loadId, circuit };
  }

  function checkRate(kind: TraceKind, sampleRateHz: number | null | undefined) {
    if (kind === 'waveform' && (sampleRateHz === null || sampleRateHz === undefined || sampleRateHz < MIN_WAVEFORM_RATE_HZ)) {
      throw invalid([{ detail: `a waveform trace needs its sample rate, at least ${MIN_WAVEFORM_RATE_HZ} Hz`, pointer: '/sampleRateHz' }]);
    }
  }

  /** Creates the trace row (no samples). */
  async function createTrace(scope: Scope, input: TraceInput): Promise<Trace> {
    checkRate(input.kind, input.sampleRateHz);
    const links = await resolveLinks(scope, input);
    return Trace.create({
      id: randomUUID(),
      organisationId: scope.organisationId,
      siteId: links.siteId,
      circuitId: links.circuitId,
      loadId: links.loadId,
      name: input.name,
      kind: input.kind,
      probe: probeSettings(input.probe ?? DEFAULT_PROBE_VIEW),
      nominalVoltageV: input.nominalVoltageV ?? links.circuit?.nominalVoltageV ?? null,
      mainsHz: input.mainsHz ?? links.circuit?.mainsHz ?? null,
      startTime: input.startTime === null || input.startTime === undefined ? null : new Date(input.startTime),
      sampleRateHz: input.sampleRateHz ?? null,
      tags: input.tags ?? [],
      notes: input.notes ?? null,
    });
  }

  /** Settings of the full analysis run at close (and when events are recomputed). */
  function analysisSettings(trace: Trace): AnalysisSettings {
    return { mainsFrequencyHz: trace.mainsHz, nominalVoltageV: trace.nominalVoltageV };
  }

  const closer = createTraceCloser({ db, store, analysisSettings });
  const queries = createTraceQueries({ db, store, find, closer });
  const ingest = createTraceIngest({ db, config, store, queue, idempotency, find, createTrace, closer });

  return {
    find,
    ...queries,
    append: ingest.append,
    importCsv: ingest.importCsv,

    async list(scope: Scope, opts: TraceListOptions) {
      const where: Record<string | symbol, unknown> = { organisationId: scope.organisationId };
      for (const key of ['siteId', 'circuitId', 'loadId', 'kind', 'status'] as const) {
        if (opts[key] !== undefined) where[key] = opts[key];
      }
      if (opts.createdFrom !== undefined || opts.createdTo !== undefined) {
        where.createdAt = {
          ...(opts.createdFrom !== undefined ? { [Op.gte]: new Date(opts.createdFrom) } : {}),
          ...(opts.createdTo !== undefined ? { [Op.lte]: new Date(opts.createdTo) } : {}),
        };
      }
      const conditions: WhereOptions[] = [where as WhereOptions];
      if (opts.q) {
        const like = db.dialect === 'postgres' ? Op.iLike : Op.like;
        // SQLite's LIKE has no escape character unless the statement names one, so name it for both.
        const pattern = db.sequelize.literal(`${db.sequelize.escape(`%${opts.q.replace(/[\\%_]/g, (c) => `\\${c}`)}%`)} ESCAPE '\\'`);
        const matches = (column: string) => db.sequelize.where(db.sequelize.col(column), like, pattern);
        conditions.push({ [Op.or]: [matches('name'), matches('notes')] });
      }
      const total = await Trace.count({ where: { [Op.and]: conditions } });
      const sort = opts.sort ?? '-createdAt';
      const field = sort.replace(/^-/, '') as 'createdAt' | 'name' | 'startTime';
      const descending = sort.startsWith('-');
      if (opts.cursor) {
        const [value, id] = decodeCursor(opts.cursor);
        const v = value === null ? null : field === 'name' ? value : new Date(value);
        const beyond = descending ? Op.lt : Op.gt;
        // Nulls (traces without a start time) sort last in both directions.
        conditions.push(
          v === null
            ? { [field]: null, id: { [beyond]: id } }
            : { [Op.or]: [{ [field]: { [beyond]: v } }, { [field]: v, id: { [beyond]: id } }, { [field]: null }] },
        );
      }
      const direction = descending ? 'DESC' : 'ASC';
      const order: Order = [[db.sequelize.literal(`CASE WHEN "${field}" IS NULL THEN 1 ELSE 0 END`), 'ASC'], [field, direction], ['id', direction]];
      const rows = await Trace.findAll({ where: { [Op.and]: conditions }, order, limit: opts.limit + 1 });
      const more = rows.length > opts.limit;
      const kept = more ? rows.slice(0, opts.limit) : rows;
      const last = kept[kept.length - 1];
      const cursorValue = (t: Trace): string | null => {
        const v = t[field];
        return v === null ? null : v instanceof Date ? v.toISOString() : v;
      };
      return { items: kept.map(toTraceView), nextCursor: more && last ? encodeCursor(cursorValue(last), last.id) : null, total };
    },

    async get(scope: Scope, id: string): Promise<TraceView> {
      return toTraceView(await find(scope, id));
    },

    /** Creates a trace; with an Idempotency-Key a retry returns the first answer instead of a second trace. */
    async create(scope: Scope, input: TraceInput, idempotencyKey?: string): Promise<{ status: number; body: unknown; replayed: boolean }> {
      const ctx = idempotencyContext(idempotencyKey, 'create-trace', '');
      if (!ctx) return { status: 201, body: toTraceView(await createTrace(scope, input)), replayed: false };
      ctx.hash.update(JSON.stringify(input));
      const fingerprint = ctx.fingerprint();
      const replayIfKnown = async (): Promise<Replay | null> => {
        const stored = await idempotency.find(scope, ctx.key);
        return stored ? idempotency.checkReplay(stored, ctx, fingerprint) : null;
      };
      const known = await replayIfKnown();
      if (known) return { ...known, replayed: true };
      const trace = await createTrace(scope, input);
      const body = toTraceView(trace);
      try {
        await db.models.IdempotencyKey.create({ ...idempotency.record(scope, ctx, fingerprint, 201, body), createdAt: new Date() });
      } catch (err) {
        if (!isDuplicateKeyError(err)) throw err;
        await trace.destroy();
        const raced = await replayIfKnown();
        if (raced) return { ...raced, replayed: true };
        throw err;
      }
      return { status: 201, body, replayed: false };
    },

    async update(scope: Scope, id: string, patch: TraceUpdate): Promise<TraceView> {
      return queue.run(id, async () => {
        const trace = await find(scope, id);
        if (patch.sampleRateHz !== undefined) checkRate(trace.kind, patch.sampleRateHz);
        const changes: Record<string, unknown> = {};
        if ('siteId' in patch || 'circuitId' in patch || 'loadId' in patch) {
          const links = await resolveLinks(scope, {
            siteId: 'siteId' in patch ? patch.siteId : trace.siteId,
            circuitId: 'circuitId' in patch ? patch.circuitId : 'siteId' in patch ? null : trace.circuitId,
            loadId: 'loadId' in patch ? patch.loadId : 'circuitId' in patch || 'siteId' in patch ? null : trace.loadId,
          });
          Object.assign(changes, { siteId: links.siteId, circuitId: links.circuitId, loadId: links.loadId });
        }
        for (const key of ['name', 'nominalVoltageV', 'mainsHz', 'sampleRateHz', 'tags', 'notes'] as const) {
          if (patch[key] !== undefined) changes[key] = patch[key];
        }
        if (patch.probe !== undefined) changes.probe = probeSettings(patch.probe);
        if (patch.startTime !== undefined) changes.startTime = patch.startTime === null ? null : new Date(patch.startTime);
        ingest.forget(id);
        await trace.update(changes);
        // A closed trace's stored analysis depends on these; run it again so it stays true.
        if (trace.status === 'closed' && (patch.probe !== undefined || patch.nominalVoltageV !== undefined || patch.mainsHz !== undefined)) {
          await closer.reanalyse(trace);
        }
        return toTraceView(trace);
      });
    },

    async close(scope: Scope, id: string, idempotencyKey?: string) {
      return ingest.close(scope, id, idempotencyKey);
    },

    /** Deletes the trace with its samples, events and analysis. */
    async remove(scope: Scope, id: string): Promise<void> {
      await queue.run(id, async () => {
        const trace = await find(scope, id);
        ingest.forget(id);
        await trace.destroy();
      });
    },
  };
}

export type TracesService = ReturnType<typeof createTracesService>;
