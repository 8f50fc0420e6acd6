import { describe, expect, it } from 'vitest';
import { INSTANTANEOUS_S, tripBand } from './trip-band';

describe('tripBand', () => {
  it('when the device is a C16 breaker, then the band is instantaneous from 10 In and may be from 5 In', () => {
    const band = tripBand('iec-c', 16);
    // source: IEC 60898-1, instantaneous band of curve C is above 5 In up to and including 10 In
    expect(band.instantaneous).toEqual({ noTripA: 80, tripA: 160 });
    const at = (a: number) => band.currentA.findIndex((c) => c >= a);
    expect(band.latestS[at(161)]).toBe(INSTANTANEOUS_S);
    expect(band.earliestS[at(81)]).toBe(INSTANTANEOUS_S);
    expect(band.latestS[at(81)]!).toBeGreaterThan(INSTANTANEOUS_S);
  });

  it('when the current rises, then neither edge gets slower and the earliest never follows the latest', () => {
    const band = tripBand('na-thermal-magnetic', 20);
    for (let i = 1; i < band.currentA.length; i++) {
      const [e0, e1, l0, l1] = [band.earliestS[i - 1], band.earliestS[i], band.latestS[i - 1], band.latestS[i]];
      if (e0 != null && e1 != null) expect(e1).toBeLessThanOrEqual(e0 + 1e-9);
      if (l0 != null && l1 != null) expect(l1).toBeLessThanOrEqual(l0 + 1e-9);
      if (e1 != null && l1 != null) expect(e1).toBeLessThanOrEqual(l1 + 1e-9);
    }
  });

  it('when the device is a fuse, then there is no instantaneous band', () => {
    expect(tripBand('fuse', 15).instantaneous).toBeNull();
  });

  it('when the kind is unknown, then the model refuses it', () => {
    expect(() => tripBand('mystery', 15)).toThrow(RangeError);
  });
});
