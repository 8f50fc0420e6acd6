/**
 * How traces look in the API. Sample times are epoch milliseconds in fields ending in `Time`
 * (`firstSampleTime`); statistics and events use the analysis views shared with POST /analyze
 * (epoch-ms `…At` fields); record dates (`createdAt`, `updatedAt`, `closedAt`) are ISO 8601 strings.
 */
import { probeScaleAPerUnit, type ProbeSettings as AnalysisProbe } from '../analysis/probe/normalise-probe.js';
import type { SampleSummary } from '../analysis/stats/sample-summary.js';
import { statisticsFromSummary } from '../analysis/stats/statistics.js';
import type { ProbeSettings, Trace, TraceKind, TraceStatus } from '../models/trace.js';
import type { StoredTrace } from '../storage/window-summary.js';
import { scaleSummary } from '../storage/summary-rows.js';
import type { TraceStorageState } from '../storage/chunk-store.js';
import { presentStatistics } from './analysis-view.js';

/** A probe as the API shows it (the analysis engine's field names). */
export interface ProbeView {
  inputUnit: 'A' | 'mA' | 'mV';
  sensitivityPerA: number;
  loops: number;
}

export function probeView(p: ProbeSettings): ProbeView {
  return { inputUnit: p.inputUnit, sensitivityPerA: p.sensitivityPerA, loops: p.loops };
}

export function probeSettings(p: ProbeView): ProbeSettings {
  return { inputUnit: p.inputUnit, sensitivityPerA: p.sensitivityPerA, loops: p.loops };
}

/** Amperes per raw unit of a trace's probe. */
export function ampsPerUnit(trace: Trace): number {
  return probeScaleAPerUnit(analysisProbe(trace));
}

export function analysisProbe(trace: Trace): AnalysisProbe {
  return { inputUnit: trace.probe.inputUnit, sensitivityPerA: trace.probe.sensitivityPerA, loops: trace.probe.loops };
}

/** Epoch ms of the trace's origin (time 0 of its stored summaries). */
export function originMs(trace: Trace): number {
  return (trace.originUs ?? 0) / 1000;
}

export const msOf = (us: number | null | undefined): number | null => (us === null || us === undefined ? null : us / 1000);

export function storedTrace(trace: Trace): StoredTrace {
  return {
    traceId: trace.id,
    chunkCount: trace.chunkCount ?? 0,
    sampleCount: trace.sampleCount ?? 0,
    originUs: trace.originUs ?? null,
    gapThresholdS: trace.gapThresholdS ?? null,
  };
}

export function storageState(trace: Trace): TraceStorageState {
  return {
    // A freshly created instance leaves unset columns undefined.
    sampleCount: trace.sampleCount ?? 0,
    chunkCount: trace.chunkCount ?? 0,
    originUs: trace.originUs ?? null,
    firstSampleUs: trace.firstSampleUs ?? null,
    lastSampleUs: trace.lastSampleUs ?? null,
    gapThresholdS: trace.gapThresholdS ?? null,
    summary: (trace.summary as unknown as SampleSummary | null) ?? null,
  };
}

/** Statistics (in amperes) of a raw-unit summary, presented with epoch-ms times. */
export function presentSummary(trace: Trace, summary: SampleSummary, powerFactor?: number) {
  const stats = statisticsFromSummary(scaleSummary(summary, ampsPerUnit(trace)), {
    voltageV: trace.nominalVoltageV,
    ...(powerFactor !== undefined ? { powerFactor } : {}),
  });
  return presentStatistics(stats, originMs(trace));
}

export interface TraceView {
  id: string;
  name: string;
  kind: TraceKind;
  status: TraceStatus;
  siteId: string | null;
  circuitId: string | null;
  loadId: string | null;
  probe: ProbeView;
  nominalVoltageV: number | null;
  mainsHz: number | null;
  startTime: number | null;
  sampleRateHz: number | null;
  tags: string[];
  notes: string | null;
  sampleCount: number;
  firstSampleTime: number | null;
  lastSampleTime: number | null;
  /** Statistics of every stored sample from the per-trace summary (no percentiles), or null when empty. */
  summary: ReturnType<typeof presentSummary> | null;
  createdAt: string;
  updatedAt: string;
  closedAt: string | null;
}

export function toTraceView(trace: Trace): TraceView {
  const summary = trace.summary as unknown as SampleSummary | null;
  return {
    id: trace.id,
    name: trace.name,
    kind: trace.kind,
    status: trace.status,
    siteId: trace.siteId,
    circuitId: trace.circuitId,
    loadId: trace.loadId,
    probe: probeView(trace.probe),
    nominalVoltageV: trace.nominalVoltageV,
    mainsHz: trace.mainsHz,
    startTime: trace.startTime ? trace.startTime.getTime() : null,
    sampleRateHz: trace.sampleRateHz,
    tags: trace.tags ?? [],
    notes: trace.notes,
    sampleCount: trace.sampleCount,
    firstSampleTime: msOf(trace.firstSampleUs),
    lastSampleTime: msOf(trace.lastSampleUs),
    summary: summary && summary.count > 0 ? presentSummary(trace, summary) : null,
    createdAt: trace.createdAt.toISOString(),
    updatedAt: trace.updatedAt.toISOString(),
    closedAt: trace.closedAt ? trace.closedAt.toISOString() : null,
  };
}
