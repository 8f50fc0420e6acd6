/**
 * Analysis engine benchmark (`npm run bench -- analysis`).
 *
 * 1. A synthetic 10,000,000-sample waveform (30 kHz, 60 Hz, a start-up surge, a surge while running,
 *    noise) through the whole pipeline: half-cycle RMS series + statistics + inrush + surges
 *    (`analyzeTrace`), with the mains frequency given and estimated.
 * 2. A 10,000,000-sample `rms` series through `computeStatistics` with exact type 7 p50/p95/p99,
 *    with implicit (start + rate) and explicit timestamps.
 * Each is printed as samples per second and as a ratio against a plain one-pass Float64Array sum over
 * the same data in the same run (the memory-bound floor), both by wall clock (median) and by CPU time
 * (minimum; on a shared machine the wall clock also counts time spent waiting for a core). Peak extra memory is the growth of the
 * process's maximum resident set size during the timed runs. Medians of repeated runs after warm-up.
 * Targets (issue 3): pipeline ≥ 150 M samples/s; statistics with exact p95/p99 ≥ 100 M samples/s.
 */
import { cpus, loadavg } from 'node:os';
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

/** Wall-clock median and CPU-time minimum (ms) of `runs` calls after two warm-up calls. */
function timeIt(run: () => unknown, runs = RUNS): { wallMs: number; cpuMs: number } {
  run(); // warm-up (JIT, lazily allocated scratch buffers)
  run();
  const wall: number[] = [];
  const cpu: number[] = [];
  for (let r = 0; r < runs; r++) {
    const c0 = process.cpuUsage();
    const t0 = process.hrtime.bigint();
    run();
    wall.push(Number(process.hrtime.bigint() - t0) / 1e6);
    const c = process.cpuUsage(c0);
    cpu.push((c.user + c.system) / 1000);
  }
  return { wallMs: median(wall), cpuMs: Math.min(...cpu) };
}

function plainSum(a: Float64Array): number {
  let s = 0;
  for (let i = 0; i < a.length; i++) s += a[i] as number;
  return s;
}

function maxRssMb(): number {
  return process.resourceUsage().maxRSS / 1024;
}

/**
 * One line: wall-clock median, samples/s from it, and the ratio to the plain sum; then the CPU-time
 * minimum and its samples/s (what the code costs when the machine is not shared with other work).
 */
function report(label: string, t: { wallMs: number; cpuMs: number }, sum: { wallMs: number; cpuMs: number }, samples = N): void {
  const rate = (ms: number): string => (samples / (ms / 1000) / 1e6).toFixed(1).padStart(6);
  console.log(
    `${label.padEnd(58)} ${t.wallMs.toFixed(1).padStart(7)} ms ${rate(t.wallMs)} M/s ${(t.wallMs / sum.wallMs).toFixed(1).padStart(5)}× sum` +
      ` | cpu ${t.cpuMs.toFixed(1).padStart(6)} ms ${rate(t.cpuMs)} M/s ${(t.cpuMs / sum.cpuMs).toFixed(1).padStart(5)}× sum`,
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
const sumWaveformMs = timeIt(() => (checksum += plainSum(waveform)));
report('plain one-pass Float64Array sum (waveform data)', sumWaveformMs, sumWaveformMs);
const rssBeforePipeline = maxRssMb();
let last = analyzeTrace({ kind: 'waveform', samples: waveform, sampleRateHz: 30_000 }, { mainsFrequencyHz: 60 });
const pipelineGivenMs = timeIt(() => {
  last = analyzeTrace({ kind: 'waveform', samples: waveform, sampleRateHz: 30_000 }, { mainsFrequencyHz: 60, nominalVoltageV: 120 });
});
report('waveform pipeline, mains frequency given', pipelineGivenMs, sumWaveformMs);
const pipelineEstimatedMs = timeIt(() => {
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
const sumRmsMs = timeIt(() => (checksum += plainSum(rmsSeries)));
report('plain one-pass Float64Array sum (rms data)', sumRmsMs, sumRmsMs);
const rssBeforeStats = maxRssMb();
let stats = computeStatistics(uniformTimeAxis(0, 20), rmsSeries, { onThresholdA: 2 });
const statsUniformMs = timeIt(() => {
  stats = computeStatistics(uniformTimeAxis(0, 20), rmsSeries, { onThresholdA: 2, voltageV: 230 });
});
report('rms statistics + exact p50/p95/p99, start + rate', statsUniformMs, sumRmsMs);
const statsExplicitMs = timeIt(() => {
  stats = computeStatistics(explicitTimeAxis(timestamps), rmsSeries, { onThresholdA: 2, voltageV: 230 });
});
report('rms statistics + exact p50/p95/p99, explicit timestamps', statsExplicitMs, sumRmsMs);
const rmsPipelineMs = timeIt(() => {
  analyzeTrace({ kind: 'rms', samples: rmsSeries, timestampsS: timestamps }, { nominalVoltageV: 230 });
});
report('rms pipeline (statistics + inrush + surges), explicit times', rmsPipelineMs, sumRmsMs);
const statsExtraMb = maxRssMb() - rssBeforeStats;
console.log(
  `  → p50/p95/p99 ${stats.p50A?.toFixed(3)}/${stats.p95A?.toFixed(3)}/${stats.p99A?.toFixed(3)} A, duty cycle ${stats.dutyCycle?.toFixed(3)}, ` +
    `peak extra memory ${statsExtraMb.toFixed(1)} MB; input ${(rmsSeries.byteLength / 1e6).toFixed(0)} MB (+ ${(timestamps.byteLength / 1e6).toFixed(0)} MB timestamps)`,
);

const verdict = (label: string, ms: { wallMs: number; cpuMs: number }, target: number): string => {
  const wall = N / (ms.wallMs / 1000) / 1e6;
  const cpu = N / (ms.cpuMs / 1000) / 1e6;
  return `${label} ≥ ${target} M/s → ${wall.toFixed(0)} M/s wall (${wall >= target ? 'met' : 'NOT met'}), ${cpu.toFixed(0)} M/s cpu (${cpu >= target ? 'met' : 'NOT met'})`;
};
console.log(`targets: ${verdict('waveform pipeline', pipelineGivenMs, 150)}; ${verdict('rms statistics with exact percentiles', statsExplicitMs, 100)}`);
console.log(`load average while running: ${loadavg().map((x) => x.toFixed(1)).join(' ')} on ${cpus().length} cores`);
if (!Number.isFinite(checksum)) console.log('checksum', checksum);
