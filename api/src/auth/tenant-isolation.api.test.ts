/**
 * Organisations are sealed from each other. Organisation B owns one of every resource type; an admin of
 * organisation A (who holds every permission) then calls every route with B's ids and reads every list.
 * Each call must answer 404 (or 400 when the made-up body is refused first), show nothing of B in any
 * body, count nothing of B in any total, and leave B's resources as they were.
 *
 * To cover a new resource type, add a fixture to RESOURCES (and a valid body to SAMPLE_BODIES for its
 * routes that take one); a route whose path names a parameter without a fixture fails the test.
 */
import { randomUUID } from 'node:crypto';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { v1Routes } from '../routes/v1/index.js';
import type { RouteSpec } from '../routes/define-route.js';
import { mintCredentials } from '../testing/credentials.js';
import { makeTestApp, type TestApp } from '../testing/make-test-app.js';

type Ids = Record<string, string>;
type Api = { post(path: string, body: unknown): Promise<request.Response> };

interface ResourceFixture {
  /** The path parameter naming this resource, e.g. `siteId`. */
  param: string;
  /** The operation that creates it; the fixture is skipped while that route does not exist. */
  createdBy: string;
  /** Creates one in the caller's organisation, named with `mark`; returns its id. */
  create(api: Api, ids: Ids, mark: string): Promise<string>;
}

async function created(res: Promise<request.Response>, path = 'id'): Promise<string> {
  const r = await res;
  expect(r.status, JSON.stringify(r.body)).toBeLessThan(300);
  return path.split('.').reduce((o: Record<string, unknown>, k) => o[k] as Record<string, unknown>, r.body) as unknown as string;
}

const RESOURCES: ResourceFixture[] = [
  { param: 'siteId', createdBy: 'createSite', create: (api, _ids, mark) => created(api.post('/sites', { name: `${mark} site`, notes: mark })) },
  {
    param: 'circuitId',
    createdBy: 'createCircuit',
    create: (api, ids, mark) => created(api.post(`/sites/${ids.siteId}/circuits`, { label: `${mark} circuit`, nominalVoltageV: 120, mainsHz: 60, deviceRatingA: 20, deviceKind: 'na-thermal-magnetic' })),
  },
  { param: 'loadId', createdBy: 'createLoad', create: (api, ids, mark) => created(api.post(`/circuits/${ids.circuitId}/loads`, { name: `${mark} load`, nameplateA: 6, connection: 'cord-and-plug' })) },
  { param: 'traceId', createdBy: 'createTrace', create: (api, ids, mark) => created(api.post('/traces', { name: `${mark} trace`, kind: 'rms', circuitId: ids.circuitId })) },
  { param: 'userId', createdBy: 'inviteUser', create: (api, _ids, mark) => created(api.post('/users', { email: `${mark.toLowerCase()}-${randomUUID().slice(0, 6)}@example.test`, name: `${mark} person`, role: 'viewer' })) },
  { param: 'keyId', createdBy: 'createApiKey', create: (api, _ids, mark) => created(api.post('/api-keys', { name: `${mark} key`, scopes: ['read'] }), 'apiKey.id') },
];

/** Valid bodies, so that routes taking one reach the lookup (and answer 404) instead of stopping at validation. */
const SAMPLE_BODIES: Record<string, unknown> = {
  updateSite: { name: 'Renamed' },
  createCircuit: { label: 'Intruder', nominalVoltageV: 120, mainsHz: 60, deviceRatingA: 20, deviceKind: 'na-thermal-magnetic' },
  updateCircuit: { label: 'Renamed' },
  createLoad: { name: 'Intruder', nameplateA: 5, connection: 'cord-and-plug' },
  updateLoad: { name: 'Renamed' },
  updateTrace: { name: 'Renamed' },
  appendSamples: { t: [1_700_000_000_000, 1_700_000_000_100], a: [1, 2] },
  checkCircuitWhatIf: { extraLoads: [] },
  updateUser: { role: 'viewer' },
};

/** Query parameters that make a route answer in text, so its body can be searched. */
const SAMPLE_QUERIES: Record<string, Record<string, string>> = {
  getCircuitReport: { format: 'csv' },
  getSiteReport: { format: 'csv' },
};

/** Fields that change by themselves between two reads (computed at request time, or touched by B's own reads). */
const VOLATILE_FIELDS = new Set(['checkedAt', 'generatedAt', 'lastUsedAt', 'lastUsedFrom']);

/** Routes that act on the caller themselves, not on a resource. */
const SELF_OPERATIONS = new Set(['signOut', 'getMe']);

describe('organisations are sealed from each other', () => {
  let t: TestApp;
  const MARK_A = 'ALPHAORG';
  const MARK_B = 'BRAVOORG';
  const idsA: Ids = {};
  const idsB: Ids = {};
  let adminA: () => Promise<Record<string, string>>;
  let adminB: Record<string, string>;
  const present = RESOURCES.filter((r) => v1Routes.some((route) => route.spec.operationId === r.createdBy));

  const apiAs = (headers: Record<string, string>): Api => ({ post: (path, body) => request(t.app).post(`/api/v1${path}`).set(headers).send(body as object) });
  const fill = (path: string, ids: Ids) =>
    path.replace(/\{(\w+)\}/g, (_m, name: string) => {
      const id = ids[name];
      if (!id) throw new Error(`No fixture makes a "${name}": add one to RESOURCES in tenant-isolation.api.test.ts`);
      return id;
    });
  function call(spec: RouteSpec, path: string, headers: Record<string, string>) {
    const req = request(t.app)[spec.method](`/api/v1${path}`).set(headers).query(SAMPLE_QUERIES[spec.operationId] ?? {});
    if (spec.body || spec.rawBody) return req.send((SAMPLE_BODIES[spec.operationId] ?? {}) as object);
    return req;
  }
  /** B's resources as B sees them, to compare before and after A's attempts. */
  async function snapshotB() {
    const out: Record<string, unknown> = {};
    for (const { spec } of v1Routes) {
      if (spec.method !== 'get' || !/\{\w+\}/.test(spec.path) || spec.path.includes('/report')) continue;
      const res = await call(spec, fill(spec.path, idsB), adminB);
      out[spec.path] = { status: res.status, body: res.body };
    }
    return JSON.parse(JSON.stringify(out, (k, v: unknown) => (VOLATILE_FIELDS.has(k) ? undefined : v))) as unknown;
  }

  beforeAll(async () => {
    t = await makeTestApp();
    const organisationB = randomUUID();
    await t.db.models.Organisation.create({ id: organisationB, name: `${MARK_B} Electrical` });
    adminB = await mintCredentials(t.app.locals.services, organisationB, 'admin');
    adminA = () => t.auth('admin', { fresh: true });
    const apiA = apiAs(await t.auth('admin'));
    for (const r of present) {
      idsB[r.param] = await r.create(apiAs(adminB), idsB, MARK_B);
      idsA[r.param] = await r.create(apiA, idsA, MARK_A);
    }
  });
  afterAll(() => t.close());

  it('when the fixtures are made, then every resource type with a route has one', () => {
    expect(present.map((r) => r.param)).toEqual(expect.arrayContaining(['siteId', 'circuitId', 'loadId', 'userId', 'keyId']));
    for (const { spec } of v1Routes) for (const [, name] of spec.path.matchAll(/\{(\w+)\}/g)) expect(Object.keys(idsB), `fixture for ${name}`).toContain(name);
  });

  it('when A calls every route with B\'s ids, then 404, nothing of B shows, and B is unchanged', async () => {
    const before = await snapshotB();
    const routes = v1Routes.filter((r) => r.spec.permission !== 'public' && !SELF_OPERATIONS.has(r.spec.operationId) && /\{\w+\}/.test(r.spec.path));
    expect(routes.length).toBeGreaterThan(10);
    for (const { spec } of routes) {
      const res = await call(spec, fill(spec.path, idsB), await adminA());
      const name = `${spec.method.toUpperCase()} ${spec.path}: ${res.status} ${res.text.slice(0, 300)}`;
      const refusedBeforeLookup = res.status === 400 && (spec.body || spec.rawBody) && !(spec.operationId in SAMPLE_BODIES);
      expect(res.status === 404 || refusedBeforeLookup, name).toBe(true);
      expect(res.text, name).not.toContain(MARK_B);
    }
    expect(JSON.stringify(await snapshotB(), null, 1)).toBe(JSON.stringify(before, null, 1));
  });

  it('when A reads every list and its own resources, then nothing of B shows or is counted', async () => {
    const bIds = Object.values(idsB);
    const gets = v1Routes.filter((r) => r.spec.method === 'get' && r.spec.permission !== 'public');
    for (const { spec } of gets) {
      const res = await call(spec, fill(spec.path, idsA), await adminA());
      const name = `GET ${spec.path}: ${res.status}`;
      expect(res.status, name).toBeLessThan(500);
      expect(res.text, name).not.toContain(MARK_B);
      for (const id of bIds) expect(res.text, `${name} shows B's ${id}`).not.toContain(id);
      if (Array.isArray(res.body?.items) && typeof res.body.total === 'number' && res.body.nextCursor === null) {
        expect(res.body.total, `${name} total`).toBe(res.body.items.length);
      }
    }
  });

  it('when A asks for its own sites, then the counts are its own', async () => {
    const sites = (await request(t.app).get('/api/v1/sites').set(await adminA())).body;
    expect(sites.total).toBe(1);
    expect(sites.items[0]).toMatchObject({ id: idsA.siteId, circuitCount: 1 });
  });
});
