/**
 * The full analysis of a stored trace (analysis/pipeline/analyze-trace.ts) over all its samples: run
 * when the trace is closed (and stored with it), again when a closed trace's probe, voltage or mains
 * frequency changes, and on request when events are asked for with other parameters.
 */
import { analyzeTrace, type AnalyzeParams, type TraceAnalysis as AnalysisResult } from '../analysis/pipeline/analyze-trace.js';
import { halfCycleRms } from '../analysis/waveform/half-cycle-rms.js';
import type { Db } from '../db/open.js';
import { Problem } from '../errors/problem.js';
import type { Trace } from '../models/trace.js';
import { readWindowSamples, type WindowSamples } from '../storage/chunk-reader.js';
import type { ChunkStore } from '../storage/chunk-store.js';
import { encodeSamples } from '../storage/chunk-codec.js';
import { ampsPerUnit, analysisProbe } from './traces-view.js';

export interface AnalysisSettings {
  mainsFrequencyHz: number | null;
  nominalVoltageV: number | null;
}

/** Most samples analysed in one call (about 1.2 GB of working memory for explicit times). */
export const MAX_ANALYSED_SAMPLES = 50_000_000;

/** An analysis with the waveform's half-cycle RMS series (seconds from the trace's origin). */
export interface StoredAnalysis {
  result: AnalysisResult;
  rms: { timesS: Float64Array; rmsA: Float64Array } | null;
}

export function createTraceCloser(deps: { db: Db; store: ChunkStore; analysisSettings: (trace: Trace) => AnalysisSettings }) {
  const { db, store } = deps;

  /** Every sample of the trace as one series. */
  async function readAll(trace: Trace): Promise<WindowSamples> {
    if (trace.sampleCount > MAX_ANALYSED_SAMPLES) {
      throw new Problem('conflict', `The trace holds ${trace.sampleCount} samples; analysis is limited to ${MAX_ANALYSED_SAMPLES} samples per trace`);
    }
    const rows = await store.readSummaries(trace.id, trace.chunkCount, Number.NEGATIVE_INFINITY, Number.POSITIVE_INFINITY, trace.sampleCount);
    return readWindowSamples(store, trace.id, rows, trace.originUs as number, Number.NEGATIVE_INFINITY, Number.POSITIVE_INFINITY);
  }

  /** Runs the analysis over every sample; analysis errors become 409 problems naming the reason. */
  async function analyse(trace: Trace, params: AnalyzeParams = {}, withRms = false): Promise<StoredAnalysis> {
    if (trace.sampleCount === 0 || trace.originUs === null) {
      throw new Problem('conflict', 'The trace has no samples to analyse; append samples first (or delete the trace)');
    }
    const samples = await readAll(trace);
    const settings = deps.analysisSettings(trace);
    const timing =
      samples.axis.kind === 'uniform'
        ? { startS: samples.axis.startS, sampleRateHz: samples.axis.rateHz }
        : { timestampsS: samples.axis.timesS };
    if (trace.kind === 'waveform' && samples.axis.kind !== 'uniform') {
      throw new Problem(
        'conflict',
        'A waveform trace is analysed as one uniform run of samples, but this one has breaks or explicit timestamps; send its batches as one continuous series (binary or start/rate/values with start omitted after the first)',
      );
    }
    const merged: AnalyzeParams = {
      mainsFrequencyHz: settings.mainsFrequencyHz,
      nominalVoltageV: settings.nominalVoltageV,
      ...params,
    };
    let result: AnalysisResult;
    try {
      result = analyzeTrace({ kind: trace.kind, samples: samples.values, probe: analysisProbe(trace), ...timing }, merged);
    } catch (err) {
      if (err instanceof RangeError) throw new Problem('conflict', `The trace cannot be analysed: ${err.message}`);
      throw err;
    }
    let rms: StoredAnalysis['rms'] = null;
    if (withRms && trace.kind === 'waveform' && samples.axis.kind === 'uniform' && result.params.mainsFrequencyHz !== null) {
      const scale = ampsPerUnit(trace);
      const amps = new Float64Array(samples.values.length);
      for (let i = 0; i < amps.length; i++) amps[i] = (samples.values[i] as number) * scale;
      const series = halfCycleRms(amps, samples.axis.rateHz, result.params.mainsFrequencyHz, samples.axis.startS);
      rms = { timesS: series.timesS, rmsA: series.rmsA };
    }
    return { result, rms };
  }

  /** Stores an analysis as the trace's (replacing any earlier one), inside `transaction`. */
  async function saveAnalysis(trace: Trace, analysis: StoredAnalysis, transaction: import('sequelize').Transaction): Promise<void> {
    await db.models.TraceAnalysis.upsert(
      {
        traceId: trace.id,
        organisationId: trace.organisationId,
        result: analysis.result as unknown as Record<string, unknown>,
        rmsTimesS: analysis.rms ? Buffer.from(analysis.rms.timesS.buffer, analysis.rms.timesS.byteOffset, analysis.rms.timesS.byteLength) : null,
        rmsValuesA: analysis.rms ? encodeSamples(Float32Array.from(analysis.rms.rmsA)) : null,
      },
      { transaction },
    );
  }

  return {
    analyse,
    saveAnalysis,
    /** Analyses a closed trace again with its current settings and stores the result. */
    async reanalyse(trace: Trace): Promise<void> {
      const analysis = await analyse(trace, {}, true);
      await db.sequelize.transaction((transaction) => saveAnalysis(trace, analysis, transaction));
    },
    /** The stored analysis of a closed trace, or null. */
    async stored(trace: Trace): Promise<StoredAnalysis | null> {
      const row = await db.models.TraceAnalysis.findOne({ where: { traceId: trace.id, organisationId: trace.organisationId } });
      if (!row) return null;
      const times = row.rmsTimesS;
      const values = row.rmsValuesA;
      return {
        result: row.result as unknown as AnalysisResult,
        rms:
          times && values
            ? {
                timesS: new Float64Array(new Uint8Array(times).buffer.slice(0)),
                rmsA: Float64Array.from(new Float32Array(new Uint8Array(values).buffer.slice(0))),
              }
            : null,
      };
    },
  };
}

export type TraceCloser = ReturnType<typeof createTraceCloser>;
