/**
 * Test signals with known truth: seeded white Gaussian noise, mains sines, offset and drift.
 */

/** mulberry32 (a public-domain 32-bit PRNG by Tommy Ettinger), seeded for reproducible tests. */
export function seededUniform(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

/** Standard normal deviates by the Box–Muller transform (Box & Muller, Ann. Math. Statist. 29, 1958). */
export function seededGaussian(seed: number): () => number {
  const u = seededUniform(seed);
  return () => Math.sqrt(-2 * Math.log(1 - u())) * Math.cos(2 * Math.PI * u());
}

export interface SyntheticTruth {
  fsHz: number;
  durationS: number;
  /** Gain from input to the recorded values. */
  gain: number;
  offsetV: number;
  driftVPerS: number;
  mainsHz: number;
  /** Mains amplitude (peak) at the input, V. */
  mainsAmplitudeV: number;
  /** Extra harmonics: harmonic number → amplitude at the input, V. */
  harmonicsV: Record<number, number>;
  /** White Gaussian noise at the input, rms over 0…fs/2, V. */
  noiseRmsV: number;
  seed: number;
}

/** The recorded samples (input × gain), volts. */
export function synthesize(truth: SyntheticTruth): Float64Array {
  const n = Math.round(truth.fsHz * truth.durationS);
  const g = seededGaussian(truth.seed);
  const out = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const t = i / truth.fsHz;
    let v = truth.offsetV + truth.driftVPerS * t + truth.mainsAmplitudeV * Math.sin(2 * Math.PI * truth.mainsHz * t + 0.3);
    for (const [k, a] of Object.entries(truth.harmonicsV)) v += a * Math.sin(2 * Math.PI * Number(k) * truth.mainsHz * t + 1.1 * Number(k));
    v += truth.noiseRmsV * g();
    out[i] = truth.gain * v;
  }
  return out;
}
