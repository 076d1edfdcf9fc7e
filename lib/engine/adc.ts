/**
 * Converter figures: LSB = full scale / 2^N, LSB referred to input = LSB / total gain, ideal SNR
 * of an N-bit converter for a full-scale sine 6.02·N + 1.76 dB (Kester, ADI tutorial MT-001).
 */
import type { Resolved } from './model';
import type { AdcReport } from './report';

/**
 * Ideal SNR of an N-bit converter, full-scale sine input (Kester, MT-001).
 * @param bits resolution N
 * @returns SNR, dB
 * @example idealSnrDb(16) → 98.08
 */
export function idealSnrDb(bits: number): number {
  return 6.02 * bits + 1.76;
}

/**
 * Size of one code step.
 * @param fullScaleV full-scale span, V
 * @param bits resolution N
 * @returns LSB, V
 * @example lsbV(3, 24) → 1.788e-7
 */
export function lsbV(fullScaleV: number, bits: number): number {
  return fullScaleV / 2 ** bits;
}

/** Converter report for the resolved plan. */
export function adcReport(r: Resolved): AdcReport {
  const a = r.plan.adc;
  const lsb = lsbV(a.fullScaleV, a.bits);
  const g = r.totalGain;
  const dcCoupled = r.plan.highPass.order === 0;
  const peakRti = (dcCoupled ? r.vdMaxV : r.signalV) * g;
  const vref = r.referenceV;
  return {
    lsbV: lsb,
    lsbRtiV: lsb / g,
    rangeRtiV: a.fullScaleV / g,
    snrIdealDb: idealSnrDb(a.bits),
    fitsOffset: vref + peakRti <= r.adcHiV && vref - peakRti >= r.adcLoV,
    codesSpanned: (2 * r.signalV * g) / lsb,
  };
}
