import { describe, expect, it } from 'vitest';
import { normaliseProbeReadings, probeScaleAPerUnit } from './normalise-probe.js';

describe('probe normalisation', () => {
  it('converts mV through a 10 mV/A and a 100 mV/A clamp', () => {
    // common practice, no source: a voltage-output clamp's sensitivity in mV per A
    const raw = new Float64Array([150, -150, 0]);
    expect(Array.from(normaliseProbeReadings(raw, { inputUnit: 'mV', sensitivityPerA: 10, loops: 1 }))).toEqual([15, -15, 0]);
    expect(Array.from(normaliseProbeReadings(raw, { inputUnit: 'mV', sensitivityPerA: 100, loops: 1 }))).toEqual([1.5, -1.5, 0]);
  });

  it('converts mA through a 1 mA/A current clamp', () => {
    // common practice, no source: a 1000:1 current transformer gives 1 mA per A
    const out = normaliseProbeReadings(new Float32Array([12.5]), { inputUnit: 'mA', sensitivityPerA: 1, loops: 1 });
    expect(out[0]).toBe(12.5);
  });

  it('divides by the loop count of a ×10 splitter', () => {
    // source: product.md "Probe" — a ×10 loop means the jaw sees 10 × the current
    const out = normaliseProbeReadings(new Float64Array([120]), { inputUnit: 'A', sensitivityPerA: 1, loops: 10 });
    expect(out[0]).toBeCloseTo(12, 12);
    expect(probeScaleAPerUnit({ inputUnit: 'mA', sensitivityPerA: 1, loops: 10 })).toBeCloseTo(0.1, 15);
  });

  it('rejects bad probes and non-finite readings with a RangeError', () => {
    const raw = new Float64Array([1, 2]);
    expect(() => normaliseProbeReadings(raw, { inputUnit: 'V' as 'A', sensitivityPerA: 1, loops: 1 })).toThrow(/inputUnit/);
    expect(() => normaliseProbeReadings(raw, { inputUnit: 'mV', sensitivityPerA: 0, loops: 1 })).toThrow(/sensitivityPerA/);
    expect(() => normaliseProbeReadings(raw, { inputUnit: 'A', sensitivityPerA: 1, loops: 2.5 })).toThrow(/loops/);
    expect(() => normaliseProbeReadings(new Float64Array([1, Number.NaN]), { inputUnit: 'A', sensitivityPerA: 1, loops: 1 })).toThrow(/\[1\]/);
    expect(() => normaliseProbeReadings(new Float64Array([Infinity]), { inputUnit: 'A', sensitivityPerA: 1, loops: 1 })).toThrow(RangeError);
  });
});
