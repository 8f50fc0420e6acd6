/** Statistics of a window or a trace, as every route answers them (see services/analysis-view.ts). */
import { z } from './common.js';

const epochMs = (what: string) => z.number().openapi({ description: `${what}, epoch ms` });
const GapInterval = z.object({ startAt: epochMs('Start'), endAt: epochMs('End'), durationS: z.number() });

export const Statistics = z
  .object({
    count: z.number().int(),
    firstAt: epochMs('First sample'),
    lastAt: epochMs('Last sample'),
    durationS: z.number(),
    coveredTimeS: z.number().openapi({ description: 'Time covered by samples, gaps excluded' }),
    minA: z.number(),
    minAt: epochMs('Time of the minimum'),
    maxA: z.number(),
    maxAt: epochMs('Time of the maximum'),
    meanA: z.number(),
    rmsA: z.number(),
    standardDeviationA: z.number(),
    timeWeightedMeanA: z.number().nullable(),
    thermalEquivalentA: z.number().nullable().openapi({ description: 'RMS over time: the steady current that heats a conductor as much' }),
    p50A: z.number().nullable(),
    p95A: z.number().nullable(),
    p99A: z.number().nullable(),
    quantileMethod: z.string().openapi({ description: 'How the percentiles were computed, or why they are null' }),
    chargeAh: z.number(),
    energyKWh: z.number().nullable().openapi({ description: 'Null without a nominal voltage' }),
    voltageV: z.number().nullable(),
    powerFactor: z.number(),
    onThresholdA: z.number().nullable(),
    dutyCycle: z.number().nullable(),
    timeAbove: z.array(z.object({ thresholdA: z.number(), timeS: z.number(), share: z.number().nullable() })),
    gaps: z.object({
      thresholdS: z.number().nullable(),
      count: z.number().int(),
      totalS: z.number(),
      longest: GapInterval.nullable(),
      listed: z.array(GapInterval),
      listTruncated: z.boolean(),
    }),
  })
  .openapi('TraceStatistics', {
    description:
      'Statistics in amperes (see README "What Headroom computes"): count, min/max with their time (`minAt`, `maxAt`, epoch ms), mean, RMS, ' +
      'standard deviation, time-weighted mean, thermal-equivalent current, p50/p95/p99 (null when assembled from summaries), charge, energy, gaps.',
  });
