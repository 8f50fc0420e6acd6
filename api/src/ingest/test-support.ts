import type { SampleSink } from './sample-sink.js';

/** A sink that keeps what it is given, for parser tests. */
export function collectingSink(): SampleSink & { values: number[]; times: number[] } {
  const sink = {
    values: [] as number[],
    times: [] as number[],
    async pushExplicit(v: Float32Array, t: Float64Array) {
      sink.values.push(...v);
      sink.times.push(...t);
    },
    async pushUniform(v: Float32Array) {
      sink.values.push(...v);
    },
  };
  return sink;
}
