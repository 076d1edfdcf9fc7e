/**
 * The part-library import on the server: the uploaded file's bytes → text (refused by content when
 * it is not UTF-8 CSV text), the mapping to use (given, remembered for the workspace and kind, or
 * suggested from the header), and the validation by `parsePartsCsv`. Nothing here writes anything.
 */
import { createHash } from 'node:crypto';
import { parsePartsCsv, partsCsvLimits, suggestColumnMapping, type ColumnMapping } from '@/lib/parts/csv-import';
import { looksBinary, parseCsvRows } from '@/lib/parts/csv-text';
import type { PartKind } from '@/lib/parts/part-kinds';
import type { PartContentInput } from '@/features/parts/part-input';
import type { ImportPreviewDto } from '@/features/parts/types';

export type ImportFileText = { ok: true; text: string; sha256: string } | { ok: false; message: string };

/**
 * Decodes an uploaded import file.
 * Refuses (by size and by content, never by file name) anything over 2 MB, empty, not valid UTF-8,
 * or binary (NUL or control bytes: a spreadsheet workbook, an image, a PDF ...).
 */
export function decodeImportFile(bytes: Uint8Array): ImportFileText {
  if (bytes.length === 0) return { ok: false, message: 'the file is empty' };
  if (bytes.length > partsCsvLimits.maxBytes) {
    return { ok: false, message: `the file is ${(bytes.length / (1024 * 1024)).toFixed(1)} MB; the limit is 2 MB` };
  }
  let text: string;
  try {
    text = new TextDecoder('utf-8', { fatal: true }).decode(bytes);
  } catch {
    return { ok: false, message: 'the file is not CSV text (it is not valid UTF-8; save it as "CSV UTF-8")' };
  }
  if (looksBinary(text)) return { ok: false, message: 'the file is not CSV text (it contains binary data)' };
  return { ok: true, text, sha256: createHash('sha256').update(bytes).digest('hex') };
}

/** The header cells of the file (first record), trimmed. */
export function csvHeader(text: string): string[] {
  const { rows } = parseCsvRows(text.replace(/^\uFEFF/, ''));
  return rows.length === 0 ? [] : rows[0].cells.map((c) => c.trim());
}

/**
 * The mapping to start from: the remembered one, kept only for columns this file has (and
 * completed by suggestions for the others), else the suggestion from the header names.
 */
export function initialMapping(
  header: readonly string[],
  kind: PartKind,
  remembered: Record<string, string | null> | null,
): { mapping: ColumnMapping; source: 'remembered' | 'suggested' } {
  const suggested = suggestColumnMapping(header, kind);
  const base: ColumnMapping = Object.fromEntries(header.filter((h) => h !== '').map((h) => [h, suggested[h] ?? null]));
  if (!remembered) return { mapping: base, source: 'suggested' };
  const applicable = Object.entries(remembered).filter(([column]) => header.includes(column));
  if (applicable.length === 0) return { mapping: base, source: 'suggested' };
  const mapping: ColumnMapping = { ...base };
  const taken = new Set<string>();
  for (const [column, field] of applicable) {
    mapping[column] = field;
    if (field) taken.add(field);
  }
  // A suggestion for a column the remembered mapping did not cover must not take a remembered field.
  for (const column of header) {
    if (applicable.some(([c]) => c === column)) continue;
    if (mapping[column] && taken.has(mapping[column]!)) mapping[column] = null;
  }
  return { mapping, source: 'remembered' };
}

export interface ImportCheck {
  preview: ImportPreviewDto;
  /** The valid parts (only when nothing is wrong with the file). */
  parts: PartContentInput[];
}

/**
 * Validates the file with the mapping and lists every problem.
 * @param existingNames names of the kind already in the library (retired parts included)
 */
export function checkImport({
  text,
  fileName,
  kind,
  mapping,
  mappingSource,
  existingNames,
}: {
  text: string;
  fileName: string;
  kind: PartKind;
  mapping: ColumnMapping;
  mappingSource: ImportPreviewDto['mappingSource'];
  existingNames: readonly string[];
}): ImportCheck {
  const header = csvHeader(text);
  const result = parsePartsCsv(text, kind, mapping, { existingNames });
  const parts: PartContentInput[] = result.rows.map((row) => {
    const { kind: k, name, description, status, sourceNote, ...values } = row;
    return { kind: k, name, description, status, sourceNote, values: values as Record<string, number | string> };
  });
  return {
    preview: {
      kind,
      fileName,
      header,
      mapping,
      mappingSource,
      refused: result.refused,
      validCount: result.refused ? 0 : result.rows.length,
      problems: result.errors,
      sample: parts.slice(0, 20).map((p, i) => ({ row: result.rowNumbers[i], name: p.name, values: p.values })),
    },
    parts: result.refused || result.errors.length > 0 ? [] : parts,
  };
}
