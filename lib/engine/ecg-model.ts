/**
 * Synthetic ECG from the dynamical model of McSharry, Clifford, Tarassenko & Smith,
 * "A dynamical model for generating synthetic electrocardiogram signals",
 * IEEE Trans. Biomed. Eng. 50(3), 2003: a trajectory on a limit cycle (the unit circle in x–y)
 * whose angular velocity ω = 2π/RR sets the beat period, and a z coordinate pushed by five
 * Gaussian events P, Q, R, S, T at fixed angles:
 *
 *   dx/dt = α·x − ω·y,   dy/dt = α·y + ω·x,   α = 1 − √(x² + y²)
 *   dz/dt = −Σ_i a_i·Δθ_i·exp(−Δθ_i² / (2·b_i²)) − (z − z0),   Δθ_i = (θ − θ_i) mod 2π, θ = atan2(y, x)
 *
 * Integrated with the classic fixed-step fourth-order Runge–Kutta method. Pure and deterministic.
 */

/** One wave event of the model: angle θ_i (rad), amplitude a_i, width b_i (rad). */
export interface EcgWaveEvent {
  name: 'P' | 'Q' | 'R' | 'S' | 'T';
  thetaRad: number;
  a: number;
  b: number;
}

/**
 * The event parameters of the paper's Table 1 (values from memory: P −π/3, 1.2, 0.25;
 * Q −π/12, −5, 0.1; R 0, 30, 0.1; S π/12, −7.5, 0.1; T π/2, 0.75, 0.4).
 */
export const mcSharryEvents: readonly EcgWaveEvent[] = [
  { name: 'P', thetaRad: -Math.PI / 3, a: 1.2, b: 0.25 },
  { name: 'Q', thetaRad: -Math.PI / 12, a: -5.0, b: 0.1 },
  { name: 'R', thetaRad: 0, a: 30.0, b: 0.1 },
  { name: 'S', thetaRad: Math.PI / 12, a: -7.5, b: 0.1 },
  { name: 'T', thetaRad: Math.PI / 2, a: 0.75, b: 0.4 },
];

export interface EcgModelOptions {
  /** Heart rate, beats per minute (constant RR interval). */
  heartRateBpm: number;
  /** Duration, s. */
  durationS: number;
  /** Output sample rate, Hz. */
  sampleRateHz: number;
  /** Largest integration step, s (the RK4 step is the sample interval split into equal sub-steps no longer than this). Default 1 ms. */
  maxStepS?: number;
  /** Peak R amplitude above the baseline of the output, V. */
  amplitudeV: number;
}

/** Wraps an angle into (−π, π]. */
function wrapRad(angle: number): number {
  let a = angle % (2 * Math.PI);
  if (a > Math.PI) a -= 2 * Math.PI;
  if (a <= -Math.PI) a += 2 * Math.PI;
  return a;
}

/**
 * Synthetic ECG samples from the McSharry et al. (2003) model, scaled so that the R peak is
 * `amplitudeV` above the baseline (the median of the record).
 * The event widths and angles are scaled with the heart rate as in the authors' generator
 * (b_i × √(HR/60); θ of P and T × (HR/60)^¼, of Q and S × √(HR/60); from memory), so that
 * the QRS narrows and the QT shortens at higher rates.
 * @param options heart rate (bpm), duration (s), sample rate (Hz), R amplitude (V)
 * @returns samples, V, at t = k / sampleRateHz
 * @example mcSharryEcg({ heartRateBpm: 60, durationS: 10, sampleRateHz: 500, amplitudeV: 1e-3 }) // R peaks 1 s apart, 1 mV
 */
export function mcSharryEcg(options: EcgModelOptions): Float64Array {
  const { heartRateBpm, durationS, sampleRateHz, amplitudeV } = options;
  if (!(heartRateBpm > 0 && heartRateBpm < 400)) throw new RangeError(`heart rate must be between 0 and 400 bpm (got ${heartRateBpm})`);
  const n = Math.max(1, Math.round(durationS * sampleRateHz));
  const dtSample = 1 / sampleRateHz;
  const maxStep = options.maxStepS ?? 1e-3;
  const substeps = Math.max(1, Math.ceil(dtSample / maxStep));
  const h = dtSample / substeps;
  const omega = (2 * Math.PI * heartRateBpm) / 60;
  const hrFactor = Math.sqrt(heartRateBpm / 60);
  const hrFactor2 = Math.sqrt(hrFactor);
  const angleScale: Record<EcgWaveEvent['name'], number> = { P: hrFactor2, Q: hrFactor, R: 1, S: hrFactor, T: hrFactor2 };
  const events = mcSharryEvents.map((e) => ({ theta: e.thetaRad * angleScale[e.name], a: e.a, b: e.b * hrFactor }));

  const derivative = (x: number, y: number, z: number, out: Float64Array) => {
    const alpha = 1 - Math.sqrt(x * x + y * y);
    const theta = Math.atan2(y, x);
    let dz = 0;
    for (const e of events) {
      const d = wrapRad(theta - e.theta);
      dz -= e.a * d * Math.exp((-d * d) / (2 * e.b * e.b));
    }
    out[0] = alpha * x - omega * y;
    out[1] = alpha * y + omega * x;
    out[2] = dz - z; // z0 = 0: baseline wander is added separately
  };

  const z = new Float64Array(n);
  // Start opposite the R event (θ = π) on the limit cycle, so the record does not begin mid-QRS.
  let sx = -1;
  let sy = 0;
  let sz = 0;
  const k1 = new Float64Array(3);
  const k2 = new Float64Array(3);
  const k3 = new Float64Array(3);
  const k4 = new Float64Array(3);
  for (let i = 0; i < n; i += 1) {
    z[i] = sz;
    for (let s = 0; s < substeps; s += 1) {
      derivative(sx, sy, sz, k1);
      derivative(sx + (h / 2) * k1[0], sy + (h / 2) * k1[1], sz + (h / 2) * k1[2], k2);
      derivative(sx + (h / 2) * k2[0], sy + (h / 2) * k2[1], sz + (h / 2) * k2[2], k3);
      derivative(sx + h * k3[0], sy + h * k3[1], sz + h * k3[2], k4);
      sx += (h / 6) * (k1[0] + 2 * k2[0] + 2 * k3[0] + k4[0]);
      sy += (h / 6) * (k1[1] + 2 * k2[1] + 2 * k3[1] + k4[1]);
      sz += (h / 6) * (k1[2] + 2 * k2[2] + 2 * k3[2] + k4[2]);
    }
  }
  const sorted = Float64Array.from(z).sort();
  const baseline = sorted[Math.floor(n / 2)];
  let peak = -Infinity;
  for (let i = 0; i < n; i += 1) peak = Math.max(peak, z[i]);
  const scale = peak > baseline ? amplitudeV / (peak - baseline) : 0;
  for (let i = 0; i < n; i += 1) z[i] = (z[i] - baseline) * scale;
  return z;
}
