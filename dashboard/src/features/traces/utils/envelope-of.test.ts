import { describe, expect, it } from 'vitest';
import { envelopeOf } from './envelope-of';

const series = {
  t: [0, 10, 20, 30, 40],
  count: [26, 26, 0, 26, 26],
  min: [-5, -6, null, -5, -5],
  max: [5, 6, null, 5, 5],
  mean: [0, 0.1, null, 0, 0],
  rms: {
    min: [3.5, null, null, 3.6, null],
    max: [3.6, null, null, 3.7, null],
    mean: [3.55, null, null, 3.65, null],
    source: 'analysis' as const,
  },
};

describe('envelopeOf', () => {
  it('when drawing RMS, then buckets without a half-cycle value are skipped but real gaps stay null', () => {
    expect(envelopeOf(series, 'rms')).toEqual({
      t: [0, 20, 30],
      min: [3.5, null, 3.6],
      max: [3.6, null, 3.7],
      mean: [3.55, null, 3.65],
    });
  });

  it('when drawing instantaneous values, then the buckets are used as they are', () => {
    expect(envelopeOf(series, 'instantaneous').mean).toEqual(series.mean);
  });

  it('when the series has no RMS (an RMS trace), then the instantaneous envelope is drawn', () => {
    expect(envelopeOf({ ...series, rms: null }, 'rms').t).toEqual(series.t);
  });
});
