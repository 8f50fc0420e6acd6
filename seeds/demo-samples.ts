/**
 * Stores the demo traces' samples through the trace ingest service, as an integrator would post them
 * (float32 at the trace's rate from its start), then closes each trace so that its analysis, inrush
 * events and surges are there when the dashboard first opens. Used by the server's first start and by
 * `npm run seed`.
 */
import type { Config } from '../api/src/config/config.js';
import type { Db } from '../api/src/db/open.js';
import { createTracesService } from '../api/src/services/traces.js';
import { rawReadings, type StoreDemoSamples } from './demo.js';

export function demoSampleStore(config: Config): StoreDemoSamples {
  let service: { db: Db; traces: ReturnType<typeof createTracesService> } | null = null;
  return async (db, trace, startTime) => {
    if (service?.db !== db) service = { db, traces: createTracesService(db, config) };
    const row = await db.models.Trace.findByPk(trace.id);
    if (!row) throw new Error(`demo trace ${trace.id} was not created`);
    const scope = { organisationId: row.organisationId, actor: { kind: 'system' as const, id: 'system' as const } };
    const raw = rawReadings(trace);
    const body = Buffer.from(raw.buffer, raw.byteOffset, raw.byteLength);
    await service.traces.append(scope, trace.id, {
      contentType: 'application/octet-stream',
      contentLength: body.byteLength,
      options: { start: String(startTime.getTime()), rate: trace.sampleRateHz },
      body: (async function* () {
        yield body;
      })(),
      idempotencyKey: undefined,
    });
    await service.traces.close(scope, trace.id);
  };
}
