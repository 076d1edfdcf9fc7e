/**
 * Pure editing helpers of the workspace: text ⇄ value for each form field, immutable updates of
 * the plan, the diff between two plans, filling a stage from a library part. No React.
 */
import { parseQuantity } from '@/lib/units/parse-quantity';
import { formatEng, toSignificant } from '@/features/plan-workspace/format';
import { findField, getAt, type FieldDef, type StageId } from '@/features/plan-workspace/stage-fields';

/** A part from the library, as the page hands it to the workspace (values keyed by plan field names, SI units). */
export interface PartOption {
  id: string;
  kind: 'instrumentation-amplifier' | 'operational-amplifier' | 'converter' | 'electrode';
  name: string;
  status: string;
  sourceNote: string;
  values: Record<string, number>;
}

/** A plan being edited: plain JSON (numbers, strings, booleans, nested objects). */
export type PlanDraft = Record<string, unknown>;

export type FieldParse = { ok: true; value: unknown } | { ok: false; message: string };

/**
 * The text an input shows for a plan value: engineering notation with the unit ("51 kΩ"),
 * per cent for ratios ("0.1 %"), plain numbers for gains.
 * @param field the field definition
 * @param value the value in the plan (SI units), or undefined
 */
export function valueToText(field: FieldDef, value: unknown): string {
  if (value === undefined || value === null) return '';
  switch (field.kind) {
    case 'quantity':
      if (typeof value !== 'number') return String(value);
      if (field.unit === 'dB') return `${toSignificant(value, 6)} dB`;
      // Six significant digits so a typed value such as 49.9 kΩ or 1.0001 kΩ survives the round trip.
      // ASCII minus so the text parses back (the display minus sign U+2212 is not a number sign).
      return formatEng(value, field.symbol, { digits: 6 }).replace('−', '-');
    case 'percent':
      return typeof value === 'number' ? `${toSignificant(value * 100, 6)} %` : String(value);
    case 'number':
      return typeof value === 'number' ? toSignificant(value, 10) : String(value);
    case 'select':
      return String(value);
    case 'boolean':
      return value === true ? 'yes' : 'no';
    case 'text':
      return String(value);
  }
}

/**
 * Parses what was typed in a field into the plan value. Messages start with the field's short
 * name: "Rg: expected a resistance (Ω), got a capacitance".
 * @param field the field definition
 * @param text what the input holds (a boolean for check boxes)
 * @returns the value in SI units (undefined = remove an optional key) or a message
 */
export function textToValue(field: FieldDef, text: string | boolean): FieldParse {
  const fail = (message: string): FieldParse => ({ ok: false, message: `${field.short}: ${message}` });
  if (field.kind === 'boolean') return { ok: true, value: text === true };
  const typed = typeof text === 'string' ? text.trim() : '';
  if (field.kind === 'text') {
    const raw = typed;
    if (raw.length > field.maxLength) return fail(`at most ${field.maxLength} characters`);
    if (field.path.join('.') === 'name' && raw === '') return fail('a name is required');
    return { ok: true, value: raw };
  }
  // Accept a pasted typographic minus (U+2212) as a sign.
  const raw = typed.replace(/^\u2212/, '-');
  if (field.kind === 'select') {
    const option = field.options.find((o) => String(o.value) === raw);
    return option ? { ok: true, value: option.value } : fail(`choose one of ${field.options.map((o) => o.label).join(', ')}`);
  }
  const optional = 'optional' in field && field.optional === true;
  if (raw === '') return optional ? { ok: true, value: undefined } : fail('a value is required');
  if (field.kind === 'quantity') {
    const parsed = parseQuantity(raw, field.unit);
    return parsed.ok ? { ok: true, value: parsed.valueSi } : fail(parsed.message);
  }
  if (field.kind === 'percent') {
    // A bare number in a per-cent field is per cent ("0.1" = 0.1 %); "%" and "ppm" are accepted as typed.
    const withUnit = /^[+-]?[\d.]+(?:[eE][+-]?\d+)?$/.test(raw) ? `${raw} %` : raw;
    const parsed = parseQuantity(withUnit, '1');
    return parsed.ok ? { ok: true, value: parsed.valueSi } : fail(parsed.message);
  }
  // Plain numbers: accept a trailing copy of the suffix ("100 V/V", "16 bits", "298.15 K").
  let numeric = raw;
  if (field.suffix && numeric.toLowerCase().endsWith(field.suffix.toLowerCase())) {
    numeric = numeric.slice(0, numeric.length - field.suffix.length).trim();
  }
  const parsed = parseQuantity(numeric, '1');
  if (!parsed.ok) return fail(parsed.message.replace('a plain number (ratio)', field.suffix ? `a plain number (${field.suffix})` : 'a plain number'));
  if (field.integer && !Number.isInteger(parsed.valueSi)) return fail('must be a whole number');
  return { ok: true, value: parsed.valueSi };
}

/**
 * Returns a copy of `root` with the value at `path` replaced (or removed when `value` is undefined).
 * Objects along the path are copied, nothing else is.
 */
export function setAt<T>(root: T, path: readonly string[], value: unknown): T {
  if (path.length === 0) return value as T;
  const [head, ...rest] = path;
  const source = root !== null && typeof root === 'object' ? (root as Record<string, unknown>) : {};
  const copy: Record<string, unknown> = { ...source };
  if (rest.length === 0) {
    if (value === undefined) delete copy[head];
    else copy[head] = value;
  } else {
    copy[head] = setAt(source[head], rest, value);
  }
  return copy as T;
}

/** Starting values when the body model is switched (Metting van Rijn et al., 1990: ≈ 3 pF to mains, ≈ 300 pF to ground). */
const bodyDefaults: Record<string, Record<string, unknown>> = {
  coupling: { mode: 'coupling', mainsVrms: 230, bodyToMainsF: 3e-12, bodyToGroundF: 300e-12 },
  // A starting value only (common practice, no source): 1 V rms on the body; edit it.
  direct: { mode: 'direct', cmVrms: 1 },
};

/**
 * Applies one field edit to the plan, with the rules that tie fields together:
 * Rg and the target first-stage gain exclude each other (the one edited last drives);
 * switching the body model replaces the body object with that model's fields.
 * @returns the new plan
 */
export function applyFieldEdit(plan: PlanDraft, path: readonly string[], value: unknown): PlanDraft {
  const key = path.join('.');
  if (key === 'body.mode') {
    if (getAt(plan, ['body', 'mode']) === value) return plan;
    return setAt(plan, ['body'], { ...(bodyDefaults[String(value)] ?? { mode: value }) });
  }
  let next = setAt(plan, path, value);
  if (key === 'instrumentation.rgOhm' && value !== undefined) next = setAt(next, ['instrumentation', 'targetGain'], undefined);
  if (key === 'instrumentation.targetGain' && value !== undefined) next = setAt(next, ['instrumentation', 'rgOhm'], undefined);
  return next;
}

/**
 * First-stage gain of the three-op-amp instrumentation stage, G1 = 1 + 2R/Rg
 * (three-op-amp analysis, e.g. Sedra & Smith, Microelectronic Circuits).
 * @param rOhm feedback resistor of each input op-amp, Ω
 * @param rgOhm gain resistor, Ω
 * @returns G1, V/V
 */
export function firstStageGain(rOhm: number, rgOhm: number): number {
  return 1 + (2 * rOhm) / rgOhm;
}

/**
 * The gain resistor for a target first-stage gain, Rg = 2R/(G1 − 1).
 * @param rOhm feedback resistor, Ω
 * @param gain target G1 (> 1), V/V
 * @returns Rg, Ω (Infinity for G1 = 1: no resistor)
 */
export function gainResistorFor(rOhm: number, gain: number): number {
  return gain <= 1 ? Number.POSITIVE_INFINITY : (2 * rOhm) / (gain - 1);
}

/**
 * The value as a person reads it (select options by their label, check boxes as yes/no);
 * for read-only views and change lists.
 */
export function valueToDisplay(field: FieldDef, value: unknown): string {
  if (value === undefined || value === null) return '(not set)';
  if (field.kind === 'select') return field.options.find((o) => o.value === value)?.label ?? String(value);
  if (field.kind === 'quantity' && typeof value === 'number') return formatEng(value, field.symbol, { digits: 4 });
  const text = valueToText(field, value);
  return text === '' ? '(empty)' : text;
}

export interface PlanChange {
  path: string[];
  /** The field's label, or the dotted path when the forms do not show it. */
  label: string;
  stageId: StageId | null;
  beforeText: string;
  afterText: string;
}

function describeValue(path: string[], value: unknown): string {
  const found = findField(path);
  if (value === undefined) return '(not set)';
  if (found) return valueToDisplay(found.field, value);
  if (typeof value === 'object') return JSON.stringify(value);
  return String(value);
}

function walk(a: unknown, b: unknown, path: string[], out: string[][]): void {
  const aObj = a !== null && typeof a === 'object' && !Array.isArray(a);
  const bObj = b !== null && typeof b === 'object' && !Array.isArray(b);
  if (aObj && bObj) {
    const keys = new Set([...Object.keys(a as object), ...Object.keys(b as object)]);
    for (const k of keys) walk((a as Record<string, unknown>)[k], (b as Record<string, unknown>)[k], [...path, k], out);
    return;
  }
  if (aObj !== bObj) {
    // One side is an object, the other a missing value: list the object's leaves; otherwise the path itself changed.
    const other = aObj ? b : a;
    if (other !== undefined) {
      out.push(path);
      return;
    }
    const obj = (aObj ? a : b) as Record<string, unknown>;
    for (const k of Object.keys(obj)) walk(aObj ? obj[k] : undefined, bObj ? obj[k] : undefined, [...path, k], out);
    return;
  }
  if (JSON.stringify(a) !== JSON.stringify(b)) out.push(path);
}

/**
 * The fields that differ between two plans, with labels and values as the forms show them.
 * @param before the older plan
 * @param after the newer plan
 */
export function diffPlans(before: unknown, after: unknown): PlanChange[] {
  const paths: string[][] = [];
  walk(before, after, [], paths);
  return paths.map((path) => {
    const found = findField(path);
    return {
      path,
      label: found ? found.field.label : path.join('.'),
      stageId: found ? found.stageId : null,
      beforeText: describeValue(path, getAt(before, path)),
      afterText: describeValue(path, getAt(after, path)),
    };
  });
}

/** Deep equality of two JSON values (key order ignored). */
export function plansEqual(a: unknown, b: unknown): boolean {
  const paths: string[][] = [];
  walk(a, b, [], paths);
  return paths.length === 0;
}

const opAmpKeys = [
  'enVPerRtHz',
  'enCornerHz',
  'inAPerRtHz',
  'inCornerHz',
  'cmrrDb',
  'gbwHz',
  'biasA',
  'offsetV',
  'inputCmFromNegV',
  'inputCmFromPosV',
  'outputFromNegV',
  'outputFromPosV',
  'inputCmOhm',
  'inputCmF',
];

/**
 * Fills a stage from a library part: amplifier parameters into the stage's op-amp, the
 * instrumentation amplifier's gain constant K (G1 = 1 + K/Rg, so R = K/2) and difference gain,
 * a converter's resolution, range and noise, an electrode's Rs, Rp, Cp and worst-case offset.
 * The stage's source note names the part.
 * @returns the new plan and the paths that were set
 */
export function applyPart(plan: PlanDraft, stageId: StageId, part: PartOption): { plan: PlanDraft; changed: string[][] } {
  const assignments: [string[], unknown][] = [];
  const v = part.values;
  const has = (k: string) => typeof v[k] === 'number' && Number.isFinite(v[k]);
  const source = `part library: ${part.name} (${part.sourceNote})`.slice(0, 500);
  if ((stageId === 'instrumentation' && part.kind === 'instrumentation-amplifier') || (stageId === 'gainStage' && part.kind === 'operational-amplifier')) {
    for (const k of opAmpKeys) if (has(k)) assignments.push([[stageId, 'opAmp', k], v[k]]);
    assignments.push([[stageId, 'opAmp', 'source'], source]);
    if (stageId === 'instrumentation') {
      if (has('rgConstantOhm')) assignments.push([['instrumentation', 'rOhm'], v.rgConstantOhm / 2]);
      if (has('rOhm')) assignments.push([['instrumentation', 'rOhm'], v.rOhm]);
      if (has('diffGain')) assignments.push([['instrumentation', 'diffGain'], v.diffGain]);
    }
  } else if (stageId === 'adc' && part.kind === 'converter') {
    for (const k of ['bits', 'fullScaleV', 'inputNoiseVrms', 'midScaleV', 'sampleRateHz']) if (has(k)) assignments.push([['adc', k], v[k]]);
  } else if (stageId === 'electrodes' && part.kind === 'electrode') {
    for (const k of ['rsOhm', 'rpOhm', 'cpF']) if (has(k)) assignments.push([['electrodes', k], v[k]]);
    if (has('offsetMaxV')) assignments.push([['electrodes', 'offsetV'], v.offsetMaxV]);
    else if (has('offsetV')) assignments.push([['electrodes', 'offsetV'], v.offsetV]);
    assignments.push([['electrodes', 'source'], source]);
  }
  let next = plan;
  const changed: string[][] = [];
  for (const [path, value] of assignments) {
    if (JSON.stringify(getAt(next, path)) !== JSON.stringify(value)) changed.push(path);
    next = setAt(next, path, value);
  }
  return { plan: next, changed };
}
