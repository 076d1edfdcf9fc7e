/**
 * Frequency response of the chain, H(f) = H_input·H_instrumentation·H_hp·H_gain-stage, with the
 * input network, each op-amp stage's closed-loop pole at GBW/(noise gain) (single-pole op-amp
 * model, e.g. Franco, Design with Operational Amplifiers, ch. 6), the Butterworth high-pass and
 * the Butterworth/Bessel low-pass. Corners are found numerically by bisection.
 *
 * `stageResponsesAt` gives each stage as Complex objects at one frequency; sweeps over a grid use
 * `stageResponsesInto` (the same values written into a buffer, no objects per frequency) or, when
 * no phase is needed, `stageGainsSquaredInto` (|H|² only), with the plan's constants read once by
 * `chainConstants`.
 */
import { argumentDeg, magnitude, multiply, powerRatioToDb, ratioToDb, type Complex } from './complex';
import { filterMagnitudeSquaredAt, filterResponseInto, highPassAt, highPassSweep, lowPassAt, lowPassSweep, type FilterSweep } from './filters';
import { inputNetworkAt, parallelRcImOhm, parallelRcReOhm, type Resolved } from './model';
import type { FrequencyResponse, ResponsePoint } from './report';

export type StageResponses = { input: Complex; instrumentation: Complex; highPass: Complex; gainStage: Complex; total: Complex };

/**
 * A single-pole closed-loop stage: gain/(1 + j·f·noiseGain/GBW).
 * @param gain closed-loop gain, V/V
 * @param noiseGain noise gain that sets the bandwidth (1 + Rf/Rg), V/V
 * @param gbwHz gain-bandwidth product, Hz
 * @param fHz frequency, Hz
 * @example closedLoopStageAt(10, 10, 1e6, 1e5) → 10/(1 + j) (−3 dB at GBW/G = 100 kHz)
 */
export function closedLoopStageAt(gain: number, noiseGain: number, gbwHz: number, fHz: number): Complex {
  const x = (fHz * noiseGain) / gbwHz;
  const d = 1 + x * x;
  return { re: gain / d, im: (-gain * x) / d };
}

/** Real part of `closedLoopStageAt`, gain/(1 + x²) with x = f·noiseGain/GBW, computed the same way, without the object. */
export function closedLoopStageRe(gain: number, noiseGain: number, gbwHz: number, fHz: number): number {
  const x = (fHz * noiseGain) / gbwHz;
  return gain / (1 + x * x);
}

/** Imaginary part of `closedLoopStageAt`, −gain·x/(1 + x²), computed the same way, without the object. */
export function closedLoopStageIm(gain: number, noiseGain: number, gbwHz: number, fHz: number): number {
  const x = (fHz * noiseGain) / gbwHz;
  return (-gain * x) / (1 + x * x);
}

/** |closedLoopStageAt|² as gain²/(1 + x²), x = f·noiseGain/GBW (equal up to rounding). */
export function closedLoopStageMagnitudeSquared(gain: number, noiseGain: number, gbwHz: number, fHz: number): number {
  const x = (fHz * noiseGain) / gbwHz;
  return (gain * gain) / (1 + x * x);
}

/**
 * Complex response of each stage and of the whole chain at fHz. Sweeps use `stageResponsesInto`
 * (the same values without objects) and `stageGainsSquaredInto` (|H|² only).
 */
export function stageResponsesAt(r: Resolved, fHz: number): StageResponses {
  const p = r.plan;
  const input = inputNetworkAt(r, fHz);
  const gbw1 = p.instrumentation.opAmp.gbwHz;
  const instrumentation = multiply(closedLoopStageAt(r.g1, r.g1, gbw1, fHz), closedLoopStageAt(r.gd, 1 + r.gd, gbw1, fHz));
  const highPass: Complex = p.highPass.order === 0 ? { re: 1, im: 0 } : highPassAt(p.highPass.order, p.highPass.fcHz, fHz);
  const lp = p.gainStage.lowPass;
  const gainStage = multiply(closedLoopStageAt(r.g2, r.g2, p.gainStage.opAmp.gbwHz, fHz), lowPassAt(lp.kind, lp.order, lp.fcHz, fHz));
  const total = multiply(multiply(input, instrumentation), multiply(highPass, gainStage));
  return { input, instrumentation, highPass, gainStage, total };
}

/** |H_total(f)|, V/V. */
export function totalMagnitudeAt(r: Resolved, fHz: number): number {
  return magnitude(stageResponsesAt(r, fHz).total);
}

/**
 * The plan's constants of H(f), read once for a whole sweep: the input network's elements, the
 * op-amp stages' gains and gain-bandwidths, and the two filters with their orders and corners
 * checked once.
 */
export type ChainConstants = {
  /** Electrode series resistance Rs, Ω. */
  rsOhm: number;
  /** Electrode Rp ∥ Cp, Ω and F. */
  rpOhm: number;
  cpF: number;
  /** Protection resistor in series with each lead, Ω. */
  seriesROhm: number;
  /** Real part of the input network's admittance Yd, 1/(2·Rcm), S. */
  ydReS: number;
  /** Capacitance of Yd's imaginary part ω·(Cdiff + (Ccm,amp + Ccm)/2), F. */
  ydCF: number;
  /** Input-pair gain G1 and difference-stage gain Gd, V/V; gain-bandwidth of their op-amps, Hz. */
  g1: number;
  gd: number;
  gbw1Hz: number;
  /** Gain of the gain stage G2, V/V, and its op-amp's gain-bandwidth, Hz. */
  g2: number;
  gbw2Hz: number;
  /** The high-pass (null when the chain is DC-coupled) and the gain stage's low-pass. */
  highPass: FilterSweep | null;
  lowPass: FilterSweep;
};

/**
 * Reads the constants of H(f) from a resolved plan.
 * @throws RangeError for a filter order or corner the filters reject
 */
export function chainConstants(r: Resolved): ChainConstants {
  const p = r.plan;
  const lp = p.gainStage.lowPass;
  return {
    rsOhm: p.electrodes.rsOhm,
    rpOhm: p.electrodes.rpOhm,
    cpF: p.electrodes.cpF,
    seriesROhm: p.protection.seriesROhm,
    ydReS: 1 / (2 * r.inputCmOhm),
    ydCF: r.cDiffF + (r.inputCmF + r.cCmF) / 2,
    g1: r.g1,
    gd: r.gd,
    gbw1Hz: p.instrumentation.opAmp.gbwHz,
    g2: r.g2,
    gbw2Hz: p.gainStage.opAmp.gbwHz,
    highPass: p.highPass.order === 0 ? null : highPassSweep(p.highPass.order, p.highPass.fcHz),
    lowPass: lowPassSweep(lp.kind, lp.order, lp.fcHz),
  };
}

/** Where `stageResponsesInto` writes each stage: real part at the offset, imaginary part after it. */
export const STAGE_OFFSET = { input: 0, instrumentation: 2, highPass: 4, gainStage: 6, total: 8 } as const;

/** Length of the buffer `stageResponsesInto` fills. */
export const STAGE_BUFFER_LENGTH = 10;

/**
 * The complex response of each stage and of the whole chain at fHz, written as plain numbers into
 * `out` at `STAGE_OFFSET` (no objects allocated, for sweeps). The same formulas, in the same order
 * of operations, as `stageResponsesAt`: the input network 1/(1 + 2·Zs·Yd) with Zs = Rs + Rp ∥ Cp +
 * R_protection (`inputNetworkAt`), the single-pole closed-loop stages gain/(1 + j·f·noiseGain/GBW)
 * (`closedLoopStageAt`), the high-pass and the low-pass (`highPassAt`, `lowPassAt`).
 * @param c from `chainConstants`
 * @param fHz frequency, Hz (finite, ≥ 0; not checked here)
 * @param out at least `STAGE_BUFFER_LENGTH` long
 */
export function stageResponsesInto(c: ChainConstants, fHz: number, out: Float64Array): void {
  // Lead impedance Zs = Rs + Rp ∥ Cp + R_protection (electrode model after Webster ch. 5;
  // electrodeImpedanceOhm, leadImpedanceOhm).
  const zsRe = c.rsOhm + parallelRcReOhm(c.rpOhm, c.cpF, fHz) + c.seriesROhm;
  const zsIm = parallelRcImOhm(c.rpOhm, c.cpF, fHz);
  // Input network 1/(1 + 2·Zs·Yd), Yd = 1/(2Rcm) + jω(Cdiff + Ccm,total/2) (Kitchin & Counts;
  // inputNetworkAt).
  const ydIm = 2 * Math.PI * fHz * c.ydCF;
  const denRe = 1 + (2 * zsRe * c.ydReS - 2 * zsIm * ydIm);
  const denIm = 2 * zsRe * ydIm + 2 * zsIm * c.ydReS;
  const denM = denRe * denRe + denIm * denIm;
  const inRe = denRe / denM;
  const inIm = -denIm / denM;
  // Instrumentation stage: input pair (gain G1, noise gain G1) × difference stage (Gd, 1 + Gd),
  // single-pole closed loops (Franco ch. 6; closedLoopStageAt).
  const a1Re = closedLoopStageRe(c.g1, c.g1, c.gbw1Hz, fHz);
  const a1Im = closedLoopStageIm(c.g1, c.g1, c.gbw1Hz, fHz);
  const adRe = closedLoopStageRe(c.gd, 1 + c.gd, c.gbw1Hz, fHz);
  const adIm = closedLoopStageIm(c.gd, 1 + c.gd, c.gbw1Hz, fHz);
  const instRe = a1Re * adRe - a1Im * adIm;
  const instIm = a1Re * adIm + a1Im * adRe;
  // High-pass (1 when DC-coupled).
  let hpRe = 1;
  let hpIm = 0;
  if (c.highPass !== null) {
    filterResponseInto(c.highPass, fHz, out, STAGE_OFFSET.highPass);
    hpRe = out[STAGE_OFFSET.highPass];
    hpIm = out[STAGE_OFFSET.highPass + 1];
  }
  // Gain stage: closed loop (G2, noise gain G2) × low-pass.
  const a2Re = closedLoopStageRe(c.g2, c.g2, c.gbw2Hz, fHz);
  const a2Im = closedLoopStageIm(c.g2, c.g2, c.gbw2Hz, fHz);
  filterResponseInto(c.lowPass, fHz, out, STAGE_OFFSET.gainStage);
  const lpRe = out[STAGE_OFFSET.gainStage];
  const lpIm = out[STAGE_OFFSET.gainStage + 1];
  const gsRe = a2Re * lpRe - a2Im * lpIm;
  const gsIm = a2Re * lpIm + a2Im * lpRe;
  // Total (input · instrumentation) · (high-pass · gain stage).
  const frontRe = inRe * instRe - inIm * instIm;
  const frontIm = inRe * instIm + inIm * instRe;
  const backRe = hpRe * gsRe - hpIm * gsIm;
  const backIm = hpRe * gsIm + hpIm * gsRe;
  out[STAGE_OFFSET.input] = inRe;
  out[STAGE_OFFSET.input + 1] = inIm;
  out[STAGE_OFFSET.instrumentation] = instRe;
  out[STAGE_OFFSET.instrumentation + 1] = instIm;
  out[STAGE_OFFSET.highPass] = hpRe;
  out[STAGE_OFFSET.highPass + 1] = hpIm;
  out[STAGE_OFFSET.gainStage] = gsRe;
  out[STAGE_OFFSET.gainStage + 1] = gsIm;
  out[STAGE_OFFSET.total] = frontRe * backRe - frontIm * backIm;
  out[STAGE_OFFSET.total + 1] = frontRe * backIm + frontIm * backRe;
}

/** Where `stageGainsSquaredInto` writes each squared magnitude. */
export const GAIN_SQUARED_OFFSET = {
  input: 0,
  instrumentation: 1,
  highPass: 2,
  gainStage: 3,
  total: 4,
  /** The difference stage's bandwidth alone, |1/(1 + j·f·(1 + Gd)/GBW1)|². */
  differenceStageShape: 5,
  /** The gain stage's closed-loop amplifier alone, |G2/(1 + j·f·G2/GBW2)|². */
  gainStageAmplifier: 6,
  /** The gain stage's low-pass alone. */
  lowPass: 7,
} as const;

/** Length of the buffer `stageGainsSquaredInto` fills. */
export const GAIN_SQUARED_BUFFER_LENGTH = 8;

/**
 * |H|² of each stage and of the whole chain at fHz, for analyses that need no phase (noise
 * integration, corner search): the same transfer functions as `stageResponsesInto`, as squared
 * magnitudes — a single-pole stage gain/(1 + j·x) as gain²/(1 + x²), the input network as
 * 1/|1 + 2·Zs·Yd|², the filters from the powers of Ω (`filterMagnitudeSquaredAt`), products of
 * stages as products of their |H|² (|a·b|² = |a|²·|b|²). Equal to |stageResponsesInto|² up to
 * rounding (a few units in the last place), with fewer divisions and no complex products.
 * @param c from `chainConstants`
 * @param fHz frequency, Hz (finite, ≥ 0; not checked here)
 * @param out at least `GAIN_SQUARED_BUFFER_LENGTH` long, receives (V/V)²
 */
export function stageGainsSquaredInto(c: ChainConstants, fHz: number, out: Float64Array): void {
  // Lead impedance and input network as in stageResponsesInto.
  const zsRe = c.rsOhm + parallelRcReOhm(c.rpOhm, c.cpF, fHz) + c.seriesROhm;
  const zsIm = parallelRcImOhm(c.rpOhm, c.cpF, fHz);
  const ydIm = 2 * Math.PI * fHz * c.ydCF;
  const denRe = 1 + (2 * zsRe * c.ydReS - 2 * zsIm * ydIm);
  const denIm = 2 * zsRe * ydIm + 2 * zsIm * c.ydReS;
  const input = 1 / (denRe * denRe + denIm * denIm);
  const differenceStageShape = closedLoopStageMagnitudeSquared(1, 1 + c.gd, c.gbw1Hz, fHz);
  const instrumentation = closedLoopStageMagnitudeSquared(c.g1, c.g1, c.gbw1Hz, fHz) * (c.gd * c.gd * differenceStageShape);
  const highPass = c.highPass === null ? 1 : filterMagnitudeSquaredAt(c.highPass, fHz);
  const gainStageAmplifier = closedLoopStageMagnitudeSquared(c.g2, c.g2, c.gbw2Hz, fHz);
  const lowPass = filterMagnitudeSquaredAt(c.lowPass, fHz);
  const gainStage = gainStageAmplifier * lowPass;
  out[GAIN_SQUARED_OFFSET.input] = input;
  out[GAIN_SQUARED_OFFSET.instrumentation] = instrumentation;
  out[GAIN_SQUARED_OFFSET.highPass] = highPass;
  out[GAIN_SQUARED_OFFSET.gainStage] = gainStage;
  out[GAIN_SQUARED_OFFSET.total] = input * instrumentation * (highPass * gainStage);
  out[GAIN_SQUARED_OFFSET.differenceStageShape] = differenceStageShape;
  out[GAIN_SQUARED_OFFSET.gainStageAmplifier] = gainStageAmplifier;
  out[GAIN_SQUARED_OFFSET.lowPass] = lowPass;
}

/**
 * |H_total(f)|, V/V, from prepared constants (`totalMagnitudeAt` up to rounding).
 * @param scratch at least `GAIN_SQUARED_BUFFER_LENGTH` long; overwritten
 */
export function chainMagnitudeAt(c: ChainConstants, fHz: number, scratch: Float64Array): number {
  stageGainsSquaredInto(c, fHz, scratch);
  return Math.sqrt(scratch[GAIN_SQUARED_OFFSET.total]);
}

/**
 * Logarithmic frequency grid.
 * @param startHz first frequency, Hz (> 0)
 * @param stopHz last frequency, Hz (included exactly)
 * @param count number of points (≥ 2)
 */
export function logGrid(startHz: number, stopHz: number, count: number): number[] {
  const n = Math.max(2, Math.floor(count));
  const ratio = Math.log(stopHz / startHz) / (n - 1);
  const out = new Array<number>(n);
  for (let i = 0; i < n; i++) out[i] = startHz * Math.exp(ratio * i);
  out[n - 1] = stopHz;
  return out;
}

/** The frequency at which the mid-band gain is read: geometric mean of the nominal corners, Hz. */
export function midbandFrequencyHz(r: Resolved): number {
  const lpHz = r.plan.gainStage.lowPass.fcHz;
  const hpHz = r.plan.highPass.order === 0 ? Math.min(r.profile.band.lowHz, lpHz / 100) : r.plan.highPass.fcHz;
  return Math.sqrt(hpHz * lpHz);
}

/**
 * Where |H| crosses `targetMag` between loHz and hiHz, by bisection on log f.
 * @returns the crossing, Hz, or null when there is none in the interval
 */
export function findCrossingHz(mag: (fHz: number) => number, targetMag: number, loHz: number, hiHz: number): number | null {
  let a = Math.log(loHz);
  let b = Math.log(hiHz);
  const fa = mag(loHz) - targetMag;
  const fb = mag(hiHz) - targetMag;
  if (fa === 0) return loHz;
  if (fb === 0) return hiHz;
  if (fa * fb > 0) return null;
  for (let i = 0; i < 60; i++) {
    const m = (a + b) / 2;
    const fm = mag(Math.exp(m)) - targetMag;
    if (fm === 0 || b - a < 1e-12) return Math.exp(m);
    if (fm * fa > 0) a = m;
    else b = m;
  }
  return Math.exp((a + b) / 2);
}

/**
 * The next unwrapped phase of a curve: the step from the previous (unwrapped) phase brought into
 * [−180°, 180°] by whole turns, so that the curve has no ±360° jumps. `turnsDeg[curve]` holds the
 * curve's running correction, degrees, and is updated.
 */
function unwrappedDeg(rawDeg: number, prevDeg: number, turnsDeg: Float64Array, curve: number): number {
  let offset = turnsDeg[curve];
  let delta = rawDeg + offset - prevDeg;
  while (delta > 180) { offset -= 360; delta -= 360; }
  while (delta < -180) { offset += 360; delta += 360; }
  turnsDeg[curve] = offset;
  return prevDeg + delta;
}

/** The stages' curves in report order, with their place in the `stageResponsesInto` buffer. */
const STAGE_CURVES: readonly { id: FrequencyResponse['stages'][number]['id']; at: number }[] = [
  { id: 'input', at: STAGE_OFFSET.input },
  { id: 'instrumentation', at: STAGE_OFFSET.instrumentation },
  { id: 'high-pass', at: STAGE_OFFSET.highPass },
  { id: 'gain-stage', at: STAGE_OFFSET.gainStage },
];

/** Buffer offsets of the curves computed: the whole chain first, then the stages. */
const CURVE_AT: readonly number[] = [STAGE_OFFSET.total, ...STAGE_CURVES.map((stage) => stage.at)];

/**
 * The channel's frequency response over 0.001 Hz … fs.
 * |H| in dB as 10·log10(|H|²), the same value as 20·log10|H| without the root; phases unwrapped.
 * @param r resolved plan
 * @param pointCount number of log-spaced points (default 200)
 */
export function frequencyResponse(r: Resolved, pointCount = 200): FrequencyResponse {
  const fs = r.plan.adc.sampleRateHz;
  const grid = logGrid(1e-3, fs, pointCount);
  const n = grid.length;
  const c = chainConstants(r);
  const buffer = new Float64Array(STAGE_BUFFER_LENGTH);
  const curves: ResponsePoint[][] = CURVE_AT.map(() => new Array<ResponsePoint>(n));
  const turnsDeg = new Float64Array(CURVE_AT.length);
  for (let i = 0; i < n; i++) {
    const fHz = grid[i];
    stageResponsesInto(c, fHz, buffer);
    for (let k = 0; k < CURVE_AT.length; k++) {
      const re = buffer[CURVE_AT[k]];
      const im = buffer[CURVE_AT[k] + 1];
      const points = curves[k];
      const rawDeg = argumentDeg(re, im);
      const phaseDeg = i === 0 ? rawDeg : unwrappedDeg(rawDeg, points[i - 1].phaseDeg, turnsDeg, k);
      points[i] = { fHz, magDb: powerRatioToDb(re * re + im * im), phaseDeg };
    }
  }
  const midHz = midbandFrequencyHz(r);
  const scratch = new Float64Array(GAIN_SQUARED_BUFFER_LENGTH);
  const mid = chainMagnitudeAt(c, midHz, scratch);
  const mag = (f: number) => chainMagnitudeAt(c, f, scratch);
  const target = mid / Math.SQRT2;
  const low = r.plan.highPass.order === 0 && mag(1e-6) > target ? 0 : findCrossingHz(mag, target, 1e-6, midHz);
  const high = findCrossingHz(mag, target, midHz, fs * 1e3);
  const aliasHz = Math.max(fs - r.profile.band.highHz, fs / 2);
  return {
    lowCornerHz: low ?? 0,
    highCornerHz: high ?? fs * 1e3,
    midbandGainDb: ratioToDb(mid),
    midbandHz: midHz,
    aliasAttenuationDb: ratioToDb(mid / mag(aliasHz)),
    attenuationAtNyquistDb: ratioToDb(mid / mag(fs / 2)),
    points: curves[0],
    stages: STAGE_CURVES.map((stage, k) => ({ id: stage.id, points: curves[k + 1] })),
  };
}
