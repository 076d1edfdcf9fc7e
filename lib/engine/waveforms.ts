/**
 * Waveforms: a synthetic input of the plan's application traced through every stage of the
 * channel in discrete time, with clipping at each node's limits, then sampled and quantized by
 * the ADC; and the low-frequency impulse test (3 mV × 100 ms) in the time domain.
 *
 * Pure, browser-safe and deterministic (seeded). Analog prototypes are mapped to discrete time
 * by the bilinear transform with pre-warping at each section's natural frequency, so corners and
 * Q are exact at the simulation rate; the rate should be well above the band (≥ 4 × the
 * low-pass corner; `simulateWaveforms` refuses anything below 2.2 ×).
 *
 * Inputs (differential unless noted):
 *  - the signal: ECG from McSharry et al. (2003) (see `ecg-model.ts`), surface EMG as band-limited
 *    Gaussian bursts, EEG as a 1/f background plus an alpha rhythm;
 *  - electrode DC offset, slow drift (baseline wander), RTI noise;
 *  - mains: the differential interference left at the input and the body common mode on both inputs.
 * Not modelled in the time domain: the input RC network's response (its corner is normally far
 * above the band; the Response view shows it), op-amp poles above 0.45 × the simulation rate,
 * slew rate and recovery from saturation (a clipped node simply holds its limit).
 */
import { mcSharryEcg } from './ecg-model';
import { evaluate } from './evaluate';
import { equivalentNoiseBandwidthHz } from './filters';
import type { ChannelPlan } from './plan';
import { profileFor } from './profiles';
import type { ChannelReport, NodeLevel } from './report';
import { lowPassSections } from './spice-netlist';

// ---------------------------------------------------------------------------------------------
// Random numbers

/** mulberry32: a small seeded 32-bit generator (public-domain algorithm by Tommy Ettinger). */
function mulberry32(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

/** Standard normal deviates by the Box–Muller transform. */
function gaussian(uniform: () => number): () => number {
  let spare: number | undefined;
  return () => {
    if (spare !== undefined) {
      const s = spare;
      spare = undefined;
      return s;
    }
    const u = Math.max(uniform(), 1e-300);
    const v = uniform();
    const r = Math.sqrt(-2 * Math.log(u));
    spare = r * Math.sin(2 * Math.PI * v);
    return r * Math.cos(2 * Math.PI * v);
  };
}

// ---------------------------------------------------------------------------------------------
// Discrete-time sections (bilinear transform)

/** A second-order discrete section, a0 = 1, transposed direct form II. */
export interface Biquad {
  b0: number;
  b1: number;
  b2: number;
  a1: number;
  a2: number;
}

/**
 * Bilinear transform of H(s) = (B0 + B1·s + B2·s²)/(A0 + A1·s + A2·s²) with s = K(1 − z⁻¹)/(1 + z⁻¹),
 * K = ω_w / tan(ω_w·T/2) (pre-warped at ω_w; Oppenheim & Schafer, Discrete-Time Signal Processing, §7.2).
 * @param num [B0, B1, B2]
 * @param den [A0, A1, A2]
 * @param sampleRateHz simulation rate, Hz
 * @param warpRadPerS frequency kept exact, rad/s
 */
export function bilinearSection(num: [number, number, number], den: [number, number, number], sampleRateHz: number, warpRadPerS: number): Biquad {
  const T = 1 / sampleRateHz;
  const K = warpRadPerS / Math.tan((warpRadPerS * T) / 2);
  const K2 = K * K;
  const n0 = num[0] + num[1] * K + num[2] * K2;
  const n1 = 2 * num[0] - 2 * num[2] * K2;
  const n2 = num[0] - num[1] * K + num[2] * K2;
  const d0 = den[0] + den[1] * K + den[2] * K2;
  const d1 = 2 * den[0] - 2 * den[2] * K2;
  const d2 = den[0] - den[1] * K + den[2] * K2;
  return { b0: n0 / d0, b1: n1 / d0, b2: n2 / d0, a1: d1 / d0, a2: d2 / d0 };
}

/** First-order low-pass ω0/(s + ω0). */
export function lowPass1(w0: number, fs: number): Biquad {
  return bilinearSection([w0, 0, 0], [w0, 1, 0], fs, w0);
}
/** First-order high-pass s/(s + ω0). */
export function highPass1(w0: number, fs: number): Biquad {
  return bilinearSection([0, 1, 0], [w0, 1, 0], fs, w0);
}
/** Second-order low-pass ω0²/(s² + (ω0/Q)s + ω0²). */
export function lowPass2(w0: number, q: number, fs: number): Biquad {
  return bilinearSection([w0 * w0, 0, 0], [w0 * w0, w0 / q, 1], fs, w0);
}
/** Second-order high-pass s²/(s² + (ω0/Q)s + ω0²). */
export function highPass2(w0: number, q: number, fs: number): Biquad {
  return bilinearSection([0, 0, 1], [w0 * w0, w0 / q, 1], fs, w0);
}

/**
 * Filters x through cascaded sections in place. The state starts at the steady state for a
 * constant input equal to `x[0]` (the channel has been connected for a long time) unless
 * `fromRest` is set (the state starts at zero).
 */
export function filterCascade(sections: Biquad[], x: Float64Array, fromRest = false): Float64Array {
  for (const s of sections) {
    let s1 = 0;
    let s2 = 0;
    if (!fromRest) {
      const x0 = x[0];
      const dcGain = (s.b0 + s.b1 + s.b2) / (1 + s.a1 + s.a2);
      const y0 = dcGain * x0;
      s2 = s.b2 * x0 - s.a2 * y0;
      s1 = s.b1 * x0 - s.a1 * y0 + s2;
    }
    for (let i = 0; i < x.length; i += 1) {
      const xi = x[i];
      const yi = s.b0 * xi + s1;
      s1 = s.b1 * xi - s.a1 * yi + s2;
      s2 = s.b2 * xi - s.a2 * yi;
      x[i] = yi;
    }
  }
  return x;
}

// ---------------------------------------------------------------------------------------------
// Channel description for the simulation

/** Allowed voltage range of a node, V. */
export interface NodeRange {
  minV: number;
  maxV: number;
}

export type WaveformNode = 'input' | 'va' | 'vb' | 'ina' | 'hp' | 'g2' | 'lp' | 'adc';

/** Everything the time-domain simulation needs besides the plan. */
export interface WaveformContext {
  /** Allowed range per node, V. */
  limits: Record<WaveformNode, NodeRange>;
  /** Differential electrode DC offset applied, V. */
  offsetV: number;
  /** Signal amplitude (peak), V. */
  signalAmplitudeV: number;
  /** Common-mode DC level at the amplifier inputs, V (the body is held at the reference). */
  commonModeDcV: number;
  /** Body common-mode amplitude at mains frequency, V peak. */
  commonModeMainsPeakV: number;
  /** Differential mains interference left at the input, V peak. */
  mainsDifferentialPeakV: number;
  /** Noise referred to input, V rms, over `noiseBandwidthHz`. */
  noiseRmsV: number;
  /** Bandwidth the RTI noise figure refers to, Hz. */
  noiseBandwidthHz: number;
  /** Application of the profile. */
  application: 'ecg' | 'emg' | 'eeg';
}

/** Nominal first-stage gain G1 = 1 + 2R/Rg (three-op-amp instrumentation amplifier). */
function firstStageGain(plan: ChannelPlan): number {
  const ina = plan.instrumentation;
  if (ina.rgOhm !== undefined) return 1 + (2 * ina.rOhm) / ina.rgOhm;
  return ina.targetGain ?? 1;
}

/**
 * Node ranges from the plan: op-amp output swing to each rail for VA, VB, the instrumentation
 * output, the gain-stage and filter outputs; the op-amp input common-mode range for the inputs
 * and the high-pass output (the gain-stage input); the ADC full scale around mid-scale.
 */
export function nodeRangesFromPlan(plan: ChannelPlan): Record<WaveformNode, NodeRange> {
  const { positiveV, negativeV } = plan.supply;
  const inaOp = plan.instrumentation.opAmp;
  const gainOp = plan.gainStage.opAmp;
  const out = (op: typeof inaOp): NodeRange => ({ minV: negativeV + op.outputFromNegV, maxV: positiveV - op.outputFromPosV });
  const cm = (op: typeof inaOp): NodeRange => ({ minV: negativeV + op.inputCmFromNegV, maxV: positiveV - op.inputCmFromPosV });
  const half = plan.adc.fullScaleV / 2;
  return {
    input: cm(inaOp),
    va: out(inaOp),
    vb: out(inaOp),
    ina: out(inaOp),
    hp: plan.highPass.order === 0 ? out(inaOp) : cm(gainOp),
    g2: out(gainOp),
    lp: out(gainOp),
    adc: { minV: plan.adc.midScaleV - half, maxV: plan.adc.midScaleV + half },
  };
}

/**
 * The simulation context from the plan alone: node ranges from the op-amp and converter
 * parameters, no interference and no noise (pass them in `overrides`). See `waveformContext`
 * for the context taken from the report.
 */
export function waveformContextFromPlan(plan: ChannelPlan, overrides: Partial<WaveformContext> = {}): WaveformContext {
  const profile = profileFor(plan.profileId, plan.customProfile);
  return {
    limits: nodeRangesFromPlan(plan),
    offsetV: Math.max(plan.electrodes.offsetV, profile.dcOffset.value),
    signalAmplitudeV: plan.signalAmplitudeV ?? profile.signalAmplitude.value,
    commonModeDcV: plan.supply.referenceV,
    commonModeMainsPeakV: 0,
    mainsDifferentialPeakV: 0,
    noiseRmsV: 0,
    noiseBandwidthHz: Math.max(profile.band.highHz - profile.band.lowHz, 1),
    application: profile.application,
    ...overrides,
  };
}

/** Finds a node of the report by stage and name. */
function reportNode(report: ChannelReport, stageId: string, name: string): NodeLevel | undefined {
  return report.stages.find((s) => s.id === stageId)?.nodes.find((n) => n.name === name);
}

/**
 * The simulation context from the engine's report: each node's allowed range from the report's
 * stage levels, the worst-case DC input without the signal (electrode offset, bias and lead-off
 * terms, op-amp offsets), the body common mode and the differential interference left at the
 * input, and the RTI noise. The noise is injected white at the input with the density that gives
 * the report's rms through the chain's noise bandwidth (the low-pass noise bandwidth less the
 * high-pass's π/2·fc); its 1/f colour is not reproduced.
 * @param plan a valid channel plan
 * @param report `evaluate(plan)`
 * @param overrides values that replace the derived ones
 */
export function waveformContext(plan: ChannelPlan, report: ChannelReport, overrides: Partial<WaveformContext> = {}): WaveformContext {
  const fallback = waveformContextFromPlan(plan);
  const range = (node: NodeLevel | undefined, dflt: NodeRange): NodeRange => (node ? { minV: node.lowLimitV, maxV: node.highLimitV } : dflt);
  const va = range(reportNode(report, 'instrumentation', 'VA'), fallback.limits.va);
  const vb = range(reportNode(report, 'instrumentation', 'VB'), fallback.limits.vb);
  const g2 = range(reportNode(report, 'gain-stage', 'gain-stage output'), fallback.limits.g2);
  const lp = plan.gainStage.lowPass;
  const hpNoiseBandwidthHz = plan.highPass.order === 0 ? 0 : (Math.PI / 2) * plan.highPass.fcHz;
  const noiseBandwidthHz = Math.max(equivalentNoiseBandwidthHz(lp.kind, lp.order, lp.fcHz) - hpNoiseBandwidthHz, lp.fcHz / 10);
  return {
    ...fallback,
    limits: {
      input: range(reportNode(report, 'instrumentation', 'IN+ (V1)'), fallback.limits.input),
      va,
      vb,
      ina: range(reportNode(report, 'instrumentation', 'VOUT'), fallback.limits.ina),
      hp: range(reportNode(report, 'high-pass', 'high-pass output'), fallback.limits.hp),
      g2,
      lp: g2,
      adc: range(reportNode(report, 'adc', 'ADC input'), fallback.limits.adc),
    },
    offsetV: Math.max(0, report.worstCaseInputV - fallback.signalAmplitudeV),
    commonModeMainsPeakV: report.interference.bodyCmV * Math.SQRT2,
    mainsDifferentialPeakV: report.interference.rtiPpV / 2,
    noiseRmsV: report.noise.rtiRmsV,
    noiseBandwidthHz,
    ...overrides,
  };
}

// ---------------------------------------------------------------------------------------------
// Synthetic signals

/**
 * Surface EMG: Gaussian noise band-limited to 20–450 Hz (second-order Butterworth edges), under a
 * burst envelope (1 s contraction every 2 s, raised-cosine edges of 0.2 s); scaled so the rms in
 * a burst is a quarter of the amplitude (peaks near the amplitude). Common practice, no source.
 */
function syntheticEmg(n: number, fs: number, amplitudeV: number, rand: () => number): Float64Array {
  const g = gaussian(rand);
  const x = new Float64Array(n);
  for (let i = 0; i < n; i += 1) x[i] = g();
  const hiHz = Math.min(450, 0.45 * fs);
  const loHz = Math.min(20, hiHz / 4);
  filterCascade([highPass2(2 * Math.PI * loHz, Math.SQRT1_2, fs), lowPass2(2 * Math.PI * hiHz, Math.SQRT1_2, fs)], x, true);
  let power = 0;
  for (let i = 0; i < n; i += 1) power += x[i] * x[i];
  const rms = Math.sqrt(power / n) || 1;
  const periodS = 2;
  const onS = 1;
  const edgeS = 0.2;
  for (let i = 0; i < n; i += 1) {
    const t = (i / fs) % periodS;
    const start = 0.5;
    let env = 0;
    if (t >= start && t < start + onS) {
      const u = t - start;
      env = u < edgeS ? 0.5 - 0.5 * Math.cos((Math.PI * u) / edgeS) : u > onS - edgeS ? 0.5 - 0.5 * Math.cos((Math.PI * (onS - u)) / edgeS) : 1;
    }
    x[i] = ((x[i] / rms) * amplitudeV * env) / 4;
  }
  return x;
}

/**
 * EEG: a 1/f background (sum of sinusoids 0.5–45 Hz with amplitude ∝ 1/√f and random phases)
 * plus a 10 Hz alpha rhythm waxing and waning with a 4 s period; the background rms is a tenth
 * of the amplitude and the alpha peak half of it. Common practice, no source.
 */
function syntheticEeg(n: number, fs: number, amplitudeV: number, rand: () => number): Float64Array {
  const x = new Float64Array(n);
  const durationS = n / fs;
  const components = Math.min(1500, Math.max(50, Math.round(45 * durationS)));
  const fMax = Math.min(45, 0.45 * fs);
  let variance = 0;
  for (let k = 0; k < components; k += 1) {
    const f = 0.5 + ((fMax - 0.5) * (k + rand())) / components;
    const a = 1 / Math.sqrt(f);
    variance += (a * a) / 2;
    const phase = 2 * Math.PI * rand();
    const w = (2 * Math.PI * f) / fs;
    for (let i = 0; i < n; i += 1) x[i] += a * Math.sin(w * i + phase);
  }
  const backgroundScale = (0.1 * amplitudeV) / Math.sqrt(variance);
  const alphaPhase = 2 * Math.PI * rand();
  for (let i = 0; i < n; i += 1) {
    const t = i / fs;
    const envelope = 0.5 - 0.5 * Math.cos((2 * Math.PI * t) / 4);
    x[i] = x[i] * backgroundScale + 0.5 * amplitudeV * envelope * Math.sin(2 * Math.PI * 10 * t + alphaPhase);
  }
  return x;
}

// ---------------------------------------------------------------------------------------------
// Simulation

export interface WaveformIncludes {
  signal: boolean;
  offset: boolean;
  drift: boolean;
  mains: boolean;
  noise: boolean;
}

export interface WaveformOptions {
  /** Length of the record, s. */
  durationS: number;
  /** Simulation rate, Hz (well above the band; the ADC then samples at its own rate). */
  sampleRateHz: number;
  /** Seed of the random parts (noise, EMG, EEG). */
  seed: number;
  /** Synthetic signal; default: the profile's application. */
  signal?: 'ecg' | 'emg' | 'eeg';
  /** Components to include; each defaults to true. */
  include?: Partial<WaveformIncludes>;
  /**
   * When the electrode offset appears, s (an electrode connected at that instant). Default:
   * present from long before the record, so every high-pass starts settled.
   */
  offsetStartS?: number;
  /** Heart rate of the synthetic ECG, bpm (default 72). */
  heartRateBpm?: number;
  /** Baseline wander: amplitude (V peak, default half the signal amplitude) and frequency (Hz, default 0.2). */
  drift?: { amplitudeV?: number; frequencyHz?: number };
  /** Most points per trace for display (min/max envelope decimation), default 2000. */
  maxDisplayPoints?: number;
  /** The plan's report (`evaluate(plan)`); computed when not given. */
  report?: ChannelReport;
  /**
   * `report` (default): limits, offset, interference and noise from the engine's report;
   * `plan`: limits from the plan's op-amp and converter parameters, no interference or noise.
   */
  contextFrom?: 'report' | 'plan';
  /** Values that replace the derived context (limits, interference, noise ...). */
  context?: Partial<WaveformContext>;
}

/** A run of consecutive clipped samples, s. */
export interface ClipSegment {
  startS: number;
  endS: number;
}

/** Full-resolution result of the chain simulation. */
export interface ChainSimulation {
  sampleRateHz: number;
  context: WaveformContext;
  /** Differential input, V. */
  input: Float64Array;
  /** Node voltages, V, after clipping. */
  nodes: Record<WaveformNode, Float64Array>;
  /** Clipping flags per node and sample (1 = the node was at its limit). */
  clipped: Record<WaveformNode, Uint8Array>;
  adc: { sampleRateHz: number; timeS: Float64Array; codes: Int32Array; valuesV: Float64Array; lsbV: number };
}

function clipInPlace(x: Float64Array, range: NodeRange, flags: Uint8Array): void {
  for (let i = 0; i < x.length; i += 1) {
    if (x[i] > range.maxV) {
      x[i] = range.maxV;
      flags[i] = 1;
    } else if (x[i] < range.minV) {
      x[i] = range.minV;
      flags[i] = 1;
    }
  }
}

function checkOptions(plan: ChannelPlan, options: WaveformOptions): void {
  if (!(Number.isFinite(options.durationS) && options.durationS > 0 && options.durationS <= 600)) {
    throw new RangeError(`durationS must be a number of seconds above 0 and at most 600 (got ${options.durationS})`);
  }
  if (!(Number.isFinite(options.sampleRateHz) && options.sampleRateHz > 0)) {
    throw new RangeError(`sampleRateHz must be a positive number of hertz (got ${options.sampleRateHz})`);
  }
  if (options.sampleRateHz < 2.2 * plan.gainStage.lowPass.fcHz) {
    throw new RangeError(`sampleRateHz must be at least 2.2 × the low-pass corner (${2.2 * plan.gainStage.lowPass.fcHz} Hz) to simulate the band (got ${options.sampleRateHz})`);
  }
  if (options.durationS * options.sampleRateHz > 5e6) {
    throw new RangeError(`durationS × sampleRateHz must be at most 5 million samples (got ${options.durationS * options.sampleRateHz})`);
  }
  if (!Number.isInteger(options.seed)) throw new RangeError(`seed must be a whole number (got ${options.seed})`);
}

/**
 * Simulates the chain at full resolution (see `simulateWaveforms` for the display form).
 * @param plan a valid channel plan
 * @param options duration (s), simulation rate (Hz), seed, signal, components
 */
export function simulateChain(plan: ChannelPlan, options: WaveformOptions): ChainSimulation {
  checkOptions(plan, options);
  const fs = options.sampleRateHz;
  const n = Math.max(2, Math.round(options.durationS * fs));
  const ctx =
    options.contextFrom === 'plan'
      ? waveformContextFromPlan(plan, options.context)
      : waveformContext(plan, options.report ?? evaluate(plan), options.context);
  const include: WaveformIncludes = { signal: true, offset: true, drift: true, mains: true, noise: true, ...options.include };
  const rand = mulberry32(options.seed);
  const signalKind = options.signal ?? ctx.application;
  const mainsW = 2 * Math.PI * plan.mainsHz;

  // ---- the differential input
  const vd = new Float64Array(n);
  if (include.signal) {
    const s =
      signalKind === 'ecg'
        ? mcSharryEcg({ heartRateBpm: options.heartRateBpm ?? 72, durationS: n / fs, sampleRateHz: fs, amplitudeV: ctx.signalAmplitudeV })
        : signalKind === 'emg'
          ? syntheticEmg(n, fs, ctx.signalAmplitudeV, rand)
          : syntheticEeg(n, fs, ctx.signalAmplitudeV, rand);
    for (let i = 0; i < n; i += 1) vd[i] += s[i];
  }
  if (include.offset) {
    const from = options.offsetStartS === undefined ? 0 : Math.max(0, Math.ceil(options.offsetStartS * fs));
    for (let i = from; i < n; i += 1) vd[i] += ctx.offsetV;
  }
  if (include.drift) {
    const a = options.drift?.amplitudeV ?? ctx.signalAmplitudeV / 2;
    const w = 2 * Math.PI * (options.drift?.frequencyHz ?? 0.2);
    for (let i = 0; i < n; i += 1) vd[i] += a * Math.sin((w * i) / fs);
  }
  if (include.mains && ctx.mainsDifferentialPeakV > 0) {
    for (let i = 0; i < n; i += 1) vd[i] += ctx.mainsDifferentialPeakV * Math.sin((mainsW * i) / fs);
  }
  if (include.noise && ctx.noiseRmsV > 0) {
    // White noise whose rms over the stated bandwidth is the RTI figure: σ = (rms/√B)·√(fs/2).
    const g = gaussian(rand);
    const sigma = (ctx.noiseRmsV / Math.sqrt(ctx.noiseBandwidthHz)) * Math.sqrt(fs / 2);
    for (let i = 0; i < n; i += 1) vd[i] += sigma * g();
  }
  const vcm = new Float64Array(n).fill(ctx.commonModeDcV);
  if (include.mains && ctx.commonModeMainsPeakV > 0) {
    for (let i = 0; i < n; i += 1) vcm[i] += ctx.commonModeMainsPeakV * Math.sin((mainsW * i) / fs);
  }

  const flags = {} as Record<WaveformNode, Uint8Array>;
  const nodes = {} as Record<WaveformNode, Float64Array>;
  for (const k of ['input', 'va', 'vb', 'ina', 'hp', 'g2', 'lp', 'adc'] as WaveformNode[]) flags[k] = new Uint8Array(n);
  const poleIfInBand = (fHz: number): { ok: boolean; w0: number } => ({ ok: fHz < 0.45 * fs, w0: 2 * Math.PI * fHz });

  // ---- inputs: the higher of the two input voltages against the input common-mode range
  const inputWorst = new Float64Array(n);
  for (let i = 0; i < n; i += 1) {
    const p = vcm[i] + vd[i] / 2;
    const m = vcm[i] - vd[i] / 2;
    const r = ctx.limits.input;
    if (p > r.maxV || p < r.minV || m > r.maxV || m < r.minV) flags.input[i] = 1;
    inputWorst[i] = vd[i];
  }
  nodes.input = inputWorst;

  // ---- first stage: VA = Vcm + G1·Vd/2, VB = Vcm − G1·Vd/2 (closed-loop pole at GBW/G1)
  const g1 = firstStageGain(plan);
  const gd = plan.instrumentation.diffGain;
  const gbwIna = plan.instrumentation.opAmp.gbwHz;
  const diff1 = Float64Array.from(vd, (v) => g1 * v);
  const p1 = poleIfInBand(gbwIna / g1);
  if (p1.ok) filterCascade([lowPass1(p1.w0, fs)], diff1);
  const va = new Float64Array(n);
  const vb = new Float64Array(n);
  for (let i = 0; i < n; i += 1) {
    va[i] = vcm[i] + diff1[i] / 2;
    vb[i] = vcm[i] - diff1[i] / 2;
  }
  clipInPlace(va, ctx.limits.va, flags.va);
  clipInPlace(vb, ctx.limits.vb, flags.vb);
  nodes.va = va;
  nodes.vb = vb;

  // ---- difference stage: Gd·(VA − VB) (closed-loop pole at GBW/(1 + Gd), its noise gain) + Vref
  const vref = plan.supply.referenceV;
  const ina = new Float64Array(n);
  for (let i = 0; i < n; i += 1) ina[i] = gd * (va[i] - vb[i]);
  const p2 = poleIfInBand(gbwIna / (1 + gd));
  if (p2.ok) filterCascade([lowPass1(p2.w0, fs)], ina);
  for (let i = 0; i < n; i += 1) ina[i] += vref;
  clipInPlace(ina, ctx.limits.ina, flags.ina);
  nodes.ina = ina;

  // ---- high-pass around the reference
  const hp = Float64Array.from(ina, (v) => v - vref);
  if (plan.highPass.order === 1) filterCascade([highPass1(2 * Math.PI * plan.highPass.fcHz, fs)], hp);
  else if (plan.highPass.order === 2) filterCascade([highPass2(2 * Math.PI * plan.highPass.fcHz, Math.SQRT1_2, fs)], hp);
  for (let i = 0; i < n; i += 1) hp[i] += vref;
  clipInPlace(hp, ctx.limits.hp, flags.hp);
  nodes.hp = hp;

  // ---- gain stage G2 (pole at GBW/G2)
  const g2Gain = plan.gainStage.gain;
  const g2 = Float64Array.from(hp, (v) => g2Gain * (v - vref));
  const p3 = poleIfInBand(plan.gainStage.opAmp.gbwHz / g2Gain);
  if (p3.ok) filterCascade([lowPass1(p3.w0, fs)], g2);
  for (let i = 0; i < n; i += 1) g2[i] += vref;
  clipInPlace(g2, ctx.limits.g2, flags.g2);
  nodes.g2 = g2;

  // ---- anti-alias low-pass sections
  const lp = Float64Array.from(g2, (v) => v - vref);
  const wc = 2 * Math.PI * plan.gainStage.lowPass.fcHz;
  const sections = lowPassSections(plan.gainStage.lowPass.kind, plan.gainStage.lowPass.order).map((s) =>
    s.kind === 'real' ? lowPass1(s.w0Normalized * wc, fs) : lowPass2(s.w0Normalized * wc, s.q, fs),
  );
  filterCascade(sections, lp);
  for (let i = 0; i < n; i += 1) lp[i] += vref;
  clipInPlace(lp, ctx.limits.lp, flags.lp);
  nodes.lp = lp;

  // ---- ADC input range, sampling (latest simulation sample at each conversion) and quantization
  const adcIn = Float64Array.from(lp);
  clipInPlace(adcIn, ctx.limits.adc, flags.adc);
  nodes.adc = adcIn;
  const fsAdc = plan.adc.sampleRateHz;
  const nAdc = Math.max(1, Math.floor((n / fs) * fsAdc));
  const lsbV = plan.adc.fullScaleV / 2 ** plan.adc.bits;
  const bottomV = plan.adc.midScaleV - plan.adc.fullScaleV / 2;
  const maxCode = 2 ** plan.adc.bits - 1;
  const timeS = new Float64Array(nAdc);
  const codes = new Int32Array(nAdc);
  const valuesV = new Float64Array(nAdc);
  for (let k = 0; k < nAdc; k += 1) {
    const t = k / fsAdc;
    const i = Math.min(n - 1, Math.floor(t * fs + 1e-9));
    const code = Math.min(maxCode, Math.max(0, Math.floor((adcIn[i] - bottomV) / lsbV)));
    timeS[k] = t;
    codes[k] = code;
    valuesV[k] = bottomV + (code + 0.5) * lsbV;
  }
  return { sampleRateHz: fs, context: ctx, input: vd, nodes, clipped: flags, adc: { sampleRateHz: fsAdc, timeS, codes, valuesV, lsbV } };
}

/** Runs of set flags as time segments, s. */
export function clipSegments(flags: Uint8Array, sampleRateHz: number): ClipSegment[] {
  const out: ClipSegment[] = [];
  let start = -1;
  for (let i = 0; i <= flags.length; i += 1) {
    const on = i < flags.length && flags[i] === 1;
    if (on && start < 0) start = i;
    if (!on && start >= 0) {
      out.push({ startS: start / sampleRateHz, endS: i / sampleRateHz });
      start = -1;
    }
  }
  return out;
}

/**
 * Min/max envelope decimation: at most `maxPoints` points (pairs of the minimum and maximum of
 * each bucket, in time order), so peaks and clipping stay visible in a plot.
 */
export function decimateMinMax(values: ArrayLike<number>, sampleRateHz: number, maxPoints: number): { timeS: number[]; values: number[] } {
  const n = values.length;
  if (n <= maxPoints) return { timeS: Array.from({ length: n }, (_, i) => i / sampleRateHz), values: Array.from(values) };
  const buckets = Math.max(1, Math.floor(maxPoints / 2));
  const size = n / buckets;
  const timeS: number[] = [];
  const out: number[] = [];
  for (let b = 0; b < buckets; b += 1) {
    const from = Math.floor(b * size);
    const to = Math.min(n, Math.floor((b + 1) * size));
    let iMin = from;
    let iMax = from;
    for (let i = from; i < to; i += 1) {
      if (values[i] < values[iMin]) iMin = i;
      if (values[i] > values[iMax]) iMax = i;
    }
    const [first, second] = iMin <= iMax ? [iMin, iMax] : [iMax, iMin];
    timeS.push(first / sampleRateHz, second / sampleRateHz);
    out.push(values[first], values[second]);
  }
  return { timeS, values: out };
}

export interface WaveformTrace {
  node: WaveformNode;
  label: string;
  /** Allowed range of the node, V. */
  limits: NodeRange;
  /** Decimated time axis, s, and node voltage, V. */
  timeS: number[];
  values: number[];
  /** Where the node was at its limit. */
  clippedSegments: ClipSegment[];
  /** Fraction of the record at the limit. */
  clippedFraction: number;
}

export interface WaveformResult {
  durationS: number;
  sampleRateHz: number;
  seed: number;
  signal: 'ecg' | 'emg' | 'eeg';
  context: WaveformContext;
  /** The differential input (signal, offset, drift, mains, noise), V, decimated. */
  input: { timeS: number[]; values: number[] };
  traces: WaveformTrace[];
  /** Converter output: codes and their mid-code voltages, decimated. */
  adc: { sampleRateHz: number; lsbV: number; timeS: number[]; codes: number[]; valuesV: number[] };
}

const nodeLabels: Record<WaveformNode, string> = {
  input: 'Inputs (differential; flagged outside the input common-mode range)',
  va: 'First stage, positive output VA',
  vb: 'First stage, negative output VB',
  ina: 'Instrumentation output',
  hp: 'High-pass output',
  g2: 'Gain-stage output',
  lp: 'Anti-alias low-pass output',
  adc: 'ADC input',
};

/**
 * A synthetic signal of the application, with electrode offset, slow drift, mains (differential
 * and common-mode) and RTI noise, traced through every stage with clipping, then sampled and
 * quantized by the ADC. Seeded and deterministic.
 * @param plan a valid channel plan
 * @param options duration (s), simulation rate (Hz), seed, signal, included components
 * @returns per-stage traces (decimated for display) with clipped segments, and the ADC codes
 * @example simulateWaveforms(plan, { durationS: 10, sampleRateHz: 2000, seed: 1 }).traces.length // 8
 */
export function simulateWaveforms(plan: ChannelPlan, options: WaveformOptions): WaveformResult {
  const sim = simulateChain(plan, options);
  const fs = sim.sampleRateHz;
  const maxPoints = options.maxDisplayPoints ?? 2000;
  const traces = (Object.keys(nodeLabels) as WaveformNode[]).map((node) => {
    const values = node === 'input' ? sim.input : sim.nodes[node];
    const flags = sim.clipped[node];
    let count = 0;
    for (let i = 0; i < flags.length; i += 1) count += flags[i];
    const d = decimateMinMax(values, fs, maxPoints);
    return { node, label: nodeLabels[node], limits: sim.context.limits[node], timeS: d.timeS, values: d.values, clippedSegments: clipSegments(flags, fs), clippedFraction: count / flags.length };
  });
  const codesD = decimateMinMax(sim.adc.codes, sim.adc.sampleRateHz, maxPoints);
  return {
    durationS: sim.input.length / fs,
    sampleRateHz: fs,
    seed: options.seed,
    signal: options.signal ?? sim.context.application,
    context: sim.context,
    input: decimateMinMax(sim.input, fs, maxPoints),
    traces,
    adc: {
      sampleRateHz: sim.adc.sampleRateHz,
      lsbV: sim.adc.lsbV,
      timeS: codesD.timeS,
      codes: codesD.values,
      valuesV: codesD.values.map((c) => plan.adc.midScaleV - plan.adc.fullScaleV / 2 + (c + 0.5) * sim.adc.lsbV),
    },
  };
}

// ---------------------------------------------------------------------------------------------
// Low-frequency impulse test

export interface ImpulseTestOptions {
  /** Pulse amplitude, V (default: the profile's impulse test, else 3 mV). */
  amplitudeV?: number;
  /** Pulse duration, s (default: the profile's, else 100 ms). */
  widthS?: number;
  /** Simulation rate, Hz (default 1 kHz, raised to 4 × the low-pass corner). */
  sampleRateHz?: number;
  /** Time after the pulse over which displacement and slope are measured, s (default 2 s). */
  windowS?: number;
  /** Most points per trace for display, default 2000. */
  maxDisplayPoints?: number;
}

export interface ImpulseTestSimulation {
  amplitudeV: number;
  widthS: number;
  /** When the pulse starts and ends, s. */
  startS: number;
  endS: number;
  sampleRateHz: number;
  /** The rectangular input, V (decimated). */
  input: { timeS: number[]; values: number[] };
  /** The whole chain's output referred to input (÷ mid-band gain G1·Gd·G2), V (decimated). */
  output: { timeS: number[]; values: number[] };
  /**
   * Largest baseline displacement after the pulse, V: measured on the high-pass output referred
   * to input, where the anti-alias filter's edge ringing does not mask the baseline.
   */
  displacementV: number;
  /** Largest slope of the baseline after the pulse, V/s (same node). */
  slopeVPerS: number;
}

/**
 * The low-frequency impulse test in the time domain: a rectangular differential pulse (3 mV ×
 * 100 ms in the diagnostic-ECG standards) through the linear chain (no offset, noise or clipping).
 * For a first-order high-pass the displacement is A·(1 − e^(−T/τ)), τ = 1/(2π·fc): 93 µV at 0.05 Hz.
 * @param plan a valid channel plan
 * @param options pulse, rate and measuring window
 */
export function simulateImpulseTest(plan: ChannelPlan, options: ImpulseTestOptions = {}): ImpulseTestSimulation {
  const profile = profileFor(plan.profileId, plan.customProfile);
  const check = profile.checks.impulseDisplacementV ?? profile.checks.impulseSlopeVPerS;
  const amplitudeV = options.amplitudeV ?? check?.amplitudeV ?? 3e-3;
  const widthS = options.widthS ?? check?.durationS ?? 0.1;
  const windowS = options.windowS ?? 2;
  const fs = Math.max(options.sampleRateHz ?? 1000, 4 * plan.gainStage.lowPass.fcHz);
  for (const [name, v] of [['amplitudeV', amplitudeV], ['widthS', widthS], ['windowS', windowS], ['sampleRateHz', fs]] as const) {
    if (!(Number.isFinite(v) && v > 0)) throw new RangeError(`${name} must be a positive number (got ${v})`);
  }
  const startS = 0.2;
  const endS = startS + widthS;
  const n = Math.round((endS + windowS) * fs) + 1;
  const x = new Float64Array(n);
  for (let i = 0; i < n; i += 1) {
    const t = i / fs;
    x[i] = t >= startS - 1e-12 && t < endS - 1e-12 ? amplitudeV : 0;
  }
  // High-pass node (referred to input: the stages before it are flat at these frequencies).
  const hp = Float64Array.from(x);
  if (plan.highPass.order === 1) filterCascade([highPass1(2 * Math.PI * plan.highPass.fcHz, fs)], hp, true);
  else if (plan.highPass.order === 2) filterCascade([highPass2(2 * Math.PI * plan.highPass.fcHz, Math.SQRT1_2, fs)], hp, true);
  // Whole chain: the anti-alias low-pass after the high-pass.
  const out = Float64Array.from(hp);
  const wc = 2 * Math.PI * plan.gainStage.lowPass.fcHz;
  const sections = lowPassSections(plan.gainStage.lowPass.kind, plan.gainStage.lowPass.order).map((s) =>
    s.kind === 'real' ? lowPass1(s.w0Normalized * wc, fs) : lowPass2(s.w0Normalized * wc, s.q, fs),
  );
  filterCascade(sections, out, true);

  const iEnd = Math.round(endS * fs);
  let displacementV = 0;
  let slopeVPerS = 0;
  for (let i = iEnd; i < n; i += 1) {
    displacementV = Math.max(displacementV, Math.abs(hp[i]));
    if (i > iEnd) slopeVPerS = Math.max(slopeVPerS, Math.abs(hp[i] - hp[i - 1]) * fs);
  }
  const maxPoints = options.maxDisplayPoints ?? 2000;
  return {
    amplitudeV,
    widthS,
    startS,
    endS,
    sampleRateHz: fs,
    input: decimateMinMax(x, fs, maxPoints),
    output: decimateMinMax(out, fs, maxPoints),
    displacementV,
    slopeVPerS,
  };
}
