import { describeLoadStartUp } from '../../analysis/check/load-start-up.js';
import { addConstantCurrent } from '../../analysis/check/stacked-scenarios.js';
import { validateCurrentProfile } from '../../analysis/trip/current-profile.js';
import { tripModelFor } from '../../analysis/trip/trip-model.js';
import type { Scope } from '../../auth/scope.js';
import type { Db } from '../../db/open.js';
import type { CheckRun, CheckView } from '../checks.js';
import type { TraceReader } from '../trace-figures.js';
import type { CircuitView } from '../circuits.js';
import type { SiteView } from '../sites.js';
import type { PlotLimit, PlotSeries } from './pdf-plot.js';

/** Everything a report shows about one circuit. */
export interface CircuitReportData {
  circuit: CircuitView;
  check: CheckView;
  plot: ReportPlot;
  /** The loads' recorded traces, when any has samples. */
  recorded: ReportPlot | null;
}

/** One plot of a report: title, a note under it, curves, limit lines and the time axis label. */
export interface ReportPlot {
  title: string;
  note: string;
  series: PlotSeries[];
  limits: PlotLimit[];
  xLabel: string;
}

/** The header of a report: what it is about, when and by whom it was prepared. */
export interface ReportHeader {
  title: string;
  site: SiteView;
  preparedBy: string;
  preparedAt: Date;
}

/** A circuit of a site report that could not be judged as recorded, and why. */
export interface SkippedCircuit {
  label: string;
  reason: string;
}

const SERIES_COLORS = ['#1f4e79', '#8a4b08', '#2e6b30', '#6a1b6a'];

/** Who is asking, in words for "prepared by": the user's name and e-mail, the API key's name, or Headroom. */
export async function describePreparer(db: Db, scope: Scope): Promise<string> {
  const actor = scope.actor;
  if (actor.kind === 'user') {
    const user = await db.models.User.findOne({ where: { id: actor.id, organisationId: scope.organisationId } });
    return user ? `${user.name} (${user.email})` : 'a user of this organisation';
  }
  if (actor.kind === 'key') {
    const key = await db.models.ApiKey.findOne({ where: { id: actor.id, organisationId: scope.organisationId } });
    return key ? `API key "${key.name}"` : 'an API key of this organisation';
  }
  return 'Headroom';
}

/**
 * The curve to plot for a check: the worst aligned start-up (the load whose start gives the highest stacked
 * current, on top of the others' running current), as the check modelled it from traces or nameplates,
 * with the device rating, the 80 % loading line and the instantaneous no-trip edge.
 */
export function stackedStartPlot(run: CheckRun): ReportPlot {
  const { view, circuit, loads, parameters } = run;
  const limits: PlotLimit[] = [
    { label: `rating ${circuit.ratingA} A`, amps: circuit.ratingA, color: '#b35900', dashed: false },
    { label: `80 % loading ${0.8 * circuit.ratingA} A`, amps: 0.8 * circuit.ratingA, color: '#707070', dashed: true },
  ];
  const band = tripModelFor(circuit.deviceKind, circuit.ratingA).instantaneous;
  if (band !== null) {
    const noTripA = band.noTripMultiple * circuit.ratingA;
    limits.push({ label: `instantaneous band starts ${noTripA} A`, amps: noTripA, color: '#b00020', dashed: true });
  }
  const worst = view.startUps.reduce<number>((best, s, i, all) => (s.stackedPeakA > (all[best]?.stackedPeakA ?? -1) ? i : best), -1);
  const load = loads[worst];
  const scenario = view.startUps[worst];
  if (load === undefined || scenario === undefined) {
    return { title: 'Current', note: 'No loads are recorded on this circuit.', series: [], limits, xLabel: 'time from switch-on (s)' };
  }
  const start = describeLoadStartUp(load, circuit.mainsHz, circuit.nominalVoltageV, parameters);
  const profile = addConstantCurrent(start.profile, scenario.othersRunningA);
  const lastS = profile.timesS[profile.timesS.length - 1]!;
  const endS = validateCurrentProfile(profile);
  // A held profile (start then running) is drawn a little past its last step so the running level shows.
  const shownEndS = start.holdLast ? Math.max(endS, lastS + Math.max(1, 0.5 * (lastS - profile.timesS[0]!))) : endS;
  const measured = scenario.startUpSource === 'events' || scenario.startUpSource === 'start-profile';
  return {
    title: `Worst aligned start: ${scenario.startingLoad} starting while the others run`,
    note: measured
      ? 'Start-up as recorded or declared, stacked on the other loads\' running current (worst-case alignment).'
      : 'Start-up modelled from nameplates (not measured), stacked on the other loads\' running current.',
    series: [
      { label: `${scenario.startingLoad} + others running`, timesS: profile.timesS, currentA: profile.currentA, step: true, endS: shownEndS, color: SERIES_COLORS[0]! },
    ],
    limits,
    xLabel: start.holdLast ? 'time from switch-on (s)' : 'time from the start of the recorded duty (s)',
  };
}

/** Buckets read per recorded trace for the report plot (about one per point of the plot's width). */
export const RECORDED_PLOT_POINTS = 600;

/**
 * The recorded traces of the circuit's loads (those the check used), each from its own start, as the highest
 * RMS reading per bucket (`max` of an `rms` trace, of the half-cycle RMS of a `waveform`) so every inrush shows,
 * with the rating and 80 % lines. Null when no load was judged on a trace.
 */
export async function recordedTracesPlot(reader: TraceReader, scope: Scope, run: CheckRun): Promise<ReportPlot | null> {
  const used = run.view.loads.flatMap((l) => l.usedTraceIds.map((traceId) => ({ load: l.name, traceId })));
  if (used.length === 0) return null;
  const curves: Array<{ label: string; timesS: number[]; currentA: number[] }> = [];
  for (const { load, traceId } of used.slice(0, SERIES_COLORS.length)) {
    const trace = await reader.get(scope, traceId);
    const series = await reader.series(scope, traceId, {}, RECORDED_PLOT_POINTS);
    const values = trace.kind === 'waveform' ? series.rms?.max : series.max;
    if (!values) continue;
    const t0 = series.t[0] ?? 0;
    const timesS: number[] = [];
    const currentA: number[] = [];
    values.forEach((a, i) => {
      if (a !== null && series.t[i] !== undefined) {
        timesS.push((series.t[i]! - t0) / 1000);
        currentA.push(a);
      }
    });
    if (timesS.length > 0) curves.push({ label: `${load}: ${trace.name}`, timesS, currentA });
  }
  if (curves.length === 0) return null;
  const longestS = Math.max(...curves.map((c) => c.timesS[c.timesS.length - 1] ?? 0));
  const [unit, divisor] = longestS > 3 * 3600 ? ['h', 3600] : longestS > 600 ? ['min', 60] : ['s', 1];
  const ratingA = run.circuit.ratingA;
  return {
    title: 'Recorded traces',
    note: `Highest RMS reading per bucket (about ${RECORDED_PLOT_POINTS} per trace), each trace from its own start; the check stacks them in the worst alignment.`,
    series: curves.map((c, i) => ({
      label: c.label,
      timesS: c.timesS.map((t) => t / divisor),
      currentA: c.currentA,
      step: false,
      color: SERIES_COLORS[i % SERIES_COLORS.length]!,
    })),
    limits: [
      { label: `rating ${ratingA} A`, amps: ratingA, color: '#b35900', dashed: false },
      { label: `80 % loading ${0.8 * ratingA} A`, amps: 0.8 * ratingA, color: '#707070', dashed: true },
    ],
    xLabel: `time from the start of each recording (${unit})`,
  };
}
