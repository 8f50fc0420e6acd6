/**
 * Headroom's analysis engine: pure functions over typed arrays (no I/O, no framework imports).
 * This file lists the public exports by topic; nothing inside `analysis/` imports it (so there are
 * no re-export cycles), and callers may equally import the topic files directly. Definitions,
 * defaults and sources are in each file's doc comments and in README.md ("What Headroom computes").
 * The circuit-check modules (`trip/`, `code-rules/`, `check/`, `ratings/`) are imported from their
 * own folders.
 */

// Entry point: the whole analysis of one trace
export {
  analyzeTrace,
  DEFAULT_ANALYZE_PARAMS,
  HALF_CYCLE_RMS_METHOD,
  type AnalyzeParams,
  type AnalyzeParamsUsed,
  type TraceAnalysis,
  type TraceInput,
  type TraceKind,
  type WaveformSummary,
} from './pipeline/analyze-trace.js';

// Input checks and limits
export {
  MAX_ABS_CURRENT_A,
  MAX_ABS_TIME_S,
  assertFiniteValues,
  type SampleArray,
} from './validation/assert-input.js';

// Probe: raw readings to amperes
export {
  DEFAULT_PROBE,
  MAX_PROBE_LOOPS,
  assertProbeSettings,
  normaliseProbeReadings,
  probeScaleAPerUnit,
  type ProbeInputUnit,
  type ProbeSettings,
} from './probe/normalise-probe.js';

// Time axes, typical spacing and gaps
export {
  MAX_SAMPLE_RATE_HZ,
  assertTimeAxis,
  explicitTimeAxis,
  indexAfterTime,
  indexRangeForWindow,
  timeAt,
  timesOf,
  uniformTimeAxis,
  type ExplicitTimeAxis,
  type TimeAxis,
  type UniformTimeAxis,
} from './time/time-axis.js';
export {
  DEFAULT_GAP_FACTOR,
  TYPICAL_SPACING_SAMPLE_INTERVALS,
  gapThresholdFromSpacing,
  typicalSpacingS,
} from './time/typical-spacing.js';

// Waveforms: half-cycle RMS (IEC 61000-4-30 method), mains frequency, shape
export {
  MAX_MAINS_FREQUENCY_HZ,
  MIN_MAINS_FREQUENCY_HZ,
  aggregationCyclesFor,
  iecWindowLengths,
  type IecWindowLengths,
} from './waveform/iec-windows.js';
export {
  MIN_SAMPLES_PER_HALF_CYCLE,
  halfCycleBlocks,
  sumSegment,
  type HalfCycleBlocks,
  type SegmentSums,
} from './waveform/half-cycle-blocks.js';
export { halfCycleRms, halfCycleRmsFromBlocks, type HalfCycleRmsSeries } from './waveform/half-cycle-rms.js';
export { cycleAggregateRms, type CycleAggregateSeries } from './waveform/cycle-aggregation.js';
export {
  DEFAULT_MAINS_FREQUENCY_ESTIMATE_PARAMS,
  estimateMainsFrequency,
  type MainsFrequencyEstimate,
  type MainsFrequencyEstimateParams,
} from './waveform/mains-frequency.js';
export {
  crestFactor,
  formFactor,
  waveformShape,
  waveformShapeFromBlocks,
  type WaveformShape,
} from './waveform/waveform-shape.js';

// Statistics, quantiles and mergeable summaries
export {
  PERCENTILES_NEED_SAMPLES,
  computeStatistics,
  statisticsFromSummary,
  type GapReport,
  type Statistics,
  type StatisticsOptions,
  type StatisticsOutputOptions,
  type TimeAboveThreshold,
} from './stats/statistics.js';
export {
  DEFAULT_MAX_GAPS_LISTED,
  SUMMARY_BLOCK_SAMPLES,
  assertSummaryOptions,
  summarise,
  type GapInterval,
  type SampleSummary,
  type SummariseOptions,
} from './stats/sample-summary.js';
export { mergeSummaries, mergeSummaryList } from './stats/merge-summaries.js';
export { QUANTILE_METHOD, exactQuantiles, medianAbove } from './stats/quantiles.js';
export { selectRanks } from './stats/order-statistics.js';
export { chargeAhFromIntegral, energyKWhFromIntegral } from './stats/energy.js';
export { timeAboveOnSegment } from './stats/linear-segment.js';

// Events: on/off levels, inrush, surges
export {
  DEFAULT_EVENT_PARAMS,
  detectEvents,
  resolveEventParams,
  type DetectedEvents,
  type EventContext,
  type EventLimitParams,
  type EventParams,
  type EventParamsUsed,
} from './events/detect-events.js';
export {
  DEFAULT_ON_THRESHOLD_PARAMS,
  resolveOnThreshold,
  type OnThresholdParams,
  type ResolvedOnThreshold,
} from './events/on-threshold.js';
export { findOnPeriods, type OnPeriod } from './events/on-periods.js';
export {
  DEFAULT_INRUSH_PARAMS,
  analyseInrush,
  steadyCurrent,
  type InrushEvent,
  type InrushParams,
} from './events/inrush.js';
export { DEFAULT_SURGE_PARAMS, findSurges, type Surge, type SurgeParams } from './events/surges.js';
export { crossingTime, integrateSquares } from './events/series-integral.js';

// Power and nameplate helpers
export { DEFAULT_POWER_FACTOR, ampsFromWatts, voltAmperes, wattsFromAmps } from './power/watts-amps.js';
export {
  HORSEPOWER_MATCH_TOLERANCE,
  NEC_TABLE_430_248,
  motorTableVoltageColumn,
  singlePhaseMotorFullLoadCurrent,
  type MotorFullLoadCurrent,
  type MotorTableVoltageV,
  type SinglePhaseMotorRow,
} from './nameplate/motor-full-load-current.js';
export {
  NEC_TABLE_430_7_B,
  isLockedRotorCodeLetter,
  lockedRotorCurrentRange,
  type KvaPerHpBand,
  type LockedRotorCodeLetter,
  type LockedRotorCurrentRange,
} from './nameplate/locked-rotor-current.js';
