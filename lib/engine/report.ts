/**
 * The engine's output: a typed, JSON-serialisable report. SI units throughout; every numeric
 * field carries its unit in its name (V, A, Ω, Hz, s, dB; `share` and `margin` are fractions).
 */

/** One circuit node checked against its allowed range. */
export type NodeLevel = {
  name: string;
  /** Lowest and highest voltage the node reaches (worst-case offset, signal, common mode), V. */
  minV: number;
  maxV: number;
  /** The node's allowed range (op-amp swing, input common-mode range, ADC full scale), V. */
  lowLimitV: number;
  highLimitV: number;
  /** Distance to the nearest limit, V (negative = out of range). */
  headroomV: number;
  /** Headroom as a fraction of the allowed range. */
  headroomFraction: number;
};

export type StageId = 'electrodes' | 'protection' | 'instrumentation' | 'high-pass' | 'gain-stage' | 'adc' | 'right-leg-drive' | 'lead-off';

export type StageLevels = { id: StageId; name: string; /** Mid-band voltage gain, V/V. */ gain: number; nodes: NodeLevel[] };

export type ResponsePoint = { fHz: number; magDb: number; phaseDeg: number };

export type FrequencyResponse = {
  /** −3 dB corners relative to mid-band, Hz (lowCornerHz = 0 for a DC-coupled chain). */
  lowCornerHz: number;
  highCornerHz: number;
  midbandGainDb: number;
  /** Frequency at which the mid-band gain is taken, Hz. */
  midbandHz: number;
  /** Attenuation relative to mid-band at fs − band high (the first alias of the band edge), dB. */
  aliasAttenuationDb: number;
  /** Attenuation relative to mid-band at fs/2, dB. */
  attenuationAtNyquistDb: number;
  points: ResponsePoint[];
  stages: { id: StageId | 'input'; points: ResponsePoint[] }[];
};

export type ImpulseTest = {
  /** Largest baseline displacement after the pulse, V (input-referred). */
  displacementV: number;
  /** Largest slope after the pulse, V/s (input-referred). */
  slopeVPerS: number;
  amplitudeV: number;
  durationS: number;
};

export type Recovery = {
  /** Time for the chain to return within range after the step, s (null = never, DC-coupled and saturated). */
  timeS: number | null;
  /** Step applied at the input, V. */
  stepV: number;
  /** Allowed residual at the high-pass output, V. */
  bandV: number;
};

export type NoiseContribution = { name: string; rmsV: number; /** Fraction of the total noise power. */ share: number; stageId: StageId };

export type NoiseReport = {
  rtiRmsV: number;
  /** 6.6 × rms (common practice for Gaussian noise, no source). */
  rtiPpV: number;
  /** Thermal noise of the electrode source impedance alone, integrated the same way, V rms. */
  floorRmsV: number;
  bandLowHz: number;
  bandHighHz: number;
  contributions: NoiseContribution[];
  densityPoints: { fHz: number; totalVPerRtHz: number; byContributor: Record<string, number> }[];
};

export type CmrrReport = {
  dcDb: number;
  mainsDb: number;
  /** Lowest CMRR over the profile band and mains frequency, dB. */
  worstCaseDb: number;
  /** Worst-case resistor-limited CMRR of the stage, G1·(1 + Gd)/(4t), dB. */
  resistorLimitedDb: number;
  points: { fHz: number; cmrrDb: number }[];
};

export type InterferenceReport = {
  /** Common-mode voltage on the body at mains frequency, V rms. */
  bodyCmV: number;
  /** Total mains interference referred to input, V peak-to-peak (terms added in magnitude: worst case). */
  rtiPpV: number;
  terms: { name: string; rtiPpV: number }[];
  /** Whether the right-leg drive would need more current than its limit (its loop then gives no reduction). */
  rightLegDriveSaturated: boolean;
  cmrTest: { rtiPpV: number; limitPpV: number; vcmRms: number } | null;
};

export type AdcReport = {
  lsbV: number;
  lsbRtiV: number;
  /** Full-scale span referred to input, V. */
  rangeRtiV: number;
  snrIdealDb: number;
  /** Whether offset (as it reaches the converter) plus signal stays within full scale. */
  fitsOffset: boolean;
  /** Codes spanned by the peak-to-peak signal. */
  codesSpanned: number;
};

export type Verdict = 'meets' | 'marginal' | 'fails';

export type Check = {
  id: string;
  title: string;
  value: number;
  limit: number;
  unit: string;
  /** 'atMost': value must not exceed limit; 'atLeast': value must reach limit. */
  sense: 'atMost' | 'atLeast';
  /** Relative margin (limit − value)/|limit| or (value − limit)/|limit|; for a zero limit, the difference itself. */
  margin: number;
  verdict: Verdict;
  source: string;
  sourceVerified: boolean;
  /** The stage that causes the result (for links in the UI). */
  stageId: StageId;
};

export type PatientCurrents = {
  /** DC current per lead in normal condition (bias + DC lead-off), A. */
  dcA: number;
  /** AC current per lead in normal condition (AC lead-off), A rms. */
  acA: number;
  /** IEC 60601-1 normal-condition limit for DC, A. */
  limitNormalA: number;
  /** IEC 60601-1 single-fault limit for DC, A. */
  limitSingleFaultA: number;
  limitNormalAcA: number;
  limitSingleFaultAcA: number;
  /** Current the right-leg driver could push with its output at a rail (single fault), A; 0 without a driver. */
  rightLegFaultA: number;
};

export type Suggestion = { id: string; checkId: string; title: string; detail: string; patch: { path: string; value: number } };

export type Warning = { id: string; message: string };

export type ChannelReport = {
  engineVersion: string;
  planName: string;
  profile: { id: string; name: string };
  gains: { g1: number; rgOhm: number; gd: number; g2: number; totalGain: number };
  /** Worst-case differential DC input used for the levels (offset, bias and lead-off terms, op-amp offsets, signal), V. */
  worstCaseInputV: number;
  stages: StageLevels[];
  maxFirstStageGain: number;
  maxFirstStageGainDetail: { limitingNode: string; rgOhm: number | null };
  commonModeWindow: { vdV: number; minV: number; maxV: number; vertices: { vcmV: number; voutV: number }[] };
  response: FrequencyResponse;
  impulseTest: ImpulseTest;
  recovery: Recovery;
  noise: NoiseReport;
  cmrr: CmrrReport;
  interference: InterferenceReport;
  adc: AdcReport;
  patientCurrents: PatientCurrents;
  checks: Check[];
  suggestions: Suggestion[];
  warnings: Warning[];
  assumptions: string[];
};
