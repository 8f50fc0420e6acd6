/**
 * Helpers for storage tests: a trace row to write into, and a batch writer on its current state.
 */
import { randomUUID } from 'node:crypto';
import type { Db } from '../db/open.js';
import type { Trace } from '../models/trace.js';
import { startBatch, type BatchWriter } from './batch-writer.js';
import { storageState } from '../services/traces-view.js';
import type { ChunkStore } from './chunk-store.js';
import type { SampleSummary } from '../analysis/stats/sample-summary.js';

export async function makeTrace(db: Db, sampleRateHz: number | null = null): Promise<Trace> {
  const organisationId = randomUUID();
  await db.models.Organisation.create({ id: organisationId, name: 'Storage test' });
  return db.models.Trace.create({
    id: randomUUID(),
    organisationId,
    siteId: null,
    circuitId: null,
    loadId: null,
    name: 'storage test',
    kind: 'rms',
    probe: { inputUnit: 'A', sensitivityPerA: 1, loops: 1 },
    nominalVoltageV: null,
    mainsHz: null,
    startTime: null,
    sampleRateHz,
    notes: null,
  });
}

/** A writer for the trace's next batch (the trace row is reloaded first). */
export async function writerFor(store: ChunkStore, trace: Trace): Promise<BatchWriter> {
  await trace.reload();
  const state = { ...storageState(trace) };
  return startBatch({ traceId: trace.id, organisationId: trace.organisationId, store, state, sampleRateHz: trace.sampleRateHz, flushSamples: 10_000 });
}

/** Stores explicit-time samples as one batch. */
export async function appendExplicit(store: ChunkStore, trace: Trace, values: Float32Array, timesUs: Float64Array): Promise<void> {
  const writer = await writerFor(store, trace);
  await writer.pushExplicit(values, timesUs);
  await writer.finish();
  await trace.reload();
}

/** Checks two summaries agree: counts and extremes exactly, sums to a relative 1e-9. */
export function summaryDifferences(actual: SampleSummary, expected: SampleSummary): string[] {
  const out: string[] = [];
  const exact = ['count', 'minA', 'maxA', 'firstA', 'lastA', 'gapCount', 'gapThresholdS'] as const;
  for (const k of exact) if (actual[k] !== expected[k]) out.push(`${k}: ${String(actual[k])} != ${String(expected[k])}`);
  const close = ['meanA', 'm2A2', 'minTimeS', 'maxTimeS', 'firstTimeS', 'lastTimeS', 'coveredTimeS', 'integralAs', 'integralA2s', 'gapTimeS'] as const;
  for (const k of close) {
    const a = actual[k];
    const e = expected[k];
    if (Math.abs(a - e) > 1e-9 * Math.max(1, Math.abs(e))) out.push(`${k}: ${a} != ${e}`);
  }
  return out;
}
