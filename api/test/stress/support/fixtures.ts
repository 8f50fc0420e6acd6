/**
 * A small set of rows in one organisation, made through the public API as its admin: a site, a circuit,
 * a load and a trace with a few samples. Steps whose route refuses are skipped, so the fuzzer keeps
 * working while the API grows. `ensure()` rebuilds only what a fuzz case deleted, so the database stays
 * small however long the run.
 */
import request from 'supertest';
import type { HeadroomApp } from '../../../src/app.js';
import type { Db } from '../../../src/db/open.js';

async function post(app: HeadroomApp, auth: Record<string, string>, url: string, body: unknown): Promise<string | undefined> {
  const res = await request(app).post(url).set(auth).send(body as object);
  return res.status < 300 && res.body && typeof res.body.id === 'string' ? (res.body.id as string) : undefined;
}

export interface FixtureIds {
  siteId?: string | undefined;
  circuitId?: string | undefined;
  loadId?: string | undefined;
  traceId?: string | undefined;
}

export function fixtureBuilder(app: HeadroomApp, db: Db, auth: () => Promise<Record<string, string>>) {
  const ids: FixtureIds = {};
  const exists = async (table: 'Site' | 'Circuit' | 'Load' | 'Trace', id: string | undefined) =>
    id !== undefined && (await (db.models[table] as unknown as { count(o: object): Promise<number> }).count({ where: { id } })) > 0;

  return {
    ids,
    /** Makes whichever of site, circuit, load and trace is missing (a deleted site takes its circuit with it). */
    async ensure(): Promise<void> {
      const h = await auth();
      if (!(await exists('Site', ids.siteId))) {
        ids.siteId = await post(app, h, '/api/v1/sites', { name: 'Fuzz target site', address: '1 Test Lane' });
      }
      if (!ids.siteId) return;
      if (!(await exists('Circuit', ids.circuitId))) {
        ids.circuitId = await post(app, h, `/api/v1/sites/${ids.siteId}/circuits`, {
          label: 'Counter circuit',
          nominalVoltageV: 120,
          mainsHz: 60,
          deviceRatingA: 20,
          deviceKind: 'na-thermal-magnetic',
        });
      }
      if (!ids.circuitId) return;
      if (!(await exists('Load', ids.loadId))) {
        ids.loadId = await post(app, h, `/api/v1/circuits/${ids.circuitId}/loads`, { name: 'Kettle', nameplateA: 12.5, connection: 'cord-and-plug' });
      }
      if (!(await exists('Trace', ids.traceId))) {
        ids.traceId = await post(app, h, '/api/v1/traces', { name: 'Fuzz target trace', kind: 'rms', siteId: ids.siteId, circuitId: ids.circuitId });
        if (ids.traceId) {
          const start = Date.parse('2026-03-02T08:00:00Z');
          const t = Array.from({ length: 200 }, (_, i) => start + i * 100);
          const a = t.map((_, i) => (i < 20 ? 40 - i * 1.5 : 9.5 + (i % 7) * 0.1));
          await request(app).post(`/api/v1/traces/${ids.traceId}/samples`).set(h).send({ t, a });
        }
      }
    },
  };
}
