/**
 * Analysis engine benchmark (`npm run bench -- analysis`).
 *
 * 1. A synthetic 10,000,000-sample waveform (30 kHz, 60 Hz, a start-up surge, a surge while running,
 *    noise) through the whole pipeline: half-cycle RMS series + statistics + inrush + surges
 *    (`analyzeTrace`), with the mains frequency given and estimated.
 * 2. A 10,000,000-sample `rms` series through `computeStatistics` with exact type 7 p50/p95/p99,
 *    with implicit (start + rate) and explicit timestamps.
 * Each is printed as samples per second and as a ratio against a plain one-pass Float64Array sum over
 * the same data in the same run (the memory-bound floor). Peak extra memory is the growth of the
 * process's maximum resident set size during the timed runs. Medians of repeated runs after warm-up.
 * Targets (issue 3): pipeline ≥ 150 M samples/s; statistics with exact p95/p99 ≥ 100 M samples/s.
 */
import { analyzeTrace } from '../api/src/analysis/pipeline/analyze-trace.js';
import { computeStatistics } from '../api/src/analysis/stats/statistics.js';
import { normalDeviate, seededRandom } from '../api/src/analysis/test-support/seeded-random.js';
import { syntheticStartWaveform } from '../api/src/analysis/test-support/synthetic-waveform.js';
import { explicitTimeAxis, uniformTimeAxis } from '../api/src/analysis/time/time-axis.js';

const N = 10_000_000;
const RUNS = 9;

function median(values: number[]): number {
  const s = [...values].sort((x, y) => x - y);
  return s[s.length >> 1] as number;
}

function timeIt(label: string, run: () => unknown, runs = RUNS): number {
  run(); // warm-up (JIT, lazily allocated scratch buffers)
  run();
  const times: number[] = [];
  for (let r = 0; r < runs; r++) {
    const t0 = process.hrtime.bigint();
    run();
    times.push(Number(process.hrtime.bigint() - t0) / 1e6);
  }
  const ms = median(times);
  void label;
  return ms;
}

function plainSum(a: Float64Array): number {
  let s = 0;
  for (let i = 0; i < a.length; i++) s += a[i] as number;
  return s;
}

function maxRssMb(): number {
  return process.resourceUsage().maxRSS / 1024;
}

function report(label: string, ms: number, sumMs: number, samples = N): void {
  const rate = samples / (ms / 1000);
  console.log(
    `${label.padEnd(58)} ${ms.toFixed(1).padStart(7)} ms  ${(rate / 1e6).toFixed(1).padStart(6)} M samples/s  ${(ms / sumMs).toFixed(1).padStart(5)}× a plain sum`,
  );
}

// ---------------------------------------------------------------- data (not timed)
const waveform = syntheticStartWaveform({ sampleCount: N, surgeStartS: 200, surgeLengthS: 0.5 });
const random = seededRandom(42);
const rmsSeries = new Float64Array(N);
const timestamps = new Float64Array(N);
let level = 0;
for (let i = 0; i < N; i++) {
  // A logger at 20 readings/s: a load cycling on (≈ 12 A) and off, with noise and jittered times.
  if (i % 50_000 === 0) level = level > 1 ? 0.2 : 12;
  rmsSeries[i] = Math.max(0, level + 0.3 * normalDeviate(random));
  timestamps[i] = i * 0.05 + 0.01 * random();
}

console.log(`node ${process.version}, ${N.toLocaleString('en')} samples per run, median of ${RUNS} runs`);
console.log(`GLIBC_TUNABLES=${process.env.GLIBC_TUNABLES ?? '(unset)'}`);

// ---------------------------------------------------------------- 1. waveform pipeline
let checksum = 0;
const sumWaveformMs = timeIt('sum', () => (checksum += plainSum(waveform)));
report('plain one-pass Float64Array sum (waveform data)', sumWaveformMs, sumWaveformMs);
const rssBeforePipeline = maxRssMb();
let last = analyzeTrace({ kind: 'waveform', samples: waveform, sampleRateHz: 30_000 }, { mainsFrequencyHz: 60 });
const pipelineGivenMs = timeIt('pipeline', () => {
  last = analyzeTrace({ kind: 'waveform', samples: waveform, sampleRateHz: 30_000 }, { mainsFrequencyHz: 60, nominalVoltageV: 120 });
});
report('waveform pipeline, mains frequency given', pipelineGivenMs, sumWaveformMs);
const pipelineEstimatedMs = timeIt('pipeline', () => {
  last = analyzeTrace({ kind: 'waveform', samples: waveform, sampleRateHz: 30_000 }, { nominalVoltageV: 120 });
});
report('waveform pipeline, mains frequency estimated', pipelineEstimatedMs, sumWaveformMs);
const pipelineExtraMb = maxRssMb() - rssBeforePipeline;
console.log(
  `  → RMS series ${last.rmsSeriesLength} values, ${last.inrushEvents.length} inrush event(s) (peak ${last.inrushEvents[0]?.peakA.toFixed(1)} A, ` +
    `settled ${last.inrushEvents[0]?.settleTimeS?.toFixed(3)} s after it), ${last.surges.length} surge(s), f = ${last.params.mainsFrequencyHz?.toFixed(3)} Hz`,
);
console.log(`  → peak extra memory (max RSS growth): ${pipelineExtraMb.toFixed(1)} MB; input ${(waveform.byteLength / 1e6).toFixed(0)} MB`);

// ---------------------------------------------------------------- 2. rms series statistics
const sumRmsMs = timeIt('sum', () => (checksum += plainSum(rmsSeries)));
report('plain one-pass Float64Array sum (rms data)', sumRmsMs, sumRmsMs);
const rssBeforeStats = maxRssMb();
let stats = computeStatistics(uniformTimeAxis(0, 20), rmsSeries, { onThresholdA: 2 });
const statsUniformMs = timeIt('stats', () => {
  stats = computeStatistics(uniformTimeAxis(0, 20), rmsSeries, { onThresholdA: 2, voltageV: 230 });
});
report('rms statistics + exact p50/p95/p99, start + rate', statsUniformMs, sumRmsMs);
const statsExplicitMs = timeIt('stats', () => {
  stats = computeStatistics(explicitTimeAxis(timestamps), rmsSeries, { onThresholdA: 2, voltageV: 230 });
});
report('rms statistics + exact p50/p95/p99, explicit timestamps', statsExplicitMs, sumRmsMs);
const rmsPipelineMs = timeIt('rms pipeline', () => {
  analyzeTrace({ kind: 'rms', samples: rmsSeries, timestampsS: timestamps }, { nominalVoltageV: 230 });
});
report('rms pipeline (statistics + inrush + surges), explicit times', rmsPipelineMs, sumRmsMs);
const statsExtraMb = maxRssMb() - rssBeforeStats;
console.log(
  `  → p50/p95/p99 ${stats.p50A?.toFixed(3)}/${stats.p95A?.toFixed(3)}/${stats.p99A?.toFixed(3)} A, duty cycle ${stats.dutyCycle?.toFixed(3)}, ` +
    `peak extra memory ${statsExtraMb.toFixed(1)} MB; input ${(rmsSeries.byteLength / 1e6).toFixed(0)} MB (+ ${(timestamps.byteLength / 1e6).toFixed(0)} MB timestamps)`,
);

const pipelineRate = N / (pipelineGivenMs / 1000) / 1e6;
const statsRate = N / (statsExplicitMs / 1000) / 1e6;
console.log(
  `targets: waveform pipeline ≥ 150 M/s → ${pipelineRate.toFixed(0)} M/s ${pipelineRate >= 150 ? 'met' : 'NOT met'}; ` +
    `rms statistics with exact percentiles ≥ 100 M/s → ${statsRate.toFixed(0)} M/s ${statsRate >= 100 ? 'met' : 'NOT met'}`,
);
if (!Number.isFinite(checksum)) console.log('checksum', checksum);
