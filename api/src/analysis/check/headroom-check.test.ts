import { describe, expect, it } from 'vitest';
import { profileFromSteps } from '../trip/current-profile.js';
import { iecThermalFamily } from '../trip/iec-60898-1.js';
import { assessThermal } from '../trip/thermal-family.js';
import { ul489ThermalFamily } from '../trip/ul-489.js';
import type { CircuitUnderCheck, LoadUnderCheck } from './check-input.js';
import { checkCircuitHeadroom } from './headroom-check.js';

/** A 20 A, 120 V, 60 Hz multi-outlet circuit on a North-American breaker, NEC 2023 (invented). */
function circuit(overrides: Partial<CircuitUnderCheck> = {}): CircuitUnderCheck {
  return {
    ratingA: 20,
    deviceKind: 'na-thermal-magnetic',
    nominalVoltageV: 120,
    mainsHz: 60,
    alsoFeedsLightingOrOutlets: true,
    necEdition: 2023,
    ...overrides,
  };
}

/** A plain cord-and-plug, noncontinuous load measured from a trace (invented). */
function load(name: string, runningA: number, overrides: Partial<LoadUnderCheck> = {}): LoadUnderCheck {
  return { name, runningA, runningSource: 'trace', continuous: false, connection: 'cord-and-plug', ...overrides };
}

describe('worked stacking example: 9 A steady load + 13 A motor starting at 30 A for 0.3 s on 20 A', () => {
  // Invented loads; hand computation (trade-facts 6.2 item 26): running 9 + 13 = 22 A > 20 A;
  // aligned start 30 + 9 = 39 A = 1.95 × 20 A, below every instantaneous band (lowest: B at 3 In = 60 A,
  // IEC 60898-1 Table 7); 0.3 s at about 2 In is far shorter than the 2 min a UL 489 breaker may take at 200 %.
  const loads = [
    load('bench grinder', 9),
    load('shop vacuum', 13, { startUp: { kind: 'events', events: [{ peakA: 30, durationS: 0.3 }] } }),
  ];

  it('is over the limit on the running sum (NEC 210.23 parent text), not on the start', () => {
    const result = checkCircuitHeadroom(circuit(), loads);
    expect(result.steady.runningTotalA).toBe(22);
    expect(result.verdict).toBe('over-the-limit');
    expect(result.reasons[0]).toMatchObject({
      verdict: 'over-the-limit',
      ruleId: 'nec-210.23-total-within-rating',
      citation: { code: 'NFPA 70', edition: 2023, section: '210.23' },
    });
    expect(result.headroomA).toBe(-2);
    expect(result.reasons.some((r) => r.ruleId === 'instantaneous-band')).toBe(false);
  });

  it('stacks the start at 39 A = 1.95 In, below the instantaneous band of every device kind', () => {
    for (const deviceKind of ['iec-b', 'iec-c', 'iec-d', 'na-thermal-magnetic'] as const) {
      const result = checkCircuitHeadroom(circuit({ deviceKind }), loads);
      const start = result.scenarios.find((s) => s.startingLoad === 'shop vacuum')!;
      expect(start.othersRunningA).toBe(9);
      expect(start.stackedPeakA).toBe(39);
      expect(start.instantaneous!.multipleOfRating).toBeCloseTo(1.95, 12);
      expect(start.instantaneous!.outcome).toBe('will-not-trip');
    }
    // source: IEC 60898-1:2015 Table 7 — B no-trip edge 3 In = 60 A on 20 A
    const b20 = checkCircuitHeadroom(circuit({ deviceKind: 'iec-b' }), loads);
    expect(b20.startHeadroomA).toBe(60 - 39);
  });

  it('the start alone trips no thermal element: nothing trips within the 0.3 s start', () => {
    // source: UL 489 calibration (200 % ≤ 2 min): the start profile (39 A for 0.3 s, then back to 9 A)
    const startOnly = profileFromSteps([
      { currentA: 39, durationS: 0.3 },
      { currentA: 9, durationS: 600 },
    ]);
    expect(assessThermal(ul489ThermalFamily(20), 20, startOnly, { initialCurrentA: 9 }).outcome).toBe('will-not-trip');
    // source: IEC 60898-1:2015 Table 7 (2.55 In not before 1 s): the fastest IEC member also holds
    expect(assessThermal(iecThermalFamily(20), 20, startOnly, { initialCurrentA: 9 }).outcome).toBe('will-not-trip');
    // In the check the running total (22 A = 1.1 In) is then held: only the fastest band members trip, and
    // only after tens of seconds — the overload is the running sum, not the start.
    const result = checkCircuitHeadroom(circuit(), loads);
    const start = result.scenarios.find((s) => s.startingLoad === 'shop vacuum')!;
    expect(start.thermal.outcome).toBe('may-trip');
    expect(start.thermal.estimatedTripS).toBeNull();
    expect(start.thermal.earliestTripS!).toBeGreaterThan(10);
  });
});

describe('NEC 210.23 examples', () => {
  // source: jadelearning.com 210.23 article (trade-facts 6.2 example 5): fastened-in-place water cooler 3 A + ice
  // machine 8 A = 11 A > 10 A (50 % of 20 A) on a circuit that also feeds a microwave receptacle → not permitted
  it('water cooler 3 A + ice machine 8 A on a shared 20 A circuit → dedicated circuit advised (210.23(B)(2))', () => {
    const result = checkCircuitHeadroom(circuit(), [
      load('water cooler', 3, { connection: 'fastened-in-place', runningSource: 'nameplate-amps' }),
      load('ice machine', 8, { connection: 'fastened-in-place', runningSource: 'nameplate-amps' }),
    ]);
    expect(result.verdict).toBe('dedicated-circuit-advised');
    expect(result.reasons[0]).toMatchObject({
      ruleId: 'nec-210.23-fastened-in-place-share',
      citation: { edition: 2023, section: '210.23(B)(2)' },
    });
    expect(result.steady.fastenedInPlaceA).toBe(11);
  });

  // source: EC&M Code Q&A, Sept 2012 (trade-facts 6.2 example 6): 13 A central vacuum, fastened, shared 20 A circuit
  it('13 A central vacuum fastened on a shared 20 A circuit → its own circuit, citing 210.23(A)(2) under NEC 2020', () => {
    const result = checkCircuitHeadroom(circuit({ necEdition: 2020 }), [
      load('central vacuum', 13, { connection: 'fastened-in-place', runningSource: 'nameplate-amps' }),
    ]);
    expect(result.verdict).toBe('dedicated-circuit-advised');
    expect(result.reasons[0]!.citation).toMatchObject({ edition: 2020, section: '210.23(A)(2)' });
    // On a circuit that feeds nothing else the same vacuum is fine.
    expect(
      checkCircuitHeadroom(circuit({ alsoFeedsLightingOrOutlets: false }), [
        load('central vacuum', 13, { connection: 'fastened-in-place' }),
      ]).verdict,
    ).not.toBe('dedicated-circuit-advised');
  });

  // source: NEC 2023 210.23(B)(1) (trade-facts 6.2 example 4): one cord-and-plug appliance ≤ 16 A on a 20 A circuit
  it('a 16 A coffee maker is permitted but tight; a 17 A one needs its own circuit', () => {
    const at16 = checkCircuitHeadroom(circuit(), [load('coffee maker', 16)]);
    expect(at16.verdict).toBe('tight');
    expect(at16.steady.rules.find((r) => r.ruleId === 'nec-210.23-cord-and-plug-share')!.passed).toBe(true);
    const at17 = checkCircuitHeadroom(circuit(), [load('coffee maker', 17)]);
    expect(at17.verdict).toBe('dedicated-circuit-advised');
    expect(at17.reasons[0]).toMatchObject({ loadName: 'coffee maker', citation: { section: '210.23(B)(1)' } });
    // On an individual branch circuit 210.23's share does not apply (210.22: any load up to the rating).
    expect(checkCircuitHeadroom(circuit({ individualBranchCircuit: true }), [load('coffee maker', 17)]).verdict).toBe(
      'tight',
    );
  });

  // source: NEC 2023 210.23(B)(1): a 19 A cord-and-plug appliance on a 15 A circuit exceeds even its own circuit
  it('a load too big for a circuit of its own at this rating is over the limit', () => {
    const result = checkCircuitHeadroom(circuit({ ratingA: 15 }), [load('space heater', 19)]);
    expect(result.verdict).toBe('over-the-limit');
  });
});

describe('continuous loads (NEC 210.20(A), 240.6(A))', () => {
  // source: trade-facts 6.2 example 8 — 16 A continuous → 20 A device; 17 A → 21.25 A → 25 A
  it('16 A continuous on 20 A passes at exactly 100 % of the limit (tight); 17 A is over the limit', () => {
    const at16 = checkCircuitHeadroom(
      circuit(),
      [load('heat trace', 16, { continuous: true, connection: 'fastened-in-place' })],
      {},
    );
    expect(at16.steady.requiredRatingA).toBe(20);
    expect(at16.reasons.find((r) => r.ruleId === 'nec-210.20-continuous-load-device')!.verdict).toBe('tight');
    const at17 = checkCircuitHeadroom(circuit({ alsoFeedsLightingOrOutlets: false }), [
      load('heat trace', 17, { continuous: true, connection: 'fastened-in-place' }),
    ]);
    expect(at17.verdict).toBe('over-the-limit');
    const rule = at17.reasons.find((r) => r.ruleId === 'nec-210.20-continuous-load-device')!;
    expect(rule.citation.section).toBe('210.20(A)');
    expect(rule.message).toMatch(/25 A/);
    expect(at17.headroomA).toBeCloseTo(20 - 21.25, 12);
  });
});

describe('instantaneous band verdicts (IEC 60898-1 curve B, In = 16 A: 48–80 A)', () => {
  const b16 = circuit({ ratingA: 16, deviceKind: 'iec-b', nominalVoltageV: 230, mainsHz: 50 });
  const starter = (peakA: number) =>
    load('compressor', 4, { startUp: { kind: 'events', events: [{ peakA, durationS: 0.1 }] } });

  // source: IEC 60898-1:2015 Table 7 — B: no trip at 3 In (48 A), trip at 5 In (80 A)
  it('inside the band → dedicated circuit advised; at the trip edge → over the limit; just below → tight', () => {
    const mayTrip = checkCircuitHeadroom(b16, [load('kettle', 5), starter(40)]);
    expect(mayTrip.scenarios[1]!.stackedPeakA).toBe(40 + 5); // compressor start + kettle running
    expect(mayTrip.verdict).toBe('tight'); // 45 A is within 10 % below 48 A
    const inBand = checkCircuitHeadroom(b16, [load('kettle', 9), starter(45)]);
    expect(inBand.scenarios[1]!.instantaneous!.outcome).toBe('may-trip');
    expect(inBand.verdict).toBe('dedicated-circuit-advised');
    expect(inBand.reasons.find((r) => r.ruleId === 'instantaneous-band')!.message).toMatch(/circuit of its own/);
    const trips = checkCircuitHeadroom(b16, [load('kettle', 5), starter(76)]);
    expect(trips.verdict).toBe('over-the-limit');
    expect(trips.reasons[0]).toMatchObject({ ruleId: 'instantaneous-band', citation: { code: 'IEC 60898-1' } });
  });
});

describe('nameplate-only motors', () => {
  // source: NEC Table 430.7(B), 1 hp 115 V code G → 48.7–54.7 A (trade-facts 6.3 example 14); the top of the band is used
  it('takes the locked-rotor current from the code letter', () => {
    const result = checkCircuitHeadroom(circuit({ deviceKind: 'iec-b', nominalVoltageV: 115 }), [
      load('well pump', 16, { runningSource: 'motor-table-430.248', motor: { horsepower: 1, codeLetter: 'G' } }),
    ]);
    const scenario = result.scenarios[0]!;
    expect(scenario.startUpSource).toBe('motor-code-letter');
    expect(scenario.loadPeakA).toBeCloseTo((6.29 * 1000) / 115, 9);
    expect(result.assumptions[0]).toMatch(/Table 430\.7\(B\)/);
  });

  // source: NEC Table 430.248 (1 hp, 115 V → 16 A); 6 × FLC: common practice, no source (trade-facts 7)
  it('falls back on 6 × the Table 430.248 full-load current, saying it is common practice', () => {
    const result = checkCircuitHeadroom(circuit({ deviceKind: 'iec-b', nominalVoltageV: 115 }), [
      load('well pump', 15, { motor: { horsepower: 1 } }),
    ]);
    expect(result.scenarios[0]!.loadPeakA).toBe(96);
    expect(result.assumptions[0]).toMatch(/common practice, no source/);
    // 96 A on B20 lies between 60 A and 100 A: may trip on start-up.
    expect(result.verdict).toBe('dedicated-circuit-advised');
  });
});

describe('thermal verdicts through a duty profile (IEC 60898-1 C16)', () => {
  const c16 = circuit({
    ratingA: 16,
    deviceKind: 'iec-c',
    nominalVoltageV: 230,
    mainsHz: 50,
    alsoFeedsLightingOrOutlets: false,
  });
  const dutyAt = (amps: number, seconds: number) =>
    load('dough mixer', 5, {
      duty: profileFromSteps([
        { currentA: amps, durationS: seconds },
        { currentA: 5, durationS: 600 },
      ]),
    });

  // source: IEC 60898-1:2015 Table 7 — 2.55 In (40.8 A) from cold trips within 60 s for In ≤ 32 A
  it('2.55 In for 61 s trips every breaker the standard allows → over the limit', () => {
    const result = checkCircuitHeadroom(c16, [dutyAt(40.8, 61)]);
    expect(result.scenarios[0]!.thermal.outcome).toBe('will-trip');
    expect(result.verdict).toBe('over-the-limit');
    expect(result.reasons[0]).toMatchObject({ ruleId: 'thermal-band', citation: { code: 'IEC 60898-1' } });
  });

  // source: IEC 60898-1:2015 Table 7 — 2.55 In trips after 1–60 s: 20 s lies inside the band
  it('2.55 In for 20 s may trip a typical breaker → dedicated circuit advised', () => {
    const result = checkCircuitHeadroom(c16, [dutyAt(40.8, 20)]);
    expect(result.scenarios[0]!.thermal.outcome).toBe('may-trip');
    expect(result.scenarios[0]!.thermal.estimatedTripS).not.toBeNull();
    expect(result.verdict).toBe('dedicated-circuit-advised');
  });

  // source: IEC 60898-1:2015 Table 7 — 2.55 In must not trip within 1 s
  it('2.55 In for 0.5 s trips nothing', () => {
    const result = checkCircuitHeadroom(c16, [dutyAt(40.8, 0.5)]);
    expect(result.scenarios[0]!.thermal.outcome).toBe('will-not-trip');
  });
});

describe('thermal verdict for a steady overload (UL 489, 20 A)', () => {
  // source: UL 489 calibration — 135 % (27 A) trips within 1 h; 28 A held is above that, so every band member trips
  it('28 A running together trips every breaker the standard allows, phrased as all loads running', () => {
    const result = checkCircuitHeadroom(circuit({ alsoFeedsLightingOrOutlets: false }), [
      load('heater', 14, { connection: 'fastened-in-place' }),
      load('kiln', 14, { connection: 'fastened-in-place' }),
    ]);
    expect(result.allRunningThermal.outcome).toBe('will-trip');
    expect(result.allRunningThermal.latestTripS!).toBeLessThanOrEqual(3600);
    const thermal = result.reasons.find((r) => r.ruleId === 'thermal-band')!;
    expect(thermal.verdict).toBe('over-the-limit');
    expect(thermal.message).toMatch(/all loads running together \(28 A\)/);
    expect(thermal.loadName).toBeUndefined();
  });
});

describe('warnings, cautions and parameters', () => {
  // source: NEC 240.4(D) (trade-facts 6.2 example 11): 14 AWG Cu on a 20 A breaker → warning, limit 15 A
  it('reports a small conductor as a warning without changing the verdict', () => {
    const result = checkCircuitHeadroom(circuit({ conductor: { sizeAwg: '14', material: 'cu' } }), [load('lamp', 1)]);
    expect(result.verdict).toBe('fine');
    expect(result.warnings).toHaveLength(1);
    expect(result.warnings[0]).toMatchObject({ ruleId: 'nec-240.4-small-conductor', limitA: 15, severity: 'warning' });
    expect(
      checkCircuitHeadroom(circuit({ conductor: { sizeAwg: '12', material: 'cu' } }), [load('lamp', 1)]).warnings,
    ).toEqual([]);
  });

  it('always carries the cautions, the device notes and the parameters used', () => {
    const result = checkCircuitHeadroom(circuit(), [], { tightFraction: 0.2 });
    expect(result.verdict).toBe('fine');
    expect(result.headroomA).toBe(20);
    expect(result.cautions.map((c) => c.id)).toEqual([
      'qualified-persons',
      'local-codes',
      'measurement-category',
      'maker-curve',
      'do-not-defeat-protection',
    ]);
    expect(result.cautions[1]!.text).toMatch(/2023 edition/);
    expect(result.device.notes.join(' ')).toMatch(/from memory/);
    expect(result.parameters).toEqual({ tightFraction: 0.2, assumedMotorStartS: 1, necEdition: 2023 });
  });

  it('the trade 80 % rule of thumb makes a legal 17 A of plug-in loads tight', () => {
    // common practice, no source: keep steady loads within 80 % of the rating (16 A on 20 A)
    const result = checkCircuitHeadroom(circuit(), [load('toaster', 9), load('kettle', 8)]);
    expect(result.verdict).toBe('tight');
    expect(result.reasons.map((r) => r.ruleId)).toContain('trade-80-percent-loading');
  });
});

describe('bad input', () => {
  it.each([
    [{ ratingA: 0 }, [], /circuit\.ratingA/],
    [{ mainsHz: 55 }, [], /circuit\.mainsHz/],
    [{ necEdition: 2017 as never }, [], /circuit\.necEdition/],
    [{ deviceKind: 'gG' as never }, [], /circuit\.deviceKind/],
    [{}, [load('a', 1), load('b', -2)], /loads\[1\]\.runningA/],
    [{}, [load('', 1)], /loads\[0\]\.name/],
    [{}, [load('a', 1, { startUp: { kind: 'events', events: [] } })], /loads\[0\]\.startUp\.events/],
    [
      {},
      [load('a', 1, { startUp: { kind: 'events', events: [{ peakA: 30 }] } })],
      /needs i2tA2s, durationS or settleTimeS/,
    ],
    [{}, [load('a', 1, { motor: { horsepower: 0 } })], /loads\[0\]\.motor\.horsepower/],
    [{ deviceKind: 'fuse' as const, ratingA: 40 }, [], /30 A/],
    [{ conductor: { sizeAwg: '12', material: 'copper' as never } }, [], /circuit\.conductor\.material/],
  ] as const)('rejects %o with a RangeError naming the field', (circuitOverrides, loads, message) => {
    expect(() => checkCircuitHeadroom(circuit(circuitOverrides), loads as readonly LoadUnderCheck[])).toThrow(
      RangeError,
    );
    expect(() => checkCircuitHeadroom(circuit(circuitOverrides), loads as readonly LoadUnderCheck[])).toThrow(message);
  });

  it('rejects bad parameters', () => {
    expect(() => checkCircuitHeadroom(circuit(), [], { tightFraction: 1 })).toThrow(/tightFraction/);
    expect(() => checkCircuitHeadroom(circuit(), [], { assumedMotorStartS: 0 })).toThrow(/assumedMotorStartS/);
  });
});
