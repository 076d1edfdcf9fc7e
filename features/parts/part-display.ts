/** Labels, engineering-notation text and parsing of part fields for the library screens. */
import { partFieldSpecs, type PartFieldSpec, type PartKind, type PartStatus } from '@/lib/parts/part-kinds';
import { formatQuantity } from '@/lib/units/format-quantity';
import { parseQuantity } from '@/lib/units/parse-quantity';

export const kindLabels: Record<PartKind, string> = {
  'instrumentation-amplifier': 'Instrumentation amplifier',
  'operational-amplifier': 'Operational amplifier',
  converter: 'Converter',
  electrode: 'Electrode type',
};

export const statusLabels: Record<PartStatus, string> = {
  approved: 'Approved',
  'under-evaluation': 'Under evaluation',
  'not-for-new-designs': 'Not for new designs',
};

/** The parameter fields of a kind (name, description, source note and status aside). */
export function parameterSpecs(kind: PartKind): PartFieldSpec[] {
  return partFieldSpecs(kind).filter((s) => !['name', 'description', 'sourceNote', 'status'].includes(s.field));
}

export function specLabel(spec: PartFieldSpec): string {
  return spec.type === 'quantity' ? spec.meta.label : spec.label;
}

/** A stored value as text with its unit ("8 nV/√Hz", "2.2 MΩ", "24"). */
export function formatFieldValue(spec: PartFieldSpec, value: number | string | undefined): string {
  if (value === undefined || value === null) return '';
  if (spec.type !== 'quantity' || typeof value !== 'number') return String(value);
  return spec.meta.unit === '1' ? String(value) : formatQuantity(value, spec.meta.unit, 4);
}

/** The few parameters shown in the table row, with units. */
export function keyParameters(kind: PartKind, values: Record<string, number | string>): string {
  const keys: Record<PartKind, string[]> = {
    'instrumentation-amplifier': ['enVPerRtHz', 'cmrrDb', 'gbwHz', 'gainMax'],
    'operational-amplifier': ['enVPerRtHz', 'cmrrDb', 'gbwHz', 'biasA'],
    converter: ['bits', 'fullScaleV', 'sampleRateMaxHz', 'inputNoiseVrms'],
    electrode: ['electrodeType', 'rsOhm', 'rpOhm', 'cpF', 'offsetMaxV'],
  };
  const specs = partFieldSpecs(kind);
  return keys[kind]
    .map((field) => {
      const spec = specs.find((s) => s.field === field);
      if (!spec || values[field] === undefined) return null;
      const text = formatFieldValue(spec, values[field]);
      return field === 'bits' ? `${text} bits` : field === 'gainMax' ? `gain ≤ ${text}` : text;
    })
    .filter(Boolean)
    .join(' · ');
}

/**
 * Parses what the user typed for a field: a quantity with its unit ("8 nV/√Hz"), a bare number in
 * the field's SI unit, or an option. Empty optional fields give undefined.
 */
export function parseFieldText(spec: PartFieldSpec, text: string): { ok: true; value: number | string | undefined } | { ok: false; message: string } {
  const trimmed = text.trim();
  if (trimmed === '') return spec.required ? { ok: false, message: `${specLabel(spec)} is required` } : { ok: true, value: undefined };
  if (spec.type !== 'quantity') return { ok: true, value: trimmed };
  const parsed = parseQuantity(trimmed, spec.meta.unit);
  return parsed.ok ? { ok: true, value: parsed.valueSi } : { ok: false, message: `${specLabel(spec)}: ${parsed.message}` };
}
