import { describe, expect, it } from 'vitest';
import { normalDeviate, seededRandom } from '../test-support/seeded-random.js';
import { estimateMainsFrequency } from './mains-frequency.js';

function noisySine(f: number, rate: number, seconds: number, amplitude: number, noise: number, seed = 1): Float64Array {
  const rnd = seededRandom(seed);
  return Float64Array.from({ length: Math.round(rate * seconds) }, (_, i) => amplitude * Math.sin((2 * Math.PI * f * i) / rate) + noise * normalDeviate(rnd));
}

describe('estimateMainsFrequency', () => {
  it('finds 50 Hz, 60 Hz and an off-nominal 59.93 Hz from zero crossings', () => {
    // derived: the test signal's own frequency is the expected value
    expect(estimateMainsFrequency(noisySine(50, 10_000, 3, 10, 0.2), 10_000).mainsFrequencyHz).toBeCloseTo(50, 2);
    expect(estimateMainsFrequency(noisySine(60, 30_000, 3, 10, 0.2), 30_000).mainsFrequencyHz).toBeCloseTo(60, 2);
    expect(estimateMainsFrequency(noisySine(59.93, 7680, 6, 5, 0.05), 7680).mainsFrequencyHz).toBeCloseTo(59.93, 2);
  });

  it('skips a leading stretch with the load off (noise only)', () => {
    const rate = 10_000;
    const a = noisySine(60, rate, 8, 12, 0.02, 3);
    const rnd = seededRandom(9);
    for (let i = 0; i < 4 * rate; i++) a[i] = 0.02 * normalDeviate(rnd);
    expect(estimateMainsFrequency(a, rate).mainsFrequencyHz).toBeCloseTo(60, 2);
  });

  it('refuses a waveform without a fundamental', () => {
    expect(() => estimateMainsFrequency(new Float64Array(30_000).fill(3), 10_000)).toThrow(/give mainsFrequencyHz/);
    const rnd = seededRandom(4);
    expect(() => estimateMainsFrequency(Float64Array.from({ length: 30_000 }, () => normalDeviate(rnd)), 10_000)).toThrow(RangeError);
    expect(() => estimateMainsFrequency(new Float64Array([1, Number.NaN]), 10_000)).toThrow(/samples\[1\]/);
  });
});
