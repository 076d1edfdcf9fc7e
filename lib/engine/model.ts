/**
 * The plan resolved into the quantities every part of the engine uses: gains, worst-case input,
 * node limits, electrode and input impedances. Pure functions, SI units.
 */
import { add, divide, multiply, reciprocal, type Complex } from './complex';
import { DEFAULT_INPUT_CM_F, DEFAULT_INPUT_CM_OHM } from './constants';
import type { ChannelPlan } from './plan';
import type { RequirementProfile } from './profiles';

/**
 * First-stage gain of the three-op-amp instrumentation amplifier, G1 = 1 + 2R/Rg
 * (Sedra & Smith, Microelectronic Circuits, instrumentation amplifier section).
 * @param rOhm feedback resistor of each input op-amp, Ω
 * @param rgOhm gain resistor, Ω
 * @returns G1, V/V
 * @example firstStageGain(0.5e6, 1e3) → 1001
 */
export function firstStageGain(rOhm: number, rgOhm: number): number {
  return 1 + (2 * rOhm) / rgOhm;
}

/**
 * Gain resistor for a target first-stage gain, Rg = 2R/(G1 − 1).
 * @param rOhm feedback resistor, Ω
 * @param gain target G1 (> 1)
 * @returns Rg, Ω (Infinity for G1 = 1: no gain resistor)
 * @example gainResistorOhm(0.5e6, 1001) → 1000
 */
export function gainResistorOhm(rOhm: number, gain: number): number {
  return gain > 1 ? (2 * rOhm) / (gain - 1) : Number.POSITIVE_INFINITY;
}

/** Impedance of R ∥ C at fHz, Ω (R = 0 gives 0; R = ∞ gives the capacitor alone). */
export function parallelRcOhm(rOhm: number, cF: number, fHz: number): Complex {
  if (rOhm === 0) return { re: 0, im: 0 };
  const x = 2 * Math.PI * fHz * rOhm * cF;
  const d = 1 + x * x;
  return { re: rOhm / d, im: (-rOhm * x) / d };
}

/**
 * Real part of R ∥ C at fHz, R/(1 + x²) with x = 2πf·RC, Ω: `parallelRcOhm(…).re` computed the
 * same way, without the object (for sweeps).
 */
export function parallelRcReOhm(rOhm: number, cF: number, fHz: number): number {
  if (rOhm === 0) return 0;
  const x = 2 * Math.PI * fHz * rOhm * cF;
  return rOhm / (1 + x * x);
}

/** Imaginary part of R ∥ C at fHz, −R·x/(1 + x²), Ω: `parallelRcOhm(…).im` computed the same way, without the object. */
export function parallelRcImOhm(rOhm: number, cF: number, fHz: number): number {
  if (rOhm === 0) return 0;
  const x = 2 * Math.PI * fHz * rOhm * cF;
  return (-rOhm * x) / (1 + x * x);
}

/**
 * Electrode impedance Ze = Rs + Rp ∥ Cp (the usual electrode–skin model, e.g. Webster,
 * Medical Instrumentation: Application and Design, ch. 5).
 * @returns Ze at fHz, Ω
 */
export function electrodeImpedanceOhm(rsOhm: number, rpOhm: number, cpF: number, fHz: number): Complex {
  const p = parallelRcOhm(rpOhm, cpF, fHz);
  return { re: rsOhm + p.re, im: p.im };
}

/** Admittance of a capacitor at fHz, S. */
function capacitorAdmittance(cF: number, fHz: number): Complex {
  return { re: 0, im: 2 * Math.PI * fHz * cF };
}

export type Resolved = {
  plan: ChannelPlan;
  profile: RequirementProfile;
  g1: number;
  rgOhm: number;
  rOhm: number;
  gd: number;
  r3Ohm: number;
  r4Ohm: number;
  g2: number;
  totalGain: number;
  /** Electrode offset used for the levels: the larger of the plan's and the profile's test value, V. */
  offsetWorstV: number;
  signalV: number;
  /** DC resistance mismatch between the two leads, Ω. */
  dcMismatchOhm: number;
  /** DC lead-off current per lead, A (0 unless DC lead-off). */
  leadOffDcA: number;
  /** Worst-case differential DC input (all terms), V. */
  vdMaxV: number;
  /** The parts of vdMaxV. */
  vdTerms: { name: string; v: number }[];
  /** Input common-mode range of the input op-amps, the output swing of the instrumentation op-amps, V. */
  inLoV: number;
  inHiV: number;
  outLoV: number;
  outHiV: number;
  /** Same for the gain-stage op-amp, V. */
  in2LoV: number;
  in2HiV: number;
  out2LoV: number;
  out2HiV: number;
  adcLoV: number;
  adcHiV: number;
  referenceV: number;
  /** Amplifier common-mode input impedance parameters actually used. */
  inputCmOhm: number;
  inputCmF: number;
  usedDefaultInputCm: boolean;
  /** Protection filter capacitances actually in circuit, F (0 when the filter is disabled). */
  cDiffF: number;
  cCmF: number;
  cCmMismatch: number;
  /** Relative electrode impedance difference between the leads. */
  electrodeMismatch: number;
};

/**
 * Resolves a validated plan against its profile.
 * @param plan a plan that passed `parsePlan`
 * @param profile its requirement profile
 */
export function resolvePlan(plan: ChannelPlan, profile: RequirementProfile): Resolved {
  const inst = plan.instrumentation;
  const rgOhm = inst.rgOhm ?? gainResistorOhm(inst.rOhm, inst.targetGain ?? 1);
  const g1 = inst.rgOhm !== undefined ? firstStageGain(inst.rOhm, inst.rgOhm) : (inst.targetGain ?? 1);
  const gd = inst.diffGain;
  const g2 = plan.gainStage.gain;
  const offsetWorstV = Math.max(plan.electrodes.offsetV, profile.dcOffset.value);
  const signalV = plan.signalAmplitudeV ?? profile.signalAmplitude.value;
  const electrodeMismatch = plan.electrodes.impedanceMismatch ?? 0;
  const dcMismatchOhm = electrodeMismatch * (plan.electrodes.rsOhm + plan.electrodes.rpOhm) + plan.electrodes.imbalanceROhm;
  const leadOffDcA = plan.leadOff.mode === 'dc' ? plan.leadOff.currentA : 0;
  const op = inst.opAmp;
  const vdTerms = [
    { name: 'electrode offset', v: offsetWorstV },
    { name: 'bias current × source mismatch', v: op.biasA * dcMismatchOhm },
    { name: 'lead-off current × electrode mismatch', v: leadOffDcA * dcMismatchOhm },
    { name: 'input op-amp offsets', v: 2 * op.offsetV },
    { name: 'signal', v: signalV },
  ];
  const vdMaxV = vdTerms.reduce((s, t) => s + t.v, 0);
  const { positiveV, negativeV, referenceV } = plan.supply;
  const op2 = plan.gainStage.opAmp;
  const filterOn = plan.protection.filter.enabled;
  return {
    plan,
    profile,
    g1,
    rgOhm,
    rOhm: inst.rOhm,
    gd,
    r3Ohm: inst.r3Ohm,
    r4Ohm: inst.r3Ohm * gd,
    g2,
    totalGain: g1 * gd * g2,
    offsetWorstV,
    signalV,
    dcMismatchOhm,
    leadOffDcA,
    vdMaxV,
    vdTerms,
    inLoV: negativeV + op.inputCmFromNegV,
    inHiV: positiveV - op.inputCmFromPosV,
    outLoV: negativeV + op.outputFromNegV,
    outHiV: positiveV - op.outputFromPosV,
    in2LoV: negativeV + op2.inputCmFromNegV,
    in2HiV: positiveV - op2.inputCmFromPosV,
    out2LoV: negativeV + op2.outputFromNegV,
    out2HiV: positiveV - op2.outputFromPosV,
    adcLoV: plan.adc.midScaleV - plan.adc.fullScaleV / 2,
    adcHiV: plan.adc.midScaleV + plan.adc.fullScaleV / 2,
    referenceV,
    inputCmOhm: op.inputCmOhm ?? DEFAULT_INPUT_CM_OHM,
    inputCmF: op.inputCmF ?? DEFAULT_INPUT_CM_F,
    usedDefaultInputCm: op.inputCmOhm === undefined || op.inputCmF === undefined,
    cDiffF: filterOn ? plan.protection.filter.cDiffF : 0,
    cCmF: filterOn ? plan.protection.filter.cCmF : 0,
    cCmMismatch: filterOn ? plan.protection.filter.cCmMismatch : 0,
    electrodeMismatch,
  };
}

/**
 * Series impedance of one lead at fHz: electrode × (1 + extra) + imbalance network (optional) +
 * protection resistor, Ω.
 */
export function leadImpedanceOhm(r: Resolved, fHz: number, opts: { mismatch?: number; withImbalance?: boolean } = {}): Complex {
  const e = r.plan.electrodes;
  const ze = electrodeImpedanceOhm(e.rsOhm, e.rpOhm, e.cpF, fHz);
  const k = 1 + (opts.mismatch ?? 0);
  let re = ze.re * k + r.plan.protection.seriesROhm;
  let im = ze.im * k;
  if (opts.withImbalance) {
    const zi = parallelRcOhm(e.imbalanceROhm, e.imbalanceCF, fHz);
    re += zi.re;
    im += zi.im;
  }
  return { re, im };
}

/**
 * Common-mode input impedance of one input to the reference: the amplifier's Rcm ∥ Ccm in
 * parallel with the protection filter's common-mode capacitor (scaled by `cmScale`), Ω.
 * Returns a very large value when everything is open.
 */
export function inputCmImpedanceOhm(r: Resolved, fHz: number, cmScale = 1): Complex {
  const y = add({ re: 1 / r.inputCmOhm, im: 0 }, capacitorAdmittance(r.inputCmF + r.cCmF * cmScale, fHz));
  return reciprocal(y);
}

/**
 * Differential response of the input network: each lead's series impedance Zs driving the
 * differential capacitor, the two common-mode capacitors and the amplifier's input impedance,
 * H = 1/(1 + 2·Zs·Yd), Yd = jωCdiff + (jωCcm_total + 1/Rcm)/2. For Zs = R this is the familiar
 * corner 1/(2πR(2Cdiff + Ccm)) (Kitchin & Counts, A Designer's Guide to Instrumentation
 * Amplifiers, RFI-filter section).
 */
export function inputNetworkAt(r: Resolved, fHz: number): Complex {
  const zs = leadImpedanceOhm(r, fHz);
  const w = 2 * Math.PI * fHz;
  const yd: Complex = { re: 1 / (2 * r.inputCmOhm), im: w * (r.cDiffF + (r.inputCmF + r.cCmF) / 2) };
  const den = add({ re: 1, im: 0 }, multiply({ re: 2 * zs.re, im: 2 * zs.im }, yd));
  return divide({ re: 1, im: 0 }, den);
}
