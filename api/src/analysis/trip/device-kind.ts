/**
 * Kinds of overcurrent device Headroom models:
 * - `iec-b`, `iec-c`, `iec-d`: IEC 60898-1 miniature circuit-breakers of curve B, C or D (In ≤ 125 A);
 * - `na-thermal-magnetic`: a North-American residential thermal-magnetic breaker (UL 489 calibration points
 *   plus a typical instantaneous band from memory; ≤ 600 A);
 * - `fuse-ul-248-time-delay`: a 250 V time-delay (dual-element) branch-circuit fuse of ≤ 30 A;
 * - `fuse`: a fuse whose class is not recorded; modelled as the time-delay fuse, with a note that a
 *   non-time-delay fuse opens sooner on start-up currents.
 * IEC 60269 gG fuses are not modelled: only their conventional currents are known (from memory), which
 * is not enough to bound a time-current curve.
 */
export type DeviceKind = 'iec-b' | 'iec-c' | 'iec-d' | 'na-thermal-magnetic' | 'fuse-ul-248-time-delay' | 'fuse';

/** Every {@link DeviceKind}, for validation and API schemas. */
export const DEVICE_KINDS: readonly DeviceKind[] = [
  'iec-b',
  'iec-c',
  'iec-d',
  'na-thermal-magnetic',
  'fuse-ul-248-time-delay',
  'fuse',
];

/** Throws RangeError unless `kind` is a known {@link DeviceKind}. */
export function assertDeviceKind(kind: string, field = 'deviceKind'): asserts kind is DeviceKind {
  if (!(DEVICE_KINDS as readonly string[]).includes(kind)) {
    throw new RangeError(`${field} must be one of ${DEVICE_KINDS.join(', ')} (got ${kind})`);
  }
}

/** True for fuses (they count 240.6(A)'s extra fuse ratings and have no separate instantaneous element). */
export function isFuse(kind: DeviceKind): boolean {
  return kind.startsWith('fuse-');
}
