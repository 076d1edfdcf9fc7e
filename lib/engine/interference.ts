/**
 * Mains interference. Body common mode from displacement currents (Metting van Rijn, Peper &
 * Grimbergen, "High-quality recording of bioelectric events", Med. Biol. Eng. Comput. 1990):
 * mains couples through C_pow into the body, which returns to earth through C_body and, via the
 * reference electrode, through the amplifier. A right-leg drive divides the reference path's
 * impedance by (1 + loop gain) (Winter & Webster, "Driven-right-leg circuit design", IEEE TBME
 * 1983) as long as its output current stays below its limit.
 * Conversion to differential: each input sees Vcm·Zcm/(Z_lead + Zcm); the difference between the
 * two leads (electrode imbalance, Ccm mismatch) plus Vcm/CMRR.
 */
import { add, divide, magnitude, multiply, reciprocal, subtract, type Complex } from './complex';
import { SINE_PP_PER_RMS } from './constants';
import { inputCmImpedanceOhm, leadImpedanceOhm, parallelRcOhm, type Resolved } from './model';
import type { InterferenceReport } from './report';
import { stageCmrrDb } from './cmrr';

/**
 * Body common-mode voltage at mains frequency (coupling model), V rms (complex).
 * Vbody = Vmains·Zp/(Zp + 1/(jωC_pow)), Zp = Z_ref ∥ 1/(jωC_body).
 */
export function bodyVoltageFromCoupling(mainsVrms: number, bodyToMainsF: number, bodyToGroundF: number, referencePathOhm: Complex, fHz: number): Complex {
  const w = 2 * Math.PI * fHz;
  const zBody: Complex = { re: 0, im: -1 / (w * bodyToGroundF) };
  const zp = reciprocal(add(reciprocal(referencePathOhm), reciprocal(zBody)));
  const zPow: Complex = { re: 0, im: -1 / (w * bodyToMainsF) };
  return multiply({ re: mainsVrms, im: 0 }, divide(zp, add(zp, zPow)));
}

/**
 * Body common mode for the plan, V rms (magnitude), with the right-leg drive applied when it can
 * supply the current.
 * @param loopGainOverride loop gain to use instead of the plan's (for suggestions)
 */
export function bodyCommonMode(r: Resolved, loopGainOverride?: number): { vcmRms: number; rldSaturated: boolean } {
  const body = r.plan.body;
  if (body.mode === 'direct') return { vcmRms: body.cmVrms, rldSaturated: false };
  const rld = r.plan.rightLegDrive;
  const f = r.plan.mainsHz;
  const passive: Complex = { re: r.plan.electrodes.groundOhm + (rld.enabled ? rld.outputROhm : 0), im: 0 };
  const vPassive = bodyVoltageFromCoupling(body.mainsVrms, body.bodyToMainsF, body.bodyToGroundF, passive, f);
  if (!rld.enabled && loopGainOverride === undefined) return { vcmRms: magnitude(vPassive), rldSaturated: false };
  const loop = loopGainOverride ?? rld.loopGain;
  const driven: Complex = { re: passive.re / (1 + loop), im: 0 };
  const vDriven = bodyVoltageFromCoupling(body.mainsVrms, body.bodyToMainsF, body.bodyToGroundF, driven, f);
  // The driver must sink the displacement current; beyond its limit the loop gives no reduction.
  const currentA = magnitude(vDriven) / driven.re * Math.SQRT2;
  if (currentA > rld.currentLimitA) return { vcmRms: magnitude(vPassive), rldSaturated: true };
  return { vcmRms: magnitude(vDriven), rldSaturated: false };
}

/**
 * Differential voltage from common mode through the lead-impedance / input-impedance dividers,
 * per volt of common mode: Zcm1/(Z1 + Zcm1) − Zcm2/(Z2 + Zcm2).
 */
export function imbalanceConversion(z1: Complex, zcm1: Complex, z2: Complex, zcm2: Complex): Complex {
  return subtract(divide(zcm1, add(z1, zcm1)), divide(zcm2, add(z2, zcm2)));
}

/**
 * Required common-mode input impedance so that Vcm·|ΔZ|/|Zcm| stays within a differential limit.
 * @example requiredCmImpedanceOhm(10, 40.7e3, 1e-3 / (2 * Math.SQRT2)) → 1.15e9
 */
export function requiredCmImpedanceOhm(vcmRms: number, imbalanceOhm: number, limitRms: number): number {
  return (vcmRms * imbalanceOhm) / limitRms;
}

/** Interference terms (RTI peak-to-peak) for a given common mode and lead impedances. */
function terms(r: Resolved, vcmRms: number, z1: Complex, z2: Complex): { name: string; rtiPpV: number }[] {
  const f = r.plan.mainsHz;
  const zcm1 = inputCmImpedanceOhm(r, f, 1 + r.cCmMismatch);
  const zcm2 = inputCmImpedanceOhm(r, f, 1);
  const conv = magnitude(imbalanceConversion(z1, zcm1, z2, zcm2));
  const cmrr = 10 ** (-stageCmrrDb(r, f) / 20);
  return [
    { name: 'lead imbalance against common-mode input impedance', rtiPpV: vcmRms * conv * SINE_PP_PER_RMS },
    { name: 'amplifier CMRR', rtiPpV: vcmRms * cmrr * SINE_PP_PER_RMS },
  ];
}

/**
 * Interference in use (body coupling) and the profile's common-mode test.
 * The test applies its common-mode voltage to the leads through the test's high source
 * impedance (assumed 300 pF total coupling, as in the 100 pF + 200 pF arrangement); a
 * right-leg drive holds the node down by its output resistance ÷ (1 + loop gain) if it can
 * supply the current; without one no reduction is credited (conservative).
 */
export function interferenceReport(r: Resolved, loopGainOverride?: number): InterferenceReport {
  const f = r.plan.mainsHz;
  const body = bodyCommonMode(r, loopGainOverride);
  const z1 = leadImpedanceOhm(r, f, { mismatch: r.electrodeMismatch, withImbalance: true });
  const z2 = leadImpedanceOhm(r, f);
  const t = terms(r, body.vcmRms, z1, z2);
  const test = r.profile.checks.cmrTest;
  let cmrTest: InterferenceReport['cmrTest'] = null;
  if (test) {
    const vcm = cmrTestCommonModeRms(r, test.vcmRms, loopGainOverride);
    const rProt = r.plan.protection.seriesROhm;
    const zi = parallelRcOhm(test.imbalanceROhm, test.imbalanceCF, f);
    const tt = terms(r, vcm, { re: zi.re + rProt, im: zi.im }, { re: rProt, im: 0 });
    cmrTest = { rtiPpV: tt.reduce((s, x) => s + x.rtiPpV, 0), limitPpV: test.value, vcmRms: vcm };
  }
  return {
    bodyCmV: body.vcmRms,
    rtiPpV: t.reduce((s, x) => s + x.rtiPpV, 0),
    terms: t,
    rightLegDriveSaturated: body.rldSaturated,
    cmrTest,
  };
}

/** Test source capacitance (coupling + node to earth) assumed for the CMR test, F (from the 100 pF + 200 pF arrangement; partly confirmed). */
export const CMR_TEST_SOURCE_F = 300e-12;

/** Common-mode voltage on the leads during the profile's CMR test, V rms. */
export function cmrTestCommonModeRms(r: Resolved, testVrms: number, loopGainOverride?: number): number {
  const rld = r.plan.rightLegDrive;
  if (!rld.enabled && loopGainOverride === undefined) return testVrms;
  const w = 2 * Math.PI * r.plan.mainsHz;
  const zSrc: Complex = { re: 0, im: -1 / (w * CMR_TEST_SOURCE_F) };
  const zRld: Complex = { re: rld.outputROhm / (1 + (loopGainOverride ?? rld.loopGain)), im: 0 };
  const v = magnitude(multiply({ re: testVrms, im: 0 }, divide(zRld, add(zRld, zSrc))));
  const currentA = (testVrms / magnitude(add(zRld, zSrc))) * Math.SQRT2;
  if (currentA > rld.currentLimitA) return testVrms;
  return v;
}
