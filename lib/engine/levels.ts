/**
 * Levels and headroom through the chain (three-op-amp analysis, Sedra & Smith, Microelectronic
 * Circuits, instrumentation-amplifier section): with V1, V2, Vcm = (V1 + V2)/2, Vd = V1 − V2 the
 * input op-amp outputs are VA = Vcm + (G1/2)·Vd and VB = Vcm − (G1/2)·Vd, and the stage output is
 * Vout = Gd·(VA − VB) + Vref.
 */
import type { Resolved } from './model';
import type { NodeLevel, StageLevels } from './report';

/**
 * Outputs of the two input op-amps of a three-op-amp instrumentation amplifier.
 * @param vcmV input common-mode voltage, V
 * @param vdV differential input voltage, V
 * @param g1 first-stage gain 1 + 2R/Rg
 * @returns { vaV, vbV }, V
 * @example firstStageOutputs(5, 0.01, 1001) → { vaV: 10.005, vbV: -0.005 } (Sedra & Smith example: 5 ± 5.005 V)
 */
export function firstStageOutputs(vcmV: number, vdV: number, g1: number): { vaV: number; vbV: number } {
  return { vaV: vcmV + (g1 / 2) * vdV, vbV: vcmV - (g1 / 2) * vdV };
}

/** Builds a node from the extremes of a voltage and its allowed range. */
export function nodeLevel(name: string, a: number, b: number, lowLimitV: number, highLimitV: number): NodeLevel {
  const minV = Math.min(a, b);
  const maxV = Math.max(a, b);
  const headroomV = Math.min(highLimitV - maxV, minV - lowLimitV);
  const span = highLimitV - lowLimitV;
  return { name, minV, maxV, lowLimitV, highLimitV, headroomV, headroomFraction: span > 0 ? headroomV / span : -1 };
}

/** Common-mode range at the inputs, V: the reference, shifted by DC currents through the leads, plus the mains common mode. */
export function commonModeRange(r: Resolved, mainsCmPeakV: number): { loV: number; hiV: number } {
  const e = r.plan.electrodes;
  const leadDcOhm = e.rsOhm + e.rpOhm + r.plan.protection.seriesROhm + e.imbalanceROhm;
  const shiftV = (r.leadOffDcA + r.plan.instrumentation.opAmp.biasA) * leadDcOhm;
  return { loV: r.referenceV - shiftV - mainsCmPeakV, hiV: r.referenceV + shiftV + mainsCmPeakV };
}

/**
 * Every node of the chain at the worst-case DC input and signal.
 * @param r resolved plan
 * @param mainsCmPeakV mains common-mode amplitude at the inputs, V peak
 */
export function stageLevels(r: Resolved, mainsCmPeakV: number): StageLevels[] {
  const { loV: cmLo, hiV: cmHi } = commonModeRange(r, mainsCmPeakV);
  const d = r.vdMaxV;
  const { g1, gd, g2, referenceV: vref } = r;
  const half = d / 2;
  const vaHi = cmHi + (g1 / 2) * d;
  const vaLo = cmLo - (g1 / 2) * d;
  const plusHi = (gd * vaHi + vref) / (1 + gd);
  const plusLo = (gd * vaLo + vref) / (1 + gd);
  const voutSwing = gd * g1 * d;
  const dcCoupled = r.plan.highPass.order === 0;
  // After a high-pass only the signal is left around the reference.
  const hpSwing = dcCoupled ? voutSwing : gd * g1 * r.signalV;
  const out2Swing = g2 * hpSwing;
  return [
    { id: 'electrodes', name: 'Electrodes', gain: 1, nodes: [] },
    { id: 'protection', name: 'Input protection', gain: 1, nodes: [] },
    {
      id: 'instrumentation',
      name: 'Instrumentation stage',
      gain: g1 * gd,
      nodes: [
        nodeLevel('IN+ (V1)', cmLo - half, cmHi + half, r.inLoV, r.inHiV),
        nodeLevel('IN− (V2)', cmLo - half, cmHi + half, r.inLoV, r.inHiV),
        nodeLevel('VA', vaLo, vaHi, r.outLoV, r.outHiV),
        nodeLevel('VB', vaLo, vaHi, r.outLoV, r.outHiV),
        nodeLevel('difference-stage input', plusLo, plusHi, r.inLoV, r.inHiV),
        nodeLevel('VOUT', vref - voutSwing, vref + voutSwing, r.outLoV, r.outHiV),
      ],
    },
    {
      id: 'high-pass',
      name: r.plan.highPass.order === 0 ? 'Coupling (DC)' : 'High-pass',
      gain: 1,
      nodes: [nodeLevel('high-pass output', vref - hpSwing, vref + hpSwing, r.in2LoV, r.in2HiV)],
    },
    {
      id: 'gain-stage',
      name: 'Gain and anti-alias stage',
      gain: g2,
      nodes: [nodeLevel('gain-stage output', vref - out2Swing, vref + out2Swing, r.out2LoV, r.out2HiV)],
    },
    { id: 'adc', name: 'Converter', gain: 1, nodes: [nodeLevel('ADC input', vref - out2Swing, vref + out2Swing, r.adcLoV, r.adcHiV)] },
  ];
}

/**
 * Largest first-stage gain G1 that keeps every first-stage node in range at the worst-case
 * differential input (and, for a DC-coupled chain, every later node too). Closed form: each
 * node is linear in G1, so each range gives one bound (VA ≤ out_hi ⇒ G1 ≤ 2(out_hi − Vcm_hi)/Vd, …).
 * @returns the bound (0 when no gain ≥ 0 fits, e.g. the inputs themselves are out of range) and the node that sets it
 */
export function maxFirstStageGain(r: Resolved, mainsCmPeakV: number): { gain: number; limitingNode: string } {
  const { loV: cmLo, hiV: cmHi } = commonModeRange(r, mainsCmPeakV);
  const d = r.vdMaxV;
  const { gd, g2, referenceV: vref } = r;
  if (cmLo - d / 2 < r.inLoV || cmHi + d / 2 > r.inHiV) return { gain: 0, limitingNode: 'IN+/IN− (input common-mode range)' };
  if (!(d > 0)) return { gain: Number.MAX_VALUE, limitingNode: 'none (no differential input)' };
  const bounds: { node: string; g: number }[] = [
    { node: 'VA/VB (high)', g: (2 * (r.outHiV - cmHi)) / d },
    { node: 'VA/VB (low)', g: (2 * (cmLo - r.outLoV)) / d },
    { node: 'difference-stage input (high)', g: (2 * (r.inHiV * (1 + gd) - vref - gd * cmHi)) / (gd * d) },
    { node: 'difference-stage input (low)', g: (2 * (vref + gd * cmLo - r.inLoV * (1 + gd))) / (gd * d) },
    { node: 'VOUT (high)', g: (r.outHiV - vref) / (gd * d) },
    { node: 'VOUT (low)', g: (vref - r.outLoV) / (gd * d) },
  ];
  if (r.plan.highPass.order === 0) {
    bounds.push(
      { node: 'gain-stage input (high)', g: (r.in2HiV - vref) / (gd * d) },
      { node: 'gain-stage input (low)', g: (vref - r.in2LoV) / (gd * d) },
      { node: 'gain-stage output (high)', g: (r.out2HiV - vref) / (g2 * gd * d) },
      { node: 'gain-stage output (low)', g: (vref - r.out2LoV) / (g2 * gd * d) },
      { node: 'ADC input (high)', g: (r.adcHiV - vref) / (g2 * gd * d) },
      { node: 'ADC input (low)', g: (vref - r.adcLoV) / (g2 * gd * d) },
    );
  }
  let best = bounds[0];
  for (const b of bounds) if (b.g < best.g) best = b;
  return { gain: Math.max(0, best.g), limitingNode: best.node };
}

type HalfPlane = { a: number; b: number; c: number }; // a·vcm + b·vout ≤ c

function clip(poly: { vcmV: number; voutV: number }[], h: HalfPlane): { vcmV: number; voutV: number }[] {
  const out: { vcmV: number; voutV: number }[] = [];
  const value = (p: { vcmV: number; voutV: number }) => h.a * p.vcmV + h.b * p.voutV - h.c;
  for (let i = 0; i < poly.length; i++) {
    const p = poly[i];
    const q = poly[(i + 1) % poly.length];
    const vp = value(p);
    const vq = value(q);
    if (vp <= 0) out.push(p);
    if ((vp < 0 && vq > 0) || (vp > 0 && vq < 0)) {
      const t = vp / (vp - vq);
      out.push({ vcmV: p.vcmV + t * (q.vcmV - p.vcmV), voutV: p.voutV + t * (q.voutV - p.voutV) });
    }
  }
  return out;
}

/**
 * Allowed common-mode window of the instrumentation stage: the Vcm range for the worst-case
 * differential input, and the polygon (a hexagon for a three-op-amp stage) of valid
 * (Vcm, Vout) pairs. With Vd = (Vout − Vref)/(G1·Gd): VA = Vcm + (Vout − Vref)/(2Gd),
 * VB = Vcm − (Vout − Vref)/(2Gd), each within the output swing, Vout within the swing, the
 * inputs and the difference stage's input within the common-mode range.
 */
export function commonModeWindow(r: Resolved): { vdV: number; minV: number; maxV: number; vertices: { vcmV: number; voutV: number }[] } {
  const { g1, gd, referenceV: vref } = r;
  const d = r.vdMaxV;
  const lows = [r.inLoV + d / 2, r.outLoV + (g1 * d) / 2, (r.inLoV * (1 + gd) - vref) / gd + (g1 * d) / 2];
  const highs = [r.inHiV - d / 2, r.outHiV - (g1 * d) / 2, (r.inHiV * (1 + gd) - vref) / gd - (g1 * d) / 2];
  const k = 1 / (2 * gd); // VA − Vcm per volt of (Vout − Vref)
  const kin = 1 / (2 * g1 * gd);
  const span = r.plan.supply.positiveV - r.plan.supply.negativeV;
  let poly = [
    { vcmV: r.plan.supply.negativeV - span, voutV: r.outLoV },
    { vcmV: r.plan.supply.positiveV + span, voutV: r.outLoV },
    { vcmV: r.plan.supply.positiveV + span, voutV: r.outHiV },
    { vcmV: r.plan.supply.negativeV - span, voutV: r.outHiV },
  ];
  const planes: HalfPlane[] = [];
  for (const s of [1, -1]) {
    // VA (s = 1) and VB (s = −1) within the output swing.
    planes.push({ a: 1, b: s * k, c: r.outHiV + s * k * vref }, { a: -1, b: -s * k, c: -r.outLoV - s * k * vref });
    // V1 and V2 within the input common-mode range.
    planes.push({ a: 1, b: s * kin, c: r.inHiV + s * kin * vref }, { a: -1, b: -s * kin, c: -r.inLoV - s * kin * vref });
  }
  // Difference-stage input: (Gd·VA + Vref)/(1 + Gd) within the input range.
  const m = gd / (1 + gd);
  planes.push(
    { a: m, b: m * k, c: r.inHiV - vref / (1 + gd) + m * k * vref },
    { a: -m, b: -m * k, c: -r.inLoV + vref / (1 + gd) - m * k * vref },
  );
  for (const h of planes) {
    poly = clip(poly, h);
    if (poly.length === 0) break;
  }
  return { vdV: d, minV: Math.max(...lows), maxV: Math.min(...highs), vertices: poly };
}
