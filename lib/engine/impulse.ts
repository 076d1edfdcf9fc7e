/**
 * Low-frequency impulse test and overload recovery of the high-pass.
 * First order: step response g(t) = e^(−t/τ), τ = 1/(2π·fc); a pulse of amplitude A and
 * length T leaves a displacement A·(1 − e^(−T/τ)) with slope displacement/τ.
 * Second-order Butterworth (ζ = 1/√2): H = s²/(s² + 2ζω s + ω²) has the step response
 * g(t) = e^(−at)·(cos bt − (a/b)·sin bt), a = ζω, b = ω·√(1 − ζ²) (inverse Laplace transform,
 * e.g. Ogata, Modern Control Engineering, second-order systems); the pulse response is
 * A·(g(t) − g(t − T)) for t ≥ T.
 */
import type { ImpulseTest, Recovery } from './report';
import type { Resolved } from './model';

const ZETA = Math.SQRT1_2;

/**
 * Step response of the high-pass at time tS after a unit step.
 * @param order 0 (DC-coupled: 1), 1 or 2 (Butterworth)
 * @param fcHz corner, Hz
 * @param tS time, s (≥ 0)
 * @returns g(t), V/V
 */
export function highPassStepResponse(order: 0 | 1 | 2, fcHz: number, tS: number): number {
  if (order === 0) return 1;
  const w = 2 * Math.PI * fcHz;
  if (order === 1) return Math.exp(-w * tS);
  const a = ZETA * w;
  const b = w * Math.sqrt(1 - ZETA * ZETA);
  return Math.exp(-a * tS) * (Math.cos(b * tS) - (a / b) * Math.sin(b * tS));
}

/** Time derivative of the step response, 1/s. */
export function highPassStepSlope(order: 0 | 1 | 2, fcHz: number, tS: number): number {
  if (order === 0) return 0;
  const w = 2 * Math.PI * fcHz;
  if (order === 1) return -w * Math.exp(-w * tS);
  const a = ZETA * w;
  const b = w * Math.sqrt(1 - ZETA * ZETA);
  return Math.exp(-a * tS) * (-2 * a * Math.cos(b * tS) + ((a * a - b * b) / b) * Math.sin(b * tS));
}

/**
 * Response to a rectangular pulse after its end: largest displacement and largest slope.
 * Closed form for first order; for second order sampled over the decay (the extremes sit just
 * after the pulse), with the instant after the pulse included exactly.
 * @param order high-pass order
 * @param fcHz corner, Hz
 * @param amplitudeV pulse amplitude, V
 * @param durationS pulse length, s
 * @example pulseTest(1, 0.05, 3e-3, 0.1) → displacement ≈ 92.8 µV, slope ≈ 29.2 µV/s
 */
export function pulseTest(order: 0 | 1 | 2, fcHz: number, amplitudeV: number, durationS: number): ImpulseTest {
  if (order === 0) return { displacementV: 0, slopeVPerS: 0, amplitudeV, durationS };
  if (order === 1) {
    const tau = 1 / (2 * Math.PI * fcHz);
    const displacementV = amplitudeV * (1 - Math.exp(-durationS / tau));
    return { displacementV, slopeVPerS: displacementV / tau, amplitudeV, durationS };
  }
  const tau = 1 / (2 * Math.PI * fcHz);
  const spanS = 6 * tau;
  const steps = 400;
  let maxD = 0;
  let maxS = 0;
  for (let i = 0; i <= steps; i++) {
    const t = durationS + (spanS * i) / steps;
    const y = amplitudeV * (highPassStepResponse(2, fcHz, t) - highPassStepResponse(2, fcHz, t - durationS));
    const dy = amplitudeV * (highPassStepSlope(2, fcHz, t) - highPassStepSlope(2, fcHz, t - durationS));
    maxD = Math.max(maxD, Math.abs(y));
    maxS = Math.max(maxS, Math.abs(dy));
  }
  return { displacementV: maxD, slopeVPerS: maxS, amplitudeV, durationS };
}

/**
 * Time after which |g(t)| stays at or below `ratio` (0 < ratio < 1), s.
 * First order: τ·ln(1/ratio). Second order: the last crossing of |g| = ratio, found by a
 * backward scan from where the envelope e^(−at)·√(1 + (a/b)²) falls below ratio, then bisection.
 */
export function settlingTimeS(order: 1 | 2, fcHz: number, ratio: number): number {
  if (ratio >= 1) return 0;
  const w = 2 * Math.PI * fcHz;
  if (order === 1) return Math.log(1 / ratio) / w;
  const a = ZETA * w;
  const b = w * Math.sqrt(1 - ZETA * ZETA);
  const tEnd = Math.log(Math.sqrt(1 + (a / b) ** 2) / ratio) / a;
  const steps = 2000;
  const g = (t: number) => Math.abs(highPassStepResponse(2, fcHz, t)) - ratio;
  for (let i = steps; i > 0; i--) {
    const t1 = (tEnd * i) / steps;
    const t0 = (tEnd * (i - 1)) / steps;
    if (g(t0) > 0 && g(t1) <= 0) {
      let lo = t0;
      let hi = t1;
      for (let k = 0; k < 50; k++) {
        const m = (lo + hi) / 2;
        if (g(m) > 0) lo = m;
        else hi = m;
      }
      return hi;
    }
  }
  return 0;
}

/**
 * Recovery after a saturating step (electrode motion, defibrillation) of the size of the
 * worst-case offset: the step reaching the high-pass is limited by the first stage's output
 * range; the chain has recovered when the residual at the high-pass output, times G2, plus the
 * signal fits in the gain stage and the converter again.
 */
export function recoveryAfterStep(r: Resolved): Recovery {
  const stepV = r.offsetWorstV;
  const vref = r.referenceV;
  const firstRoom = Math.max(r.outHiV - vref, vref - r.outLoV);
  const stepAtHp = Math.min(r.g1 * r.gd * stepV, firstRoom);
  const room2 = Math.min(r.out2HiV - vref, vref - r.out2LoV, r.adcHiV - vref, vref - r.adcLoV);
  const bandV = Math.max(0, room2 / r.g2 - r.g1 * r.gd * r.signalV);
  const order = r.plan.highPass.order;
  if (order === 0) return { timeS: stepAtHp <= bandV ? 0 : null, stepV, bandV };
  if (bandV <= 0) return { timeS: null, stepV, bandV };
  return { timeS: settlingTimeS(order, r.plan.highPass.fcHz, bandV / stepAtHp), stepV, bandV };
}
