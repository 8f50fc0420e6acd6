import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import type { DeviceKind } from '../trip/device-kind.js';
import type { CircuitUnderCheck, LoadUnderCheck } from './check-input.js';
import { checkCircuitHeadroom } from './headroom-check.js';
import { compareVerdicts } from './verdict.js';

// Multi-outlet ratings of NEC 210.3 (15, 20, 30, 40, 50 A); the fuse profile covers ≤ 30 A only.
const RATINGS = [15, 20, 30, 40, 50] as const;
const KINDS: readonly DeviceKind[] = ['iec-b', 'iec-c', 'iec-d', 'na-thermal-magnetic', 'fuse-ul-248-time-delay'];
const maxRatingFor = (kind: DeviceKind) => (kind.startsWith('fuse') ? 30 : 50);

/** A load described relative to a rating, so that the generated cases spread over all four verdicts. */
interface RelativeLoad {
  runningShare: number;
  continuous: boolean;
  connection: 'cord-and-plug' | 'fastened-in-place';
  start: { peakMultiple: number; durationS: number } | null;
}

const relativeLoadArb: fc.Arbitrary<RelativeLoad> = fc.record({
  runningShare: fc.double({ min: 0, max: 0.7, noNaN: true }),
  continuous: fc.boolean(),
  connection: fc.constantFrom('cord-and-plug' as const, 'fastened-in-place' as const),
  start: fc.option(
    fc.record({
      peakMultiple: fc.double({ min: 0.05, max: 12, noNaN: true }),
      durationS: fc.double({ min: 0.01, max: 8, noNaN: true }),
    }),
    { nil: null },
  ),
});

/** Absolute loads for a circuit of `ratingA`, every current multiplied by `factor` for load `scaled` (or all). */
function materialise(relative: RelativeLoad[], ratingA: number, factor = 1, scaled = -1): LoadUnderCheck[] {
  return relative.map((r, i) => {
    const k = scaled === -1 || scaled === i ? factor : 1;
    const runningA = r.runningShare * ratingA * k;
    return {
      name: `load ${i}`,
      runningA,
      runningSource: 'trace',
      continuous: r.continuous,
      connection: r.connection,
      startUp:
        r.start === null
          ? null
          : { kind: 'events', events: [{ peakA: r.start.peakMultiple * ratingA * k, durationS: r.start.durationS }] },
    };
  });
}

const circuitArb = fc
  .record({
    deviceKind: fc.constantFrom(...KINDS),
    rating: fc.constantFrom(...RATINGS),
    alsoFeedsLightingOrOutlets: fc.boolean(),
    individualBranchCircuit: fc.boolean(),
    necEdition: fc.constantFrom(2020 as const, 2023 as const),
  })
  .map(({ rating, ...c }): CircuitUnderCheck => ({
    ...c,
    ratingA: Math.min(rating, maxRatingFor(c.deviceKind)),
    nominalVoltageV: 120,
    mainsHz: 60,
  }));

const loadsArb = fc.array(relativeLoadArb, { minLength: 1, maxLength: 3 });
const verdictFor = (circuit: CircuitUnderCheck, loads: LoadUnderCheck[]) =>
  checkCircuitHeadroom(circuit, loads).verdict;

describe('verdict properties', () => {
  it('the generators reach every verdict (so the properties below are not vacuous)', () => {
    const verdicts = fc
      .sample(fc.tuple(circuitArb, loadsArb), { numRuns: 400, seed: 42 })
      .map(([circuit, relative]) => verdictFor(circuit, materialise(relative, circuit.ratingA)));
    for (const verdict of ['fine', 'tight', 'dedicated-circuit-advised', 'over-the-limit'] as const) {
      expect(verdicts.filter((v) => v === verdict).length).toBeGreaterThan(20);
    }
  });

  it('more current on any one load never gives a better verdict', () => {
    fc.assert(
      fc.property(
        circuitArb,
        loadsArb,
        fc.nat(),
        fc.double({ min: 1, max: 1.6, noNaN: true }),
        (circuit, relative, which, factor) => {
          const index = which % relative.length;
          const before = verdictFor(circuit, materialise(relative, circuit.ratingA));
          const after = verdictFor(circuit, materialise(relative, circuit.ratingA, factor, index));
          expect(compareVerdicts(after, before)).toBeGreaterThanOrEqual(0);
        },
      ),
      { numRuns: 500 },
    );
  });

  it('more running current beside a starting load never makes the verdict better', () => {
    // Targeted at the start-up check: one short start near the instantaneous bands, one plain running load.
    const starterArb = fc.record({
      peakMultiple: fc.double({ min: 2, max: 22, noNaN: true }),
      durationS: fc.double({ min: 0.01, max: 0.2, noNaN: true }),
    });
    fc.assert(
      fc.property(
        circuitArb,
        starterArb,
        fc.double({ min: 0, max: 0.6, noNaN: true }),
        fc.double({ min: 1, max: 1.6, noNaN: true }),
        (circuit, start, runningShare, factor) => {
          const relative: RelativeLoad[] = [
            { runningShare: 0.1, continuous: false, connection: 'cord-and-plug', start },
            { runningShare, continuous: false, connection: 'cord-and-plug', start: null },
          ];
          const before = verdictFor(circuit, materialise(relative, circuit.ratingA));
          const after = verdictFor(circuit, materialise(relative, circuit.ratingA, factor, 1));
          expect(compareVerdicts(after, before)).toBeGreaterThanOrEqual(0);
        },
      ),
      { numRuns: 1000 },
    );
  });

  it('a higher rating never gives a worse verdict for the same loads', () => {
    fc.assert(
      fc.property(circuitArb, fc.constantFrom(...RATINGS), loadsArb, (circuit, other, relative) => {
        const lower = Math.min(circuit.ratingA, other, maxRatingFor(circuit.deviceKind));
        const higher = Math.min(Math.max(circuit.ratingA, other), maxRatingFor(circuit.deviceKind));
        const loads = materialise(relative, lower);
        const atLower = verdictFor({ ...circuit, ratingA: lower }, loads);
        const atHigher = verdictFor({ ...circuit, ratingA: higher }, loads);
        expect(compareVerdicts(atHigher, atLower)).toBeLessThanOrEqual(0);
      }),
      { numRuns: 500 },
    );
  });
});
