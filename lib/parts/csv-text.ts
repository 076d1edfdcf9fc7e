/**
 * Shared CSV plumbing for the part-library importer and the bench-record reader: binary-content
 * detection and record splitting with spreadsheet line numbers. Pure; papaparse does the parsing.
 */
import Papa from 'papaparse';

/** Whether decoded text looks like binary content rather than CSV (NULs, control characters, undecodable bytes). */
export function looksBinary(text: string): boolean {
  const sample = text.slice(0, 65536);
  let suspicious = 0;
  for (let i = 0; i < sample.length; i++) {
    const c = sample.charCodeAt(i);
    if (c === 0) return true;
    if ((c < 32 && c !== 9 && c !== 10 && c !== 13) || c === 0xfffd) suspicious++;
  }
  return suspicious > 0 && suspicious >= Math.max(1, sample.length * 0.001);
}

export interface ParsedCsvRow {
  cells: string[];
  /** Spreadsheet line number where the record starts. */
  line: number;
}

/**
 * Splits CSV text into records with their starting line numbers (papaparse, delimiter detected,
 * blank lines skipped). Shared with the bench-record reader.
 */
export function parseCsvRows(text: string): { rows: ParsedCsvRow[]; errors: Array<{ line: number; message: string }> } {
  const rows: ParsedCsvRow[] = [];
  const errors: Array<{ line: number; message: string }> = [];
  let lineAtCursor = 1;
  let lastCursor = 0;
  const lineOf = (pos: number) => {
    for (let i = lastCursor; i < pos && i < text.length; i++) if (text.charCodeAt(i) === 10) lineAtCursor++;
    lastCursor = Math.max(lastCursor, pos);
    return lineAtCursor;
  };
  let previousEnd = 0;
  Papa.parse<string[]>(text, {
    skipEmptyLines: 'greedy',
    comments: '#',
    step: (result) => {
      let start = previousEnd;
      while (start < text.length && /\s/.test(text[start])) start++;
      const line = lineOf(start);
      previousEnd = result.meta.cursor;
      for (const e of result.errors) if (e.code !== 'UndetectableDelimiter') errors.push({ line, message: `CSV syntax: ${e.message}` });
      rows.push({ cells: result.data, line });
    },
  });
  return { rows, errors };
}

