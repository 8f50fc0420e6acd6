import { z } from './common.js';
import { Statistics } from './statistics.js';

/** How raw readings become amperes (same shape as a trace's probe). */
export const Probe = z
  .object({
    inputUnit: z.enum(['A', 'mA', 'mV']).openapi({ description: 'Unit of the raw readings' }),
    sensitivityPerA: z
      .number()
      .positive()
      .openapi({ description: 'Raw units per ampere through the jaw: 1 for amperes or 1 mA/A, 10 for 10 mV/A', example: 1 }),
    loops: z
      .number()
      .int()
      .min(1)
      .max(100)
      .openapi({ description: 'Turns of the conductor through the jaw (10 with a x10 splitter loop: readings are divided by 10)', example: 1 }),
  })
  .strict()
  .openapi('Probe');

export const EventParamsInput = z
  .object({
    onThresholdA: z.number().nonnegative().nullable().optional().openapi({ description: 'Fixed on-threshold (A); null or absent: derived from the trace' }),
    onFloorA: z.number().nonnegative().optional().openapi({ description: 'Absolute floor of the on-threshold above the baseline (A); default 0.5' }),
    onFraction: z.number().gt(0).lt(1).optional().openapi({ description: 'Share of the running level above baseline at which the load counts as on; default 0.25' }),
    hysteresisFraction: z.number().min(0).lt(1).optional().openapi({ description: 'Hysteresis below the on-threshold, as a share; default 0.5' }),
    maxInrushS: z.number().positive().optional().openapi({ description: 'Window after the switch-on in which the peak is sought (s); default 10' }),
    settleTolerance: z.number().gt(0).lt(1).optional().openapi({ description: 'Settling band as a fraction of the steady current; default 0.1' }),
    settleHoldS: z.number().nonnegative().optional().openapi({ description: 'Time the current must stay in the band (s); default 0.5' }),
    firstCycles: z.number().int().min(1).optional().openapi({ description: 'Cycles after the switch-on searched for the instantaneous peak (waveforms); default 2' }),
    surgeThresholdFraction: z.number().positive().optional().openapi({ description: 'Surge: excursion above running as a fraction of it; default 0.25' }),
    surgeFloorA: z.number().nonnegative().optional().openapi({ description: 'Surge: absolute floor of the excursion (A); default 1' }),
    surgeMinDurationS: z.number().nonnegative().optional().openapi({ description: 'Shortest surge reported (s); default 0.02' }),
  })
  .strict()
  .openapi('EventParams');

export const AnalyzeParamsInput = z
  .object({
    mainsFrequencyHz: z.number().min(40).max(70).nullable().optional().openapi({ description: 'Mains frequency of a waveform; absent: estimated from zero crossings' }),
    nominalVoltageV: z.number().positive().max(1000).nullable().optional().openapi({ description: 'Voltage for the energy figure; absent: no energy' }),
    powerFactor: z.number().gt(0).max(1).optional().openapi({ description: 'Power factor for the energy figure; default 1' }),
    thresholdsA: z.array(z.number().nonnegative()).max(20).optional().openapi({ description: 'Current levels to report time above' }),
    gapFactor: z.number().min(1).optional().openapi({ description: 'Intervals longer than this x the typical spacing are gaps; default 2.5' }),
    events: EventParamsInput.optional(),
  })
  .strict()
  .openapi('AnalyzeParams');

const TimeValue = z.union([z.number(), z.string()]);

export const AnalyzeRequest = z
  .object({
    kind: z.enum(['rms', 'waveform']).openapi({ description: '`rms`: each sample is an RMS reading; `waveform`: instantaneous values, uniformly sampled at 1 kHz or more' }),
    probe: Probe.optional(),
    t: z.array(TimeValue).optional().openapi({ description: 'Timestamps: epoch milliseconds or ISO 8601 strings (one format), strictly increasing. With `a`.' }),
    a: z.array(z.number()).optional().openapi({ description: 'Readings at the times `t`, in the probe\'s unit' }),
    start: TimeValue.optional().openapi({ description: 'Time of the first of `values`: epoch ms or ISO 8601; default 0' }),
    rate: z.number().positive().max(1_000_000).optional().openapi({ description: 'Sample rate of `values` (Hz)' }),
    values: z.array(z.number()).optional().openapi({ description: 'Uniformly sampled readings, in the probe\'s unit' }),
    params: AnalyzeParamsInput.optional(),
  })
  .strict()
  .superRefine((body, ctx) => {
    const explicit = body.t !== undefined || body.a !== undefined;
    const uniform = body.values !== undefined || body.rate !== undefined || body.start !== undefined;
    if (explicit === uniform) {
      ctx.addIssue({ code: 'custom', path: [], message: 'send either `t` and `a`, or `values` with `rate` (and optionally `start`)' });
      return;
    }
    if (explicit) {
      if (!body.t) ctx.addIssue({ code: 'custom', path: ['t'], message: 'required with `a`' });
      if (!body.a) ctx.addIssue({ code: 'custom', path: ['a'], message: 'required with `t`' });
      if (body.t && body.a && body.t.length !== body.a.length) {
        ctx.addIssue({ code: 'custom', path: ['a'], message: `has ${body.a.length} values but \`t\` has ${body.t.length}` });
      }
    } else {
      if (!body.values) ctx.addIssue({ code: 'custom', path: ['values'], message: 'required with `rate`' });
      if (body.rate === undefined) ctx.addIssue({ code: 'custom', path: ['rate'], message: 'required with `values`' });
    }
  })
  .openapi('AnalyzeRequest');

export const InrushEvent = z
  .object({
    onsetAt: z.number().openapi({ description: 'Switch-on time, epoch ms' }),
    peakA: z.number(),
    peakAt: z.number().openapi({ description: 'Time of the peak, epoch ms' }),
    timeToPeakS: z.number(),
    steadyA: z.number(),
    peakToSteadyRatio: z.number().nullable(),
    settled: z.boolean(),
    settleTimeS: z.number().nullable(),
    durationS: z.number(),
    i2tA2s: z.number(),
  })
  .catchall(z.unknown())
  .openapi('InrushEvent');

export const Surge = z
  .object({
    startAt: z.number().openapi({ description: 'epoch ms' }),
    endAt: z.number().openapi({ description: 'epoch ms' }),
    durationS: z.number(),
    peakA: z.number(),
    runningA: z.number(),
    i2tA2s: z.number(),
  })
  .catchall(z.unknown())
  .openapi('Surge');

export const WaveformFigures = z
  .object({
    peakA: z.number().openapi({ description: 'Peak: the largest |i| (A)' }),
    peakAt: z.number().openapi({ description: 'Time of the first sample reaching the peak, epoch ms' }),
    rmsA: z.number().openapi({ description: 'RMS: √(mean of i²) (A)' }),
    dcA: z.number().openapi({ description: 'DC: the mean of i (A)' }),
    rectifiedMeanA: z.number().openapi({ description: 'Rectified mean: the mean of |i| (A)' }),
    crestFactor: z.number().nullable().openapi({ description: 'Peak / RMS (√2 for a sine); null when the RMS is 0' }),
    formFactor: z.number().nullable().openapi({ description: 'RMS / rectified mean (π / (2√2) for a sine); null when the rectified mean is 0' }),
  })
  .strict()
  .openapi('WaveformFigures');

export const EventParamsUsed = z
  .object({
    onThresholdA: z.number().openapi({ description: 'On-threshold used (A): given, or derived from the trace' }),
    offThresholdA: z.number().openapi({ description: 'Off-threshold used (A), below the on-threshold by the hysteresis' }),
    baselineA: z.number().openapi({ description: 'Lowest value of the RMS series (A)' }),
    runningLevelA: z.number().nullable().openapi({ description: 'Median of the values more than onFloorA above the baseline (A); null when there are none' }),
    onThresholdSource: z.enum(['given', 'derived']),
    onFloorA: z.number(),
    onFraction: z.number(),
    hysteresisFraction: z.number(),
    maxInrushS: z.number(),
    settleTolerance: z.number(),
    settleHoldS: z.number(),
    firstCycles: z.number().int(),
    surgeThresholdFraction: z.number(),
    surgeFloorA: z.number(),
    surgeMinDurationS: z.number(),
    maxEvents: z.number().int().openapi({ description: 'Most inrush events and most surges listed' }),
  })
  .strict()
  .openapi('EventParamsUsed', { description: 'Every event parameter used (see EventParams), defaults included, with the levels it resolved to' });

export const AnalyzeParamsUsed = z
  .object({
    probe: Probe,
    mainsFrequencyHz: z.number().nullable().openapi({ description: 'Mains frequency used for a waveform (Hz); null for rms traces' }),
    mainsFrequencySource: z.enum(['given', 'estimated']).nullable(),
    nominalVoltageV: z.number().nullable(),
    powerFactor: z.number(),
    thresholdsA: z.array(z.number()),
    gapFactor: z.number(),
    events: EventParamsUsed,
  })
  .strict()
  .openapi('AnalyzeParamsUsed', { description: 'Every parameter the analysis used, defaults included' });

export const AnalyzeResponse = z
  .object({
    kind: z.enum(['rms', 'waveform']),
    sampleCount: z.number().int(),
    firstAt: z.number().openapi({ description: 'Time of the first sample, epoch ms' }),
    lastAt: z.number().openapi({ description: 'Time of the last sample, epoch ms' }),
    rmsSeriesLength: z.number().int(),
    rmsSeriesMethod: z.string().nullable(),
    waveform: z.union([WaveformFigures, z.null()]).openapi({ description: 'Peak, RMS, DC, crest and form factor of a waveform; null for rms traces' }),
    statistics: Statistics.openapi({ description: 'Statistics of the RMS series (see README "What Headroom computes")' }),
    inrushEvents: z.array(InrushEvent),
    surges: z.array(Surge),
    onPeriodCount: z.number().int(),
    eventsTruncated: z.boolean().openapi({ description: 'True when more than params.events.maxEvents inrush events or surges were found and the lists were cut' }),
    params: AnalyzeParamsUsed,
  })
  .openapi('AnalyzeResponse');
