/**
 * The whole analysis of one trace in one call: the entry point behind `POST /api/v1/analyze` and
 * behind closing a stored trace.
 *
 * Steps: raw readings → amperes through the probe; for `waveform` traces, the mains frequency
 * (given, or estimated from zero crossings), one fused pass cutting the record into half-cycle
 * blocks, the half-cycle RMS series (IEC 61000-4-30 method applied to current) and the waveform's
 * shape (peak, RMS, crest and form factor); then, on the RMS series (a waveform's half-cycle series,
 * or an `rms` trace's own samples): the on/off levels, the statistics and the inrush events and
 * surges. The output is plain JSON-able data and echoes every parameter used.
 * Sources: see the files of each step.
 */

import {
  DEFAULT_EVENT_PARAMS,
  detectEvents,
  resolveEventParams,
  type EventParams,
  type EventParamsUsed,
} from '../events/detect-events.js';
import type { InrushEvent } from '../events/inrush.js';
import { resolveOnThreshold } from '../events/on-threshold.js';
import type { Surge } from '../events/surges.js';
import { DEFAULT_PROBE, probeScaleAPerUnit, type ProbeSettings } from '../probe/normalise-probe.js';
import { DEFAULT_POWER_FACTOR } from '../power/watts-amps.js';
import { computeStatistics, type Statistics } from '../stats/statistics.js';
import { DEFAULT_MAX_GAPS_LISTED } from '../stats/sample-summary.js';
import { explicitTimeAxis, uniformTimeAxis, type TimeAxis } from '../time/time-axis.js';
import { DEFAULT_GAP_FACTOR } from '../time/typical-spacing.js';
import {
  MAX_ABS_CURRENT_A,
  assertFiniteValues,
  assertSampleArray,
  type SampleArray,
} from '../validation/assert-input.js';
import { halfCycleBlocks } from '../waveform/half-cycle-blocks.js';
import { halfCycleRmsFromBlocks } from '../waveform/half-cycle-rms.js';
import { estimateMainsFrequency } from '../waveform/mains-frequency.js';
import { waveformShapeFromBlocks } from '../waveform/waveform-shape.js';

/** Kind of trace: `rms` (each sample an RMS reading) or `waveform` (instantaneous, uniform ≥ 1 kHz). */
export type TraceKind = 'rms' | 'waveform';

/**
 * The samples of a trace. Timestamps are either explicit (`timestampsS`, seconds, strictly
 * increasing; `rms` traces only) or implicit (`startS` + `sampleRateHz`).
 */
export interface TraceInput {
  kind: TraceKind;
  /** Raw readings in the probe's unit (amperes with the default probe). */
  samples: SampleArray;
  timestampsS?: Float64Array;
  /** Time of the first sample (s) for implicit timestamps; default 0. */
  startS?: number;
  /** Sample rate (Hz) for implicit timestamps. */
  sampleRateHz?: number;
  /** How raw readings become amperes; default DEFAULT_PROBE (amperes, one loop). */
  probe?: ProbeSettings;
}

/** Settings of the analysis; every field is optional. */
export interface AnalyzeParams {
  /** Mains frequency (Hz, 40–70) of a waveform; absent or null: estimated from zero crossings. */
  mainsFrequencyHz?: number | null;
  /** Nominal RMS voltage (V) for energy; absent or null: no energy figure. */
  nominalVoltageV?: number | null;
  /** Power factor for energy (0 < PF ≤ 1); default DEFAULT_POWER_FACTOR (1). */
  powerFactor?: number;
  /** Current levels (A) to report time above; default none. */
  thresholdsA?: number[];
  /** Gap factor (≥ 1): intervals longer than this × the typical spacing are gaps; default 2.5. */
  gapFactor?: number;
  /** Cap on the gaps listed individually; default 100. */
  maxGapsListed?: number;
  /** Event-detection parameters; absent fields take DEFAULT_EVENT_PARAMS. */
  events?: Partial<EventParams>;
}

/** Defaults of AnalyzeParams (events: DEFAULT_EVENT_PARAMS). */
export const DEFAULT_ANALYZE_PARAMS: Readonly<Required<Omit<AnalyzeParams, 'events'>> & { events: Readonly<EventParams> }> = Object.freeze({
  mainsFrequencyHz: null,
  nominalVoltageV: null,
  powerFactor: DEFAULT_POWER_FACTOR,
  thresholdsA: [],
  gapFactor: DEFAULT_GAP_FACTOR,
  maxGapsListed: DEFAULT_MAX_GAPS_LISTED,
  events: DEFAULT_EVENT_PARAMS,
});

/** How the RMS series of a waveform was made, as stated in the output. */
export const HALF_CYCLE_RMS_METHOD =
  'one-cycle RMS refreshed every half cycle (IEC 61000-4-30 method applied to current); window grid starts at the first sample';

/** Shape of a waveform record (null for `rms` traces). Units: A; ratios dimensionless. */
export interface WaveformSummary {
  peakA: number;
  peakTimeS: number;
  rmsA: number;
  dcA: number;
  rectifiedMeanA: number;
  crestFactor: number | null;
  formFactor: number | null;
}

/** The parameters used, echoed in the output. */
export interface AnalyzeParamsUsed {
  probe: ProbeSettings;
  mainsFrequencyHz: number | null;
  mainsFrequencySource: 'given' | 'estimated' | null;
  nominalVoltageV: number | null;
  powerFactor: number;
  thresholdsA: number[];
  gapFactor: number;
  events: EventParamsUsed;
}

/** Result of analyzeTrace. JSON-able (`rmsSeries` only when asked for). */
export interface TraceAnalysis {
  kind: TraceKind;
  sampleCount: number;
  firstTimeS: number;
  lastTimeS: number;
  /** Values in the RMS series the statistics and events use (samples of an `rms` trace). */
  rmsSeriesLength: number;
  /** Method of the RMS series; null for `rms` traces (their samples are the series). */
  rmsSeriesMethod: string | null;
  waveform: WaveformSummary | null;
  /** Statistics of the RMS series. */
  statistics: Statistics;
  inrushEvents: InrushEvent[];
  surges: Surge[];
  onPeriodCount: number;
  /** True when more than params.events.maxEvents events or surges were found and the lists were cut. */
  eventsTruncated: boolean;
  params: AnalyzeParamsUsed;
}

function scaledToAmps(samples: SampleArray, probe: ProbeSettings): SampleArray {
  const scale = probeScaleAPerUnit(probe);
  if (scale === 1) return samples;
  const amps = new Float64Array(samples.length);
  for (let i = 0; i < samples.length; i++) amps[i] = (samples[i] as number) * scale;
  return amps;
}

function timeAxisOf(input: TraceInput): TimeAxis {
  const explicit = input.timestampsS !== undefined;
  const implicit = input.sampleRateHz !== undefined;
  if (explicit === implicit) {
    throw new RangeError('give either timestampsS or sampleRateHz (with an optional startS), not both or neither');
  }
  if (explicit) {
    if (input.kind === 'waveform') throw new RangeError('waveform traces need a uniform sample rate (sampleRateHz), not timestamps');
    if (input.startS !== undefined) throw new RangeError('startS goes with sampleRateHz, not with timestampsS');
    return explicitTimeAxis(input.timestampsS as Float64Array);
  }
  return uniformTimeAxis(input.startS ?? 0, input.sampleRateHz as number);
}

/**
 * Analyses one trace (see the file comment). Throws a RangeError naming the problem for any bad
 * input: empty or non-finite samples, bad timestamps, a bad probe or parameter, a waveform too short
 * for one cycle, or one whose mains frequency cannot be estimated.
 */
export function analyzeTrace(input: TraceInput, params: AnalyzeParams = {}): TraceAnalysis {
  if (input.kind !== 'rms' && input.kind !== 'waveform') {
    throw new RangeError(`kind must be "rms" or "waveform" (got ${String(input.kind)})`);
  }
  assertSampleArray(input.samples, 'samples');
  if (input.samples.length === 0) throw new RangeError('samples must not be empty');
  const probe = input.probe ?? DEFAULT_PROBE;
  const axis = timeAxisOf(input);
  const eventParams = resolveEventParams(params.events);
  const amps = scaledToAmps(input.samples, probe);
  const statisticsOptions = {
    voltageV: params.nominalVoltageV ?? null,
    powerFactor: params.powerFactor ?? DEFAULT_POWER_FACTOR,
    thresholdsA: params.thresholdsA ?? [],
    gapFactor: params.gapFactor ?? DEFAULT_GAP_FACTOR,
    maxGapsListed: params.maxGapsListed ?? DEFAULT_MAX_GAPS_LISTED,
  };

  let seriesAxis: TimeAxis;
  let series: SampleArray;
  let waveform: WaveformSummary | null = null;
  let mainsFrequencyHz: number | null = null;
  let mainsFrequencySource: 'given' | 'estimated' | null = null;
  let blocks: ReturnType<typeof halfCycleBlocks> | undefined;
  let seriesMinA: number | undefined;
  if (input.kind === 'waveform') {
    const rateHz = input.sampleRateHz as number;
    if (params.mainsFrequencyHz !== undefined && params.mainsFrequencyHz !== null) {
      mainsFrequencyHz = params.mainsFrequencyHz;
      mainsFrequencySource = 'given';
    } else {
      mainsFrequencyHz = estimateMainsFrequency(amps, rateHz).mainsFrequencyHz;
      mainsFrequencySource = 'estimated';
    }
    blocks = halfCycleBlocks(amps, rateHz, mainsFrequencyHz, input.startS ?? 0);
    const rms = halfCycleRmsFromBlocks(blocks);
    if (rms.rmsA.length === 0) throw new RangeError('the waveform is shorter than one and a half cycles: no RMS value can be formed');
    const shape = waveformShapeFromBlocks(blocks);
    waveform = {
      peakA: shape.peakA,
      peakTimeS: blocks.startS + shape.peakIndex / rateHz,
      rmsA: shape.rmsA,
      dcA: shape.dcA,
      rectifiedMeanA: shape.rectifiedMeanA,
      crestFactor: shape.crestFactor,
      formFactor: shape.formFactor,
    };
    series = rms.rmsA;
    seriesAxis = explicitTimeAxis(rms.timesS);
  } else {
    seriesMinA = assertFiniteValues(amps, 'samples (in amperes)', MAX_ABS_CURRENT_A).min;
    series = amps;
    seriesAxis = axis;
  }

  const levels = resolveOnThreshold(series, eventParams, 0, series.length, seriesMinA);
  const statistics = computeStatistics(seriesAxis, series, { ...statisticsOptions, onThresholdA: levels.onThresholdA });
  const events = detectEvents(seriesAxis, series, eventParams, { levels, ...(blocks ? { blocks } : {}) });
  const lastIndex = input.samples.length - 1;
  return {
    kind: input.kind,
    sampleCount: input.samples.length,
    firstTimeS: axis.kind === 'uniform' ? axis.startS : (axis.timesS[0] as number),
    lastTimeS: axis.kind === 'uniform' ? axis.startS + lastIndex / axis.rateHz : (axis.timesS[lastIndex] as number),
    rmsSeriesLength: series.length,
    rmsSeriesMethod: input.kind === 'waveform' ? HALF_CYCLE_RMS_METHOD : null,
    waveform,
    statistics,
    inrushEvents: events.inrushEvents,
    surges: events.surges,
    onPeriodCount: events.onPeriodCount,
    eventsTruncated: events.eventsTruncated,
    params: {
      probe: { ...probe },
      mainsFrequencyHz,
      mainsFrequencySource,
      nominalVoltageV: statisticsOptions.voltageV,
      powerFactor: statisticsOptions.powerFactor,
      thresholdsA: [...statisticsOptions.thresholdsA],
      gapFactor: statisticsOptions.gapFactor,
      events: events.params,
    },
  };
}
