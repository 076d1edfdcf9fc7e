/**
 * The stages of a channel plan as the workspace shows them, and the fields of each stage form:
 * where the value lives in the plan, its accessible label, its unit. Pure data and small helpers;
 * no React.
 */
import { builtInProfileIds } from '@/lib/engine/plan';
import type { ExpectedUnit } from '@/lib/units/parse-quantity';

/** Stage identifiers; they match the plan's top-level keys (the profile stage holds the plan-wide settings and the supply). */
export const stageIds = [
  'profile',
  'electrodes',
  'protection',
  'instrumentation',
  'highPass',
  'gainStage',
  'adc',
  'rightLegDrive',
  'leadOff',
] as const;
export type StageId = (typeof stageIds)[number];

export interface StageInfo {
  id: StageId;
  /** Card title. */
  title: string;
  /** Used in the accessible name of the card button: "Open instrumentation stage". */
  noun: string;
  /** Optional stages are drawn apart from the signal path. */
  optional: boolean;
  /** The part-library kind that can fill this stage, if any. */
  partKind?: 'instrumentation-amplifier' | 'operational-amplifier' | 'converter' | 'electrode';
}

export const stages: Record<StageId, StageInfo> = {
  profile: { id: 'profile', title: 'Profile and supply', noun: 'profile and supply', optional: false },
  electrodes: { id: 'electrodes', title: 'Electrodes and body', noun: 'electrodes', optional: false, partKind: 'electrode' },
  protection: { id: 'protection', title: 'Input protection', noun: 'protection', optional: false },
  instrumentation: {
    id: 'instrumentation',
    title: 'Instrumentation stage',
    noun: 'instrumentation stage',
    optional: false,
    partKind: 'instrumentation-amplifier',
  },
  highPass: { id: 'highPass', title: 'High-pass', noun: 'high-pass', optional: false },
  gainStage: { id: 'gainStage', title: 'Gain and low-pass', noun: 'gain and low-pass', optional: false, partKind: 'operational-amplifier' },
  adc: { id: 'adc', title: 'Converter', noun: 'converter', optional: false, partKind: 'converter' },
  rightLegDrive: { id: 'rightLegDrive', title: 'Right-leg drive', noun: 'right-leg drive', optional: true },
  leadOff: { id: 'leadOff', title: 'Lead-off detection', noun: 'lead-off detection', optional: true },
};

/** The signal path, left to right, and the optional stages drawn below it. */
export const signalPathStageIds: StageId[] = ['electrodes', 'protection', 'instrumentation', 'highPass', 'gainStage', 'adc'];
export const optionalStageIds: StageId[] = ['rightLegDrive', 'leadOff'];

interface FieldBase {
  /** Where the value lives in the plan. */
  path: string[];
  /** Accessible label, also used in messages ("Gain resistance Rg"). */
  label: string;
  /** Short name that prefixes an inline error ("Rg: expected a resistance (Ω), got a capacitance"). */
  short: string;
  /** Shown when the field applies only in some configurations. */
  visibleWhen?: (plan: unknown) => boolean;
  /** Help text under the input. */
  hint?: string;
}

/** A physical quantity typed with its unit ("51 kΩ"). */
export interface QuantityField extends FieldBase {
  kind: 'quantity';
  unit: ExpectedUnit;
  /** Unit symbol for display ("Ω", "V/√Hz"). */
  symbol: string;
  /** Optional plan fields: an empty input removes the key (the engine then uses its stated default). */
  optional?: boolean;
}
/** A plain ratio shown and typed as per cent ("0.1 %"). */
export interface PercentField extends FieldBase {
  kind: 'percent';
  optional?: boolean;
}
/** A dimensionless number (gain, bits, order); `integer` refuses fractions. */
export interface NumberField extends FieldBase {
  kind: 'number';
  integer?: boolean;
  /** Unit word shown after the value (e.g. "V/V", "bits", "K"); a trailing copy of it is accepted when typed. */
  suffix?: string;
  optional?: boolean;
}
export interface SelectField extends FieldBase {
  kind: 'select';
  options: { value: string | number; label: string }[];
}
export interface BooleanField extends FieldBase {
  kind: 'boolean';
}
export interface TextField extends FieldBase {
  kind: 'text';
  maxLength: number;
}
export type FieldDef = QuantityField | PercentField | NumberField | SelectField | BooleanField | TextField;

/** Reads a nested value without throwing. */
export function getAt(root: unknown, path: readonly string[]): unknown {
  let v: unknown = root;
  for (const key of path) {
    if (v === null || typeof v !== 'object') return undefined;
    v = (v as Record<string, unknown>)[key];
  }
  return v;
}

/** The form field name of a plan path (react-hook-form treats dots as nesting, so underscores join the keys). */
export function fieldKey(path: readonly string[]): string {
  return path.join('_');
}

const q = (path: string[], label: string, short: string, unit: ExpectedUnit, symbol: string, extra: Partial<QuantityField> = {}): QuantityField => ({
  kind: 'quantity',
  path,
  label,
  short,
  unit,
  symbol,
  ...extra,
});

/** The op-amp parameters, under `base` (instrumentation.opAmp or gainStage.opAmp). */
function opAmpFields(base: string[]): FieldDef[] {
  const p = (k: string) => [...base, k];
  return [
    q(p('enVPerRtHz'), 'Voltage-noise density en', 'en', 'V/rtHz', 'V/√Hz'),
    q(p('enCornerHz'), 'Voltage-noise 1/f corner', 'en corner', 'Hz', 'Hz'),
    q(p('inAPerRtHz'), 'Current-noise density in', 'in', 'A/rtHz', 'A/√Hz'),
    q(p('inCornerHz'), 'Current-noise 1/f corner', 'in corner', 'Hz', 'Hz'),
    q(p('cmrrDb'), 'Op-amp CMRR', 'CMRR', 'dB', 'dB'),
    q(p('gbwHz'), 'Gain-bandwidth product', 'GBW', 'Hz', 'Hz'),
    q(p('biasA'), 'Input bias current', 'Ib', 'A', 'A'),
    q(p('offsetV'), 'Input offset voltage', 'Vos', 'V', 'V'),
    q(p('inputCmFromNegV'), 'Input common-mode limit from negative rail', 'CM limit (−)', 'V', 'V', {
      hint: 'negative = beyond the rail',
    }),
    q(p('inputCmFromPosV'), 'Input common-mode limit from positive rail', 'CM limit (+)', 'V', 'V', {
      hint: 'negative = beyond the rail',
    }),
    q(p('outputFromNegV'), 'Output swing to negative rail', 'swing (−)', 'V', 'V'),
    q(p('outputFromPosV'), 'Output swing to positive rail', 'swing (+)', 'V', 'V'),
    q(p('inputCmOhm'), 'Common-mode input resistance', 'Rcm', 'ohm', 'Ω', { optional: true, hint: 'empty: the engine assumes 1 TΩ' }),
    q(p('inputCmF'), 'Common-mode input capacitance', 'Ccm', 'F', 'F', { optional: true, hint: 'empty: the engine assumes 3 pF' }),
    { kind: 'text', path: p('source'), label: 'Op-amp source note', short: 'source', maxLength: 500 },
  ];
}

const bodyIs = (mode: string) => (plan: unknown) => getAt(plan, ['body', 'mode']) === mode;
const filterOn = (plan: unknown) => getAt(plan, ['protection', 'filter', 'enabled']) === true;
const hpOn = (plan: unknown) => getAt(plan, ['highPass', 'order']) !== 0;
const rldOn = (plan: unknown) => getAt(plan, ['rightLegDrive', 'enabled']) === true;
const leadOffOn = (plan: unknown) => getAt(plan, ['leadOff', 'mode']) !== 'none';

const profileLabels: Record<string, string> = {
  'diagnostic-ecg': 'Diagnostic ECG',
  'monitoring-ecg': 'Monitoring ECG',
  'ambulatory-ecg': 'Ambulatory ECG',
  'surface-emg': 'Surface EMG',
  eeg: 'EEG',
  custom: 'Custom profile',
};

/** The fields of each stage form, in display order. */
export const stageFields: Record<StageId, FieldDef[]> = {
  profile: [
    { kind: 'text', path: ['name'], label: 'Plan name', short: 'name', maxLength: 200 },
    {
      kind: 'select',
      path: ['profileId'],
      label: 'Requirement profile',
      short: 'profile',
      options: [...builtInProfileIds, 'custom'].map((id) => ({ value: id, label: profileLabels[id] ?? id })),
    },
    {
      kind: 'select',
      path: ['mainsHz'],
      label: 'Mains frequency',
      short: 'mains',
      options: [
        { value: 50, label: '50 Hz' },
        { value: 60, label: '60 Hz' },
      ],
    },
    { kind: 'number', path: ['temperatureK'], label: 'Temperature', short: 'temperature', suffix: 'K' },
    {
      kind: 'select',
      path: ['appliedPart'],
      label: 'Applied part type',
      short: 'applied part',
      options: [
        { value: 'BF', label: 'BF' },
        { value: 'CF', label: 'CF' },
      ],
    },
    q(['signalAmplitudeV'], 'Largest signal amplitude', 'signal', 'V', 'V', { optional: true, hint: "empty: the profile's value" }),
    q(['supply', 'positiveV'], 'Positive rail', 'V+', 'V', 'V'),
    q(['supply', 'negativeV'], 'Negative rail', 'V−', 'V', 'V'),
    q(['supply', 'referenceV'], 'Reference voltage', 'Vref', 'V', 'V'),
  ],
  electrodes: [
    q(['electrodes', 'offsetV'], 'Electrode DC offset', 'offset', 'V', 'V'),
    q(['electrodes', 'rsOhm'], 'Electrode series resistance Rs', 'Rs', 'ohm', 'Ω'),
    q(['electrodes', 'rpOhm'], 'Electrode parallel resistance Rp', 'Rp', 'ohm', 'Ω'),
    q(['electrodes', 'cpF'], 'Electrode parallel capacitance Cp', 'Cp', 'F', 'F'),
    { kind: 'percent', path: ['electrodes', 'impedanceMismatch'], label: 'Electrode impedance mismatch', short: 'mismatch', optional: true },
    q(['electrodes', 'imbalanceROhm'], 'Imbalance resistance', 'Rimb', 'ohm', 'Ω'),
    q(['electrodes', 'imbalanceCF'], 'Imbalance capacitance', 'Cimb', 'F', 'F'),
    q(['electrodes', 'groundOhm'], 'Reference electrode impedance', 'Zref', 'ohm', 'Ω'),
    { kind: 'text', path: ['electrodes', 'source'], label: 'Electrode source note', short: 'source', maxLength: 500 },
    {
      kind: 'select',
      path: ['body', 'mode'],
      label: 'Body common-mode model',
      short: 'body model',
      options: [
        { value: 'coupling', label: 'Capacitive coupling to mains' },
        { value: 'direct', label: 'Stated common-mode voltage' },
      ],
    },
    q(['body', 'mainsVrms'], 'Mains voltage (rms)', 'mains', 'V', 'V', { visibleWhen: bodyIs('coupling') }),
    q(['body', 'bodyToMainsF'], 'Body-to-mains capacitance', 'Cbm', 'F', 'F', { visibleWhen: bodyIs('coupling') }),
    q(['body', 'bodyToGroundF'], 'Body-to-ground capacitance', 'Cbg', 'F', 'F', { visibleWhen: bodyIs('coupling') }),
    q(['body', 'cmVrms'], 'Body common-mode voltage (rms)', 'Vcm', 'V', 'V', { visibleWhen: bodyIs('direct') }),
  ],
  protection: [
    q(['protection', 'seriesROhm'], 'Series resistance per lead', 'Rseries', 'ohm', 'Ω'),
    { kind: 'boolean', path: ['protection', 'filter', 'enabled'], label: 'Input RC filter', short: 'filter' },
    q(['protection', 'filter', 'cDiffF'], 'Differential filter capacitance', 'Cdiff', 'F', 'F', { visibleWhen: filterOn }),
    q(['protection', 'filter', 'cCmF'], 'Common-mode filter capacitance', 'Ccm', 'F', 'F', { visibleWhen: filterOn }),
    { kind: 'percent', path: ['protection', 'filter', 'cCmMismatch'], label: 'Common-mode capacitor mismatch', short: 'Ccm mismatch', visibleWhen: filterOn },
  ],
  instrumentation: [
    q(['instrumentation', 'rOhm'], 'Feedback resistance R', 'R', 'ohm', 'Ω'),
    q(['instrumentation', 'rgOhm'], 'Gain resistance Rg', 'Rg', 'ohm', 'Ω', { optional: true }),
    { kind: 'number', path: ['instrumentation', 'targetGain'], label: 'First-stage gain', short: 'G1', suffix: 'V/V', optional: true },
    q(['instrumentation', 'r3Ohm'], 'Difference-stage resistance R3', 'R3', 'ohm', 'Ω'),
    { kind: 'number', path: ['instrumentation', 'diffGain'], label: 'Difference-stage gain Gd', short: 'Gd', suffix: 'V/V' },
    { kind: 'percent', path: ['instrumentation', 'resistorTolerance'], label: 'Resistor tolerance', short: 'tolerance' },
    ...opAmpFields(['instrumentation', 'opAmp']),
  ],
  highPass: [
    {
      kind: 'select',
      path: ['highPass', 'order'],
      label: 'High-pass order',
      short: 'order',
      options: [
        { value: 0, label: 'none (DC-coupled)' },
        { value: 1, label: 'first order' },
        { value: 2, label: 'second order (Butterworth)' },
      ],
    },
    q(['highPass', 'fcHz'], 'High-pass corner', 'fc', 'Hz', 'Hz', { visibleWhen: hpOn }),
  ],
  gainStage: [
    { kind: 'number', path: ['gainStage', 'gain'], label: 'Second-stage gain', short: 'G2', suffix: 'V/V' },
    {
      kind: 'select',
      path: ['gainStage', 'lowPass', 'kind'],
      label: 'Low-pass family',
      short: 'family',
      options: [
        { value: 'butterworth', label: 'Butterworth' },
        { value: 'bessel', label: 'Bessel' },
      ],
    },
    {
      kind: 'select',
      path: ['gainStage', 'lowPass', 'order'],
      label: 'Low-pass order',
      short: 'order',
      options: [1, 2, 3, 4, 5, 6, 7, 8].map((n) => ({ value: n, label: String(n) })),
    },
    q(['gainStage', 'lowPass', 'fcHz'], 'Low-pass corner', 'fc', 'Hz', 'Hz'),
    q(['gainStage', 'filterNoiseVPerRtHz'], 'Filter noise density', 'filter noise', 'V/rtHz', 'V/√Hz'),
    ...opAmpFields(['gainStage', 'opAmp']),
  ],
  adc: [
    { kind: 'number', path: ['adc', 'bits'], label: 'Converter resolution', short: 'bits', suffix: 'bits', integer: true },
    q(['adc', 'fullScaleV'], 'Full-scale range', 'full scale', 'V', 'V'),
    q(['adc', 'midScaleV'], 'Mid-scale voltage', 'mid-scale', 'V', 'V'),
    q(['adc', 'sampleRateHz'], 'Sample rate', 'fs', 'Hz', 'Hz'),
    q(['adc', 'inputNoiseVrms'], 'Converter input noise (rms)', 'ADC noise', 'V', 'V'),
  ],
  rightLegDrive: [
    { kind: 'boolean', path: ['rightLegDrive', 'enabled'], label: 'Right-leg drive enabled', short: 'enabled' },
    { kind: 'number', path: ['rightLegDrive', 'loopGain'], label: 'Right-leg-drive loop gain', short: 'loop gain', suffix: 'V/V', visibleWhen: rldOn },
    q(['rightLegDrive', 'outputROhm'], 'Driver output resistor', 'Rout', 'ohm', 'Ω', { visibleWhen: rldOn }),
    q(['rightLegDrive', 'currentLimitA'], 'Driver current limit', 'Ilimit', 'A', 'A', { visibleWhen: rldOn }),
  ],
  leadOff: [
    {
      kind: 'select',
      path: ['leadOff', 'mode'],
      label: 'Lead-off detection',
      short: 'mode',
      options: [
        { value: 'none', label: 'none' },
        { value: 'dc', label: 'DC current' },
        { value: 'ac', label: 'AC current' },
      ],
    },
    q(['leadOff', 'currentA'], 'Lead-off current', 'I', 'A', 'A', { visibleWhen: leadOffOn }),
    q(['leadOff', 'frequencyHz'], 'Lead-off excitation frequency', 'f', 'Hz', 'Hz', {
      visibleWhen: (plan) => getAt(plan, ['leadOff', 'mode']) === 'ac',
    }),
  ],
};

/** Every field of every stage, with its stage. */
export const allFields: { stageId: StageId; field: FieldDef }[] = stageIds.flatMap((stageId) =>
  stageFields[stageId].map((field) => ({ stageId, field })),
);

/** Finds the field definition of a plan path (exact match), if the forms show it. */
export function findField(path: readonly (string | number)[]): { stageId: StageId; field: FieldDef } | undefined {
  const key = path.map(String).join('.');
  return allFields.find((f) => f.field.path.join('.') === key);
}

/** The stage a plan path belongs to (by its first key; supply and plan-wide settings belong to the profile stage). */
export function stageOfPath(path: readonly (string | number)[]): StageId {
  const head = String(path[0] ?? '');
  if (head === 'body') return 'electrodes';
  if ((stageIds as readonly string[]).includes(head)) return head as StageId;
  return 'profile';
}
