/**
 * Frequency response of the chain, H(f) = H_input·H_instrumentation·H_hp·H_gain-stage, with the
 * input network, each op-amp stage's closed-loop pole at GBW/(noise gain) (single-pole op-amp
 * model, e.g. Franco, Design with Operational Amplifiers, ch. 6), the Butterworth high-pass and
 * the Butterworth/Bessel low-pass. Corners are found numerically by bisection.
 */
import { magnitude, multiply, phaseDeg, ratioToDb, type Complex } from './complex';
import { highPassAt, lowPassAt } from './filters';
import { inputNetworkAt, type Resolved } from './model';
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

/** Complex response of each stage and of the whole chain at fHz. */
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

function unwrap(points: ResponsePoint[]): void {
  let offset = 0;
  for (let i = 1; i < points.length; i++) {
    const raw = points[i].phaseDeg + offset;
    const prev = points[i - 1].phaseDeg;
    let delta = raw - prev;
    while (delta > 180) { offset -= 360; delta -= 360; }
    while (delta < -180) { offset += 360; delta += 360; }
    points[i].phaseDeg = prev + delta;
  }
}

/** A response point; |H| in dB as 10·log10(|H|²), the same value as 20·log10|H| without the root. */
function point(fHz: number, h: Complex): ResponsePoint {
  return { fHz, magDb: 10 * Math.log10(h.re * h.re + h.im * h.im), phaseDeg: phaseDeg(h) };
}

/**
 * The channel's frequency response over 0.001 Hz … fs.
 * @param r resolved plan
 * @param pointCount number of log-spaced points (default 200)
 */
export function frequencyResponse(r: Resolved, pointCount = 200): FrequencyResponse {
  const fs = r.plan.adc.sampleRateHz;
  const grid = logGrid(1e-3, fs, pointCount);
  const total: ResponsePoint[] = [];
  const stages: Record<'input' | 'instrumentation' | 'high-pass' | 'gain-stage', ResponsePoint[]> = {
    input: [], instrumentation: [], 'high-pass': [], 'gain-stage': [],
  };
  for (const f of grid) {
    const s = stageResponsesAt(r, f);
    total.push(point(f, s.total));
    stages.input.push(point(f, s.input));
    stages.instrumentation.push(point(f, s.instrumentation));
    stages['high-pass'].push(point(f, s.highPass));
    stages['gain-stage'].push(point(f, s.gainStage));
  }
  unwrap(total);
  for (const key of Object.keys(stages) as (keyof typeof stages)[]) unwrap(stages[key]);
  const midHz = midbandFrequencyHz(r);
  const mid = totalMagnitudeAt(r, midHz);
  const mag = (f: number) => totalMagnitudeAt(r, f);
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
    points: total,
    stages: [
      { id: 'input', points: stages.input },
      { id: 'instrumentation', points: stages.instrumentation },
      { id: 'high-pass', points: stages['high-pass'] },
      { id: 'gain-stage', points: stages['gain-stage'] },
    ],
  };
}
