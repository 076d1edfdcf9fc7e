/**
 * Part-library import from CSV: parse with papaparse, map columns to part fields, parse each
 * cell with its engineering unit ("8 nV/√Hz", "2.2 MΩ"), validate each row with the part's
 * zod schema, and list every bad row with the column, field, value and reason.
 *
 * Row numbers are spreadsheet line numbers: the header is row 1, the first data row is row 2
 * (a quoted cell spanning lines counts the line where its record starts).
 *
 * Pure: takes the file's text, returns typed results; nothing is written anywhere.
 */
import Papa from 'papaparse';
import { parseQuantity } from '@/lib/units/parse-quantity';
import { formatQuantity } from '@/lib/units/format-quantity';
import { looksBinary, parseCsvRows } from '@/lib/parts/csv-text';
import { partFieldSpecs, partSchemaByKind, type PartByKind, type PartFieldSpec, type PartKind } from '@/lib/parts/part-kinds';

/** Size limits of one import. */
export const partsCsvLimits = {
  /** 2 MB (2 × 1024 × 1024 bytes of UTF-8). */
  maxBytes: 2 * 1024 * 1024,
  /** Data rows, header not counted. */
  maxRows: 5000,
} as const;

export interface PartsCsvError {
  /** Spreadsheet row (header = 1); 0 for a problem with the whole file. */
  row: number;
  /** CSV column header, '' when the problem is not tied to one column. */
  column: string;
  /** Part field, '' when the problem is not tied to one field. */
  field: string;
  /** The cell's text as found (shortened to 200 characters). */
  value: string;
  message: string;
}

export interface PartsCsvColumn {
  /** Header text as found. */
  column: string;
  /** The part field the column fills, or null when it is ignored. */
  field: string | null;
  /** A unit given in the header ("Rs (kΩ)"), applied to bare numbers in the column. */
  headerUnit: string | null;
}

export interface PartsCsvResult<K extends PartKind> {
  /** True when the whole file was refused (size, not CSV, no header, unusable mapping); rows is then empty. */
  refused: boolean;
  /** Valid parts, in file order. */
  rows: PartByKind[K][];
  /** Spreadsheet row number of each valid part (same order as `rows`). */
  rowNumbers: number[];
  errors: PartsCsvError[];
  columns: PartsCsvColumn[];
}

/** Column header → part field (null: ignore the column). */
export type ColumnMapping = Record<string, string | null>;

const clip = (s: string) => (s.length > 200 ? `${s.slice(0, 197)}...` : s);

/** Lower-case letters and digits only: "Voltage-noise density (nV/√Hz)" → "voltagenoisedensity". */
function headerKey(header: string): string {
  return splitHeaderUnit(header)
    .name.toLowerCase()
    .replace(/[^a-z0-9]/g, '');
}

/** "Rs (kΩ)" / "Rs [kohm]" → { name: "Rs", unit: "kΩ" }. */
function splitHeaderUnit(header: string): { name: string; unit: string | null } {
  const m = /^(.*?)\s*[([]\s*([^()[\]]+?)\s*[)\]]\s*$/.exec(header.trim());
  return m && m[1] !== '' ? { name: m[1], unit: m[2] } : { name: header.trim(), unit: null };
}

/** Extra header names accepted for a field, beyond its field name, its label and its name without the unit suffix. */
const synonyms: Record<string, string[]> = {
  name: ['part', 'partname'],
  description: ['desc'],
  sourceNote: ['source', 'sourceofvalues', 'provenance'],
  enVPerRtHz: ['voltagenoise', 'vnoise', 'noisedensity'],
  enCornerHz: ['voltagenoisecorner', 'encorner'],
  inAPerRtHz: ['currentnoise', 'inoise'],
  inCornerHz: ['currentnoisecorner', 'incorner'],
  gbwHz: ['gbp', 'gainbandwidth'],
  biasA: ['ib', 'biascurrent', 'inputbias'],
  offsetV: ['vos', 'inputoffset'],
  gainMin: ['mingain'],
  gainMax: ['maxgain'],
  diffGain: ['differencegain'],
  rgConstantOhm: ['rgconstant', 'gainconstant', 'gainresistorconstant'],
  bits: ['resolutionbits', 'nbits'],
  fullScaleV: ['fullscale', 'fsr', 'fullscalerange'],
  sampleRateMaxHz: ['samplerate', 'maxsamplerate', 'fsmax'],
  inputNoiseVrms: ['inputnoise', 'noise', 'adcnoise'],
  electrodeType: ['type'],
  rsOhm: ['seriesresistance'],
  rpOhm: ['parallelresistance'],
  cpF: ['parallelcapacitance'],
  offsetTypicalV: ['offsettyp', 'typicaloffset', 'offsettypical'],
  offsetMaxV: ['maxoffset', 'offsetmax'],
};

function fieldKeys(spec: PartFieldSpec): string[] {
  const label = spec.type === 'quantity' ? spec.meta.label : spec.label;
  const withoutUnit = spec.field.replace(/(VPerRtHz|APerRtHz|Ohm|Hz|Db|Vrms|V|A|F)$/, '');
  return [spec.field, label, withoutUnit, ...(synonyms[spec.field] ?? [])].map((s) => s.toLowerCase().replace(/[^a-z0-9]/g, ''));
}

/**
 * Suggests which CSV column fills which part field, by header name (field name, label,
 * common abbreviations; a unit in brackets is ignored). Each field gets at most one column.
 *
 * @param header the CSV header cells
 * @param kind the part kind being imported
 * @returns column header → field, for the columns recognised
 * @example suggestColumnMapping(['Name', 'en (nV/rtHz)'], 'operational-amplifier') // { Name: 'name', 'en (nV/rtHz)': 'enVPerRtHz' }
 */
export function suggestColumnMapping(header: readonly string[], kind: PartKind): Record<string, string> {
  const specs = partFieldSpecs(kind);
  const mapping: Record<string, string> = {};
  const taken = new Set<string>();
  for (const column of header) {
    const key = headerKey(column);
    if (key === '' || column in mapping) continue;
    const spec = specs.find((s) => !taken.has(s.field) && fieldKeys(s).includes(key));
    if (spec) {
      mapping[column] = spec.field;
      taken.add(spec.field);
    }
  }
  return mapping;
}

/** Invented example values for the template (no real part). */
const templateExamples: { [K in PartKind]: Record<string, string> } = {
  'instrumentation-amplifier': {
    name: 'generic low-noise INA',
    description: 'three-op-amp instrumentation amplifier, 8 nV/√Hz',
    sourceNote: 'assumed (example values)',
    status: 'under-evaluation',
    enVPerRtHz: '8 nV/√Hz',
    enCornerHz: '10 Hz',
    inAPerRtHz: '100 fA/√Hz',
    inCornerHz: '100 Hz',
    cmrrDb: '110 dB',
    gbwHz: '1 MHz',
    biasA: '1 nA',
    offsetV: '50 µV',
    inputCmFromNegV: '0.1 V',
    inputCmFromPosV: '1 V',
    outputFromNegV: '50 mV',
    outputFromPosV: '50 mV',
    gainMin: '1',
    gainMax: '1000',
    diffGain: '1',
    rgConstantOhm: '50 kΩ',
  },
  'operational-amplifier': {
    name: 'generic precision op-amp',
    description: 'rail-to-rail output, low bias current',
    sourceNote: 'assumed (example values)',
    status: 'under-evaluation',
    enVPerRtHz: '12 nV/√Hz',
    enCornerHz: '5 Hz',
    inAPerRtHz: '0.5 pA/√Hz',
    inCornerHz: '50 Hz',
    cmrrDb: '100 dB',
    gbwHz: '5 MHz',
    biasA: '10 pA',
    offsetV: '200 µV',
    inputCmFromNegV: '-0.1 V',
    inputCmFromPosV: '1.2 V',
    outputFromNegV: '20 mV',
    outputFromPosV: '20 mV',
  },
  converter: {
    name: 'generic 24-bit sigma-delta ADC',
    description: 'differential input, 5 V span',
    sourceNote: 'assumed (example values)',
    status: 'under-evaluation',
    bits: '24',
    fullScaleV: '5 V',
    sampleRateMaxHz: '32 kHz',
    inputNoiseVrms: '1 µV',
  },
  electrode: {
    name: 'generic dry electrode',
    description: 'stainless dry contact, no gel',
    sourceNote: 'assumed (example values)',
    status: 'under-evaluation',
    electrodeType: 'dry',
    rsOhm: '1 kΩ',
    rpOhm: '2 MΩ',
    cpF: '10 nF',
    offsetTypicalV: '50 mV',
    offsetMaxV: '300 mV',
  },
};

/**
 * The CSV template of a part kind: a header naming every field and one example row of
 * invented generic values, written with their units.
 * @param kind the part kind
 */
export function partsCsvTemplate(kind: PartKind): string {
  const fields = partFieldSpecs(kind).map((s) => s.field);
  const example = templateExamples[kind];
  return `${Papa.unparse({ fields, data: [fields.map((f) => example[f] ?? '')] }, { newline: '\n' })}\n`;
}

function utf8ByteLength(text: string): number {
  let bytes = 0;
  for (let i = 0; i < text.length; i++) {
    const c = text.charCodeAt(i);
    if (c < 0x80) bytes += 1;
    else if (c < 0x800) bytes += 2;
    else if (c >= 0xd800 && c <= 0xdbff) {
      bytes += 4;
      i++;
    } else bytes += 3;
  }
  return bytes;
}

function normaliseEnum(value: string): string {
  return value.trim().toLowerCase().replace(/[\s_]+/g, '-');
}

/**
 * Parses a part-library CSV file of one part kind.
 *
 * Cells may carry engineering units ("8 nV/√Hz", "2.2 MΩ", "47 nF", "1 MHz", "120 dB"); a unit in the
 * column header ("Rs (kΩ)") applies to bare numbers in that column; a bare number without any unit is
 * taken in the field's SI unit. Every bad row is listed with its column, field, value and reason;
 * duplicate names (within the file, case-insensitive, and against `existingNames`) are errors.
 * The whole file is refused when over 2 MB or 5,000 data rows, when it is not CSV text, when it has no
 * header, or when a required field has no column.
 *
 * @param text the file's content, decoded as UTF-8
 * @param kind which kind of part the file holds
 * @param mapping column header → field (null: ignore); defaults to {@link suggestColumnMapping}
 * @param options.existingNames names already in the library
 */
export function parsePartsCsv<K extends PartKind>(
  text: string,
  kind: K,
  mapping?: ColumnMapping,
  options: { existingNames?: readonly string[] } = {},
): PartsCsvResult<K> {
  const result: PartsCsvResult<K> = { refused: false, rows: [], rowNumbers: [], errors: [], columns: [] };
  const refuse = (message: string, extra: Partial<PartsCsvError> = {}): PartsCsvResult<K> => {
    result.refused = true;
    result.rows = [];
    result.rowNumbers = [];
    result.errors.push({ row: 0, column: '', field: '', value: '', message, ...extra });
    return result;
  };

  if (typeof text !== 'string') return refuse('the file content must be text');
  const bytes = utf8ByteLength(text);
  if (bytes > partsCsvLimits.maxBytes) {
    return refuse(`the file is ${(bytes / (1024 * 1024)).toFixed(1)} MB; the limit is 2 MB`);
  }
  const body = text.replace(/^\uFEFF/, '');
  if (body.trim() === '') return refuse('the file is empty');
  if (looksBinary(body)) return refuse('the file is not CSV text (it contains binary data)');

  const parsed = parseCsvRows(body);
  if (parsed.rows.length === 0) return refuse('the file has no rows');
  const [headerRow, ...dataRows] = parsed.rows;
  if (dataRows.length > partsCsvLimits.maxRows) {
    return refuse(`the file has ${dataRows.length.toLocaleString('en-US')} data rows; the limit is ${partsCsvLimits.maxRows.toLocaleString('en-US')}`);
  }
  const header = headerRow.cells.map((c) => c.trim());
  if (header.length < 2) {
    return refuse('the first line must be a header naming at least two columns (is the file comma-, semicolon- or tab-separated?)');
  }
  if (header.every((c) => c === '' || /^[+-]?(\d|\.\d)/.test(c))) {
    return refuse('the first line must be a header naming the columns; it looks like data');
  }
  const seen = new Set<string>();
  for (const column of header) {
    if (column === '') continue;
    if (seen.has(column)) return refuse(`column "${column}" appears twice in the header`, { column });
    seen.add(column);
  }

  const specs = partFieldSpecs(kind);
  const specByField = new Map(specs.map((s) => [s.field, s]));
  const effectiveMapping: ColumnMapping = mapping ?? suggestColumnMapping(header, kind);
  const fieldColumn = new Map<string, number>();
  for (const [column, field] of Object.entries(effectiveMapping)) {
    const index = header.indexOf(column);
    if (index < 0) return refuse(`the mapping names column "${column}", which is not in the header`, { column });
    if (field === null || field === '') continue;
    if (field === 'kind') continue;
    if (!specByField.has(field)) return refuse(`the mapping assigns column "${column}" to "${field}", which is not a field of ${kind} parts`, { column, field });
    if (fieldColumn.has(field)) {
      return refuse(`columns "${header[fieldColumn.get(field)!]}" and "${column}" are both mapped to ${field}`, { column, field });
    }
    fieldColumn.set(field, index);
  }
  const kindColumn = Object.entries(effectiveMapping).find(([, f]) => f === 'kind')?.[0] ?? header.find((h) => headerKey(h) === 'kind');
  const kindIndex = kindColumn === undefined ? -1 : header.indexOf(kindColumn);

  result.columns = header.map((column, index) => {
    const field = [...fieldColumn.entries()].find(([, i]) => i === index)?.[0] ?? (index === kindIndex ? 'kind' : null);
    return { column, field, headerUnit: field && specByField.get(field)?.type === 'quantity' ? splitHeaderUnit(column).unit : null };
  });

  if (fieldColumn.size === 0) {
    return refuse(`no column of the header is a ${kind} field; expected columns such as ${specs.slice(0, 5).map((s) => s.field).join(', ')}`);
  }
  const missing = specs.filter((s) => s.required && !fieldColumn.has(s.field));
  if (missing.length > 0) {
    for (const s of missing) {
      const label = s.type === 'quantity' ? s.meta.label : s.label;
      result.errors.push({ row: 0, column: '', field: s.field, value: '', message: `no column for required field ${s.field} (${label})` });
    }
    result.refused = true;
    return result;
  }
  // A unit in the header must suit the field it fills.
  for (const [field, index] of fieldColumn) {
    const spec = specByField.get(field)!;
    const unit = splitHeaderUnit(header[index]).unit;
    if (spec.type !== 'quantity' || unit === null) continue;
    const check = parseQuantity(`1 ${unit}`, spec.meta.unit);
    if (!check.ok) return refuse(`column "${header[index]}": ${check.message}`, { column: header[index], field, value: unit });
  }

  for (const e of parsed.errors) result.errors.push({ row: e.line, column: '', field: '', value: '', message: e.message });
  const badLines = new Set(parsed.errors.map((e) => e.line));

  const nameRows = new Map<string, number>();
  const existing = new Set((options.existingNames ?? []).map((n) => n.trim().toLowerCase()));

  for (const dataRow of dataRows) {
    const row = dataRow.line;
    if (badLines.has(row)) continue;
    const cells = dataRow.cells;
    if (cells.length !== header.length) {
      result.errors.push({
        row,
        column: '',
        field: '',
        value: clip(cells.join(',')),
        message: `row has ${cells.length} value${cells.length === 1 ? '' : 's'}; the header has ${header.length} columns`,
      });
      continue;
    }
    const rowErrors: PartsCsvError[] = [];
    const candidate: Record<string, unknown> = { kind };
    if (kindIndex >= 0) {
      const givenKind = normaliseEnum(cells[kindIndex]);
      if (givenKind !== '' && givenKind !== kind) {
        rowErrors.push({ row, column: header[kindIndex], field: 'kind', value: clip(cells[kindIndex]), message: `row is a ${givenKind} part, but this import is for ${kind} parts` });
      }
    }
    for (const [field, index] of fieldColumn) {
      const spec = specByField.get(field)!;
      const raw = cells[index];
      const value = raw.trim();
      const column = header[index];
      if (spec.type === 'quantity') {
        if (value === '') {
          if (!spec.required) continue;
          rowErrors.push({ row, column, field, value: '', message: `${spec.meta.label} is required` });
          continue;
        }
        const headerUnit = splitHeaderUnit(column).unit;
        const withUnit = headerUnit !== null && /^[+-]?(?:\d+(?:\.\d*)?|\.\d+)(?:[eE][+-]?\d+)?$/.test(value) ? `${value} ${headerUnit}` : value;
        const q = parseQuantity(withUnit, spec.meta.unit);
        if (!q.ok) rowErrors.push({ row, column, field, value: clip(raw), message: `${spec.meta.label}: ${q.message}` });
        else candidate[field] = q.valueSi;
      } else if (spec.type === 'enum') {
        candidate[field] = normaliseEnum(value);
      } else {
        if (value !== '' || spec.required) candidate[field] = value;
      }
    }
    if (rowErrors.length === 0) {
      const check = partSchemaByKind[kind].safeParse(candidate);
      if (!check.success) {
        for (const issue of check.error.issues) {
          const field = String(issue.path[0] ?? '');
          const index = fieldColumn.get(field);
          rowErrors.push({
            row,
            column: index === undefined ? '' : header[index],
            field,
            value: index === undefined ? '' : clip(cells[index]),
            message: issue.message,
          });
        }
      } else {
        const part = check.data as PartByKind[K];
        const nameKey = part.name.toLowerCase();
        const nameIndex = fieldColumn.get('name')!;
        if (existing.has(nameKey)) {
          rowErrors.push({ row, column: header[nameIndex], field: 'name', value: clip(part.name), message: `a part named "${part.name}" already exists in the library` });
        } else if (nameRows.has(nameKey)) {
          rowErrors.push({ row, column: header[nameIndex], field: 'name', value: clip(part.name), message: `duplicate name "${part.name}" (already in row ${nameRows.get(nameKey)})` });
        } else {
          nameRows.set(nameKey, row);
          result.rows.push(part);
          result.rowNumbers.push(row);
        }
      }
    }
    result.errors.push(...rowErrors);
  }
  return result;
}

/** Formats a part's numeric field for display with its unit ("8 nV/√Hz"). */
export function formatPartField(kind: PartKind, field: string, valueSi: number): string {
  const spec = partFieldSpecs(kind).find((s) => s.field === field);
  if (!spec || spec.type !== 'quantity') return String(valueSi);
  return spec.meta.unit === '1' ? String(valueSi) : formatQuantity(valueSi, spec.meta.unit);
}
