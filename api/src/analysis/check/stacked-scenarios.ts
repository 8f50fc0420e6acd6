import type { Citation } from '../code-rules/citation.js';
import { formatAmps } from '../code-rules/rule-result.js';
import { profileFromSteps, type CurrentProfile } from '../trip/current-profile.js';
import {
  assessInstantaneous,
  type InstantaneousAssessment,
  type InstantaneousBasis,
} from '../trip/instantaneous-band.js';
import { assessThermal, type ThermalAssessment } from '../trip/thermal-family.js';
import type { TripModel } from '../trip/trip-model.js';
import type { CheckParameters, CircuitUnderCheck, LoadUnderCheck } from './check-input.js';
import { describeLoadStartUp, type StartUpSource } from './load-start-up.js';
import { compareVerdicts, type CheckReason } from './verdict.js';

/**
 * One worst-case alignment: load `startingLoad` starts (or runs its duty) while every other load runs at
 * its running current. Currents add arithmetically (in phase — the worst case).
 * - `othersRunningA`: sum of the other loads' running currents, amps;
 * - `loadPeakA`: the starting load's own highest current; `stackedPeakA` = loadPeakA + othersRunningA;
 * - `instantaneous` / `instantaneousAlone`: the stacked and the lone start against the device's
 *   instantaneous band (null for fuses);
 * - `thermal`: the stacked profile through the device's thermal band, starting in equilibrium with the
 *   others' running current; after a start the running total is held (a duty profile is not held).
 */
export interface StackedScenario {
  startingLoad: string;
  othersRunningA: number;
  loadPeakA: number;
  stackedPeakA: number;
  basis: InstantaneousBasis;
  startUpSource: StartUpSource;
  instantaneous: InstantaneousAssessment | null;
  instantaneousAlone: InstantaneousAssessment | null;
  thermal: ThermalAssessment;
}

/** Result of {@link checkStackedScenarios}. */
export interface StackedScenarios {
  scenarios: StackedScenario[];
  /** Amps left between the worst stacked start and the no-trip edge of the band (null for fuses or no loads). */
  startHeadroomA: number | null;
  /** All loads running together, from cold and held: the steady part of the thermal check. */
  allRunning: ThermalAssessment;
  /** Assumptions made for loads without measured start-ups (plain English). */
  assumptions: string[];
  reasons: CheckReason[];
}

/** `profile` with `amps` added to every sample (new arrays; the input is not changed). */
export function addConstantCurrent(profile: CurrentProfile, amps: number): CurrentProfile {
  const currentA = new Float64Array(profile.currentA.length);
  for (let i = 0; i < currentA.length; i++) currentA[i] = profile.currentA[i]! + amps;
  return { timesS: profile.timesS, currentA, ...(profile.endS === undefined ? {} : { endS: profile.endS }) };
}

function formatSeconds(seconds: number): string {
  if (seconds < 120) return `${Number(seconds.toPrecision(2))} s`;
  if (seconds < 7200) return `${Number((seconds / 60).toPrecision(2))} min`;
  return `${Number((seconds / 3600).toPrecision(2))} h`;
}

function instantaneousReason(scenario: StackedScenario, model: TripModel, tightFraction: number): CheckReason | null {
  const stacked = scenario.instantaneous;
  const band = model.instantaneous;
  if (stacked === null || band === null) return null;
  const who = scenario.startingLoad;
  const others = scenario.othersRunningA > 0 ? ` while the others run (${formatAmps(scenario.othersRunningA)})` : '';
  const figure =
    `Starting ${who}${others} draws up to ${formatAmps(scenario.stackedPeakA)} ` +
    `(${stacked.multipleOfRating.toFixed(2)} × rating, ${stacked.basis})`;
  const base = { ruleId: 'instantaneous-band', citation: band.citation, loadName: who };
  const aloneClear = scenario.instantaneousAlone?.outcome === 'will-not-trip';
  if (stacked.outcome === 'will-trip') {
    return {
      ...base,
      verdict: 'over-the-limit',
      message: `${figure}: at or above ${formatAmps(stacked.tripA)}, where a ${model.label} must trip instantaneously.`,
    };
  }
  if (stacked.outcome === 'may-trip') {
    return {
      ...base,
      verdict: 'dedicated-circuit-advised',
      message:
        `${figure}: inside the instantaneous band (${formatAmps(stacked.noTripA)}–${formatAmps(stacked.tripA)}) ` +
        `of a ${model.label}, so it may trip on start-up` +
        (aloneClear
          ? '; on a circuit of its own the start stays below the band.'
          : ', even on its own; check the maker’s curve.'),
    };
  }
  if (stacked.ratioToNoTripEdge > 1 - tightFraction) {
    return {
      ...base,
      verdict: 'tight',
      message: `${figure}: only ${formatAmps(stacked.marginA)} below the instantaneous band of a ${model.label}.`,
    };
  }
  return null;
}

function thermalCitation(model: TripModel): Citation {
  const point = model.thermal.testPoints.find((p) => p.requirement === 'trip-within') ?? model.thermal.testPoints[0]!;
  return point.citation;
}

/**
 * The thermal finding for one assessment: every band member trips → over-the-limit; the nominal member
 * trips → dedicated-circuit-advised; only faster members trip, or the fastest reaches (1 − tightFraction)
 * of its trip point → tight. `when` describes the situation ("With all loads running …").
 */
function thermalReason(
  t: ThermalAssessment,
  when: string,
  model: TripModel,
  tightFraction: number,
  loadName?: string,
): CheckReason | null {
  const base = {
    ruleId: 'thermal-band',
    citation: thermalCitation(model),
    ...(loadName === undefined ? {} : { loadName }),
  };
  if (t.outcome === 'will-trip') {
    return {
      ...base,
      verdict: 'over-the-limit',
      message:
        `${when}, every device the standard allows trips on overload, within ` +
        `${formatSeconds(t.earliestTripS!)}–${formatSeconds(t.latestTripS!)}.`,
    };
  }
  if (t.estimatedTripS !== null) {
    return {
      ...base,
      verdict: 'dedicated-circuit-advised',
      message:
        `${when}, a typical ${model.label} would trip on overload after about ${formatSeconds(t.estimatedTripS)} ` +
        `(band from ${formatSeconds(t.earliestTripS!)}; some devices may hold).`,
    };
  }
  if (t.outcome === 'may-trip') {
    return {
      ...base,
      verdict: 'tight',
      message:
        `${when}, only the fastest devices the standard allows could trip on overload (from ` +
        `${formatSeconds(t.earliestTripS!)}); a typical one holds.`,
    };
  }
  if (t.fastestHeatingRatio > 1 - tightFraction) {
    return {
      ...base,
      verdict: 'tight',
      message: `${when}, the fastest thermal element the standard allows reaches ${Math.round(t.fastestHeatingRatio * 100)} % of its trip point.`,
    };
  }
  return null;
}

/**
 * Start-up and thermal check with worst-case alignment: for each load in turn, its start (or duty) is
 * stacked on the running current of all the others and judged against the device's instantaneous band and
 * thermal band. Instantaneous: `will-trip` → over-the-limit, `may-trip` → dedicated-circuit-advised, within
 * the tight margin below the band → tight. Thermal (worst scenario only): every band member trips →
 * over-the-limit; the nominal member trips → dedicated-circuit-advised; only faster members trip, or the
 * fastest reaches (1 − tightFraction) of its trip point → tight.
 */
export function checkStackedScenarios(
  circuit: CircuitUnderCheck,
  loads: readonly LoadUnderCheck[],
  model: TripModel,
  params: CheckParameters,
): StackedScenarios {
  const totalRunningA = loads.reduce((s, l) => s + l.runningA, 0);
  const scenarios: StackedScenario[] = [];
  const assumptions: string[] = [];
  for (const load of loads) {
    const start = describeLoadStartUp(load, circuit.mainsHz, circuit.nominalVoltageV, params);
    if (start.assumption !== null) assumptions.push(start.assumption);
    const othersRunningA = Math.max(0, totalRunningA - load.runningA);
    const stackedPeakA = start.peakA + othersRunningA;
    const band = model.instantaneous;
    scenarios.push({
      startingLoad: load.name,
      othersRunningA,
      loadPeakA: start.peakA,
      stackedPeakA,
      basis: start.basis,
      startUpSource: start.source,
      instantaneous: band === null ? null : assessInstantaneous(band, model.ratingA, stackedPeakA, start.basis),
      instantaneousAlone: band === null ? null : assessInstantaneous(band, model.ratingA, start.peakA, start.basis),
      thermal: assessThermal(model.thermal, model.ratingA, addConstantCurrent(start.profile, othersRunningA), {
        initialCurrentA: othersRunningA,
        holdLast: start.holdLast,
      }),
    });
  }

  const reasons: CheckReason[] = [];
  for (const scenario of scenarios) {
    const reason = instantaneousReason(scenario, model, params.tightFraction);
    if (reason !== null) reasons.push(reason);
  }
  // All loads running together from cold, held: the steady part of the thermal check.
  const allRunning = assessThermal(
    model.thermal,
    model.ratingA,
    profileFromSteps([{ currentA: totalRunningA, durationS: 1 }]),
    {
      holdLast: true,
    },
  );
  // The worst thermal finding; on a tie the all-running one, which names no single load.
  const thermal = scenarios
    .map((scenario) =>
      thermalReason(
        scenario.thermal,
        `With ${scenario.startingLoad} starting while the others run`,
        model,
        params.tightFraction,
        scenario.startingLoad,
      ),
    )
    .reduce<CheckReason | null>(
      (worst, reason) =>
        reason !== null && (worst === null || compareVerdicts(reason.verdict, worst.verdict) > 0) ? reason : worst,
      thermalReason(
        allRunning,
        `With all loads running together (${formatAmps(totalRunningA)})`,
        model,
        params.tightFraction,
      ),
    );
  if (thermal !== null) reasons.push(thermal);
  const margins = scenarios.flatMap((s) => (s.instantaneous === null ? [] : [s.instantaneous.marginA]));
  return {
    scenarios,
    startHeadroomA: margins.length === 0 ? null : Math.min(...margins),
    allRunning,
    assumptions,
    reasons,
  };
}
