import { VERDICTS } from '../../../analysis/check/verdict.js';
import { LOAD_CONNECTIONS } from '../../../models/load.js';
import { Citation, CircuitWarning } from './citation.js';
import { Id, Timestamp, z } from './common.js';
import { LoadFigureFields } from './loads.js';

export const Verdict = z.enum(VERDICTS).openapi('Verdict', {
  description: 'fine < tight < dedicated-circuit-advised < over-the-limit (README "How Headroom judges a circuit")',
});

const TripOutcome = z.enum(['will-not-trip', 'may-trip', 'will-trip']);
const InstantaneousBasis = z.enum(['half-cycle-rms', 'peak-over-root-2', 'sample-rms']);

const tightFraction = z.number().min(0).lt(1).openapi({ description: 'Margin below a limit that counts as tight (default 0.1)' });
const assumedMotorStartS = z
  .number()
  .positive()
  .max(60)
  .openapi({ description: 'How long a motor known only by its nameplate draws its locked-rotor current, s (default 1)' });

export const CheckQuery = z.object({
  tightFraction: z.coerce.number().min(0).lt(1).optional().openapi({ description: 'Margin below a limit that counts as tight (default 0.1)' }),
  assumedMotorStartS: z.coerce.number().positive().max(60).optional().openapi({ description: 'Assumed locked-rotor time of a nameplate-only motor, s (default 1)' }),
});

export const WhatIfLoad = z.object(LoadFigureFields).strict().openapi('WhatIfLoad');

export const WhatIfCheck = z
  .object({
    extraLoads: z.array(WhatIfLoad).max(20).default([]).openapi({ description: 'Hypothetical loads, by nameplate, added to the stored ones' }),
    parameters: z.object({ tightFraction: tightFraction.optional(), assumedMotorStartS: assumedMotorStartS.optional() }).strict().optional(),
  })
  .strict()
  .openapi('WhatIfCheck');

export const CheckReason = z
  .object({
    verdict: Verdict,
    ruleId: z.string().openapi({ example: 'nec-210.23-total-within-rating' }),
    citation: Citation,
    message: z.string(),
    loadName: z.string().optional(),
  })
  .openapi('CheckReason');

const RuleResult = z
  .object({
    ruleId: z.string(),
    citation: Citation,
    limitA: z.number(),
    actualA: z.number(),
    passed: z.boolean(),
    severity: z.enum(['violation', 'warning', 'advice']),
    message: z.string(),
  })
  .openapi('RuleResult');

const InstantaneousAssessment = z
  .object({
    outcome: TripOutcome,
    currentA: z.number(),
    basis: InstantaneousBasis,
    noTripA: z.number(),
    tripA: z.number(),
    ratioToNoTripEdge: z.number(),
    ratioToTripEdge: z.number(),
    marginA: z.number(),
    multipleOfRating: z.number(),
  })
  .openapi('InstantaneousAssessment');

const ThermalAssessment = z
  .object({
    outcome: TripOutcome,
    estimatedTripS: z.number().nullable(),
    earliestTripS: z.number().nullable(),
    latestTripS: z.number().nullable(),
    membersTripping: z.number().int(),
    memberCount: z.number().int(),
    fastestHeatingRatio: z.number(),
    nominalHeatingRatio: z.number(),
  })
  .openapi('ThermalAssessment');

const StartUpScenario = z
  .object({
    startingLoad: z.string(),
    othersRunningA: z.number(),
    loadPeakA: z.number(),
    stackedPeakA: z.number(),
    basis: InstantaneousBasis,
    startUpSource: z.enum(['events', 'start-profile', 'motor-code-letter', 'motor-six-times-flc', 'running-only']),
    instantaneous: InstantaneousAssessment.nullable(),
    instantaneousAlone: InstantaneousAssessment.nullable(),
    thermal: ThermalAssessment,
  })
  .openapi('StartUpScenario', { description: 'One load starting while every other load runs (worst-case alignment)' });

const CheckedLoad = z
  .object({
    loadId: Id.nullable(),
    name: z.string(),
    whatIf: z.boolean(),
    runningA: z.number(),
    runningSource: z.enum(['trace', 'nameplate-amps', 'nameplate-watts', 'motor-table-430.248']),
    continuous: z.boolean(),
    connection: z.enum(LOAD_CONNECTIONS),
    startPeakA: z.number(),
    startUpSource: StartUpScenario.shape.startUpSource,
    traceIds: z.array(Id).openapi({ description: 'Traces linked to the load' }),
    usedTraceIds: z.array(Id).openapi({ description: 'Linked traces with samples, which the figures come from (empty: nameplate)' }),
    inrushEvents: z.array(
      z.object({
        traceId: Id,
        onsetAt: z.number().openapi({ description: 'Epoch ms' }),
        peakA: z.number(),
        steadyA: z.number(),
        timeToPeakS: z.number(),
        settleTimeS: z.number().nullable(),
        durationS: z.number(),
        i2tA2s: z.number(),
      }).loose(),
    ),
    surges: z.array(
      z.object({ traceId: Id, startAt: z.number(), durationS: z.number(), peakA: z.number(), runningA: z.number(), i2tA2s: z.number() }).loose(),
    ),
  })
  .openapi('CheckedLoad');

export const HeadroomCheck = z
  .object({
    circuitId: Id,
    circuitLabel: z.string(),
    siteId: Id,
    checkedAt: Timestamp,
    verdict: Verdict,
    verdictLabel: z.string().openapi({ example: 'Dedicated circuit advised' }),
    summary: z.string(),
    headroomA: z.number().openapi({ description: 'Rating − (noncontinuous + 125 % of continuous load), A; negative when over' }),
    startHeadroomA: z.number().nullable().openapi({ description: 'Amps between the worst stacked start and the instantaneous no-trip edge; null for fuses' }),
    reasons: z.array(CheckReason).openapi({ description: 'Worst first; each names its rule or clause with the edition' }),
    steady: z.object({
      ratingA: z.number(),
      runningTotalA: z.number(),
      continuousA: z.number(),
      noncontinuousA: z.number(),
      fastenedInPlaceA: z.number(),
      requiredRatingA: z.number(),
      rules: z.array(RuleResult),
    }),
    startUps: z.array(StartUpScenario),
    thermal: z.object({ allRunning: ThermalAssessment }),
    loads: z.array(CheckedLoad),
    warnings: z.array(CircuitWarning),
    device: z.object({ deviceKind: z.string(), ratingA: z.number(), label: z.string(), notes: z.array(z.string()) }),
    assumptions: z.array(z.string()),
    cautions: z.array(z.object({ id: z.string(), text: z.string() })),
    parameters: z.object({ tightFraction: z.number(), assumedMotorStartS: z.number(), necEdition: z.number().int() }),
  })
  .openapi('HeadroomCheck');
