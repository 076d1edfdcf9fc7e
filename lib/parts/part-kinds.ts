/**
 * Part-library entries: instrumentation amplifiers, operational amplifiers, converters and
 * electrode types. SI units inside, the unit in every numeric field name. Each numeric field
 * carries metadata (label, expected unit, plausible range) in {@link partFieldMeta} so the CSV
 * importer can parse "8 nV/√Hz" into the field and give range errors that name the field.
 *
 * The plausible ranges are wide sanity limits to catch unit slips (a noise density typed in
 * volts, a capacitance in farads instead of nanofarads); they are common practice, no source.
 */
import { z } from 'zod';
import type { OpAmp } from '@/lib/engine/plan';
import type { ExpectedUnit } from '@/lib/units/parse-quantity';
import { formatQuantity } from '@/lib/units/format-quantity';

export const partKinds = ['instrumentation-amplifier', 'operational-amplifier', 'converter', 'electrode'] as const;
export type PartKind = (typeof partKinds)[number];

export const partStatuses = ['approved', 'under-evaluation', 'not-for-new-designs'] as const;
export type PartStatus = (typeof partStatuses)[number];

export const electrodeTypes = ['dry', 'wet-gel', 'hydrogel', 'textile', 'capacitive', 'needle', 'other'] as const;
export type ElectrodeType = (typeof electrodeTypes)[number];

/** What the importer needs to know about a numeric field. */
export interface NumericFieldMeta {
  label: string;
  unit: ExpectedUnit;
  /** Lower bound, in SI units of `unit`. */
  min: number;
  /** Whether `min` itself is allowed. */
  minInclusive: boolean;
  /** Upper bound (inclusive), in SI units of `unit`. */
  max: number;
  integer: boolean;
}

/** Metadata of every numeric part field, looked up by the field's schema. */
export const partFieldMeta = z.registry<NumericFieldMeta>();

/**
 * A numeric part field: a finite number within a plausible range, with its label and unit registered.
 * Messages name the field and the constraint: "voltage-noise density must be at most 1 µV/√Hz".
 */
function quantity(
  label: string,
  unit: ExpectedUnit,
  range: { min: number; minInclusive?: boolean; max: number; integer?: boolean },
) {
  const meta: NumericFieldMeta = {
    label,
    unit,
    min: range.min,
    minInclusive: range.minInclusive ?? true,
    max: range.max,
    integer: range.integer ?? false,
  };
  const fmt = (v: number) => (unit === '1' ? String(v) : formatQuantity(v, unit));
  const schema = z
    .number({ error: `${label} must be a number` })
    .refine(Number.isFinite, { message: `${label} must be a finite number`, abort: true })
    .refine((v) => !meta.integer || Number.isInteger(v), { message: `${label} must be a whole number`, abort: true })
    .refine((v) => (meta.minInclusive ? v >= meta.min : v > meta.min), {
      message:
        meta.minInclusive
          ? meta.min === 0
            ? `${label} must not be negative`
            : `${label} must be at least ${fmt(meta.min)}`
          : meta.min === 0 ? `${label} must be greater than zero` : `${label} must be greater than ${fmt(meta.min)}`,
      abort: true,
    })
    .refine((v) => v <= meta.max, { message: `${label} must be at most ${fmt(meta.max)}` });
  schema.register(partFieldMeta, meta);
  return schema;
}

const text = (label: string, maxChars: number) =>
  z
    .string({ error: `${label} must be text` })
    .trim()
    .max(maxChars, { message: `${label} must be at most ${maxChars} characters` });

/** Fields every part has. */
const partBase = {
  /** Library name, unique within the workspace. Generic, no manufacturer part number. */
  name: text('name', 120).min(1, { message: 'name is required' }),
  /** Generic description ("low-noise INA, 8 nV/√Hz"), free of manufacturer names. */
  description: text('description', 500).default(''),
  /** Where the values come from: datasheet revision, measured, or assumed. */
  sourceNote: text('source note', 500).min(1, { message: 'source note is required (datasheet revision, measured or assumed)' }),
  status: z.enum(partStatuses, { error: `status must be one of ${partStatuses.join(', ')}` }),
};

/** Amplifier parameters, the same fields as the channel plan's op-amp (`opAmpSchema` in lib/engine/plan.ts). */
const amplifierFields = {
  enVPerRtHz: quantity('voltage-noise density', 'V/rtHz', { min: 0, minInclusive: false, max: 1e-6 }),
  enCornerHz: quantity('voltage-noise 1/f corner', 'Hz', { min: 0, max: 100e3 }),
  inAPerRtHz: quantity('current-noise density', 'A/rtHz', { min: 0, max: 1e-9 }),
  inCornerHz: quantity('current-noise 1/f corner', 'Hz', { min: 0, max: 100e3 }),
  cmrrDb: quantity('CMRR', 'dB', { min: 0, minInclusive: false, max: 200 }),
  gbwHz: quantity('gain-bandwidth product', 'Hz', { min: 0, minInclusive: false, max: 10e9 }),
  biasA: quantity('input bias current', 'A', { min: 0, max: 1e-3 }),
  offsetV: quantity('input offset voltage', 'V', { min: 0, max: 0.1 }),
  inputCmFromNegV: quantity('input common-mode limit from the negative rail', 'V', { min: -5, max: 10 }),
  inputCmFromPosV: quantity('input common-mode limit from the positive rail', 'V', { min: -5, max: 10 }),
  outputFromNegV: quantity('output swing to the negative rail', 'V', { min: 0, max: 10 }),
  outputFromPosV: quantity('output swing to the positive rail', 'V', { min: 0, max: 10 }),
  /** Common-mode input resistance of each input, Ω (optional; the engine assumes a default when omitted). */
  inputCmOhm: quantity('common-mode input resistance', 'ohm', { min: 0, minInclusive: false, max: 1e16 }).optional(),
  /** Common-mode input capacitance of each input, F (optional). */
  inputCmF: quantity('common-mode input capacitance', 'F', { min: 0, max: 1e-9 }).optional(),
};

export const operationalAmplifierPartSchema = z.object({
  ...partBase,
  kind: z.literal('operational-amplifier'),
  ...amplifierFields,
});

export const instrumentationAmplifierPartSchema = z
  .object({
    ...partBase,
    kind: z.literal('instrumentation-amplifier'),
    ...amplifierFields,
    /** Smallest and largest first-stage gain the part supports, V/V. */
    gainMin: quantity('minimum gain', '1', { min: 1, max: 1e5 }),
    gainMax: quantity('maximum gain', '1', { min: 1, max: 1e5 }),
    /** Fixed gain of the internal difference stage, V/V. */
    diffGain: quantity('difference-stage gain', '1', { min: 0, minInclusive: false, max: 1000 }),
    /** Gain-setting constant K in G1 = 1 + K/Rg, Ω (K = 2R of the three-op-amp topology). */
    rgConstantOhm: quantity('gain-resistor constant', 'ohm', { min: 0, minInclusive: false, max: 10e6 }),
  })
  .superRefine((p, ctx) => {
    if (p.gainMax < p.gainMin) {
      ctx.addIssue({ code: 'custom', path: ['gainMax'], message: 'maximum gain must not be below the minimum gain' });
    }
  });

export const converterPartSchema = z.object({
  ...partBase,
  kind: z.literal('converter'),
  bits: quantity('resolution', '1', { min: 8, max: 32, integer: true }),
  /** Full-scale input span (peak to peak of the input range), V. */
  fullScaleV: quantity('full-scale range', 'V', { min: 0, minInclusive: false, max: 100 }),
  sampleRateMaxHz: quantity('maximum sample rate', 'Hz', { min: 0, minInclusive: false, max: 1e9 }),
  /** Input-referred noise of the converter over fs/2, V rms. */
  inputNoiseVrms: quantity('input-referred noise', 'V', { min: 0, max: 1 }),
});

export const electrodePartSchema = z
  .object({
    ...partBase,
    kind: z.literal('electrode'),
    electrodeType: z.enum(electrodeTypes, { error: `electrode type must be one of ${electrodeTypes.join(', ')}` }),
    /** Series resistance (Ze = Rs + Rp∥Cp), Ω. */
    rsOhm: quantity('series resistance', 'ohm', { min: 0, max: 100e6 }),
    /** Parallel resistance, Ω. */
    rpOhm: quantity('parallel resistance', 'ohm', { min: 0, minInclusive: false, max: 10e9 }),
    /** Parallel capacitance, F. */
    cpF: quantity('parallel capacitance', 'F', { min: 0, max: 1e-3 }),
    /** Typical and worst-case half-cell offset difference between two electrodes (magnitude), V. */
    offsetTypicalV: quantity('typical offset', 'V', { min: 0, max: 1 }),
    offsetMaxV: quantity('maximum offset', 'V', { min: 0, max: 1 }),
  })
  .superRefine((p, ctx) => {
    if (p.offsetMaxV < p.offsetTypicalV) {
      ctx.addIssue({ code: 'custom', path: ['offsetMaxV'], message: 'maximum offset must not be below the typical offset' });
    }
  });

export type OperationalAmplifierPart = z.infer<typeof operationalAmplifierPartSchema>;
export type InstrumentationAmplifierPart = z.infer<typeof instrumentationAmplifierPartSchema>;
export type ConverterPart = z.infer<typeof converterPartSchema>;
export type ElectrodePart = z.infer<typeof electrodePartSchema>;
export type Part = OperationalAmplifierPart | InstrumentationAmplifierPart | ConverterPart | ElectrodePart;

export interface PartByKind {
  'instrumentation-amplifier': InstrumentationAmplifierPart;
  'operational-amplifier': OperationalAmplifierPart;
  converter: ConverterPart;
  electrode: ElectrodePart;
}

export const partSchemaByKind = {
  'instrumentation-amplifier': instrumentationAmplifierPartSchema,
  'operational-amplifier': operationalAmplifierPartSchema,
  converter: converterPartSchema,
  electrode: electrodePartSchema,
} as const;

/** Any part, discriminated by `kind`. */
export const partSchema = z.union([
  instrumentationAmplifierPartSchema,
  operationalAmplifierPartSchema,
  converterPartSchema,
  electrodePartSchema,
]);

/** A field the importer can fill, with what it needs to parse a cell. */
export type PartFieldSpec =
  | { field: string; type: 'quantity'; required: boolean; meta: NumericFieldMeta }
  | { field: string; type: 'text'; required: boolean; label: string }
  | { field: string; type: 'enum'; required: true; label: string; options: readonly string[] };

function objectShape(kind: PartKind): Record<string, z.ZodType> {
  const schema = partSchemaByKind[kind];
  // The refined schemas (INA, electrode) keep their object shape in `.shape` in zod 4.
  return (schema as unknown as z.ZodObject).shape as Record<string, z.ZodType>;
}

/**
 * The importable fields of a part kind, in template order (`kind` is excluded: it is fixed per import).
 * @param kind the part kind
 */
export function partFieldSpecs(kind: PartKind): PartFieldSpec[] {
  const specs: PartFieldSpec[] = [];
  for (const [field, schema] of Object.entries(objectShape(kind))) {
    if (field === 'kind') continue;
    const optional = schema instanceof z.ZodOptional;
    const meta = partFieldMeta.get(optional ? (schema.unwrap() as z.ZodType) : schema);
    if (meta) {
      specs.push({ field, type: 'quantity', required: !optional, meta });
    } else if (field === 'status') {
      specs.push({ field, type: 'enum', required: true, label: 'status', options: partStatuses });
    } else if (field === 'electrodeType') {
      specs.push({ field, type: 'enum', required: true, label: 'electrode type', options: electrodeTypes });
    } else {
      const label = field === 'sourceNote' ? 'source note' : field;
      specs.push({ field, type: 'text', required: field !== 'description', label });
    }
  }
  return specs;
}

/**
 * The channel plan's op-amp parameters from an amplifier part (the plan's `source` names the part).
 * @param part an operational or instrumentation amplifier from the library
 */
export function amplifierPartToOpAmp(part: OperationalAmplifierPart | InstrumentationAmplifierPart): OpAmp {
  return {
    enVPerRtHz: part.enVPerRtHz,
    enCornerHz: part.enCornerHz,
    inAPerRtHz: part.inAPerRtHz,
    inCornerHz: part.inCornerHz,
    cmrrDb: part.cmrrDb,
    gbwHz: part.gbwHz,
    biasA: part.biasA,
    offsetV: part.offsetV,
    inputCmFromNegV: part.inputCmFromNegV,
    inputCmFromPosV: part.inputCmFromPosV,
    outputFromNegV: part.outputFromNegV,
    outputFromPosV: part.outputFromPosV,
    ...(part.inputCmOhm === undefined ? {} : { inputCmOhm: part.inputCmOhm }),
    ...(part.inputCmF === undefined ? {} : { inputCmF: part.inputCmF }),
    source: `part library: ${part.name} (${part.sourceNote})`.slice(0, 500),
  };
}
