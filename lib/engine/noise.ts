/**
 * Noise referred to input (RTI). Each source is a density (V/√Hz) at its own place in the chain,
 * shaped by its own transfer to the output and divided by the mid-band gain, then integrated
 * over the band with the real filter shapes. Thermal noise e = √(4kTR) (Johnson 1928, Nyquist
 * 1928); for a passive RC network the density is √(4kT·Re Z). 1/f regions as
 * e²(f) = e_n²·(1 + f_c/f) (Kester, ADI tutorial MT-048).
 */
import { BOLTZMANN_J_PER_K, NOISE_PP_PER_RMS } from './constants';
import { parallelRcImOhm, parallelRcReOhm, type Resolved } from './model';
import type { ChannelPlan } from './plan';
import type { NoiseContribution, NoiseReport, StageId } from './report';
import {
  chainConstants,
  chainMagnitudeAt,
  type ChainConstants,
  GAIN_SQUARED_BUFFER_LENGTH,
  GAIN_SQUARED_OFFSET,
  logGrid,
  midbandFrequencyHz,
  stageGainsSquaredInto,
} from './response';

/**
 * Thermal (Johnson–Nyquist) noise density of a resistor, √(4kTR).
 * @param rOhm resistance, Ω
 * @param temperatureK absolute temperature, K
 * @returns noise density, V/√Hz
 * @example thermalNoiseDensityVPerRtHz(1e3, 298.15) → 4.058e-9
 */
export function thermalNoiseDensityVPerRtHz(rOhm: number, temperatureK: number): number {
  return Math.sqrt(4 * BOLTZMANN_J_PER_K * temperatureK * rOhm);
}

/**
 * Rms of a noise source with white density e_n and 1/f corner f_c over [fL, fH]:
 * e_rms = e_n·√(f_c·ln(f_H/f_L) + (f_H − f_L)) (Kester, ADI MT-048).
 * @example oneOverFNoiseRmsV(10e-9, 10, 0.1, 10) → 74.8e-9
 */
export function oneOverFNoiseRmsV(enVPerRtHz: number, cornerHz: number, fLowHz: number, fHighHz: number): number {
  return enVPerRtHz * Math.sqrt(cornerHz * Math.log(fHighHz / fLowHz) + (fHighHz - fLowHz));
}

/**
 * Rms of a power density S(f) (V²/Hz) integrated over [fL, fH] on a log grid (trapezoid rule in
 * ln f: ∫S df = ∫S·f d ln f).
 * @returns V rms
 */
export function integrateRmsV(densitySq: (fHz: number) => number, fLowHz: number, fHighHz: number, points = 400): number {
  const grid = logGrid(fLowHz, fHighHz, points);
  const dl = Math.log(grid[1] / grid[0]);
  let sum = 0;
  let prev = densitySq(grid[0]) * grid[0];
  for (let i = 1; i < grid.length; i++) {
    const cur = densitySq(grid[i]) * grid[i];
    sum += ((prev + cur) / 2) * dl;
    prev = cur;
  }
  return Math.sqrt(sum);
}

/** The contributors, in the order the report lists them, with the stage each belongs to. */
const CONTRIBUTORS: readonly { name: string; stageId: StageId }[] = [
  { name: 'electrode thermal noise', stageId: 'electrodes' },
  { name: 'imbalance network thermal noise', stageId: 'electrodes' },
  { name: 'protection resistors thermal noise', stageId: 'protection' },
  { name: 'input op-amp voltage noise', stageId: 'instrumentation' },
  { name: 'input op-amp current noise × source impedance', stageId: 'instrumentation' },
  { name: 'gain-setting resistors R, Rg', stageId: 'instrumentation' },
  { name: 'difference stage', stageId: 'instrumentation' },
  { name: 'gain-stage op-amp', stageId: 'gain-stage' },
  { name: 'filter network', stageId: 'gain-stage' },
  { name: 'ADC input noise', stageId: 'adc' },
  { name: 'ADC quantization', stageId: 'adc' },
];

/**
 * Every contributor's density √S, V/√Hz, from the power densities S (V²/Hz) of one grid point,
 * keyed by name in the order of CONTRIBUTORS (density[k] belongs to CONTRIBUTORS[k]; the sweep
 * equivalence test checks the keys against the list). One object literal with the names spelled
 * out: adding eleven computed keys one by one to an empty object costs several times as much for
 * the hundreds of points a budget holds.
 */
function byContributorAt(density: Float64Array): Record<string, number> {
  return {
    'electrode thermal noise': Math.sqrt(density[0]),
    'imbalance network thermal noise': Math.sqrt(density[1]),
    'protection resistors thermal noise': Math.sqrt(density[2]),
    'input op-amp voltage noise': Math.sqrt(density[3]),
    'input op-amp current noise × source impedance': Math.sqrt(density[4]),
    'gain-setting resistors R, Rg': Math.sqrt(density[5]),
    'difference stage': Math.sqrt(density[6]),
    'gain-stage op-amp': Math.sqrt(density[7]),
    'filter network': Math.sqrt(density[8]),
    'ADC input noise': Math.sqrt(density[9]),
    'ADC quantization': Math.sqrt(density[10]),
  };
}

/** e²(f) = e_n²·(1 + f_c/f): white density with a 1/f region below the corner (Kester, ADI MT-048). */
const en2 = (en: number, fc: number, f: number) => en * en * (1 + fc / f);

/** The plan's constants of the noise densities, read once for a whole budget. */
type NoiseConstants = {
  chain: ChainConstants;
  /** 1/|H_total|² at mid-band, (V/V)⁻²: every density is referred to input by this factor. */
  inverseMid2: number;
  /** 4kT, J. */
  kT4: number;
  electrodes: ChannelPlan['electrodes'];
  /** Protection resistor in series with each lead, Ω. */
  seriesROhm: number;
  /** Relative electrode impedance difference between the leads. */
  mismatch: number;
  /** The input op-amps' and the gain-stage op-amp's noise parameters. */
  op1: ChannelPlan['instrumentation']['opAmp'];
  op2: ChannelPlan['gainStage']['opAmp'];
  /** Noise gain of the difference stage squared, (1 + Gd)², (V/V)². */
  diffNoiseGain2: number;
  /** R3 ∥ R4, Ω. */
  r34Ohm: number;
  /**
   * Power densities of the white sources at their own place, V²/Hz: gain-setting resistors
   * R, R, Rg (referred to the input pair's input), both protection resistors, the difference
   * stage's R3 ∥ R4 pair, the filter network, the ADC's input noise and its quantization noise.
   */
  gainResistorsV2PerHz: number;
  protectionV2PerHz: number;
  diffResistorsV2PerHz: number;
  filterNetworkV2PerHz: number;
  adcInputV2PerHz: number;
  quantizationV2PerHz: number;
};

function noiseConstants(r: Resolved): NoiseConstants {
  const p = r.plan;
  const kT4 = 4 * BOLTZMANN_J_PER_K * p.temperatureK;
  const fs = p.adc.sampleRateHz;
  const chain = chainConstants(r);
  const midMag = chainMagnitudeAt(chain, midbandFrequencyHz(r), new Float64Array(GAIN_SQUARED_BUFFER_LENGTH));
  const r34Ohm = (r.r3Ohm * r.r4Ohm) / (r.r3Ohm + r.r4Ohm);
  const rgTerm = Number.isFinite(r.rgOhm) ? kT4 * r.rgOhm * ((r.g1 - 1) / r.g1) ** 2 : 0;
  const lsbV = p.adc.fullScaleV / 2 ** p.adc.bits;
  return {
    chain,
    inverseMid2: 1 / (midMag * midMag),
    kT4,
    electrodes: p.electrodes,
    seriesROhm: p.protection.seriesROhm,
    mismatch: r.electrodeMismatch,
    op1: p.instrumentation.opAmp,
    op2: p.gainStage.opAmp,
    diffNoiseGain2: (1 + r.gd) ** 2,
    r34Ohm,
    gainResistorsV2PerHz: (kT4 * 2 * r.rOhm) / (r.g1 * r.g1) + rgTerm,
    protectionV2PerHz: kT4 * 2 * p.protection.seriesROhm,
    diffResistorsV2PerHz: 2 * kT4 * r34Ohm,
    filterNetworkV2PerHz: p.gainStage.filterNoiseVPerRtHz ** 2,
    // White over the Nyquist band: rms² spread over fs/2; quantization noise LSB²/12.
    adcInputV2PerHz: (p.adc.inputNoiseVrms * p.adc.inputNoiseVrms) / (fs / 2),
    quantizationV2PerHz: (lsbV * lsbV) / 12 / (fs / 2),
  };
}

/**
 * RTI power density of every contributor at fHz, V²/Hz, written to out[k] for CONTRIBUTORS[k]:
 * the source's density at its place times its transfer to the output (|H|²), divided by the
 * mid-band |H|².
 * @param f frequency, Hz
 * @param gains scratch for `stageGainsSquaredInto`
 */
function contributorDensitiesAt(c: NoiseConstants, f: number, gains: Float64Array, out: Float64Array): void {
  const e = c.electrodes;
  const { op1, op2, kT4, mismatch } = c;
  stageGainsSquaredInto(c.chain, f, gains);
  const G = GAIN_SQUARED_OFFSET;
  const hpGs = gains[G.highPass] * gains[G.gainStage];
  // Transfers to the output referred to input: from the electrodes (whole chain), from the
  // input op-amps (all but the input network), from the difference op-amp, from the gain stage.
  const full = gains[G.total] * c.inverseMid2;
  const afterInput = gains[G.instrumentation] * hpGs * c.inverseMid2;
  const afterDiff = gains[G.differenceStageShape] * hpGs * c.inverseMid2;
  const filterOnly = gains[G.lowPass] * c.inverseMid2;
  const gainStageOnly = gains[G.gainStageAmplifier] * filterOnly;
  // Electrode Ze = Rs + Rp ∥ Cp and imbalance network Zi = Ri ∥ Ci (electrodeImpedanceOhm,
  // parallelRcOhm); the leads' series impedances Z1 = Ze·(1 + mismatch) + R_protection + Zi and
  // Z2 = Ze + R_protection (leadImpedanceOhm).
  const zeRe = e.rsOhm + parallelRcReOhm(e.rpOhm, e.cpF, f);
  const zeIm = parallelRcImOhm(e.rpOhm, e.cpF, f);
  const ziRe = parallelRcReOhm(e.imbalanceROhm, e.imbalanceCF, f);
  const ziIm = parallelRcImOhm(e.imbalanceROhm, e.imbalanceCF, f);
  const z1Re = zeRe * (1 + mismatch) + c.seriesROhm + ziRe;
  const z1Im = zeIm * (1 + mismatch) + ziIm;
  const z2Re = zeRe + c.seriesROhm;
  const z2Im = zeIm;
  const en1 = en2(op1.enVPerRtHz, op1.enCornerHz, f);
  const in1 = en2(op1.inAPerRtHz, op1.inCornerHz, f);
  const r34 = c.r34Ohm;
  out[0] = kT4 * (zeRe * (2 + mismatch)) * full; // electrode thermal noise
  out[1] = kT4 * ziRe * full; // imbalance network
  out[2] = c.protectionV2PerHz * full; // protection resistors
  out[3] = 2 * en1 * afterInput; // input op-amp voltage noise
  out[4] = in1 * (z1Re * z1Re + z1Im * z1Im + (z2Re * z2Re + z2Im * z2Im)) * full; // current noise × |Z1|², |Z2|²
  out[5] = c.gainResistorsV2PerHz * afterInput; // gain-setting resistors
  out[6] = c.diffNoiseGain2 * (en1 + c.diffResistorsV2PerHz + 2 * in1 * r34 * r34) * afterDiff; // difference stage
  out[7] = en2(op2.enVPerRtHz, op2.enCornerHz, f) * gainStageOnly; // gain-stage op-amp
  out[8] = c.filterNetworkV2PerHz * filterOnly; // filter network
  out[9] = c.adcInputV2PerHz * c.inverseMid2; // ADC input noise
  out[10] = c.quantizationV2PerHz * c.inverseMid2; // ADC quantization
}

/**
 * The full noise budget referred to input.
 * @param r resolved plan
 * @param pointCount integration points (default 240); `densityPoints` holds every second one
 */
export function noiseBudget(r: Resolved, pointCount = 240): NoiseReport {
  const fs = r.plan.adc.sampleRateHz;
  const windowS = r.profile.checks.noisePpV?.windowS ?? 10;
  const bandLowHz = Math.min(1 / windowS, fs / 20);
  const bandHighHz = fs / 2;
  const grid = logGrid(bandLowHz, bandHighHz, pointCount);
  const n = grid.length;
  const c = noiseConstants(r);
  const gains = new Float64Array(GAIN_SQUARED_BUFFER_LENGTH);
  const count = CONTRIBUTORS.length;
  const density = new Float64Array(count);
  // Power of each contributor, V², by the trapezoid rule in ln f (∫S df = ∫S·f d ln f) on the
  // uniform ln f grid: the end points weigh d ln f/2, the others d ln f.
  const dl = Math.log(grid[1] / grid[0]);
  const power = new Float64Array(count);
  const densityPoints: NoiseReport['densityPoints'] = new Array(Math.ceil(n / 2));
  for (let i = 0; i < n; i++) {
    const f = grid[i];
    contributorDensitiesAt(c, f, gains, density);
    const weight = (i === 0 || i === n - 1 ? dl / 2 : dl) * f;
    let sum = 0;
    for (let k = 0; k < count; k++) {
      power[k] += density[k] * weight;
      sum += density[k];
    }
    if (i % 2 === 0) densityPoints[i / 2] = { fHz: f, totalVPerRtHz: Math.sqrt(sum), byContributor: byContributorAt(density) };
  }
  let totalPower = 0;
  for (let k = 0; k < count; k++) totalPower += power[k];
  const contributions: NoiseContribution[] = CONTRIBUTORS.map((contributor, k) => ({
    name: contributor.name,
    rmsV: Math.sqrt(power[k]),
    share: totalPower > 0 ? power[k] / totalPower : 0,
    stageId: contributor.stageId,
  }));
  const rtiRmsV = Math.sqrt(totalPower);
  return {
    rtiRmsV,
    rtiPpV: rtiRmsV * NOISE_PP_PER_RMS,
    floorRmsV: Math.sqrt(power[0]), // the electrode thermal noise, contributions[0].rmsV
    bandLowHz,
    bandHighHz,
    contributions,
    densityPoints,
  };
}
