import { describe, expect, it } from 'vitest';
import { profileFromSteps } from './current-profile.js';
import { DEVICE_KINDS } from './device-kind.js';
import { assessProfileTrip, tripModelFor } from './trip-model.js';

describe('trip models by device kind', () => {
  it('builds every kind and rejects unknown kinds and out-of-scope ratings', () => {
    for (const kind of DEVICE_KINDS) {
      const model = tripModelFor(kind, 20);
      expect(model.thermal.members.length).toBe(9);
      expect(model.notes.length).toBeGreaterThan(0);
    }
    expect(tripModelFor('fuse-ul-248-time-delay', 20).instantaneous).toBeNull();
    expect(tripModelFor('fuse', 20).notes[0]).toMatch(/class is not recorded/);
    expect(() => tripModelFor('iec-z' as never, 20)).toThrow(RangeError);
    expect(() => tripModelFor('iec-c', 200)).toThrow(RangeError);
  });

  // Worked example (invented loads; trade-facts 6.2 item 26): 9 A running + a start of 30 A for 0.3 s on 20 A
  // → aligned 39 A = 1.95 In for 0.3 s, below the lowest instantaneous band (B: 3 In, IEC 60898-1 Table 7) and
  // far shorter than the 2 min a UL 489 breaker may take at 2 In (UL 489 calibration): no trip from one start.
  it('the aligned start of 39 A for 0.3 s trips none of the 20 A devices', () => {
    const profile = profileFromSteps([
      { currentA: 39, durationS: 0.3 },
      { currentA: 9, durationS: 60 },
    ]);
    for (const kind of ['iec-b', 'iec-c', 'iec-d', 'na-thermal-magnetic', 'fuse-ul-248-time-delay'] as const) {
      const result = assessProfileTrip(tripModelFor(kind, 20), profile, {
        basis: 'half-cycle-rms',
        initialCurrentA: 9,
      });
      expect(result.outcome).toBe('will-not-trip');
      expect(result.thermal.fastestHeatingRatio).toBeLessThan(1);
    }
    const b20 = assessProfileTrip(tripModelFor('iec-b', 20), profile, { basis: 'half-cycle-rms' });
    expect(b20.instantaneous!.multipleOfRating).toBeCloseTo(1.95, 12);
  });

  // source: IEC 60898-1:2015 Table 7 — C16 at 10 In trips instantaneously; the combined outcome is the worse part
  it('combines the instantaneous and thermal parts into the worse outcome', () => {
    const model = tripModelFor('iec-c', 16);
    const spike = assessProfileTrip(model, profileFromSteps([{ currentA: 160, durationS: 0.02 }]), {
      basis: 'half-cycle-rms',
    });
    expect(spike.instantaneous!.outcome).toBe('will-trip');
    expect(spike.thermal.outcome).toBe('will-not-trip');
    expect(spike.outcome).toBe('will-trip');
  });
});
