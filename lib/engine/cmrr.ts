/**
 * Common-mode rejection of the instrumentation stage. The stage's 1/CMRR is the sum (worst case)
 * of: the difference stage's resistor mismatch divided by G1, the input op-amps' CMRR mismatch
 * (not divided by G1), the difference op-amp's own CMRR divided by G1 (Pallás-Areny & Webster,
 * "Common mode rejection ratio in differential amplifiers", IEEE Trans. Instrum. Meas. 1991),
 * the input op-amps' gain-bandwidth mismatch, and the input RC time-constant mismatch
 * 1/CMRR ≈ 2πf·|Δτ| (same paper).
 */
import { GBW_SPREAD } from './constants';
import type { Resolved } from './model';
import type { CmrrReport } from './report';
import { logGrid } from './response';

/** Four resistors of a difference amplifier: r1 input and r2 feedback of the inverting side, r3 input and r4 to the reference on the non-inverting side. */
export type DifferenceAmpResistors = { r1Ohm: number; r2Ohm: number; r3Ohm: number; r4Ohm: number };

/**
 * Exact differential and common-mode gains of a difference amplifier with an ideal op-amp:
 * Vout = Vp·(r4/(r3 + r4))·(1 + r2/r1) − Vn·r2/r1, Ad = (k + m)/2, Acm = k − m.
 * @returns gains, V/V
 */
export function differenceAmpGains(r: DifferenceAmpResistors): { differentialGain: number; commonModeGain: number } {
  const k = (r.r4Ohm / (r.r3Ohm + r.r4Ohm)) * (1 + r.r2Ohm / r.r1Ohm);
  const m = r.r2Ohm / r.r1Ohm;
  return { differentialGain: (k + m) / 2, commonModeGain: k - m };
}

/**
 * CMRR of a difference amplifier from four actual resistor values, 20·log10|Ad/Acm|.
 * Reference: Sedra & Smith, Microelectronic Circuits — gain 100 with 1 % resistors gives
 * Acm ≈ 0.04 and CMRR ≈ 68 dB in the worst case.
 * @returns CMRR, dB (Infinity for a perfect match)
 */
export function differenceAmpCmrrDb(r: DifferenceAmpResistors): number {
  const { differentialGain, commonModeGain } = differenceAmpGains(r);
  return 20 * Math.log10(Math.abs(differentialGain / commonModeGain));
}

/**
 * Worst-case resistor-limited CMRR of a difference stage, (1 + Gd)/(4t) (Pallás-Areny & Webster 1991).
 * @param gd difference-stage gain R4/R3
 * @param tolerance resistor tolerance, fraction
 * @returns CMRR as a ratio (Infinity for t = 0)
 * @example worstCaseDifferenceCmrr(100, 0.01) → 2525 (68.0 dB)
 */
export function worstCaseDifferenceCmrr(gd: number, tolerance: number): number {
  return (1 + gd) / (4 * tolerance);
}

/** The parts of 1/CMRR at fHz (dimensionless), summed in magnitude. */
export function inverseCmrrTerms(r: Resolved, fHz: number, opts: { diffCmrr?: number } = {}): { resistors: number; opAmps: number; gbw: number; inputRc: number } {
  const inst = r.plan.instrumentation;
  const op = inst.opAmp;
  const diffCmrr = opts.diffCmrr ?? worstCaseDifferenceCmrr(r.gd, inst.resistorTolerance);
  const opInv = 10 ** (-op.cmrrDb / 20);
  // Input pair: |1/CMRR_A1 − 1/CMRR_A2| ≤ 2/CMRR (signs may differ); difference op-amp divided by G1.
  const opAmps = 2 * opInv + opInv / r.g1;
  // Each input op-amp is a follower for common mode: VA − VB = Vcm·jf·(1/GBW2 − 1/GBW1), referred through G1.
  const gbwMismatch = (2 * GBW_SPREAD) / (op.gbwHz * (1 - GBW_SPREAD * GBW_SPREAD));
  const gbw = (fHz * gbwMismatch) / r.g1;
  const tau = r.plan.protection.seriesROhm * r.cCmF;
  const dTau = tau * (r.cCmMismatch + 2 * inst.resistorTolerance);
  const inputRc = 2 * Math.PI * fHz * dTau;
  return { resistors: 1 / (r.g1 * diffCmrr), opAmps, gbw, inputRc };
}

/** Stage CMRR at fHz, dB. */
export function stageCmrrDb(r: Resolved, fHz: number, opts: { diffCmrr?: number } = {}): number {
  const t = inverseCmrrTerms(r, fHz, opts);
  return -20 * Math.log10(t.resistors + t.opAmps + t.gbw + t.inputRc);
}

/**
 * CMRR report: at DC, at mains, the worst over the profile band and mains, the resistor-limited
 * value, and a sweep from 0.1 Hz to fs/2.
 */
export function cmrrReport(r: Resolved, pointCount = 60): CmrrReport {
  const mains = r.plan.mainsHz;
  const band = r.profile.band;
  const points = logGrid(0.1, r.plan.adc.sampleRateHz / 2, pointCount).map((fHz) => ({ fHz, cmrrDb: stageCmrrDb(r, fHz) }));
  const tol = r.plan.instrumentation.resistorTolerance;
  return {
    dcDb: stageCmrrDb(r, 0),
    mainsDb: stageCmrrDb(r, mains),
    worstCaseDb: Math.min(stageCmrrDb(r, band.lowHz), stageCmrrDb(r, mains), stageCmrrDb(r, band.highHz)),
    resistorLimitedDb: tol > 0 ? 20 * Math.log10(r.g1 * worstCaseDifferenceCmrr(r.gd, tol)) : Number.MAX_VALUE,
    points,
  };
}
