import * as ss from 'simple-statistics';
import { describe, expect, it } from 'vitest';
import { cycleAggregateRms } from './cycle-aggregation.js';
import { halfCycleBlocks } from './half-cycle-blocks.js';
import { halfCycleRms } from './half-cycle-rms.js';
import { waveformShape, waveformShapeFromBlocks } from './waveform-shape.js';

function sine(amplitude: number, frequencyHz: number, rateHz: number, seconds: number, phase = 0): Float64Array {
  return Float64Array.from({ length: Math.round(rateHz * seconds) }, (_, i) => amplitude * Math.sin((2 * Math.PI * frequencyHz * i) / rateHz + phase));
}

describe('halfCycleRms', () => {
  it('gives peak/√2 for a sampled sine at 60 Hz and 50 Hz, in every window', () => {
    // source: textbook, RMS of a sine = peak/√2 (trade-facts.md 4.1; 6.5 example 19: 10 A → 7.0711 A)
    for (const [f, rate] of [[60, 7680], [50, 6400], [60, 30000], [50, 44100]] as const) {
      const series = halfCycleRms(sine(10, f, rate, 1, 0.3), rate, f);
      for (const v of series.rmsA) expect(v).toBeCloseTo(10 / Math.SQRT2, f === 50 && rate === 44100 ? 2 : 9);
    }
  });

  it('has one value per half cycle with the window centre as its time', () => {
    // 60 Hz at 7680/s: 128-sample window, 64-sample step (IEC 61000-4-30, trade-facts.md 6.5 example 20)
    const rate = 7680;
    const a = sine(1, 60, rate, 1);
    const series = halfCycleRms(a, rate, 60, 2);
    expect(series.rmsA.length).toBe(120 - 1);
    expect(series.windowSamples).toBe(128);
    expect(series.stepSamples).toBe(64);
    expect(series.timesS[0]).toBeCloseTo(2 + 63.5 / rate, 12);
    expect(series.timesS[1]! - series.timesS[0]!).toBeCloseTo(64 / rate, 12);
    // Each value equals the plain RMS of its 128 samples (source: simple-statistics rootMeanSquare).
    expect(series.rmsA[5]).toBeCloseTo(ss.rootMeanSquare(Array.from(a.subarray(5 * 64, 5 * 64 + 128))), 12);
  });

  it('follows a step in amplitude within one cycle', () => {
    const rate = 7680;
    const a = sine(10, 60, rate, 1);
    for (let i = a.length / 2; i < a.length; i++) a[i]! *= 3;
    const series = halfCycleRms(a, rate, 60);
    expect(series.rmsA[10]).toBeCloseTo(7.0711, 4);
    expect(series.rmsA[series.rmsA.length - 1]).toBeCloseTo(21.2132, 4);
    const transitional = Array.from(series.rmsA).filter((v) => v > 7.08 && v < 21.2);
    expect(transitional.length).toBeLessThanOrEqual(1);
  });

  it('rejects bad samples and too low a sample rate', () => {
    const a = sine(1, 60, 7680, 0.1);
    a[100] = Number.NaN;
    expect(() => halfCycleRms(a, 7680, 60)).toThrow(/samples\[100\]/);
    expect(() => halfCycleRms(new Float64Array(100), 400, 60)).toThrow(/samples per half cycle/);
    expect(() => halfCycleRms(new Float64Array(100), 7680, 400)).toThrow(/mainsFrequencyHz/);
  });
});

describe('waveform shape', () => {
  it('sine: crest factor √2, form factor π/(2√2)', () => {
    // source: textbook (trade-facts.md 4.1): CF of a sine √2 ≈ 1.4142, FF ≈ 1.1107
    const a = sine(10, 60, 7680, 1, 0.1);
    const shape = waveformShape(a);
    expect(shape.rmsA).toBeCloseTo(7.0711, 4);
    expect(shape.crestFactor).toBeCloseTo(Math.SQRT2, 3);
    // Sampling a rectified sine 128 times per cycle leaves an error of order 1e-4 in its mean.
    expect(shape.formFactor).toBeCloseTo(Math.PI / (2 * Math.SQRT2), 3);
    expect(shape.dcA).toBeCloseTo(0, 9);
  });

  it('square wave: RMS = peak, crest factor 1, form factor 1', () => {
    // source: textbook (trade-facts.md 4.1: square wave CF = 1)
    const a = Float64Array.from({ length: 7680 }, (_, i) => (Math.floor(i / 64) % 2 === 0 ? 5 : -5));
    const shape = waveformShape(a);
    expect(shape.rmsA).toBe(5);
    expect(shape.crestFactor).toBe(1);
    expect(shape.formFactor).toBe(1);
    expect(halfCycleRms(a, 7680, 60).rmsA.every((v) => v === 5)).toBe(true);
  });

  it('triangle and half-wave rectified sine', () => {
    // source: textbook (trade-facts.md 4.1, from memory; derivable): triangle CF √3; half-wave sine RMS peak/2, mean peak/π, CF 2
    const rate = 7680;
    const tri = Float64Array.from({ length: rate }, (_, i) => {
      const phase = ((i * 60) / rate) % 1;
      return 4 * Math.abs(phase - 0.5) - 1;
    });
    expect(waveformShape(tri).crestFactor).toBeCloseTo(Math.sqrt(3), 3);
    const half = sine(8, 60, rate, 1).map((v) => Math.max(0, v));
    const shape = waveformShape(half);
    expect(shape.rmsA).toBeCloseTo(4, 6);
    expect(shape.dcA).toBeCloseTo(8 / Math.PI, 2);
    // Sampled 128 times per cycle from phase 0 the mean is exactly 8·cot(π/128)/128 (closed-form sum of sines).
    expect(shape.dcA).toBeCloseTo((8 / Math.tan(Math.PI / 128)) / 128, 9);
    expect(shape.crestFactor).toBeCloseTo(2, 6);
  });

  it('DC plus sine: RMS = √(Idc² + (Ipk/√2)²)', () => {
    // source: trade-facts.md 4.1 (derived)
    const a = sine(4, 50, 6400, 1).map((v) => v + 3);
    expect(waveformShape(a).rmsA).toBeCloseTo(Math.sqrt(9 + 8), 9);
  });

  it('whole-record shape from the block totals equals the direct pass', () => {
    const a = sine(10, 60, 30000, 0.37, 1).map((v, i) => v + (i % 7) * 0.01);
    const direct = waveformShape(a);
    const fromBlocks = waveformShapeFromBlocks(halfCycleBlocks(a, 30000, 60));
    expect(fromBlocks.peakA).toBe(direct.peakA);
    expect(fromBlocks.peakIndex).toBe(direct.peakIndex);
    expect(fromBlocks.rmsA).toBeCloseTo(direct.rmsA, 12);
    expect(fromBlocks.rectifiedMeanA).toBeCloseTo(direct.rectifiedMeanA, 12);
  });
});

describe('10/12-cycle aggregation', () => {
  it('aggregates 12 cycles at 60 Hz into 200 ms values and 10 cycles at 50 Hz', () => {
    // source: IEC 61000-4-30 basic aggregation interval (trade-facts.md 4.2)
    const at60 = cycleAggregateRms(halfCycleBlocks(sine(10, 60, 7680, 1.05), 7680, 60));
    expect(at60.cycles).toBe(12);
    expect(at60.rmsA.length).toBe(5);
    expect(at60.timesS[1]! - at60.timesS[0]!).toBeCloseTo(0.2, 12);
    expect(at60.rmsA[0]).toBeCloseTo(7.0711, 4);
    const at50 = cycleAggregateRms(halfCycleBlocks(sine(10, 50, 6400, 1), 6400, 50));
    expect(at50.cycles).toBe(10);
    expect(at50.rmsA.length).toBe(5);
  });
});
