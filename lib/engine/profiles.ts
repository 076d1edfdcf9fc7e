/**
 * Requirement profiles: named sets of limits with their test conditions and sources. The built-in
 * five are data; custom profiles use the same schema (`profileSchema`).
 *
 * Sources are summarised in our own words (standard + clause topic). `sourceVerified: false`
 * marks values recalled from memory or taken as common practice — they must be checked against
 * the primary text before a design relies on them. Confidence as gathered in the engine notes:
 * H = found in a secondary source quoting the clause, M = partly confirmed, L = from memory.
 */
import { z } from 'zod';
import type { BuiltInProfileId } from './plan';

const finiteNumber = (what: string) =>
  z.number({ error: `${what} must be a number` }).refine(Number.isFinite, { message: `${what} must be a finite number` });
const positiveNumber = (what: string) => finiteNumber(what).refine((v) => v > 0, { message: `${what} must be greater than zero` });

/** One limit: value (SI unit given by the key), the test condition, and where it comes from. */
export const limitSpecSchema = z.object({
  value: finiteNumber('limit value'),
  condition: z.string().max(1000),
  source: z.string().min(1, { message: 'every limit needs a source (standard and clause topic, or "common practice, no source")' }).max(500),
  sourceVerified: z.boolean(),
});
export type LimitSpec = z.infer<typeof limitSpecSchema>;

/** The profile's common-mode rejection test: a common-mode voltage with an imbalance in one lead. */
export const cmrTestSchema = limitSpecSchema.extend({
  /** Common-mode voltage on the leads' common node, V rms at mains frequency. */
  vcmRms: positiveNumber('test common-mode voltage'),
  /** Imbalance network in one lead: R ∥ C. */
  imbalanceROhm: positiveNumber('test imbalance resistance'),
  imbalanceCF: finiteNumber('test imbalance capacitance').refine((v) => v >= 0, { message: 'test imbalance capacitance must not be negative' }),
  /** DC offset applied during the test, V. */
  dcOffsetV: finiteNumber('test DC offset'),
  /** Observation window, s. */
  windowS: positiveNumber('test window'),
});

export const profileSchema = z.object({
  id: z.string().min(1, { message: 'profile id must not be empty' }).max(100),
  name: z.string().min(1, { message: 'profile name must not be empty' }).max(200),
  application: z.enum(['ecg', 'emg', 'eeg'], { error: 'application must be ecg, emg or eeg' }),
  description: z.string().max(2000),
  /** Largest differential signal, V peak, used when the plan gives none. */
  signalAmplitude: limitSpecSchema,
  /** Electrode DC offset the channel must tolerate, V (magnitude). */
  dcOffset: limitSpecSchema,
  /** The band of interest, Hz, used for flatness, alias and noise integration. */
  band: z.object({ lowHz: positiveNumber('band low edge'), highHz: positiveNumber('band high edge') }),
  checks: z.object({
    /** The −3 dB low corner must be at or below this, Hz. */
    lowCornerMaxHz: limitSpecSchema.optional(),
    /** The −3 dB high corner must be at or above this, Hz. */
    highCornerMinHz: limitSpecSchema.optional(),
    /** Noise referred to input, V peak-to-peak, over `windowS`. */
    noisePpV: limitSpecSchema.extend({ windowS: positiveNumber('noise window') }).optional(),
    /** Mains interference referred to input in use, V peak-to-peak. */
    mainsInterferencePpV: limitSpecSchema.optional(),
    cmrTest: cmrTestSchema.optional(),
    /** Minimum CMRR at mains frequency, dB. */
    cmrrMinDb: limitSpecSchema.optional(),
    /** Low-frequency impulse test (3 mV × 100 ms): displacement after the pulse, V. */
    impulseDisplacementV: limitSpecSchema.extend({ amplitudeV: positiveNumber('pulse amplitude'), durationS: positiveNumber('pulse duration') }).optional(),
    /** Low-frequency impulse test: slope after the pulse, V/s. */
    impulseSlopeVPerS: limitSpecSchema.extend({ amplitudeV: positiveNumber('pulse amplitude'), durationS: positiveNumber('pulse duration') }).optional(),
    /** Minimum input impedance of each lead to the common, Ω, at the listed frequencies. */
    inputImpedanceMinOhm: limitSpecSchema.extend({ frequenciesHz: z.array(positiveNumber('test frequency')).min(1) }).optional(),
    /** Maximum DC current in any input lead, A. */
    dcLeadCurrentMaxA: limitSpecSchema.optional(),
    /** Minimum sample rate, Hz. */
    sampleRateMinHz: limitSpecSchema.optional(),
    /** Largest LSB referred to input, V. */
    lsbMaxV: limitSpecSchema.optional(),
    /** Minimum attenuation of the first alias (fs − band high), dB. */
    aliasMinDb: limitSpecSchema.optional(),
    /** Largest gain error (fraction) for the tolerance yield. */
    gainErrorMax: limitSpecSchema.optional(),
  }),
});
export type RequirementProfile = z.infer<typeof profileSchema>;

const COMMON_PRACTICE = 'common practice, no source';

const aliasCheck: LimitSpec = {
  value: 40,
  condition: 'attenuation at fs − band high relative to mid-band',
  source: COMMON_PRACTICE,
  sourceVerified: false,
};

const mainsInUse = (value: number): LimitSpec => ({
  value,
  condition: 'body common mode from displacement currents, referred to input, at mains frequency',
  source: 'Metting van Rijn, Peper & Grimbergen 1990 (Med. Biol. Eng. Comput.): 1–10 µV p-p interference is acceptable',
  sourceVerified: true,
});

const ecgImpulse = {
  amplitudeV: 3e-3,
  durationS: 0.1,
};

/** The five built-in profiles. */
export const builtInProfiles: Record<BuiltInProfileId, RequirementProfile> = {
  'diagnostic-ecg': {
    id: 'diagnostic-ecg',
    name: 'Diagnostic ECG',
    application: 'ecg',
    description: 'Resting 12-lead diagnostic electrocardiograph (IEC 60601-2-25, AAMI EC11 topics).',
    signalAmplitude: { value: 5e-3, condition: 'differential input dynamic range ±5 mV', source: 'IEC 60601-2-25, input dynamic range topic (from memory)', sourceVerified: false },
    dcOffset: { value: 0.3, condition: '±300 mV DC applied during the input-impedance and common-mode tests', source: 'IEC 60601-2-25, electrode offset tolerance during the input impedance and CMR tests', sourceVerified: true },
    band: { lowHz: 0.05, highHz: 150 },
    checks: {
      lowCornerMaxHz: { value: 0.05, condition: '−3 dB low corner at 0.05 Hz or lower', source: 'AHA 2007 recommendations for the standardization of the ECG, low-frequency response', sourceVerified: false },
      highCornerMinHz: { value: 150, condition: '−3 dB high corner at 150 Hz or higher (adults; 250 Hz for children)', source: 'AHA 2007 recommendations for the standardization of the ECG, high-frequency response', sourceVerified: false },
      noisePpV: { value: 30e-6, windowS: 10, condition: '≤ 30 µV peak-to-valley referred to input over 10 s with 51 kΩ ∥ 47 nF in the leads (10 repeats, at least 9 pass)', source: 'IEC 60601-2-25, system noise topic', sourceVerified: false },
      mainsInterferencePpV: mainsInUse(10e-6),
      cmrTest: { value: 1e-3, vcmRms: 10, imbalanceROhm: 51e3, imbalanceCF: 47e-9, dcOffsetV: 0.3, windowS: 10, condition: '20 V rms mains through 100 pF (≈ 10 V rms on the lead node), 51 kΩ ∥ 47 nF in each lead in turn, ±300 mV DC: ≤ 1 mV peak-to-valley referred to input', source: 'IEC 60601-2-25, common-mode rejection topic', sourceVerified: false },
      impulseDisplacementV: { value: 0.1e-3, ...ecgImpulse, condition: '3 mV × 100 ms rectangular pulse: baseline displacement after the pulse ≤ 0.1 mV', source: 'IEC 60601-2-25, low-frequency (impulse) response topic (from memory)', sourceVerified: false },
      impulseSlopeVPerS: { value: 0.3e-3, ...ecgImpulse, condition: '3 mV × 100 ms rectangular pulse: slope after the pulse ≤ 0.3 mV/s', source: 'IEC 60601-2-25, low-frequency (impulse) response topic', sourceVerified: true },
      inputImpedanceMinOhm: { value: 2.5e6, frequenciesHz: [0.67, 40], condition: '≥ 2.5 MΩ per lead: ≤ 20 % amplitude drop with 620 kΩ ∥ 4.7 nF in series, at 0.67 Hz and 40 Hz, with ±300 mV DC', source: 'IEC 60601-2-25, input impedance topic', sourceVerified: true },
      dcLeadCurrentMaxA: { value: 0.1e-6, condition: 'DC current through any patient electrode lead ≤ 0.1 µA', source: 'AAMI EC11, DC current per input lead topic', sourceVerified: true },
      lsbMaxV: { value: 5e-6, condition: 'amplitude quantization ≤ 5 µV referred to input', source: 'AHA 2007 recommendations, amplitude resolution (from memory)', sourceVerified: false },
      aliasMinDb: aliasCheck,
      gainErrorMax: { value: 0.05, condition: 'gain within ±5 %', source: 'IEC 60601-2-25, gain accuracy topic (from memory)', sourceVerified: false },
    },
  },
  'monitoring-ecg': {
    id: 'monitoring-ecg',
    name: 'Monitoring ECG',
    application: 'ecg',
    description: 'Bedside or wearable ECG monitoring (IEC 60601-2-27, AAMI EC13 topics).',
    signalAmplitude: { value: 5e-3, condition: 'differential input dynamic range ±5 mV', source: 'IEC 60601-2-27, input dynamic range topic (from memory)', sourceVerified: false },
    dcOffset: { value: 0.3, condition: '±300 mV DC electrode offset tolerance', source: 'IEC 60601-2-27, electrode offset topic (from memory)', sourceVerified: false },
    band: { lowHz: 0.67, highHz: 40 },
    checks: {
      lowCornerMaxHz: { value: 0.67, condition: '−3 dB low corner at 0.67 Hz or lower (−3 dB allowed at the band edge)', source: 'IEC 60601-2-27, frequency response topic', sourceVerified: false },
      highCornerMinHz: { value: 40, condition: '−3 dB high corner at 40 Hz or higher', source: 'IEC 60601-2-27, frequency response topic', sourceVerified: false },
      noisePpV: { value: 30e-6, windowS: 10, condition: '≤ 30 µV peak-to-valley referred to input with 51 kΩ ∥ 47 nF in the leads', source: 'IEC 60601-2-27, system noise topic', sourceVerified: true },
      mainsInterferencePpV: mainsInUse(10e-6),
      cmrTest: { value: 1e-3, vcmRms: 10, imbalanceROhm: 51e3, imbalanceCF: 47e-9, dcOffsetV: 0.3, windowS: 60, condition: '≈ 10 V rms common mode, 51 kΩ ∥ 47 nF in every lead in turn, ±300 mV DC: ≤ 1 mV peak-to-valley referred to input over 60 s', source: 'IEC 60601-2-27, common-mode rejection topic', sourceVerified: true },
      aliasMinDb: aliasCheck,
      lsbMaxV: { value: 10e-6, condition: 'LSB referred to input ≤ 10 µV (a third of the noise limit)', source: COMMON_PRACTICE, sourceVerified: false },
      gainErrorMax: { value: 0.05, condition: 'gain within ±5 %', source: 'IEC 60601-2-27, gain accuracy topic (from memory)', sourceVerified: false },
    },
  },
  'ambulatory-ecg': {
    id: 'ambulatory-ecg',
    name: 'Ambulatory ECG',
    application: 'ecg',
    description: 'Long-term ambulatory (Holter-type) ECG recording (IEC 60601-2-47 topics).',
    signalAmplitude: { value: 5e-3, condition: 'differential input dynamic range ±5 mV', source: 'IEC 60601-2-47, input dynamic range topic (from memory)', sourceVerified: false },
    dcOffset: { value: 0.3, condition: '±300 mV DC electrode offset tolerance', source: 'IEC 60601-2-47, electrode offset topic', sourceVerified: false },
    band: { lowHz: 0.67, highHz: 40 },
    checks: {
      lowCornerMaxHz: { value: 0.67, condition: '−3 dB low corner at 0.67 Hz or lower', source: 'IEC 60601-2-47, frequency response topic (from memory)', sourceVerified: false },
      highCornerMinHz: { value: 40, condition: '−3 dB high corner at 40 Hz or higher', source: 'IEC 60601-2-47, frequency response topic (from memory)', sourceVerified: false },
      noisePpV: { value: 50e-6, windowS: 10, condition: '≤ 50 µV peak-to-valley referred to input over 10 s', source: 'IEC 60601-2-47, noise topic (from memory)', sourceVerified: false },
      mainsInterferencePpV: mainsInUse(10e-6),
      cmrrMinDb: { value: 60, condition: 'common-mode rejection ≥ 60 dB at mains frequency', source: 'IEC 60601-2-47, common-mode rejection topic', sourceVerified: false },
      inputImpedanceMinOhm: { value: 10e6, frequenciesHz: [10], condition: 'input impedance > 10 MΩ at 10 Hz', source: 'IEC 60601-2-47, input impedance topic', sourceVerified: false },
      aliasMinDb: aliasCheck,
      lsbMaxV: { value: 10e-6, condition: 'LSB referred to input ≤ 10 µV', source: COMMON_PRACTICE, sourceVerified: false },
      gainErrorMax: { value: 0.05, condition: 'gain within ±5 %', source: 'IEC 60601-2-47, gain accuracy topic (from memory)', sourceVerified: false },
    },
  },
  'surface-emg': {
    id: 'surface-emg',
    name: 'Surface EMG',
    application: 'emg',
    description: 'Surface electromyography with bipolar electrodes (SENIAM and ISEK recommendations).',
    signalAmplitude: { value: 5e-3, condition: 'surface EMG up to about ±5 mV', source: 'surface EMG amplitude range (from memory)', sourceVerified: false },
    dcOffset: { value: 0.3, condition: 'electrode DC offset ±300 mV, as for ECG electrodes', source: COMMON_PRACTICE, sourceVerified: false },
    band: { lowHz: 20, highHz: 450 },
    checks: {
      lowCornerMaxHz: { value: 20, condition: 'high-pass corner between 10 and 20 Hz (at most 20 Hz)', source: 'SENIAM recommendations for surface EMG, filtering topic', sourceVerified: false },
      highCornerMinHz: { value: 450, condition: 'low-pass corner about 500 Hz (at least 450 Hz); no notch filter', source: 'SENIAM recommendations for surface EMG, filtering topic', sourceVerified: false },
      noisePpV: { value: 20e-6, windowS: 1, condition: 'noise referred to input ≤ 20 µV p-p in the band', source: 'surface EMG noise level (from memory)', sourceVerified: false },
      mainsInterferencePpV: mainsInUse(10e-6),
      sampleRateMinHz: { value: 1000, condition: 'sampling at 1 kHz or faster', source: 'SENIAM recommendations for surface EMG, sampling topic (from memory)', sourceVerified: false },
      aliasMinDb: aliasCheck,
      lsbMaxV: { value: 5e-6, condition: 'LSB referred to input ≤ 5 µV', source: COMMON_PRACTICE, sourceVerified: false },
      gainErrorMax: { value: 0.05, condition: 'gain within ±5 %', source: COMMON_PRACTICE, sourceVerified: false },
    },
  },
  eeg: {
    id: 'eeg',
    name: 'EEG',
    application: 'eeg',
    description: 'Electroencephalography (IEC 80601-2-26 topics).',
    signalAmplitude: { value: 1e-3, condition: 'EEG up to about ±1 mV including artefacts', source: 'EEG amplitude range (from memory)', sourceVerified: false },
    dcOffset: { value: 0.15, condition: '±150 mV DC applied during the common-mode test', source: 'IEC 80601-2-26, common-mode rejection test conditions', sourceVerified: false },
    band: { lowHz: 0.5, highHz: 50 },
    checks: {
      lowCornerMaxHz: { value: 0.5, condition: '−3 dB low corner at 0.5 Hz or lower', source: 'IEC 80601-2-26, frequency response topic (from memory)', sourceVerified: false },
      highCornerMinHz: { value: 50, condition: '−3 dB high corner at 50 Hz or higher', source: 'IEC 80601-2-26, frequency response topic (from memory)', sourceVerified: false },
      noisePpV: { value: 6e-6, windowS: 10, condition: '≤ 6 µV peak-to-valley referred to input', source: 'IEC 80601-2-26, noise topic', sourceVerified: true },
      mainsInterferencePpV: mainsInUse(1e-6),
      cmrTest: { value: 2 * 2 * Math.SQRT2 * 10 ** (-90 / 20), vcmRms: 2, imbalanceROhm: 10e3, imbalanceCF: 47e-9, dcOffsetV: 0.15, windowS: 10, condition: '2 V rms common mode, 10 kΩ ∥ 47 nF in one lead, ±150 mV DC; limit taken as 90 dB rejection (from memory) = 179 µV p-v', source: 'IEC 80601-2-26, common-mode rejection topic (limit from memory)', sourceVerified: false },
      aliasMinDb: aliasCheck,
      lsbMaxV: { value: 0.5e-6, condition: 'LSB referred to input ≤ 0.5 µV', source: COMMON_PRACTICE, sourceVerified: false },
      gainErrorMax: { value: 0.05, condition: 'gain within ±5 %', source: 'IEC 80601-2-26, gain accuracy topic (from memory)', sourceVerified: false },
    },
  },
};

/** IEC 60601-1 patient leakage / patient auxiliary current limits, A (normal condition, single fault). */
export const patientCurrentLimits = {
  CF: { dc: { normalA: 10e-6, singleFaultA: 50e-6 }, ac: { normalA: 10e-6, singleFaultA: 50e-6 } },
  BF: { dc: { normalA: 10e-6, singleFaultA: 50e-6 }, ac: { normalA: 100e-6, singleFaultA: 500e-6 } },
} as const;
/** Source text for the patient-current limits. */
export const patientCurrentSource = 'IEC 60601-1, patient leakage and patient auxiliary current limits for type BF and CF applied parts';

/**
 * The profile a plan refers to: a built-in one, or its validated custom profile.
 * @throws Error when a custom profile does not match the schema (parsePlan reports this as a field error first)
 */
export function profileFor(profileId: string, customProfile?: unknown): RequirementProfile {
  if (profileId !== 'custom') return builtInProfiles[profileId as BuiltInProfileId];
  return profileSchema.parse(customProfile);
}
