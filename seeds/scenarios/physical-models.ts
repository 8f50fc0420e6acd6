/**
 * Simple physical models that make invented demo traces (demo data only: tests of the analysis never
 * use these as a reference). Each returns amps as a Float32Array at a fixed sample rate.
 */

/** Deterministic pseudo-random numbers (mulberry32), so the demo looks the same on every machine. */
export function seededRandom(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

export interface MotorStartModel {
  rateHz: number;
  durationS: number;
  /** Seconds from the start of the record at which the motor is switched on. */
  startAtS: number;
  /** Seconds at which it is switched off (default: never). */
  stopAtS?: number;
  runningA: number;
  /** RMS current at the first instant (locked rotor). */
  startPeakA: number;
  /** Time constant of the decay from the start peak to running current. */
  tauS: number;
  /** Relative load ripple while running (e.g. 0.03 for ±3 %). */
  ripple: number;
  /** Extra short surges while running: [time s, extra A, duration s]. */
  surges?: Array<[number, number, number]>;
  seed: number;
}

/** RMS series of a motor start: off, then a surge decaying exponentially to the running current. */
export function motorStartRms(m: MotorStartModel): Float32Array {
  const n = Math.round(m.durationS * m.rateHz);
  const out = new Float32Array(n);
  const rand = seededRandom(m.seed);
  for (let i = 0; i < n; i++) {
    const t = i / m.rateHz;
    if (t < m.startAtS || (m.stopAtS !== undefined && t >= m.stopAtS)) {
      out[i] = 0.02 * rand(); // probe noise floor
      continue;
    }
    const since = t - m.startAtS;
    let a = m.runningA + (m.startPeakA - m.runningA) * Math.exp(-since / m.tauS);
    a *= 1 + m.ripple * (rand() * 2 - 1);
    for (const [at, extra, dur] of m.surges ?? []) {
      if (t >= at && t < at + dur) a += extra * Math.sin((Math.PI * (t - at)) / dur);
    }
    out[i] = a;
  }
  return out;
}

export interface HeaterModel {
  rateHz: number;
  durationS: number;
  onAtS: number;
  offAtS: number;
  /** Hot running current. */
  currentA: number;
  /** Cold-element current as a multiple of the hot one (nichrome: a few percent). */
  coldRatio: number;
  warmUpTauS: number;
  seed: number;
}

/** RMS series of a resistive element: a slightly higher cold current relaxing to the hot current. */
export function resistiveHeaterRms(h: HeaterModel): Float32Array {
  const n = Math.round(h.durationS * h.rateHz);
  const out = new Float32Array(n);
  const rand = seededRandom(h.seed);
  for (let i = 0; i < n; i++) {
    const t = i / h.rateHz;
    if (t < h.onAtS || t >= h.offAtS) {
      out[i] = 0.02 * rand();
      continue;
    }
    const since = t - h.onAtS;
    out[i] = h.currentA * (1 + (h.coldRatio - 1) * Math.exp(-since / h.warmUpTauS)) * (1 + 0.005 * (rand() * 2 - 1));
  }
  return out;
}

export interface CyclingModel {
  rateHz: number;
  durationS: number;
  onS: number;
  offS: number;
  firstStartS: number;
  runningA: number;
  lockedRotorA: number;
  startTauS: number;
  seed: number;
}

/** RMS series of a compressor cycling on a thermostat: each start is a short locked-rotor surge. */
export function compressorCyclingRms(c: CyclingModel): Float32Array {
  const n = Math.round(c.durationS * c.rateHz);
  const out = new Float32Array(n);
  const rand = seededRandom(c.seed);
  const period = c.onS + c.offS;
  for (let i = 0; i < n; i++) {
    const t = i / c.rateHz;
    const phase = t - c.firstStartS;
    if (phase < 0 || phase % period >= c.onS) {
      out[i] = 0.02 * rand();
      continue;
    }
    const since = phase % period;
    // Running current creeps up as the head pressure builds during a cycle.
    const running = c.runningA * (1 + 0.06 * Math.min(1, since / c.onS));
    out[i] = (running + (c.lockedRotorA - running) * Math.exp(-since / c.startTauS)) * (1 + 0.01 * (rand() * 2 - 1));
  }
  return out;
}

export interface WaveformMotorModel {
  rateHz: number;
  mainsHz: number;
  durationS: number;
  startAtS: number;
  runningRmsA: number;
  startRmsA: number;
  tauS: number;
  /** Decaying DC offset at switch-on as a fraction of the first peak (asymmetry). */
  dcOffset: number;
  noiseA: number;
  seed: number;
}

/** Instantaneous current of a motor start: a sine whose RMS envelope decays to running, plus a DC offset. */
export function motorStartWaveform(w: WaveformMotorModel): Float32Array {
  const n = Math.round(w.durationS * w.rateHz);
  const out = new Float32Array(n);
  const rand = seededRandom(w.seed);
  const omega = 2 * Math.PI * w.mainsHz;
  for (let i = 0; i < n; i++) {
    const t = i / w.rateHz;
    let a = w.noiseA * (rand() * 2 - 1);
    if (t >= w.startAtS) {
      const since = t - w.startAtS;
      const rms = w.runningRmsA + (w.startRmsA - w.runningRmsA) * Math.exp(-since / w.tauS);
      const peak = Math.SQRT2 * rms;
      a += peak * Math.sin(omega * since) + w.dcOffset * Math.SQRT2 * w.startRmsA * Math.exp(-since / 0.02);
    }
    out[i] = a;
  }
  return out;
}
