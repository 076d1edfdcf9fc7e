/**
 * Noise referred to input (RTI). Each source is a density (V/√Hz) at its own place in the chain,
 * shaped by its own transfer to the output and divided by the mid-band gain, then integrated
 * over the band with the real filter shapes. Thermal noise e = √(4kTR) (Johnson 1928, Nyquist
 * 1928); for a passive RC network the density is √(4kT·Re Z). 1/f regions as
 * e²(f) = e_n²·(1 + f_c/f) (Kester, ADI tutorial MT-048).
 */
import { magnitudeSquared } from './complex';
import { BOLTZMANN_J_PER_K, NOISE_PP_PER_RMS } from './constants';
import { lowPassMagnitudeSquared } from './filters';
import { leadImpedanceOhm, electrodeImpedanceOhm, parallelRcOhm, type Resolved } from './model';
import type { NoiseContribution, NoiseReport, StageId } from './report';
import { closedLoopStageAt, logGrid, midbandFrequencyHz, stageResponsesAt, totalMagnitudeAt } from './response';

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

/** e²(f) = e_n²·(1 + f_c/f): white density with a 1/f region below the corner (Kester, ADI MT-048). */
const en2 = (en: number, fc: number, f: number) => en * en * (1 + fc / f);

/**
 * The full noise budget referred to input.
 * @param r resolved plan
 * @param pointCount integration points (default 240); `densityPoints` holds every second one
 */
export function noiseBudget(r: Resolved, pointCount = 240): NoiseReport {
  const p = r.plan;
  const kT4 = 4 * BOLTZMANN_J_PER_K * p.temperatureK;
  const fs = p.adc.sampleRateHz;
  const windowS = r.profile.checks.noisePpV?.windowS ?? 10;
  const bandLowHz = Math.min(1 / windowS, fs / 20);
  const bandHighHz = fs / 2;
  const grid = logGrid(bandLowHz, bandHighHz, pointCount);
  const n = grid.length;
  const midMag = totalMagnitudeAt(r, midbandFrequencyHz(r));
  const mid2 = midMag * midMag;
  const op1 = p.instrumentation.opAmp;
  const op2 = p.gainStage.opAmp;
  const lp = p.gainStage.lowPass;
  const e = p.electrodes;
  const r34 = (r.r3Ohm * r.r4Ohm) / (r.r3Ohm + r.r4Ohm);
  const rgTerm = Number.isFinite(r.rgOhm) ? kT4 * r.rgOhm * ((r.g1 - 1) / r.g1) ** 2 : 0;
  const gainResistors = (kT4 * 2 * r.rOhm) / (r.g1 * r.g1) + rgTerm;
  const protection = kT4 * 2 * p.protection.seriesROhm;
  const filterNoise2 = p.gainStage.filterNoiseVPerRtHz ** 2;
  const lsbV = p.adc.fullScaleV / 2 ** p.adc.bits;
  const adcDensity2 = (p.adc.inputNoiseVrms * p.adc.inputNoiseVrms) / (fs / 2);
  const quantDensity2 = (lsbV * lsbV) / 12 / (fs / 2);

  // RTI power density of every contributor at every grid point, V²/Hz: the source's density at its
  // place times its transfer to the output (|H|²), divided by the mid-band |H|².
  const density = CONTRIBUTORS.map(() => new Float64Array(n));
  const [dElectrode, dImbalance, dProtection, dInputEn, dInputIn, dGainR, dDiff, dGainStage, dFilter, dAdc, dQuant] = density;
  for (let i = 0; i < n; i++) {
    const f = grid[i];
    const s = stageResponsesAt(r, f);
    const hpGs = magnitudeSquared(s.highPass) * magnitudeSquared(s.gainStage);
    const full = magnitudeSquared(s.total) / mid2;
    const afterInput = (magnitudeSquared(s.instrumentation) * hpGs) / mid2;
    const afterDiff = (magnitudeSquared(closedLoopStageAt(1, 1 + r.gd, op1.gbwHz, f)) * hpGs) / mid2;
    const lp2 = lowPassMagnitudeSquared(lp.kind, lp.order, lp.fcHz, f);
    const gainStageOnly = (magnitudeSquared(closedLoopStageAt(r.g2, r.g2, op2.gbwHz, f)) * lp2) / mid2;
    const ze = electrodeImpedanceOhm(e.rsOhm, e.rpOhm, e.cpF, f);
    const z1 = leadImpedanceOhm(r, f, { mismatch: r.electrodeMismatch, withImbalance: true });
    const z2 = leadImpedanceOhm(r, f);
    const en1 = en2(op1.enVPerRtHz, op1.enCornerHz, f);
    const in1 = en2(op1.inAPerRtHz, op1.inCornerHz, f);
    dElectrode[i] = kT4 * (ze.re * (2 + r.electrodeMismatch)) * full;
    dImbalance[i] = kT4 * parallelRcOhm(e.imbalanceROhm, e.imbalanceCF, f).re * full;
    dProtection[i] = protection * full;
    dInputEn[i] = 2 * en1 * afterInput;
    dInputIn[i] = in1 * (magnitudeSquared(z1) + magnitudeSquared(z2)) * full;
    dGainR[i] = gainResistors * afterInput;
    dDiff[i] = (1 + r.gd) ** 2 * (en1 + 2 * kT4 * r34 + 2 * in1 * r34 * r34) * afterDiff;
    dGainStage[i] = en2(op2.enVPerRtHz, op2.enCornerHz, f) * gainStageOnly;
    dFilter[i] = filterNoise2 * (lp2 / mid2);
    dAdc[i] = adcDensity2 / mid2;
    dQuant[i] = quantDensity2 / mid2;
  }
  // Trapezoid rule in ln f: ∫S df = ∫S·f d ln f.
  const dl = Math.log(grid[1] / grid[0]);
  const power = density.map((d) => {
    let sum = 0;
    let prev = d[0] * grid[0];
    for (let i = 1; i < n; i++) {
      const cur = d[i] * grid[i];
      sum += ((prev + cur) / 2) * dl;
      prev = cur;
    }
    return sum;
  });
  const totalPower = power.reduce((a, b) => a + b, 0);
  const contributions: NoiseContribution[] = CONTRIBUTORS.map((c, k) => ({
    name: c.name,
    rmsV: Math.sqrt(power[k]),
    share: totalPower > 0 ? power[k] / totalPower : 0,
    stageId: c.stageId,
  }));
  const densityPoints: NoiseReport['densityPoints'] = [];
  for (let i = 0; i < n; i += 2) {
    const byContributor: Record<string, number> = {};
    let tot = 0;
    for (let k = 0; k < CONTRIBUTORS.length; k++) {
      byContributor[CONTRIBUTORS[k].name] = Math.sqrt(density[k][i]);
      tot += density[k][i];
    }
    densityPoints.push({ fHz: grid[i], totalVPerRtHz: Math.sqrt(tot), byContributor });
  }
  const rtiRmsV = Math.sqrt(totalPower);
  return {
    rtiRmsV,
    rtiPpV: rtiRmsV * NOISE_PP_PER_RMS,
    floorRmsV: contributions[0].rmsV,
    bandLowHz,
    bandHighHz,
    contributions,
    densityPoints,
  };
}
