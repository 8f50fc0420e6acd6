import type { Caution } from '../analysis/check/cautions.js';
import {
  DEFAULT_CHECK_PARAMETERS,
  type CheckParameters,
  type CircuitUnderCheck,
  type LoadUnderCheck,
} from '../analysis/check/check-input.js';
import { checkCircuitHeadroom, type HeadroomCheck } from '../analysis/check/headroom-check.js';
import type { StackedScenario } from '../analysis/check/stacked-scenarios.js';
import type { SteadyLoading } from '../analysis/check/steady-check.js';
import type { CheckReason, Verdict } from '../analysis/check/verdict.js';
import type { ThermalAssessment } from '../analysis/trip/thermal-family.js';
import type { Scope } from '../auth/scope.js';
import { invalid, Problem } from '../errors/problem.js';
import type { Circuit } from '../models/circuit.js';
import { loadFromNameplate, type PreparedLoad } from './check-inputs.js';
import { figuresFromTraces, type TraceFigures, type TraceReader } from './trace-figures.js';
import { circuitWarnings, type CircuitWarning } from './circuit-warnings.js';
import type { CircuitsService } from './circuits.js';
import { loadFigureProblems, type LoadFigures } from './load-figures.js';
import type { LoadsService, LoadView } from './loads.js';

/** Plain-English names of the verdicts, for reports and screens. */
export const VERDICT_LABELS: Readonly<Record<Verdict, string>> = {
  fine: 'Fine',
  tight: 'Tight',
  'dedicated-circuit-advised': 'Dedicated circuit advised',
  'over-the-limit': 'Over the limit',
};

/** One load as judged: where its figures came from. `loadId` is null for a what-if load. */
export interface CheckedLoad {
  loadId: string | null;
  name: string;
  whatIf: boolean;
  runningA: number;
  runningSource: LoadUnderCheck['runningSource'];
  continuous: boolean;
  connection: LoadUnderCheck['connection'];
  /** Highest start-up current the check used for this load alone, amps. */
  startPeakA: number;
  startUpSource: StackedScenario['startUpSource'];
  /** Linked traces, and those with samples that the figures came from. */
  traceIds: string[];
  usedTraceIds: string[];
  /** Inrush events and surges recorded in the load's traces. */
  inrushEvents: TraceFigures['inrushEvents'];
  surges: TraceFigures['surges'];
}

/** The headroom check of one circuit, as the API answers it. */
export interface CheckView {
  circuitId: string;
  circuitLabel: string;
  siteId: string;
  checkedAt: string;
  verdict: Verdict;
  verdictLabel: string;
  /** One sentence: the verdict and its main reason. */
  summary: string;
  headroomA: number;
  startHeadroomA: number | null;
  reasons: CheckReason[];
  steady: Omit<SteadyLoading, 'reasons'> & { ratingA: number };
  /** Each load starting while the others run (worst-case alignment), against the instantaneous and thermal bands. */
  startUps: StackedScenario[];
  thermal: { allRunning: ThermalAssessment };
  loads: CheckedLoad[];
  warnings: CircuitWarning[];
  device: HeadroomCheck['device'];
  assumptions: string[];
  cautions: Caution[];
  parameters: HeadroomCheck['parameters'];
}

/** A hypothetical load of a what-if check, by nameplate. */
export type WhatIfLoad = LoadFigures;

export interface CheckOptions {
  extraLoads?: WhatIfLoad[] | undefined;
  parameters?: Partial<CheckParameters> | undefined;
}

/**
 * The circuit as the check sees it. A circuit that feeds no other outlets and carries a single load is an
 * individual branch circuit (NEC 210.22: it may carry its load up to its rating, and the 210.23 shares do
 * not apply); otherwise it is a multi-outlet circuit.
 */
function circuitUnderCheck(circuit: Circuit, loadCount: number): CircuitUnderCheck {
  const material = circuit.conductorMaterial ?? 'cu';
  const awg = /^\s*(\d{1,2})\s*(awg)?\s*$/i.exec(circuit.conductorSize ?? '');
  return {
    ratingA: circuit.deviceRatingA,
    deviceKind: circuit.deviceKind,
    nominalVoltageV: circuit.nominalVoltageV,
    mainsHz: circuit.mainsHz,
    conductor: awg ? { sizeAwg: awg[1]!, material } : null,
    alsoFeedsLightingOrOutlets: circuit.feedsOtherOutlets,
    individualBranchCircuit: !circuit.feedsOtherOutlets && loadCount <= 1,
    necEdition: circuit.necEdition === 2020 ? 2020 : 2023,
  };
}

function summaryOf(result: HeadroomCheck, ratingA: number): string {
  const label = VERDICT_LABELS[result.verdict];
  const first = result.reasons[0];
  if (first !== undefined) return `${label}: ${first.message}`;
  return `${label}: every rule passes, with ${Math.round(result.headroomA * 100) / 100} A of the ${ratingA} A rating to spare.`;
}

/** A check with the inputs it was computed from (for reports that redraw the stacked profiles). */
export interface CheckRun {
  view: CheckView;
  circuit: CircuitUnderCheck;
  loads: LoadUnderCheck[];
  parameters: CheckParameters;
}

/** A load ready for the check, with where it came from. */
type Prepared = PreparedLoad & { loadId: string | null; traceIds: string[]; traced: TraceFigures | null };

export function createChecksService(deps: {
  circuits: CircuitsService;
  loads: LoadsService;
  traces?: TraceReader | undefined;
}) {
  const { circuits, loads, traces } = deps;

  /**
   * A stored load for the check: from its traces when any linked trace has samples (see trace-figures.ts),
   * else from its nameplate. A motor's nameplate still supplies the start when its traces recorded none.
   */
  async function prepareStored(
    scope: Scope,
    load: LoadView,
    voltageV: number,
    params: CheckParameters,
  ): Promise<Prepared> {
    const base = { loadId: load.id, traceIds: load.traceIds };
    const traced =
      traces && load.traceIds.length > 0 ? await figuresFromTraces(traces, scope, load.name, load.traceIds) : null;
    if (traced === null) {
      const p = loadFromNameplate(load, voltageV, params);
      if (load.traceIds.length > 0)
        p.assumptions.unshift(`${load.name}: its traces hold no samples yet; the nameplate is used.`);
      return { ...p, ...base, traced: null };
    }
    const input: LoadUnderCheck = {
      name: load.name,
      runningA: traced.runningA,
      runningSource: 'trace',
      continuous: load.continuous,
      connection: load.connection,
      startUp: traced.startUp,
      duty: traced.duty,
    };
    if (traced.startUp === null && load.motorHp != null)
      input.motor = { horsepower: load.motorHp, codeLetter: load.lockedRotorCode };
    return { input, assumptions: traced.assumptions, ...base, traced };
  }

  /**
   * Judges a circuit with its stored loads and any hypothetical `extraLoads`. 404 for a circuit outside the
   * caller's organisation; 400 naming each bad what-if field; 409 when the circuit as recorded cannot be
   * judged (e.g. a device outside every trip model).
   */
  async function run(scope: Scope, circuitId: string, options: CheckOptions = {}): Promise<CheckRun> {
    const circuit = await circuits.find(scope, circuitId);
    const extraLoads = options.extraLoads ?? [];
    const problems = extraLoads.flatMap((l, i) =>
      loadFigureProblems(l, circuit.nominalVoltageV, { pointerPrefix: `/extraLoads/${i}` }),
    );
    if (problems.length > 0) throw invalid(problems);

    const params: CheckParameters = { ...DEFAULT_CHECK_PARAMETERS, ...options.parameters };
    const stored = await loads.allOfCircuit(scope, circuitId);
    const prepared: Prepared[] = [];
    try {
      for (const load of stored) {
        prepared.push(await prepareStored(scope, load, circuit.nominalVoltageV, params));
      }
      for (const load of extraLoads) {
        const p = loadFromNameplate(load, circuit.nominalVoltageV, params);
        p.input.name = `${load.name} (what-if)`;
        prepared.push({ ...p, loadId: null, traceIds: [], traced: null });
      }
    } catch (err) {
      if (err instanceof RangeError)
        throw new Problem('conflict', `A load cannot be judged as recorded: ${err.message}`);
      throw err;
    }

    const judged = circuitUnderCheck(circuit, prepared.length);
    const inputs = prepared.map((p) => p.input);
    let result: HeadroomCheck;
    try {
      result = checkCircuitHeadroom(judged, inputs, params);
    } catch (err) {
      if (err instanceof RangeError)
        throw new Problem('conflict', `This circuit cannot be checked as recorded: ${err.message}`);
      throw err;
    }

    const { reasons: _steadyReasons, ...steady } = result.steady;
    const view: CheckView = {
      circuitId: circuit.id,
      circuitLabel: circuit.label,
      siteId: circuit.siteId,
      checkedAt: new Date().toISOString(),
      verdict: result.verdict,
      verdictLabel: VERDICT_LABELS[result.verdict],
      summary: summaryOf(result, circuit.deviceRatingA),
      headroomA: result.headroomA,
      startHeadroomA: result.startHeadroomA,
      reasons: result.reasons,
      steady: { ...steady, ratingA: circuit.deviceRatingA },
      startUps: result.scenarios,
      thermal: { allRunning: result.allRunningThermal },
      loads: prepared.map((p, i) => ({
        loadId: p.loadId,
        name: p.input.name,
        whatIf: p.loadId === null,
        runningA: p.input.runningA,
        runningSource: p.input.runningSource,
        continuous: p.input.continuous,
        connection: p.input.connection,
        startPeakA: result.scenarios[i]?.loadPeakA ?? p.input.runningA,
        startUpSource: result.scenarios[i]?.startUpSource ?? 'running-only',
        traceIds: p.traceIds,
        usedTraceIds: p.traced?.usedTraceIds ?? [],
        inrushEvents: p.traced?.inrushEvents ?? [],
        surges: p.traced?.surges ?? [],
      })),
      warnings: circuitWarnings(circuit),
      device: result.device,
      assumptions: [...prepared.flatMap((p) => p.assumptions), ...result.assumptions],
      cautions: result.cautions,
      parameters: result.parameters,
    };
    return { view, circuit: judged, loads: inputs, parameters: params };
  }

  return {
    run,
    /** The headroom check of a circuit (see {@link run}). */
    async check(scope: Scope, circuitId: string, options: CheckOptions = {}): Promise<CheckView> {
      return (await run(scope, circuitId, options)).view;
    },
  };
}

export type ChecksService = ReturnType<typeof createChecksService>;
