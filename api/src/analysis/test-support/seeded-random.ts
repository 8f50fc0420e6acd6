/**
 * Deterministic pseudo-random numbers for tests and benchmarks (Mulberry32), so that a failing
 * check can be reproduced from its seed. Returns a function giving uniform numbers in [0, 1).
 * Source: Mulberry32 by Tommy Ettinger (public domain), a common small PRNG.
 */
export function seededRandom(seed: number): () => number {
  let s = seed >>> 0;
  return () => {
    s = (s + 0x6d2b79f5) >>> 0;
    let t = s;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

/** A standard normal deviate from two uniforms (Box–Muller transform). */
export function normalDeviate(random: () => number): number {
  return Math.sqrt(-2 * Math.log(random() + 1e-300)) * Math.cos(2 * Math.PI * random());
}
