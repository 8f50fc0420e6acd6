/**
 * The device's time-current band for the chart: for each current, the earliest and the latest time the
 * device may take to trip from cold, per Headroom's trip model (the same pure functions the API's check
 * uses, imported rather than re-implemented; they do no I/O). Instantaneous band edges are drawn at
 * INSTANTANEOUS_S.
 */
import { constantCurrentTripTimeS } from '../../../../../api/src/analysis/trip/thermal-model.js';
import { tripModelFor } from '../../../../../api/src/analysis/trip/trip-model.js';
import type { DeviceKind } from '../../../../../api/src/analysis/trip/device-kind.js';

/** Time drawn for an instantaneous (magnetic) trip, s: about half a cycle to one cycle. */
export const INSTANTANEOUS_S = 0.01;

export interface TripBand {
  currentA: number[];
  /** Fastest allowed trip, s (null: never trips at this current). */
  earliestS: (number | null)[];
  /** Slowest allowed trip, s (null: may never trip at this current). */
  latestS: (number | null)[];
  /** Instantaneous band edges, A (null for fuses). */
  instantaneous: { noTripA: number; tripA: number } | null;
  label: string;
}

/** Currents from just above the rating to `maxMultiple` × rating, log-spaced. */
export function tripBand(deviceKind: string, ratingA: number, maxMultiple = 40, points = 120): TripBand {
  const model = tripModelFor(deviceKind as DeviceKind, ratingA);
  const fast = model.thermal.members[0]!;
  const slow = model.thermal.members[model.thermal.members.length - 1]!;
  const inst = model.instantaneous;
  const currentA: number[] = [];
  const earliestS: (number | null)[] = [];
  const latestS: (number | null)[] = [];
  const lo = Math.log(1.01);
  const hi = Math.log(maxMultiple);
  for (let i = 0; i < points; i++) {
    const m = Math.exp(lo + ((hi - lo) * i) / (points - 1));
    const tFast = constantCurrentTripTimeS(fast, m);
    const tSlow = constantCurrentTripTimeS(slow, m);
    let earliest = Number.isFinite(tFast) ? tFast : null;
    let latest = Number.isFinite(tSlow) ? tSlow : null;
    if (inst && m >= inst.noTripMultiple) earliest = INSTANTANEOUS_S;
    if (inst && m >= inst.tripMultiple) latest = INSTANTANEOUS_S;
    currentA.push(m * ratingA);
    earliestS.push(earliest === null ? null : Math.max(earliest, INSTANTANEOUS_S));
    latestS.push(latest === null ? null : Math.max(latest, INSTANTANEOUS_S));
  }
  return {
    currentA,
    earliestS,
    latestS,
    instantaneous: inst ? { noTripA: inst.noTripMultiple * ratingA, tripA: inst.tripMultiple * ratingA } : null,
    label: model.label,
  };
}
