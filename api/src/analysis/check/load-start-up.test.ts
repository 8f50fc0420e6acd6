import { describe, expect, it } from 'vitest';
import { profileFromSteps, validateCurrentProfile } from '../trip/current-profile.js';
import { DEFAULT_CHECK_PARAMETERS, type LoadUnderCheck } from './check-input.js';
import { describeLoadStartUp, equivalentPulseS } from './load-start-up.js';

const base: LoadUnderCheck = {
  name: 'compressor',
  runningA: 6,
  runningSource: 'trace',
  continuous: false,
  connection: 'cord-and-plug',
};

describe('equivalent pulse of a start-up event', () => {
  // source: trade-facts 6.5 item 22 (derived): a motor start of 39 A RMS for 0.3 s → 456.3 A²s
  it('turns I²t back into the duration at the peak', () => {
    expect(equivalentPulseS({ peakA: 39, i2tA2s: 39 * 39 * 0.3 }, 60)).toBeCloseTo(0.3, 12);
    expect(equivalentPulseS({ peakA: 39, i2tA2s: 456.3 }, 60)).toBeCloseTo(0.3, 4);
  });

  // derived: one half cycle is 1/(2f) — 8.33 ms at 60 Hz, 10 ms at 50 Hz (IEC 61000-4-30 half-cycle refresh)
  it('falls back on duration, then settle time, and never goes below one half cycle', () => {
    expect(equivalentPulseS({ peakA: 20, durationS: 0.5, settleTimeS: 2 }, 50)).toBe(0.5);
    expect(equivalentPulseS({ peakA: 20, settleTimeS: 2 }, 50)).toBe(2);
    expect(equivalentPulseS({ peakA: 20, durationS: 0.001 }, 60)).toBeCloseTo(1 / 120, 12);
    expect(equivalentPulseS({ peakA: 20, durationS: 0.001 }, 50)).toBeCloseTo(0.01, 12);
    expect(() => equivalentPulseS({ peakA: 20 }, 60)).toThrow(RangeError);
  });
});

describe('a load’s start-up for stacking', () => {
  it('envelopes several events: the highest peak for the longest pulse, then the running current held', () => {
    const start = describeLoadStartUp(
      {
        ...base,
        startUp: {
          kind: 'events',
          events: [
            { peakA: 40, durationS: 0.1 },
            { peakA: 25, durationS: 0.4 },
          ],
        },
      },
      60,
      120,
      DEFAULT_CHECK_PARAMETERS,
    );
    expect(start.peakA).toBe(40);
    expect(start.source).toBe('events');
    expect(start.holdLast).toBe(true);
    expect(Array.from(start.profile.currentA)).toEqual([40, 6]);
    expect(start.profile.timesS[1]).toBeCloseTo(0.4, 12);
  });

  it('appends the running current to a start profile', () => {
    const profile = profileFromSteps([
      { currentA: 30, durationS: 0.2 },
      { currentA: 12, durationS: 0.3 },
    ]);
    const start = describeLoadStartUp(
      { ...base, startUp: { kind: 'profile', profile } },
      60,
      120,
      DEFAULT_CHECK_PARAMETERS,
    );
    expect(start.peakA).toBe(30);
    expect(Array.from(start.profile.currentA)).toEqual([30, 12, 6]);
    expect(validateCurrentProfile(start.profile)).toBeCloseTo(1.5, 12);
    expect(Array.from(profile.currentA)).toEqual([30, 12]); // the input is not changed
  });

  it('uses a duty profile for the thermal part and its peak when higher than the start', () => {
    const duty = profileFromSteps([
      { currentA: 50, durationS: 1 },
      { currentA: 6, durationS: 100 },
    ]);
    const start = describeLoadStartUp(
      { ...base, duty, startUp: { kind: 'events', events: [{ peakA: 35, durationS: 0.2 }] } },
      60,
      120,
      DEFAULT_CHECK_PARAMETERS,
    );
    expect(start.profile).toBe(duty);
    expect(start.holdLast).toBe(false);
    expect(start.peakA).toBe(50);
    expect(start.basis).toBe('sample-rms');
  });

  // source: NEC Table 430.7(B) code K = 8.0–8.99 kVA/hp; 1/2 hp at 115 V → top 8.99 × 500 / 115 = 39.09 A
  it('motor nameplate: top of the code-letter band, held for the assumed start time', () => {
    const start = describeLoadStartUp({ ...base, motor: { horsepower: 0.5, codeLetter: 'k' } }, 60, 115, {
      ...DEFAULT_CHECK_PARAMETERS,
      assumedMotorStartS: 2,
    });
    expect(start.peakA).toBeCloseTo((8.99 * 500) / 115, 9);
    expect(start.source).toBe('motor-code-letter');
    expect(start.profile.timesS[1]).toBe(2);
  });

  // source: NEC Table 430.248 — 3/4 hp at 230 V → 6.9 A; 6 × FLC is common practice, no source
  it('motor without a code letter: 6 × the table full-load current, or the running current when not in the table', () => {
    const tabled = describeLoadStartUp({ ...base, motor: { horsepower: 0.75 } }, 50, 230, DEFAULT_CHECK_PARAMETERS);
    expect(tabled.peakA).toBeCloseTo(6 * 6.9, 12);
    expect(tabled.citation!.tag).toBe('common practice, no source');
    const untabled = describeLoadStartUp({ ...base, motor: { horsepower: 0.75 } }, 50, 400, DEFAULT_CHECK_PARAMETERS);
    expect(untabled.peakA).toBe(36);
    expect(untabled.assumption).toMatch(/running current/);
  });

  it('without start-up data, starts at its running current and says so', () => {
    const start = describeLoadStartUp(base, 60, 120, DEFAULT_CHECK_PARAMETERS);
    expect(start.peakA).toBe(6);
    expect(start.source).toBe('running-only');
    expect(start.assumption).toMatch(/no start-up data/);
  });
});
