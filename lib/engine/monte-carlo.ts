/**
 * Monte Carlo over resistor tolerances, op-amp CMRR spread, input-capacitor mismatch and
 * electrode impedance spread. Each trial uses cheap closed forms (the exact difference-amplifier
 * gains from sampled resistors, the first-stage gain 1 + (Ra + Rb)/Rg, the lead/input-impedance
 * dividers at mains frequency), not a full evaluation. Seeded and reproducible (mulberry32).
 */
import { add, divide, magnitude, subtract, type Complex } from './complex';
import { SINE_PP_PER_RMS } from './constants';
import { differenceAmpGains, inverseCmrrTerms } from './cmrr';
import { bodyCommonMode } from './interference';
import { electrodeImpedanceOhm, inputCmImpedanceOhm, parallelRcOhm, resolvePlan } from './model';
import type { ChannelPlan } from './plan';
import { profileFor } from './profiles';
import { parsePlan } from './validate';

export type MonteCarloOptions = {
  trials: number;
  seed: number;
  /** 'uniform' over ±tolerance, or 'normal' with the tolerance taken as 3σ (common practice, no source). */
  distribution: 'uniform' | 'normal';
  onProgress?: (done: number, total: number) => void;
  signal?: AbortSignal;
};

export type Histogram = { edges: number[]; counts: number[] };
export type Summary = { mean: number; min: number; max: number; p5: number; p50: number; p95: number };

export type MonteCarloResult = {
  trials: number;
  seed: number;
  distribution: 'uniform' | 'normal';
  cmrrDb: number[];
  /** Relative gain error of the whole chain, fraction. */
  gainError: number[];
  interferenceRtiPpV: number[];
  summary: { cmrrDb: Summary; gainError: Summary; interferenceRtiPpV: Summary };
  histograms: { cmrrDb: Histogram; gainError: Histogram; interferenceRtiPpV: Histogram };
  /** Fraction of trials meeting each profile limit, and all of them. */
  yield: { overall: number; cmrr: number | null; interference: number | null; gain: number | null };
};

/**
 * mulberry32: a small 32-bit seeded generator (public-domain algorithm by T. Ettinger).
 * @returns a function giving uniform numbers in [0, 1)
 */
export function mulberry32(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

/** A sampler of relative deviations in [−1, 1]-scaled units: uniform(−1, 1) or normal(0, 1/3). */
function deviationSampler(rand: () => number, distribution: 'uniform' | 'normal'): () => number {
  if (distribution === 'uniform') return () => 2 * rand() - 1;
  let spare: number | null = null;
  return () => {
    if (spare !== null) {
      const s = spare;
      spare = null;
      return s / 3;
    }
    // Box–Muller transform.
    const u = 1 - rand();
    const v = rand();
    const rad = Math.sqrt(-2 * Math.log(u));
    spare = rad * Math.sin(2 * Math.PI * v);
    return (rad * Math.cos(2 * Math.PI * v)) / 3;
  };
}

function summarise(values: Float64Array): Summary {
  const sorted = Float64Array.from(values).sort();
  const n = sorted.length;
  const q = (p: number) => sorted[Math.min(n - 1, Math.max(0, Math.round(p * (n - 1))))];
  let sum = 0;
  for (const v of sorted) sum += v;
  return { mean: sum / n, min: sorted[0], max: sorted[n - 1], p5: q(0.05), p50: q(0.5), p95: q(0.95) };
}

function histogram(values: Float64Array, bins = 40): Histogram {
  let lo = Infinity;
  let hi = -Infinity;
  for (const v of values) {
    if (Number.isFinite(v)) {
      if (v < lo) lo = v;
      if (v > hi) hi = v;
    }
  }
  if (!Number.isFinite(lo)) return { edges: [], counts: [] };
  if (hi === lo) hi = lo + 1e-12 + Math.abs(lo) * 1e-9;
  const width = (hi - lo) / bins;
  const edges = Array.from({ length: bins + 1 }, (_, i) => lo + i * width);
  const counts = new Array<number>(bins).fill(0);
  for (const v of values) {
    if (!Number.isFinite(v)) continue;
    counts[Math.min(bins - 1, Math.floor((v - lo) / width))]++;
  }
  return { edges, counts };
}

type Engine = {
  trial: (dev: () => number) => { cmrrDb: number; gainError: number; interferencePpV: number };
  limits: { cmrrMinDb?: number; interferenceMaxPpV?: number; gainErrorMax?: number };
};

function prepare(planInput: ChannelPlan | unknown): Engine {
  const plan = parsePlan(planInput);
  const profile = profileFor(plan.profileId, plan.customProfile);
  const r = resolvePlan(plan, profile);
  const inst = plan.instrumentation;
  const t = inst.resistorTolerance;
  const fMains = plan.mainsHz;
  const vcmRms = bodyCommonMode(r).vcmRms;
  const nominal = inverseCmrrTerms(r, fMains);
  const opInv = 10 ** (-inst.opAmp.cmrrDb / 20);
  const otherInv = nominal.gbw + nominal.inputRc + opInv / r.g1;
  const e = plan.electrodes;
  const ze = electrodeImpedanceOhm(e.rsOhm, e.rpOhm, e.cpF, fMains);
  const zImb = parallelRcOhm(e.imbalanceROhm, e.imbalanceCF, fMains);
  const rProt = plan.protection.seriesROhm;
  const spread = r.electrodeMismatch;
  const ccmMis = r.cCmMismatch;
  const nominalGain = r.totalGain;
  const rg = Number.isFinite(r.rgOhm) ? r.rgOhm : Number.POSITIVE_INFINITY;
  return {
    limits: {
      cmrrMinDb: profile.checks.cmrrMinDb?.value,
      interferenceMaxPpV: profile.checks.mainsInterferencePpV?.value,
      gainErrorMax: profile.checks.gainErrorMax?.value,
    },
    trial: (dev) => {
      const ra = r.rOhm * (1 + t * dev());
      const rb = r.rOhm * (1 + t * dev());
      const rgS = rg * (1 + t * dev());
      const g1 = Number.isFinite(rgS) ? 1 + (ra + rb) / rgS : 1;
      const d = differenceAmpGains({
        r1Ohm: r.r3Ohm * (1 + t * dev()),
        r2Ohm: r.r4Ohm * (1 + t * dev()),
        r3Ohm: r.r3Ohm * (1 + t * dev()),
        r4Ohm: r.r4Ohm * (1 + t * dev()),
      });
      const opMismatch = Math.abs(opInv * dev() - opInv * dev());
      const inv = Math.abs(d.commonModeGain / d.differentialGain) / g1 + opMismatch + otherInv;
      const cmrrDb = -20 * Math.log10(inv);
      const gainError = (g1 * d.differentialGain * r.g2) / nominalGain - 1;
      // Electrode spread: each lead scaled by 1 ± spread/2, imbalance network in lead 1.
      const k1 = 1 + (spread / 2) * dev();
      const k2 = 1 + (spread / 2) * dev();
      const z1: Complex = { re: ze.re * k1 + rProt + zImb.re, im: ze.im * k1 + zImb.im };
      const z2: Complex = { re: ze.re * k2 + rProt, im: ze.im * k2 };
      const zcm1 = inputCmImpedanceOhm(r, fMains, 1 + (ccmMis / 2) * dev());
      const zcm2 = inputCmImpedanceOhm(r, fMains, 1 + (ccmMis / 2) * dev());
      const conv = magnitude(subtract(divide(zcm1, add(z1, zcm1)), divide(zcm2, add(z2, zcm2))));
      const interferencePpV = vcmRms * (conv + inv) * SINE_PP_PER_RMS;
      return { cmrrDb, gainError, interferencePpV };
    },
  };
}

function finish(
  opts: MonteCarloOptions,
  engine: Engine,
  cmrr: Float64Array,
  gain: Float64Array,
  interference: Float64Array,
): MonteCarloResult {
  const n = cmrr.length;
  const { cmrrMinDb, interferenceMaxPpV, gainErrorMax } = engine.limits;
  let passAll = 0;
  let passC = 0;
  let passI = 0;
  let passG = 0;
  for (let i = 0; i < n; i++) {
    const c = cmrrMinDb === undefined || cmrr[i] >= cmrrMinDb;
    const it = interferenceMaxPpV === undefined || interference[i] <= interferenceMaxPpV;
    const g = gainErrorMax === undefined || Math.abs(gain[i]) <= gainErrorMax;
    passC += Number(c);
    passI += Number(it);
    passG += Number(g);
    passAll += Number(c && it && g);
  }
  return {
    trials: n,
    seed: opts.seed,
    distribution: opts.distribution,
    cmrrDb: Array.from(cmrr),
    gainError: Array.from(gain),
    interferenceRtiPpV: Array.from(interference),
    summary: { cmrrDb: summarise(cmrr), gainError: summarise(gain), interferenceRtiPpV: summarise(interference) },
    histograms: { cmrrDb: histogram(cmrr), gainError: histogram(gain), interferenceRtiPpV: histogram(interference) },
    yield: {
      overall: passAll / n,
      cmrr: cmrrMinDb === undefined ? null : passC / n,
      interference: interferenceMaxPpV === undefined ? null : passI / n,
      gain: gainErrorMax === undefined ? null : passG / n,
    },
  };
}

function checkOptions(opts: MonteCarloOptions): void {
  if (!Number.isInteger(opts.trials) || opts.trials < 1 || opts.trials > 1_000_000) {
    throw new RangeError('trials must be a whole number from 1 to 1,000,000');
  }
  if (!Number.isFinite(opts.seed)) throw new RangeError('seed must be a finite number');
}

/**
 * Runs the Monte Carlo synchronously (for scripts and tests).
 * @throws PlanValidationError for an invalid plan, RangeError for bad options
 */
export function runMonteCarloSync(plan: ChannelPlan | unknown, opts: MonteCarloOptions): MonteCarloResult {
  checkOptions(opts);
  const engine = prepare(plan);
  const dev = deviationSampler(mulberry32(opts.seed), opts.distribution);
  const cmrr = new Float64Array(opts.trials);
  const gain = new Float64Array(opts.trials);
  const interference = new Float64Array(opts.trials);
  for (let i = 0; i < opts.trials; i++) {
    const t = engine.trial(dev);
    cmrr[i] = t.cmrrDb;
    gain[i] = t.gainError;
    interference[i] = t.interferencePpV;
    if (opts.onProgress && (i + 1) % 1000 === 0) opts.onProgress(i + 1, opts.trials);
  }
  opts.onProgress?.(opts.trials, opts.trials);
  return finish(opts, engine, cmrr, gain, interference);
}

/**
 * Runs the Monte Carlo in chunks, yielding to the event loop between them so that progress can
 * be shown and the run cancelled with `signal`. Same results as `runMonteCarloSync` for the
 * same seed.
 * @returns a promise of the distributions and yields; rejects with the signal's reason when aborted
 */
export async function runMonteCarlo(plan: ChannelPlan | unknown, opts: MonteCarloOptions): Promise<MonteCarloResult> {
  checkOptions(opts);
  const engine = prepare(plan);
  const dev = deviationSampler(mulberry32(opts.seed), opts.distribution);
  const cmrr = new Float64Array(opts.trials);
  const gain = new Float64Array(opts.trials);
  const interference = new Float64Array(opts.trials);
  const chunk = 2000;
  for (let start = 0; start < opts.trials; start += chunk) {
    opts.signal?.throwIfAborted();
    const end = Math.min(opts.trials, start + chunk);
    for (let i = start; i < end; i++) {
      const t = engine.trial(dev);
      cmrr[i] = t.cmrrDb;
      gain[i] = t.gainError;
      interference[i] = t.interferencePpV;
    }
    opts.onProgress?.(end, opts.trials);
    if (end < opts.trials) await new Promise<void>((resolve) => setTimeout(resolve, 0));
  }
  opts.signal?.throwIfAborted();
  return finish(opts, engine, cmrr, gain, interference);
}
