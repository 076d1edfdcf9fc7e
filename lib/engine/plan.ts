/**
 * The channel plan: the engine's input. SI units inside; every numeric field
 * carries its unit in its name (`offsetV`, `rgOhm`, `fcHz`, `cpF`, `enVPerRtHz`).
 * Fractions (tolerances, mismatches) are plain ratios: 0.001 = 0.1 %.
 *
 * The schema is the single source of truth for the plan's shape: the UI forms,
 * the route handlers, the CLI and the committed JSON Schema all derive from it.
 */
import { z } from 'zod';

/** Built-in requirement profiles (see `profiles.ts`). */
export const builtInProfileIds = [
  'diagnostic-ecg',
  'monitoring-ecg',
  'ambulatory-ecg',
  'surface-emg',
  'eeg',
] as const;
export type BuiltInProfileId = (typeof builtInProfileIds)[number];

const finite = (what: string) =>
  z
    .number({
      error: (issue) =>
        typeof issue.input === 'number' ? `${what} must be a finite number` : issue.input === undefined ? 'is required' : `${what} must be a number`,
    }).refine(Number.isFinite, { message: `${what} must be a finite number` });
/** A strictly positive finite quantity (resistance, capacitance, frequency, ...). */
const positive = (what: string) => finite(what).refine((v) => v > 0, { message: `${what} must be greater than zero` });
/** A finite quantity that may be zero but not negative. */
const nonNegative = (what: string) => finite(what).refine((v) => v >= 0, { message: `${what} must not be negative` });
/** A ratio between 0 (inclusive) and 1 (exclusive). */
const fraction = (what: string) =>
  finite(what).refine((v) => v >= 0 && v < 1, { message: `${what} must be a fraction from 0 to below 1 (0.01 = 1 %)` });

/** Operational-amplifier parameters shared by the instrumentation stage and the gain stage. */
export const opAmpSchema = z.object({
  /** Input voltage-noise density in the white region, V/√Hz. */
  enVPerRtHz: positive('voltage-noise density'),
  /** 1/f corner of the voltage noise, Hz (0 = no 1/f region). */
  enCornerHz: nonNegative('voltage-noise 1/f corner'),
  /** Input current-noise density in the white region, A/√Hz. */
  inAPerRtHz: nonNegative('current-noise density'),
  /** 1/f corner of the current noise, Hz (0 = no 1/f region). */
  inCornerHz: nonNegative('current-noise 1/f corner'),
  /** The op-amp's own common-mode rejection at DC, dB. */
  cmrrDb: positive('op-amp CMRR'),
  /** Gain-bandwidth product, Hz. */
  gbwHz: positive('gain-bandwidth product'),
  /** Input bias current (magnitude), A. */
  biasA: nonNegative('input bias current'),
  /** Input offset voltage (magnitude, worst case), V. */
  offsetV: nonNegative('input offset voltage'),
  /** How close the input common-mode voltage may come to the negative rail, V (negative = beyond the rail). */
  inputCmFromNegV: finite('input common-mode limit from the negative rail'),
  /** How close the input common-mode voltage may come to the positive rail, V (negative = beyond the rail). */
  inputCmFromPosV: finite('input common-mode limit from the positive rail'),
  /** Output swing: closest approach to the negative rail, V. */
  outputFromNegV: nonNegative('output swing to the negative rail'),
  /** Output swing: closest approach to the positive rail, V. */
  outputFromPosV: nonNegative('output swing to the positive rail'),
  /** Common-mode input resistance of each input, Ω (optional; the engine assumes 1 TΩ and says so when omitted). */
  inputCmOhm: positive('common-mode input resistance').optional(),
  /** Common-mode input capacitance of each input, F (optional; the engine assumes 3 pF and says so when omitted). */
  inputCmF: nonNegative('common-mode input capacitance').optional(),
  /** Where the values come from (part library entry, datasheet revision, assumption). */
  source: z.string().max(500).default(''),
});
export type OpAmp = z.infer<typeof opAmpSchema>;

export const electrodesSchema = z.object({
  /** Worst-case electrode DC offset between the two measuring electrodes (magnitude), V. Profiles may impose a larger test value. */
  offsetV: nonNegative('electrode DC offset'),
  /** Series resistance of each electrode (Ze = Rs + Rp∥Cp), Ω. */
  rsOhm: nonNegative('electrode series resistance'),
  /** Parallel resistance of each electrode, Ω. */
  rpOhm: positive('electrode parallel resistance'),
  /** Parallel capacitance of each electrode, F. */
  cpF: nonNegative('electrode parallel capacitance'),
  /** Imbalance network added in series with one lead: Rimb ∥ Cimb (e.g. 51 kΩ ∥ 47 nF). */
  imbalanceROhm: nonNegative('imbalance resistance'),
  imbalanceCF: nonNegative('imbalance capacitance'),
  /** Impedance magnitude of the reference / right-leg electrode, Ω. */
  groundOhm: positive('reference electrode impedance'),
  /** Relative difference of the electrode impedance between the two measuring leads (0.2 = one lead 20 % higher); optional, used for the DC
   * mismatch, the mains imbalance and the Monte Carlo. When omitted only the imbalance network counts as mismatch. */
  impedanceMismatch: fraction('electrode impedance mismatch').optional(),
  /** Where the electrode values come from. */
  source: z.string().max(500).default(''),
});

export const bodySchema = z.discriminatedUnion('mode', [
  z.object({
    /** Body common-mode voltage from displacement currents (Metting van Rijn et al., 1990). */
    mode: z.literal('coupling'),
    /** Mains voltage, V rms. */
    mainsVrms: positive('mains voltage'),
    /** Body-to-mains capacitance, F (≈ 3 pF). */
    bodyToMainsF: positive('body-to-mains capacitance'),
    /** Body-to-ground capacitance, F (≈ 300 pF). */
    bodyToGroundF: positive('body-to-ground capacitance'),
  }),
  z.object({
    /** A directly stated common-mode voltage on the body. */
    mode: z.literal('direct'),
    /** Common-mode voltage on the body at mains frequency, V rms. */
    cmVrms: nonNegative('body common-mode voltage'),
  }),
]);

export const protectionSchema = z.object({
  /** Series resistor in each lead, Ω (0 = none). */
  seriesROhm: nonNegative('series protection resistance'),
  /** Optional RC filter after the series resistors. */
  filter: z.object({
    enabled: z.boolean(),
    /** Differential capacitor across the two inputs, F. */
    cDiffF: nonNegative('differential filter capacitance'),
    /** Common-mode capacitor from each input to the reference, F. */
    cCmF: nonNegative('common-mode filter capacitance'),
    /** Relative mismatch between the two common-mode capacitors (0.05 = 5 %). */
    cCmMismatch: fraction('common-mode capacitor mismatch'),
  }),
});

export const instrumentationSchema = z
  .object({
    /** Feedback resistor of each input op-amp, Ω (G1 = 1 + 2R/Rg). */
    rOhm: positive('feedback resistance R'),
    /** Gain resistor Rg, Ω. Give either rgOhm or targetGain. */
    rgOhm: positive('gain resistance Rg').optional(),
    /** Target first-stage gain G1 (≥ 1); Rg is then derived as 2R/(G1 − 1). */
    targetGain: finite('target first-stage gain').refine((v) => v >= 1, { message: 'target first-stage gain must be at least 1' }).optional(),
    /** Difference-stage input resistor R3, Ω. */
    r3Ohm: positive('difference-stage resistance R3'),
    /** Difference-stage gain Gd = R4/R3. */
    diffGain: positive('difference-stage gain'),
    /** Resistor tolerance of the difference stage (and R, Rg), fraction (0.001 = 0.1 %). */
    resistorTolerance: fraction('resistor tolerance'),
    /** The three op-amps of the stage (identical nominal parameters). */
    opAmp: opAmpSchema,
  })
  .superRefine((v, ctx) => {
    const given = Number(v.rgOhm !== undefined) + Number(v.targetGain !== undefined);
    if (given !== 1) {
      ctx.addIssue({ code: 'custom', path: ['rgOhm'], message: 'give exactly one of gain resistance Rg or target first-stage gain' });
    }
  });

export const supplySchema = z.object({
  /** Positive rail, V. */
  positiveV: finite('positive rail'),
  /** Negative rail, V (0 for a single supply). */
  negativeV: finite('negative rail'),
  /** Reference (mid-scale) voltage driven onto the instrumentation stage's reference pin, V. */
  referenceV: finite('reference voltage'),
});

export const highPassSchema = z.object({
  /** 0 = DC-coupled (no high-pass), 1 or 2 = first or second order (second order is Butterworth). */
  order: z.union([z.literal(0), z.literal(1), z.literal(2)], { error: 'high-pass order must be 0 (none), 1 or 2' }),
  /** −3 dB corner, Hz (ignored when order is 0). */
  fcHz: positive('high-pass corner'),
});

export const gainStageSchema = z.object({
  /** Gain of the second stage, V/V. */
  gain: finite('second-stage gain').refine((v) => v >= 1, { message: 'second-stage gain must be at least 1' }),
  lowPass: z.object({
    /** Filter family. */
    kind: z.enum(['butterworth', 'bessel'], { error: 'low-pass kind must be butterworth or bessel' }),
    /** Order 1–8. */
    order: z.number().int({ message: 'low-pass order must be a whole number' }).min(1, { message: 'low-pass order must be at least 1' }).max(8, { message: 'low-pass order must be at most 8' }),
    /** −3 dB corner, Hz. */
    fcHz: positive('low-pass corner'),
  }),
  /** Output-referred noise density of the filter network itself (resistors, excess), V/√Hz; the op-amp's e_n is separate. */
  filterNoiseVPerRtHz: nonNegative('filter noise density'),
  opAmp: opAmpSchema,
});

export const adcSchema = z.object({
  bits: z.number().int({ message: 'ADC resolution must be a whole number of bits' }).min(8, { message: 'ADC resolution must be at least 8 bits' }).max(32, { message: 'ADC resolution must be at most 32 bits' }),
  /** Full-scale input span, V (peak to peak of the input range). */
  fullScaleV: positive('ADC full-scale range'),
  /** Input voltage at mid-scale, V. */
  midScaleV: finite('ADC mid-scale voltage'),
  /** Sample rate, Hz. */
  sampleRateHz: positive('sample rate'),
  /** Input-referred noise of the converter, V rms (over fs/2). */
  inputNoiseVrms: nonNegative('ADC input noise'),
});

export const rightLegDriveSchema = z.object({
  enabled: z.boolean(),
  /** Loop gain of the common-mode feedback at mains frequency, V/V. */
  loopGain: nonNegative('right-leg-drive loop gain'),
  /** Output (protection) resistor of the driver, Ω. */
  outputROhm: nonNegative('right-leg-drive output resistor'),
  /** Current limit of the driver into the patient, A. */
  currentLimitA: nonNegative('right-leg-drive current limit'),
});

export const leadOffSchema = z.object({
  mode: z.enum(['none', 'dc', 'ac'], { error: 'lead-off mode must be none, dc or ac' }),
  /** Excitation current per lead, A (peak for AC). */
  currentA: nonNegative('lead-off current'),
  /** Excitation frequency for AC lead-off, Hz. */
  frequencyHz: nonNegative('lead-off frequency'),
});

export const planSchema = z
  .object({
    schemaVersion: z.literal(1, { error: 'schemaVersion must be 1' }),
    name: z.string().trim().min(1, { message: 'plan name must not be empty' }).max(200, { message: 'plan name must be at most 200 characters' }),
    /** A built-in profile id, or `custom` with `customProfile` given. */
    profileId: z.union([z.enum(builtInProfileIds), z.literal('custom')], { error: 'unknown requirement profile' }),
    /** Mains frequency, Hz. */
    mainsHz: z.union([z.literal(50), z.literal(60)], { error: 'mains frequency must be 50 or 60 Hz' }),
    /** Temperature for thermal noise, K. */
    temperatureK: positive('temperature').refine((v) => v < 400, { message: 'temperature must be below 400 K' }),
    /** Applied-part type for the IEC 60601-1 patient-current limits. */
    appliedPart: z.enum(['BF', 'CF'], { error: 'applied part must be BF or CF' }),
    /** Largest differential signal amplitude expected, V (peak); defaults to the profile's value when omitted. */
    signalAmplitudeV: nonNegative('signal amplitude').optional(),
    electrodes: electrodesSchema,
    body: bodySchema,
    protection: protectionSchema,
    instrumentation: instrumentationSchema,
    supply: supplySchema,
    highPass: highPassSchema,
    gainStage: gainStageSchema,
    adc: adcSchema,
    rightLegDrive: rightLegDriveSchema,
    leadOff: leadOffSchema,
    /** Custom requirement profile (required when profileId is `custom`); shape in `profiles.ts`. */
    customProfile: z.unknown().optional(),
  })
  .superRefine((p, ctx) => {
    for (const issue of crossFieldIssues(p)) ctx.addIssue({ code: 'custom', path: issue.path, message: issue.message });
  });

export type ChannelPlan = z.infer<typeof planSchema>;
/** The plan as written in JSON before defaults apply. */
export type ChannelPlanInput = z.input<typeof planSchema>;

/** Reads a nested value from an unknown object without throwing. */
function at(root: unknown, path: readonly string[]): unknown {
  let v: unknown = root;
  for (const key of path) {
    if (v === null || typeof v !== 'object') return undefined;
    v = (v as Record<string, unknown>)[key];
  }
  return v;
}

function num(root: unknown, ...path: string[]): number | undefined {
  const v = at(root, path);
  return typeof v === 'number' && Number.isFinite(v) ? v : undefined;
}

/**
 * Rules between fields (rails, corners against Nyquist, ...). Written against an unknown value
 * so that they also run when other fields are already invalid: every offending field is listed.
 * @param p the plan (possibly invalid)
 * @returns issues with their path as an array of keys
 */
export function crossFieldIssues(p: unknown): { path: string[]; message: string }[] {
  const issues: { path: string[]; message: string }[] = [];
  const pos = num(p, 'supply', 'positiveV');
  const neg = num(p, 'supply', 'negativeV');
  const ref = num(p, 'supply', 'referenceV');
  if (pos !== undefined && neg !== undefined) {
    if (pos <= neg) {
      issues.push({ path: ['supply', 'positiveV'], message: 'positive rail must be above the negative rail' });
    } else if (ref !== undefined && (ref < neg || ref > pos)) {
      issues.push({ path: ['supply', 'referenceV'], message: 'reference voltage must lie between the rails' });
    }
  }
  const fs = num(p, 'adc', 'sampleRateHz');
  const lpHz = num(p, 'gainStage', 'lowPass', 'fcHz');
  if (fs !== undefined && fs > 0 && lpHz !== undefined && lpHz >= fs / 2) {
    issues.push({ path: ['gainStage', 'lowPass', 'fcHz'], message: `low-pass corner must be below the Nyquist frequency (${fs / 2} Hz)` });
  }
  const hpOrder = num(p, 'highPass', 'order');
  const hpHz = num(p, 'highPass', 'fcHz');
  if (hpOrder !== undefined && hpOrder > 0 && hpHz !== undefined && lpHz !== undefined && lpHz > 0 && hpHz >= lpHz) {
    issues.push({ path: ['highPass', 'fcHz'], message: 'high-pass corner must be below the low-pass corner' });
  }
  if (at(p, ['leadOff', 'mode']) === 'ac') {
    const f = num(p, 'leadOff', 'frequencyHz');
    if (f !== undefined && f <= 0) issues.push({ path: ['leadOff', 'frequencyHz'], message: 'AC lead-off needs an excitation frequency above zero' });
  }
  const instrumentation = at(p, ['instrumentation']);
  if (instrumentation !== null && typeof instrumentation === 'object') {
    const given = Number(at(p, ['instrumentation', 'rgOhm']) !== undefined) + Number(at(p, ['instrumentation', 'targetGain']) !== undefined);
    if (given !== 1) issues.push({ path: ['instrumentation', 'rgOhm'], message: 'give exactly one of gain resistance Rg or target first-stage gain' });
  }
  if (at(p, ['profileId']) === 'custom' && at(p, ['customProfile']) === undefined) {
    issues.push({ path: ['customProfile'], message: 'a custom profile must be given when profileId is custom' });
  }
  return issues;
}
