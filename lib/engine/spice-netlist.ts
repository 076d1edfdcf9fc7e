/**
 * SPICE netlist of a planned channel: the same chain the engine evaluates, written as a
 * circuit that any SPICE-compatible simulator can run (it is checked against ngspice).
 *
 * Pure and browser-safe: strings in, a string out; no I/O.
 *
 * What the netlist models (small-signal, linear):
 *  - electrodes: Rs + Rp∥Cp in each lead, the imbalance network Rimb∥Cimb in series with the
 *    positive lead, the reference electrode impedance from the body to circuit ground;
 *  - input protection: series R in each lead, optional RC filter (Cdiff across the inputs,
 *    Ccm from each input to ground, the positive side larger by the stated mismatch);
 *  - the amplifier's common-mode input impedance (Rcm ∥ Ccm per input; 1 TΩ ∥ 3 pF when the plan
 *    gives none, as the engine assumes);
 *  - the three-op-amp instrumentation stage with op-amp macro-models: single-pole open-loop
 *    gain from the gain-bandwidth product, the op-amp's own common-mode error (sign selectable),
 *    voltage noise (noisy resistor Rn = e_n²/(4kT) copied by a unity VCVS, 1/f part from the
 *    resistor's flicker model) and independent current noise into both inputs;
 *  - the high-pass (none, first-order RC, or second-order Butterworth unity-gain Sallen-Key);
 *  - the gain stage (non-inverting amplifier with the gain-stage op-amp macro-model); resistors
 *    whose values the plan leaves open (high-pass R, Rf, Ri, filter R) are noiseless, and the
 *    gain-stage op-amp's current noise is left out for the same reason;
 *  - the plan's filter-network noise density at the filter input (shaped by the low-pass);
 *  - the anti-alias low-pass (Butterworth or Bessel, order 1–8) as cascaded unity-gain
 *    Sallen-Key sections with ideal buffers plus a real pole for odd orders, computed from
 *    the normalized poles of the family;
 *  - the ADC input, with the converter's input noise and quantization noise as a white source.
 * Not modelled: rail clipping (the macro-models are linear), right-leg drive, lead-off current.
 */
import type { ChannelPlan } from './plan';

/** Boltzmann constant, J/K (CODATA 2018, exact by the 2019 SI definition). */
export const BOLTZMANN_J_PER_K = 1.380649e-23;
/** Offset between kelvin and degrees Celsius. */
const KELVIN_AT_0_C = 273.15;
/** Common-mode input resistance assumed when the plan gives none, Ω (the engine's assumption too). */
const DEFAULT_INPUT_CM_OHM = 1e12;
/** Common-mode input capacitance assumed when the plan gives none, F (the engine's assumption too). */
const DEFAULT_INPUT_CM_F = 3e-12;
/** DC gain of the op-amp macro-model's single pole, V/V (high enough that closed-loop gains are exact to < 1 ppm·G). */
const OPAMP_DC_GAIN = 1e9;
/** Capacitor of the first-order high-pass and of each second-order high-pass capacitor, F (a design choice; only RC matters). */
const HIGH_PASS_CAP_F = 1e-6;
/** Resistor of each low-pass section, Ω (a design choice; the capacitors follow from it). */
const LOW_PASS_RES_OHM = 10e3;
/** Input resistor of the non-inverting gain stage, Ω (a design choice). */
const GAIN_STAGE_RI_OHM = 1e3;

export type NetlistAnalysis = 'ac' | 'noise' | 'cmrr' | 'tran';

/** Explicit resistor values of the instrumentation stage, Ω (for mismatch / CMRR analysis). */
export interface InstrumentationResistors {
  /** Feedback resistor of the positive-input op-amp A1 (VA to its inverting input). */
  r1Ohm: number;
  /** Feedback resistor of the negative-input op-amp A2 (VB to its inverting input). */
  r2Ohm: number;
  /** Gain resistor between the two inverting inputs. */
  rgOhm: number;
  /** Difference stage, inverting side: input resistor from VB. */
  r3InvOhm: number;
  /** Difference stage, inverting side: feedback resistor to the output. */
  r4InvOhm: number;
  /** Difference stage, non-inverting side: input resistor from VA. */
  r3RefOhm: number;
  /** Difference stage, non-inverting side: resistor to the reference. */
  r4RefOhm: number;
}

export interface NetlistOptions {
  analysis: NetlistAnalysis;
  /** First frequency of the sweep, Hz (ac, noise, cmrr). Default 1 mHz. */
  startHz?: number;
  /** Last frequency of the sweep, Hz. Default: the ADC sample rate. The decade sweep stops on its grid. */
  stopHz?: number;
  /** Points per decade of the sweep. Default 100. */
  pointsPerDecade?: number;
  /** Explicit instrumentation-stage resistors (others nominal). */
  resistors?: Partial<InstrumentationResistors>;
  /**
   * Where the common-mode source of the `cmrr` analysis drives: `body` (through electrodes and
   * input protection, so electrode imbalance and Ccm mismatch convert it) or `amplifier`
   * (straight onto the instrumentation-stage inputs: the stage's own CMRR). Default `body`.
   */
  commonModeAt?: 'body' | 'amplifier';
  /** Include the protection filter's differential capacitor (default true). */
  cDiff?: boolean;
  /** Leave the electrodes and input protection out: the sources drive the amplifier inputs directly (default false). */
  bypassInput?: boolean;
  /** Model each op-amp's own finite CMRR (default true). */
  opAmpCmrr?: boolean;
  /**
   * Sign of each instrumentation op-amp's common-mode error (default +1 for all: identical parts,
   * whose errors cancel between A1 and A2). Opposite signs on A1 and A2 give the worst case.
   */
  opAmpCmrrSigns?: { a1?: -1 | 1; a2?: -1 | 1; a3?: -1 | 1 };
  /** Include the imbalance network Rimb∥Cimb in the positive lead (default true). */
  imbalance?: boolean;
  /** Scale the positive lead's electrode impedance by (1 + plan.electrodes.impedanceMismatch) (default true). */
  electrodeMismatch?: boolean;
  /** Add the ADC input noise and quantization noise at the converter input (default true). */
  adcNoise?: boolean;
  /** Model the op-amps' current noise (default true). */
  currentNoise?: boolean;
  /** Transient analysis of a rectangular differential pulse (defaults: the 3 mV × 100 ms impulse test). */
  tran?: { stepS?: number; stopS?: number; amplitudeV?: number; startS?: number; widthS?: number };
  /**
   * Append an ngspice `.control` block that runs the analysis and writes the results with
   * `wrdata` to files starting with this path (e.g. `/tmp/x/plan1` → `/tmp/x/plan1.ac.txt`).
   */
  controlOutputPrefix?: string;
}

/** A complex number as [re, im]. */
type Complex = [number, number];

/** Resolved values of the instrumentation stage, Ω and V/V. */
export interface ResolvedInstrumentation extends InstrumentationResistors {
  g1: number;
  gd: number;
}

/**
 * Nominal instrumentation-stage resistor values from the plan, with explicit overrides.
 * G1 = 1 + 2R/Rg (three-op-amp instrumentation amplifier; Sedra & Smith, Microelectronic Circuits),
 * Rg = 2R/(G1 − 1) when the plan gives a target gain; R4 = Gd·R3.
 * @param plan the channel plan
 * @param overrides explicit values, Ω
 * @returns the seven resistors, Ω, and the nominal gains G1 and Gd, V/V
 * @example resolveInstrumentation(plan with rOhm 25e3, targetGain 11).rgOhm // 5000
 */
export function resolveInstrumentation(plan: ChannelPlan, overrides: Partial<InstrumentationResistors> = {}): ResolvedInstrumentation {
  const ina = plan.instrumentation;
  const rgNominalOhm = ina.rgOhm ?? (ina.targetGain !== undefined && ina.targetGain > 1 ? (2 * ina.rOhm) / (ina.targetGain - 1) : Infinity);
  const r4Ohm = ina.diffGain * ina.r3Ohm;
  const r: InstrumentationResistors = {
    r1Ohm: ina.rOhm,
    r2Ohm: ina.rOhm,
    rgOhm: rgNominalOhm,
    r3InvOhm: ina.r3Ohm,
    r4InvOhm: r4Ohm,
    r3RefOhm: ina.r3Ohm,
    r4RefOhm: r4Ohm,
    ...overrides,
  };
  return { ...r, g1: 1 + (r.r1Ohm + r.r2Ohm) / r.rgOhm, gd: r.r4InvOhm / r.r3InvOhm };
}

// ---------------------------------------------------------------------------------------------
// Normalized low-pass poles (−3 dB at 1 rad/s)

function cMul(a: Complex, b: Complex): Complex {
  return [a[0] * b[0] - a[1] * b[1], a[0] * b[1] + a[1] * b[0]];
}
function cDiv(a: Complex, b: Complex): Complex {
  const d = b[0] * b[0] + b[1] * b[1];
  return [(a[0] * b[0] + a[1] * b[1]) / d, (a[1] * b[0] - a[0] * b[1]) / d];
}
function cSub(a: Complex, b: Complex): Complex {
  return [a[0] - b[0], a[1] - b[1]];
}

/** Coefficients a_0..a_n of the reverse Bessel polynomial θ_n(s), a_k = (2n−k)! / (2^(n−k) k! (n−k)!). */
function besselCoefficients(order: number): number[] {
  const fact = (m: number): number => (m <= 1 ? 1 : m * fact(m - 1));
  const a: number[] = [];
  for (let k = 0; k <= order; k += 1) a.push(fact(2 * order - k) / (2 ** (order - k) * fact(k) * fact(order - k)));
  return a;
}

/** Roots of a real polynomial (coefficients low to high) by the Durand–Kerner iteration. */
function polynomialRoots(coefficients: number[]): Complex[] {
  const n = coefficients.length - 1;
  const lead = coefficients[n];
  const monic = coefficients.map((c) => c / lead);
  const evaluate = (z: Complex): Complex => {
    let acc: Complex = [1, 0];
    for (let k = n - 1; k >= 0; k -= 1) acc = [acc[0] * z[0] - acc[1] * z[1] + monic[k], acc[0] * z[1] + acc[1] * z[0]];
    return acc;
  };
  let roots: Complex[] = Array.from({ length: n }, (_, k) => {
    const r = 0.4 + 0.9 ** k;
    const angle = (2 * Math.PI * k) / n + 0.4;
    return [r * Math.cos(angle) * 2, r * Math.sin(angle) * 2] as Complex;
  });
  for (let iteration = 0; iteration < 500; iteration += 1) {
    let change = 0;
    roots = roots.map((z, i) => {
      let denominator: Complex = [1, 0];
      roots.forEach((w, j) => {
        if (j !== i) denominator = cMul(denominator, cSub(z, w));
      });
      const step = cDiv(evaluate(z), denominator);
      change = Math.max(change, Math.hypot(step[0], step[1]));
      return cSub(z, step);
    });
    if (change < 1e-15) break;
  }
  return roots;
}

/**
 * Normalized poles of an all-pole low-pass whose magnitude is −3 dB (1/√2) at 1 rad/s.
 * Butterworth: s_k = exp(jπ(2k + n + 1)/(2n)) (Butterworth 1930; any filter handbook).
 * Bessel: roots of the reverse Bessel polynomial, rescaled from unit delay to the −3 dB
 * frequency (as SciPy's `bessel(..., norm='mag')`).
 * @param kind filter family
 * @param order 1–8
 * @returns poles in rad/s (left half-plane), one of each conjugate pair with im ≥ 0 listed once per pole
 * @example normalizedLowPassPoles('butterworth', 2) // [[-0.7071, ±0.7071]]
 */
export function normalizedLowPassPoles(kind: 'butterworth' | 'bessel', order: number): Complex[] {
  if (kind === 'butterworth') {
    return Array.from({ length: order }, (_, k) => {
      const angle = (Math.PI * (2 * k + order + 1)) / (2 * order);
      return [Math.cos(angle), Math.sin(angle)] as Complex;
    });
  }
  const coefficients = besselCoefficients(order);
  const poles = polynomialRoots(coefficients);
  // |H(jω)|² = Π |p|² / |jω − p|², with H(0) = 1.
  const magnitudeSquared = (w: number): number =>
    poles.reduce((acc, p) => acc * ((p[0] * p[0] + p[1] * p[1]) / (p[0] * p[0] + (w - p[1]) * (w - p[1]))), 1);
  let lo = 1e-3;
  let hi = 100;
  for (let i = 0; i < 200; i += 1) {
    const mid = Math.sqrt(lo * hi);
    if (magnitudeSquared(mid) > 0.5) lo = mid;
    else hi = mid;
  }
  const w3dB = Math.sqrt(lo * hi);
  return poles.map((p) => [p[0] / w3dB, p[1] / w3dB] as Complex);
}

/** One section of the cascaded low-pass: a real pole or a complex pair, with its natural frequency (rad/s, normalized) and Q. */
export interface LowPassSection {
  kind: 'real' | 'pair';
  /** Natural frequency relative to the −3 dB corner (|p|). */
  w0Normalized: number;
  /** Quality factor |p| / (−2·Re p) (pairs only). */
  q: number;
}

/**
 * Splits the normalized poles into second-order sections (ascending Q) and, for odd orders, one real pole.
 * @param kind filter family
 * @param order 1–8
 */
export function lowPassSections(kind: 'butterworth' | 'bessel', order: number): LowPassSection[] {
  const poles = normalizedLowPassPoles(kind, order);
  const sections: LowPassSection[] = [];
  const tol = 1e-9;
  for (const p of poles) {
    const w0 = Math.hypot(p[0], p[1]);
    if (Math.abs(p[1]) < tol) sections.push({ kind: 'real', w0Normalized: w0, q: 0.5 });
    else if (p[1] > 0) sections.push({ kind: 'pair', w0Normalized: w0, q: w0 / (-2 * p[0]) });
  }
  return sections.sort((a, b) => (a.kind === b.kind ? a.q - b.q : a.kind === 'real' ? -1 : 1));
}

// ---------------------------------------------------------------------------------------------
// Formatting

/**
 * A number in SPICE notation with an engineering suffix and 7 significant digits.
 * @example spiceNumber(47e-9) // "47n"
 */
export function spiceNumber(value: number): string {
  if (value === 0) return '0';
  if (!Number.isFinite(value)) throw new Error(`cannot write ${value} into a netlist`);
  const suffixes: [number, string][] = [
    [1e12, 'T'],
    [1e9, 'G'],
    [1e6, 'Meg'],
    [1e3, 'k'],
    [1, ''],
    [1e-3, 'm'],
    [1e-6, 'u'],
    [1e-9, 'n'],
    [1e-12, 'p'],
    [1e-15, 'f'],
  ];
  const magnitude = Math.abs(value);
  if (magnitude >= 1e15 || magnitude < 1e-15) return value.toExponential(6);
  const [scale, suffix] = suffixes.find(([s]) => magnitude >= s) ?? [1e-15, 'f'];
  const scaled = Number((value / scale).toPrecision(7));
  return `${scaled}${suffix}`;
}

/** Plain-ASCII comments, so that every SPICE reader accepts the file. */
function toAscii(text: string): string {
  const map: Record<string, string> = {
    '√': 'sqrt', '∥': '||', '·': '*', '−': '-', 'Ω': 'Ohm', 'τ': 'tau', 'ω': 'w', '²': '^2', '…': '...', '→': '->',
    '×': 'x', '±': '+/-', 'µ': 'u', '°': 'deg', '–': '-', '—': '-', 'Δ': 'delta',
  };
  return text.replace(/[^\x00-\x7f]/g, (c) => map[c] ?? '?');
}

// ---------------------------------------------------------------------------------------------
// Building blocks

interface NoiseSpec {
  /** White density, V/√Hz (for a voltage) or A/√Hz (for a current). */
  density: number;
  /** 1/f corner, Hz (0 = none). */
  cornerHz: number;
}

/**
 * Lines of a noise generator: an isolated node whose open-circuit voltage has density
 * d·√(1 + fc/f). The white part is the thermal noise of Rn = d²/(4kT); the 1/f part is the
 * resistor's flicker noise S_i = KF·I^AF/f with a DC current I = 1/Rn (so I·Rn = 1 V) and AF = 2,
 * giving S_v = KF/f, hence KF = d²·fc. The 1 V DC is subtracted by the copying VCVS.
 * Returns the element lines; the node `<name>_p`/`<name>_ref` pair carries the noise voltage.
 */
function noiseGeneratorLines(name: string, spec: NoiseSpec, temperatureK: number): { lines: string[]; plus: string; minus: string } {
  const rnOhm = (spec.density * spec.density) / (4 * BOLTZMANN_J_PER_K * temperatureK);
  const plus = `${name}_p`;
  const minus = `${name}_ref`;
  const lines: string[] = [];
  if (spec.cornerHz > 0) {
    const kf = spec.density * spec.density * spec.cornerHz;
    lines.push(`R${name} ${plus} 0 ${spiceNumber(rnOhm)} ${name}_mod   ; noise resistor: thermal = ${spiceNumber(spec.density)}/√Hz, flicker corner ${spiceNumber(spec.cornerHz)}Hz`);
    lines.push(`.model ${name}_mod R (kf=${kf.toExponential(6)} af=2)`);
    lines.push(`I${name} 0 ${plus} DC ${spiceNumber(1 / rnOhm)}   ; bias for the flicker noise (I·Rn = 1 V)`);
    lines.push(`V${name} ${minus} 0 DC 1   ; subtracts the 1 V bias (noiseless)`);
  } else {
    lines.push(`R${name} ${plus} 0 ${spiceNumber(rnOhm)}   ; noise resistor: ${spiceNumber(spec.density)}/√Hz white`);
    lines.push(`V${name} ${minus} 0 DC 0   ; reference of the noise voltage`);
  }
  return { lines, plus, minus };
}

interface OpAmpModelOptions {
  temperatureK: number;
  /** Sign of the op-amp's common-mode error (0 = CMRR not modelled). */
  cmrrSign: -1 | 0 | 1;
  currentNoise: boolean;
}

/**
 * A subcircuit for an op-amp macro-model: pins (non-inverting, inverting, output).
 * Non-inverting input → common-mode error (Vcm/CMRR) → voltage noise → single-pole
 * transconductance stage (gm = 1 S into A0 Ω ∥ 1/(2π·GBW) F, both noiseless) → ideal output buffer.
 */
function opAmpSubcircuit(name: string, opAmp: ChannelPlan['gainStage']['opAmp'], options: OpAmpModelOptions): string[] {
  const lines: string[] = [];
  lines.push(`.subckt ${name} inp inn out`);
  lines.push(`* op-amp macro-model: GBW ${spiceNumber(opAmp.gbwHz)}Hz, e_n ${spiceNumber(opAmp.enVPerRtHz)}V/√Hz (1/f corner ${spiceNumber(opAmp.enCornerHz)}Hz), i_n ${spiceNumber(opAmp.inAPerRtHz)}A/√Hz, CMRR ${opAmp.cmrrDb} dB`);
  if (options.cmrrSign !== 0) {
    const halfInvCmrr = (options.cmrrSign * 0.5) / 10 ** (opAmp.cmrrDb / 20);
    lines.push(`Ecm1 ncm1 inp inp 0 ${halfInvCmrr.toExponential(6)}   ; common-mode error (V+ + V-)/(2·CMRR), part from V+`);
    lines.push(`Ecm2 ncm2 ncm1 inn 0 ${halfInvCmrr.toExponential(6)}   ; ... and part from V-`);
  } else {
    lines.push(`Vcm0 ncm2 inp DC 0   ; op-amp CMRR not modelled`);
  }
  const en = noiseGeneratorLines('vnoise', { density: opAmp.enVPerRtHz, cornerHz: opAmp.enCornerHz }, options.temperatureK);
  lines.push(...en.lines);
  lines.push(`Een nint ncm2 ${en.plus} ${en.minus} 1   ; voltage noise copied in series with V+`);
  if (options.currentNoise && opAmp.inAPerRtHz > 0) {
    // Generator of 1 kΩ thermal noise (scaled by the transconductance) with the current-noise 1/f corner.
    const rRefOhm = 1e3;
    const vDensity = Math.sqrt(4 * BOLTZMANN_J_PER_K * options.temperatureK * rRefOhm);
    for (const pin of ['inp', 'inn'] as const) {
      const inGen = noiseGeneratorLines(`inoise_${pin}`, { density: vDensity, cornerHz: opAmp.inCornerHz }, options.temperatureK);
      lines.push(...inGen.lines);
      lines.push(`Gin_${pin} ${pin} 0 ${inGen.plus} ${inGen.minus} ${(opAmp.inAPerRtHz / vDensity).toExponential(6)}   ; current noise into ${pin === 'inp' ? 'V+' : 'V-'} (i_n ${spiceNumber(opAmp.inAPerRtHz)}A/√Hz, independent per input)`);
    }
  }
  lines.push(`Gol 0 npole nint inn 1   ; input stage, gm = 1 S`);
  lines.push(`Gload npole 0 npole 0 ${(1 / OPAMP_DC_GAIN).toExponential(6)}   ; A0 = ${OPAMP_DC_GAIN.toExponential(0)} as a noiseless conductance`);
  lines.push(`Cpole npole 0 ${spiceNumber(1 / (2 * Math.PI * opAmp.gbwHz))}   ; pole at GBW/A0: unity gain at GBW`);
  lines.push(`Eout out 0 npole 0 1   ; ideal output buffer (no rail clipping)`);
  lines.push(`.ends ${name}`);
  return lines;
}

// ---------------------------------------------------------------------------------------------
// The netlist

/** Default sweep of the AC, noise and CMRR analyses. */
export function defaultSweep(plan: ChannelPlan, options: Pick<NetlistOptions, 'startHz' | 'stopHz' | 'pointsPerDecade'> = {}): { startHz: number; stopHz: number; pointsPerDecade: number } {
  return {
    startHz: options.startHz ?? 1e-3,
    stopHz: options.stopHz ?? plan.adc.sampleRateHz,
    pointsPerDecade: options.pointsPerDecade ?? 100,
  };
}

/**
 * The planned chain as a SPICE netlist (ngspice dialect; runs in batch mode).
 * Nodes worth probing: `in_p`/`in_n` (instrumentation inputs), `va`/`vb` (first-stage outputs),
 * `ina` (instrumentation output), `hp` (high-pass output), `g2` (gain-stage output),
 * `lp` (low-pass output), `adc` (converter input), `vref` (reference).
 * @param plan a parsed (valid) channel plan
 * @param options the analysis and its settings
 * @returns the netlist text
 */
export function planToNetlist(plan: ChannelPlan, options: NetlistOptions): string {
  const T = plan.temperatureK;
  const tempC = T - KELVIN_AT_0_C;
  const sweep = defaultSweep(plan, options);
  const ina = resolveInstrumentation(plan, options.resistors);
  const cmrrOn = options.opAmpCmrr ?? true;
  const signs = { a1: 1, a2: 1, a3: 1, ...options.opAmpCmrrSigns } as const;
  const inaModel = (sign: -1 | 1) => (!cmrrOn ? 'opamp_ina' : sign === 1 ? 'opamp_ina' : 'opamp_ina_neg');
  const needNegative = cmrrOn && [signs.a1, signs.a2, signs.a3].includes(-1);
  const commonModeAt = options.commonModeAt ?? 'body';
  const directToAmplifier = (options.bypassInput ?? false) || (options.analysis === 'cmrr' && commonModeAt === 'amplifier');
  const L: string[] = [];

  L.push(`* Channelsmith channel plan "${plan.name.replace(/[\r\n]+/g, ' ')}" (${options.analysis} analysis)`);
  L.push(`* Generated from the plan: a planning aid, not a verified design. Small-signal linear model: no rail clipping.`);
  L.push(`.options TEMP=${Number(tempC.toFixed(4))} TNOM=${Number(tempC.toFixed(4))}   ; plan temperature ${T} K`);
  L.push('');
  L.push('* ---- op-amp macro-models');
  const currentNoise = options.currentNoise ?? true;
  L.push(...opAmpSubcircuit('opamp_ina', plan.instrumentation.opAmp, { temperatureK: T, cmrrSign: cmrrOn ? 1 : 0, currentNoise }));
  if (needNegative) {
    L.push('* the same op-amp with its common-mode error of the opposite sign');
    L.push(...opAmpSubcircuit('opamp_ina_neg', plan.instrumentation.opAmp, { temperatureK: T, cmrrSign: -1, currentNoise }));
  }
  // The gain-stage op-amp's current noise flows into resistors whose values the plan leaves open
  // (the high-pass resistor, Rf ∥ Ri), so it is left out rather than invented.
  L.push(...opAmpSubcircuit('opamp_gain', plan.gainStage.opAmp, { temperatureK: T, cmrrSign: cmrrOn ? 1 : 0, currentNoise: false }));
  L.push('');

  // ---- sources
  L.push('* ---- sources');
  const acDiff = options.analysis === 'ac' || options.analysis === 'noise' ? 1 : 0;
  if (options.analysis === 'tran') {
    const t = { stepS: 1e-3, stopS: 2, amplitudeV: 3e-3, startS: 0.1, widthS: 0.1, ...options.tran };
    L.push(`Vd vd 0 PULSE(0 ${spiceNumber(t.amplitudeV)} ${spiceNumber(t.startS)} 1u 1u ${spiceNumber(t.widthS - 1e-6)} 1000)   ; differential rectangular pulse`);
  } else {
    L.push(`Vd vd 0 DC 0 AC ${acDiff}   ; differential test signal (electrode DC offset not applied: small-signal model)`);
  }
  L.push(`Ep src_p body vd 0 0.5   ; half the differential signal on the positive lead`);
  L.push(`En src_n body vd 0 -0.5   ; and the opposite half on the negative lead`);
  if (options.analysis === 'cmrr') {
    L.push(`Vcm body 0 DC 0 AC 1   ; common-mode test source on the ${commonModeAt === 'body' ? 'body' : 'amplifier inputs'}`);
    L.push(`Rground body 0 ${spiceNumber(plan.electrodes.groundOhm)}   ; reference electrode (shunted by the ideal common-mode source)`);
  } else {
    L.push(`Rground body 0 ${spiceNumber(plan.electrodes.groundOhm)}   ; reference electrode: body to circuit ground`);
  }
  L.push(`Vref vref 0 DC ${spiceNumber(plan.supply.referenceV)}   ; reference (mid-supply) voltage`);
  L.push('');

  if (directToAmplifier) {
    L.push('* ---- electrodes and input protection left out: the sources drive the amplifier inputs');
    L.push('Vlink_p src_p in_p DC 0');
    L.push('Vlink_n src_n in_n DC 0');
  } else {
    const e = plan.electrodes;
    const mismatch = (options.electrodeMismatch ?? true) ? (e.impedanceMismatch ?? 0) : 0;
    L.push('* ---- electrodes: Ze = Rs + Rp∥Cp in each lead; imbalance network in the positive lead');
    for (const side of ['p', 'n'] as const) {
      const from = `src_${side}`;
      const k = side === 'p' ? 1 + mismatch : 1;
      const note = side === 'p' && mismatch > 0 ? ` (× ${1 + mismatch}: electrode mismatch)` : '';
      L.push(`Rs_${side} ${from} e1_${side} ${spiceNumber(Math.max(e.rsOhm * k, 1e-6))}   ; electrode series resistance${note}`);
      L.push(`Rp_${side} e1_${side} e2_${side} ${spiceNumber(e.rpOhm * k)}   ; electrode parallel resistance${note}`);
      if (e.cpF > 0) L.push(`Cp_${side} e1_${side} e2_${side} ${spiceNumber(e.cpF / k)}   ; electrode parallel capacitance${note}`);
    }
    const withImbalance = options.imbalance ?? true;
    if (!withImbalance) {
      L.push('Vimb e2_p e3_p DC 0   ; imbalance network left out of this analysis');
    } else if (e.imbalanceROhm > 0) {
      L.push(`Rimb e2_p e3_p ${spiceNumber(e.imbalanceROhm)}   ; imbalance resistance (positive lead)`);
      if (e.imbalanceCF > 0) L.push(`Cimb e2_p e3_p ${spiceNumber(e.imbalanceCF)}   ; imbalance capacitance`);
    } else {
      L.push('Vimb e2_p e3_p DC 0   ; no imbalance network (Rimb = 0 shorts Rimb || Cimb)');
    }
    L.push('Vimb_n e2_n e3_n DC 0   ; negative lead: no imbalance network');
    L.push('');
    const pr = plan.protection;
    L.push('* ---- input protection');
    for (const side of ['p', 'n'] as const) {
      if (pr.seriesROhm > 0) L.push(`Rprot_${side} e3_${side} in_${side} ${spiceNumber(pr.seriesROhm)}   ; series protection resistor`);
      else L.push(`Vprot_${side} e3_${side} in_${side} DC 0   ; no series protection resistor`);
    }
    if (pr.filter.enabled) {
      if (pr.filter.cDiffF > 0 && (options.cDiff ?? true)) L.push(`Cdiff in_p in_n ${spiceNumber(pr.filter.cDiffF)}   ; differential filter capacitor`);
      if (pr.filter.cCmF > 0) {
        L.push(`Ccm_p in_p 0 ${spiceNumber(pr.filter.cCmF * (1 + pr.filter.cCmMismatch))}   ; common-mode capacitor, positive input (+${pr.filter.cCmMismatch * 100} % mismatch)`);
        L.push(`Ccm_n in_n 0 ${spiceNumber(pr.filter.cCmF)}   ; common-mode capacitor, negative input`);
      }
    }
  }
  L.push('');

  // ---- amplifier common-mode input impedance
  const op = plan.instrumentation.opAmp;
  const rcmOhm = op.inputCmOhm ?? DEFAULT_INPUT_CM_OHM;
  const ccmAmpF = op.inputCmF ?? DEFAULT_INPUT_CM_F;
  L.push(`* ---- common-mode input impedance of each amplifier input${op.inputCmOhm === undefined || op.inputCmF === undefined ? ' (assumed where the plan gives none)' : ''}`);
  for (const side of ['p', 'n'] as const) {
    L.push(`Rcm_${side} in_${side} 0 ${spiceNumber(rcmOhm)} noisy=0   ; common-mode input resistance (model element, noiseless)`);
    if (ccmAmpF > 0) L.push(`Ccmamp_${side} in_${side} 0 ${spiceNumber(ccmAmpF)}   ; common-mode input capacitance`);
  }
  L.push('');

  // ---- instrumentation stage
  L.push(`* ---- instrumentation stage: G1 = 1 + (R1 + R2)/Rg = ${Number(ina.g1.toPrecision(7))}, Gd = R4/R3 = ${Number(ina.gd.toPrecision(7))}`);
  L.push(`XA1 in_p fa va ${inaModel(signs.a1)}   ; input op-amp A1 (positive input)`);
  L.push(`XA2 in_n fb vb ${inaModel(signs.a2)}   ; input op-amp A2 (negative input)`);
  L.push(`R1 va fa ${spiceNumber(ina.r1Ohm)}   ; feedback R of A1`);
  if (Number.isFinite(ina.rgOhm)) L.push(`Rg fa fb ${spiceNumber(ina.rgOhm)}   ; gain resistor`);
  else L.push('* Rg omitted: G1 = 1');
  L.push(`R2 vb fb ${spiceNumber(ina.r2Ohm)}   ; feedback R of A2`);
  L.push(`R3inv vb d_n ${spiceNumber(ina.r3InvOhm)}   ; difference stage: input resistor from VB`);
  L.push(`R4inv d_n ina ${spiceNumber(ina.r4InvOhm)}   ; difference stage: feedback resistor`);
  L.push(`R3ref va d_p ${spiceNumber(ina.r3RefOhm)}   ; difference stage: input resistor from VA`);
  L.push(`R4ref d_p vref ${spiceNumber(ina.r4RefOhm)}   ; difference stage: resistor to the reference`);
  L.push(`XA3 d_p d_n ina ${inaModel(signs.a3)}   ; difference op-amp A3: ina = Gd·(VA − VB) + Vref`);
  L.push('');

  // ---- high-pass
  const hp = plan.highPass;
  if (hp.order === 0) {
    L.push('* ---- no high-pass (DC-coupled)');
    L.push('Vhp ina hp DC 0');
  } else if (hp.order === 1) {
    const rOhm = 1 / (2 * Math.PI * hp.fcHz * HIGH_PASS_CAP_F);
    L.push(`* ---- first-order high-pass, fc = ${spiceNumber(hp.fcHz)}Hz (τ = RC)`);
    L.push(`Chp ina hp ${spiceNumber(HIGH_PASS_CAP_F)}   ; series capacitor`);
    L.push(`Rhp hp vref ${spiceNumber(rOhm)} noisy=0   ; resistor to the reference (value follows from the chosen C: noiseless)`);
  } else {
    // Unity-gain Sallen-Key high-pass, equal C: ω0 = 1/(C·√(R1·R2)), Q = ½·√(R2/R1); Butterworth Q = 1/√2 → R2 = 2·R1.
    const rOhm = 1 / (2 * Math.PI * hp.fcHz * HIGH_PASS_CAP_F);
    L.push(`* ---- second-order Butterworth high-pass, fc = ${spiceNumber(hp.fcHz)}Hz (unity-gain Sallen-Key, equal C, Q = 1/√2)`);
    L.push(`Chp1 ina hpa ${spiceNumber(HIGH_PASS_CAP_F)}   ; first series capacitor`);
    L.push(`Chp2 hpa hpb ${spiceNumber(HIGH_PASS_CAP_F)}   ; second series capacitor`);
    L.push(`Rhp1 hpa hp ${spiceNumber(rOhm / Math.SQRT2)} noisy=0   ; feedback resistor R/√2 (noiseless: value follows from the chosen C)`);
    L.push(`Rhp2 hpb vref ${spiceNumber(rOhm * Math.SQRT2)} noisy=0   ; resistor to the reference R·√2`);
    L.push('Ehp hp vref hpb vref 1   ; ideal unity buffer');
  }
  L.push('');

  // ---- gain stage
  const g2 = plan.gainStage.gain;
  L.push(`* ---- gain stage: non-inverting, G2 = 1 + Rf/Ri = ${Number(g2.toPrecision(7))}`);
  if (g2 > 1) {
    L.push('XA4 hp g2n g2 opamp_gain   ; gain-stage op-amp');
    L.push(`Rf g2 g2n ${spiceNumber((g2 - 1) * GAIN_STAGE_RI_OHM)} noisy=0   ; feedback resistor (noiseless: the plan fixes only the ratio)`);
    L.push(`Ri g2n vref ${spiceNumber(GAIN_STAGE_RI_OHM)} noisy=0   ; input resistor to the reference`);
  } else {
    L.push('XA4 hp g2 g2 opamp_gain   ; gain-stage op-amp as a follower');
  }
  L.push('');

  // ---- anti-alias low-pass
  const lp = plan.gainStage.lowPass;
  const sections = lowPassSections(lp.kind, lp.order);
  const w3dB = 2 * Math.PI * lp.fcHz;
  L.push(`* ---- anti-alias low-pass: ${lp.kind}, order ${lp.order}, −3 dB at ${spiceNumber(lp.fcHz)}Hz; ideal buffers, noiseless resistors`);
  if (plan.gainStage.filterNoiseVPerRtHz > 0) {
    const fn = noiseGeneratorLines('fnoise', { density: plan.gainStage.filterNoiseVPerRtHz, cornerHz: 0 }, T);
    L.push(...fn.lines);
    L.push(`Efn lpin g2 ${fn.plus} ${fn.minus} 1   ; filter-network noise, at the filter input (shaped by the low-pass)`);
  } else {
    L.push('Vfn lpin g2 DC 0   ; no filter-network noise stated');
  }
  let node = 'lpin';
  sections.forEach((s, index) => {
    const k = index + 1;
    const out = index === sections.length - 1 ? 'lp' : `lp${k}`;
    const w0 = s.w0Normalized * w3dB;
    const R = LOW_PASS_RES_OHM;
    if (s.kind === 'real') {
      L.push(`* section ${k}: real pole at ${spiceNumber(w0 / (2 * Math.PI))}Hz`);
      L.push(`Rlp${k} ${node} lp${k}x ${spiceNumber(R)} noisy=0   ; RC section resistor`);
      L.push(`Clp${k} lp${k}x vref ${spiceNumber(1 / (w0 * R))}   ; RC section capacitor, C = 1/(w0*R)`);
      L.push(`Elp${k} ${out} vref lp${k}x vref 1   ; ideal buffer`);
    } else {
      // Unity-gain Sallen-Key low-pass, equal R: C1 (feedback) = 2Q/(ω0·R), C2 (to reference) = 1/(2Q·ω0·R).
      L.push(`* section ${k}: pole pair f0 = ${spiceNumber(w0 / (2 * Math.PI))}Hz, Q = ${s.q.toFixed(6)} (unity-gain Sallen-Key, equal R)`);
      L.push(`Rlp${k}a ${node} lp${k}a ${spiceNumber(R)} noisy=0   ; first series resistor`);
      L.push(`Rlp${k}b lp${k}a lp${k}b ${spiceNumber(R)} noisy=0   ; second series resistor`);
      L.push(`Clp${k}a lp${k}a ${out} ${spiceNumber((2 * s.q) / (w0 * R))}   ; feedback capacitor`);
      L.push(`Clp${k}b lp${k}b vref ${spiceNumber(1 / (2 * s.q * w0 * R))}   ; capacitor to the reference`);
      L.push(`Elp${k} ${out} vref lp${k}b vref 1   ; ideal buffer`);
    }
    node = out;
  });
  L.push('');

  // ---- filter-network noise and ADC input
  const fsHz = plan.adc.sampleRateHz;
  L.push('* ---- the converter input');
  const lsbV = plan.adc.fullScaleV / 2 ** plan.adc.bits;
  const adcNoiseVrms = Math.sqrt(plan.adc.inputNoiseVrms ** 2 + (lsbV * lsbV) / 12);
  if ((options.adcNoise ?? true) && adcNoiseVrms > 0) {
    const density = adcNoiseVrms / Math.sqrt(fsHz / 2);
    L.push(`* ADC: ${plan.adc.bits} bits over ${spiceNumber(plan.adc.fullScaleV)}V (LSB ${spiceNumber(lsbV)}V); input noise ${spiceNumber(plan.adc.inputNoiseVrms)}Vrms and LSB/√12 spread over fs/2 = ${spiceNumber(fsHz / 2)}Hz`);
    const an = noiseGeneratorLines('adcn', { density, cornerHz: 0 }, T);
    L.push(...an.lines);
    L.push(`Ean adc lp ${an.plus} ${an.minus} 1   ; converter noise referred to its input`);
  } else {
    L.push('Van adc lp DC 0   ; converter noise not modelled');
  }
  L.push(`Radc adc vref 1G noisy=0   ; converter input (high impedance, noiseless)`);
  L.push('');

  // ---- analysis
  L.push('* ---- analysis');
  const decSweep = `dec ${sweep.pointsPerDecade} ${spiceNumber(sweep.startHz)} ${spiceNumber(sweep.stopHz)}`;
  const probes = 'v(in_p,in_n) v(va,vb) v(ina) v(hp) v(g2) v(lp) v(adc)';
  const prefix = options.controlOutputPrefix;
  if (prefix === undefined) {
    if (options.analysis === 'ac' || options.analysis === 'cmrr') {
      L.push(`.ac ${decSweep}`);
      L.push(options.analysis === 'ac' ? '.print ac vdb(adc) vp(adc) vdb(ina) vdb(hp)' : '.print ac vdb(in_p,in_n) vdb(ina) vdb(adc)');
    } else if (options.analysis === 'noise') {
      L.push(`.noise v(adc) Vd ${decSweep}`);
      L.push('.print noise all   ; spectra and totals; input-referred = onoise / |gain| at each frequency');
    } else {
      const t = { stepS: 1e-3, stopS: 2, ...options.tran };
      L.push(`.tran ${spiceNumber(t.stepS)} ${spiceNumber(t.stopS)}`);
      L.push('.print tran v(vd) v(ina) v(hp) v(adc)');
    }
  } else {
    L.push('.control');
    L.push('set wr_singlescale');
    L.push('set wr_vecnames');
    L.push('set numdgt=10');
    if (options.analysis === 'ac' || options.analysis === 'cmrr') {
      L.push(`ac ${decSweep}`);
      L.push(`wrdata ${prefix}.${options.analysis}.txt ${probes}`);
    } else if (options.analysis === 'noise') {
      L.push(`ac ${decSweep}`);
      L.push(`wrdata ${prefix}.ac.txt ${probes}`);
      L.push(`noise v(adc) Vd ${decSweep}`);
      L.push(`wrdata ${prefix}.noise-total.txt onoise_total inoise_total`);
      L.push('setplot previous');
      L.push(`wrdata ${prefix}.noise.txt onoise_spectrum inoise_spectrum`);
    } else {
      const t = { stepS: 1e-3, stopS: 2, ...options.tran };
      L.push(`tran ${spiceNumber(t.stepS)} ${spiceNumber(t.stopS)} 0 ${spiceNumber(t.stepS)}`);
      L.push(`linearize v(vd) v(ina) v(hp) v(adc)`);
      L.push(`wrdata ${prefix}.tran.txt v(vd) v(ina) v(hp) v(adc)`);
    }
    L.push('destroy all');
    L.push('.endc');
  }
  L.push('.end');
  return toAscii(L.join('\n') + '\n');
}
