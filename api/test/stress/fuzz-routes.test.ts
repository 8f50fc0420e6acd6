/**
 * Fuzzing every /api/v1 route (the list comes from `v1Routes`, so a new route is covered the day it is
 * added). For each generated request: an answer within the deadline, never a 5xx, errors as problem
 * details without internals, no write left behind by an error, GETs write nothing, and another
 * organisation's rows never answer nor appear.
 *
 * Cases: `FUZZ_CASES` in total (default 400, spread over the routes); `npm run bench -- fuzz` runs
 * 10,000. `FUZZ_SEED` replays a failing run (fast-check prints the seed and the shrunk case).
 */
import fc from 'fast-check';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { v1Routes } from '../../src/routes/v1/index.js';
import { mintCredentials } from '../../src/testing/credentials.js';
import { makeTestApp } from '../../src/testing/make-test-app.js';
import { Callers, changedTables, collectIds, fuzzCaseArbitrary, invariantViolations, send, stateDigest, type IdPool } from './support/fuzz-harness.js';
import { fixtureBuilder } from './support/fixtures.js';

const totalCases = Number(process.env.FUZZ_CASES ?? 400);
const runsPerRoute = Math.max(5, Math.ceil(totalCases / v1Routes.length));
const seed = process.env.FUZZ_SEED ? Number(process.env.FUZZ_SEED) : undefined;

/** Cases one app takes before a fresh one replaces it: stored rows pile up, and every case hashes them all. */
const CASES_PER_APP = 150;

/** A test app with a second organisation, fixtures in both, and callers; rebuilt every CASES_PER_APP cases. */
async function makeWorld() {
  const t = await makeTestApp();
  const otherOrganisationId = crypto.randomUUID();
  await t.db.models.Organisation.create({ id: otherOrganisationId, name: 'Other organisation' });
  // Fixture credentials are minted lazily and again after a case may have revoked them.
  const adminOf = (organisationId: string) => {
    let headers: Record<string, string> | undefined;
    return async () => {
      if (!headers || (await request(t.app).get('/api/v1/me').set(headers)).status !== 200) {
        headers = await mintCredentials(t.app.locals.services, organisationId, 'admin');
      }
      return headers;
    };
  };
  const fixtures = [fixtureBuilder(t.app, t.db, adminOf(t.organisationId)), fixtureBuilder(t.app, t.db, adminOf(otherOrganisationId))];
  const world = {
    t,
    callers: new Callers(t),
    pool: undefined as unknown as IdPool,
    cases: 0,
    /** Rebuilds the rows to aim at that a case deleted, and refreshes the id pool. */
    async refreshFixtures() {
      for (const f of fixtures) await f.ensure();
      world.pool = await collectIds(t, otherOrganisationId);
    },
  };
  await world.refreshFixtures();
  return world;
}

describe('fuzzing every route', () => {
  let world: Awaited<ReturnType<typeof makeWorld>>;
  /** Answers by route and status class, to show the cases reach past validation. */
  const answers = new Map<string, Record<string, number>>();

  beforeAll(async () => {
    world = await makeWorld();
  });
  afterAll(() => world.t.close());

  it('when the fixtures are built, then both organisations have rows to aim at', () => {
    for (const table of ['sites', 'circuits', 'loads', 'traces']) {
      expect(world.pool.own.get(table)?.length, table).toBeGreaterThan(0);
      expect(world.pool.other.get(table)?.length, table).toBeGreaterThan(0);
    }
  });

  for (const route of v1Routes) {
    const { method, path } = route.spec;
    it(`${method.toUpperCase()} ${path}: never a 5xx, a hang, a partial write or another organisation's data`, async () => {
      await fc.assert(
        fc.asyncProperty(fuzzCaseArbitrary(route), async (fuzz) => {
          if (++world.cases > CASES_PER_APP) {
            await world.t.close();
            world = await makeWorld();
          }
          const { t, callers, pool } = world;
          const auth = await callers.headers(fuzz.caller, fuzz.garbageToken);
          const before = await stateDigest(t);
          const outcome = await send(t, route, fuzz, pool, auth);
          const changed = changedTables(before, await stateDigest(t));
          const tally = answers.get(`${method.toUpperCase()} ${path}`) ?? {};
          const statusClass = `${Math.floor(outcome.status / 100)}xx`;
          tally[statusClass] = (tally[statusClass] ?? 0) + 1;
          answers.set(`${method.toUpperCase()} ${path}`, tally);
          // A successful write may have signed out, revoked or deleted what later cases aim at.
          if (outcome.status < 300 && method !== 'get') {
            callers.forget();
            await world.refreshFixtures();
          }
          const violations = invariantViolations(outcome, fuzz, pool, changed, route);
          if (violations.length > 0) throw new Error(`${outcome.url}\n  ${violations.join('\n  ')}`);
        }),
        { numRuns: runsPerRoute, ...(seed !== undefined ? { seed } : {}), endOnFailure: process.env.FUZZ_SHRINK !== '1' },
      );
    }, 120_000 + runsPerRoute * 2_000);
  }

  it('when the fuzzing is over, then cases got past validation and the app still answers on a sound database', async () => {
    const all = [...answers.values()];
    const count = (cls: string) => all.reduce((n, tally) => n + (tally[cls] ?? 0), 0);
    if (process.env.FUZZ_REPORT === '1') {
      const lines = [...answers].map(([route, tally]) => `${route.padEnd(44)} ${['2xx', '3xx', '4xx', '5xx'].map((c) => `${c} ${String(tally[c] ?? 0).padStart(5)}`).join('  ')}`);
      console.log(`fuzz answers by route\n${lines.join('\n')}`);
    }
    // Not only refusals: a fair share of the generated requests must have been accepted.
    expect(count('2xx')).toBeGreaterThan(0.05 * (count('2xx') + count('4xx')));
    expect(count('4xx')).toBeGreaterThan(0);
    const res = await request(world.t.app).get('/readyz');
    expect(res.status).toBe(200);
    if (world.t.db.dialect === 'sqlite') {
      const [rows] = await world.t.db.sequelize.query('PRAGMA integrity_check');
      expect(rows).toEqual([{ integrity_check: 'ok' }]);
    }
  });
});
