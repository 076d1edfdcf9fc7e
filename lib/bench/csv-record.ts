/**
 * Bench records as CSV: one optional time column plus one column per channel, and the detection of
 * a record's format (EDF or CSV) from its content, not its file name.
 *
 * Row numbers are file line numbers (the header, when present, is row 1).
 * Pure: text or bytes in, typed results out.
 */
import { looksBinary, parseCsvRows } from '@/lib/parts/csv-text';
import type { RecordSignal } from '@/lib/bench/record-signal';

export interface CsvRecordOptions {
  /** Header of the time column, in seconds (or in the unit in brackets: "time (ms)"). Detected by name when omitted. */
  timeColumn?: string;
  /** Sample rate when the file has no time column, Hz. */
  sampleRateHz?: number;
  /** Unit of the channel values. */
  unit: 'V' | 'mV' | 'uV';
  /** Whether the values include the channel's gain (measured at the output); they are then divided by `gain` to refer them to the input. */
  gainApplied: boolean;
  /** Gain between the input and the recorded values, V/V (required when `gainApplied`). */
  gain?: number;
}

export interface CsvRecordError {
  /** File line number (header = 1); 0 for the whole file. */
  row: number;
  column: string;
  message: string;
}

export type CsvRecordResult =
  | { ok: true; signals: RecordSignal[]; timeColumn: string | null; sampleCount: number; referredToInput: boolean }
  | { ok: false; message: string; errors: CsvRecordError[] };

/** Smallest number of samples accepted. */
export const minRecordSamples = 16;
/** Largest CSV record accepted, bytes of text (a sanity limit). */
export const maxRecordChars = 64 * 1024 * 1024;
const MAX_ERRORS = 20;

const unitFactors = { V: 1, mV: 1e-3, uV: 1e-6 } as const;
const timeUnitFactors: Record<string, number> = { s: 1, sec: 1, ms: 1e-3, us: 1e-6, 'µs': 1e-6 };
const timeNames = new Set(['time', 't', 'timestamp', 'seconds', 'sec', 'times', 'elapsed', 'elapsedtime']);
const numberPattern = /^[+-]?(?:\d+(?:\.\d*)?|\.\d+)(?:[eE][+-]?\d+)?$/;

function splitHeaderUnit(header: string): { name: string; unit: string | null } {
  const m = /^(.*?)\s*[([]\s*([^()[\]]+?)\s*[)\]]\s*$/.exec(header.trim());
  return m && m[1] !== '' ? { name: m[1], unit: m[2] } : { name: header.trim(), unit: null };
}

/**
 * Reads a CSV bench record.
 *
 * Ragged rows, text or empty cells in numeric columns, a time column that does not increase or is not
 * evenly spaced, and fewer than 16 samples are refused, each with its row number.
 * The sample rate comes from the time column (the slope of the least-squares line through row index and
 * time) or from `sampleRateHz`.
 * Evenly spaced means every interval within 10 % of the mean plus the resolution of the printed times.
 *
 * @param text the file's content
 * @param options units, gain and time column
 * @returns one signal per channel column, samples in volts (divided by the gain when `gainApplied`, so
 *   then referred to the input), or the errors found
 */
export function readCsvRecord(text: string, options: CsvRecordOptions): CsvRecordResult {
  const errors: CsvRecordError[] = [];
  const fail = (message: string, row = 0, column = ''): CsvRecordResult => ({ ok: false, message, errors: [{ row, column, message }] });

  if (typeof text !== 'string') return fail('the record must be text');
  if (!(options.unit in unitFactors)) return fail('unit must be V, mV or uV');
  if (text.length > maxRecordChars) return fail(`the record is larger than ${maxRecordChars / (1024 * 1024)} MB`);
  let divisor = 1;
  if (options.gainApplied) {
    if (options.gain === undefined || !Number.isFinite(options.gain) || options.gain <= 0) {
      return fail('gain must be a positive number when the recorded values include the channel gain');
    }
    divisor = options.gain;
  }
  const body = text.replace(/^\uFEFF/, '');
  if (body.trim() === '') return fail('the record is empty');
  if (looksBinary(body)) return fail('the record is not CSV text (it contains binary data)');

  const parsed = parseCsvRows(body);
  if (parsed.errors.length > 0) {
    const e = parsed.errors[0];
    return { ok: false, message: `row ${e.line}: ${e.message}`, errors: parsed.errors.map((x) => ({ row: x.line, column: '', message: x.message })) };
  }
  const first = parsed.rows[0];
  const hasHeader = first.cells.some((c) => c.trim() !== '' && !numberPattern.test(c.trim()));
  const width = first.cells.length;
  const header = hasHeader ? first.cells.map((c) => c.trim()) : first.cells.map((_, i) => `column ${i + 1}`);
  const dataRows = hasHeader ? parsed.rows.slice(1) : parsed.rows;

  let timeIndex = -1;
  if (options.timeColumn !== undefined) {
    timeIndex = header.indexOf(options.timeColumn.trim());
    if (timeIndex < 0) return fail(`time column "${options.timeColumn}" is not in the header (columns: ${header.join(', ')})`);
  } else if (hasHeader) {
    timeIndex = header.findIndex((h) => timeNames.has(splitHeaderUnit(h).name.toLowerCase().replace(/[^a-z]/g, '')));
  }
  let timeFactor = 1;
  if (timeIndex >= 0) {
    const unit = splitHeaderUnit(header[timeIndex]).unit;
    if (unit !== null) {
      const f = timeUnitFactors[unit.trim()];
      if (f === undefined) return fail(`time column "${header[timeIndex]}": unit "${unit}" is not s, ms or us`, 1, header[timeIndex]);
      timeFactor = f;
    }
  } else if (options.sampleRateHz === undefined) {
    return fail('no time column found: name it with timeColumn, or give the sample rate');
  }
  if (timeIndex < 0 && !(Number.isFinite(options.sampleRateHz) && options.sampleRateHz! > 0)) {
    return fail('sample rate must be a positive number of hertz');
  }
  const channelIndexes = header.map((_, i) => i).filter((i) => i !== timeIndex);
  if (channelIndexes.length === 0) return fail('the record has no channel column besides the time column');

  const n = dataRows.length;
  const times = new Float64Array(n);
  const timeDecimals: number[] = [];
  const channels = channelIndexes.map(() => new Float64Array(n));
  const scale = unitFactors[options.unit] / divisor;
  for (let r = 0; r < n && errors.length < MAX_ERRORS; r++) {
    const { cells, line } = dataRows[r];
    if (cells.length !== width) {
      errors.push({ row: line, column: '', message: `row ${line} has ${cells.length} value${cells.length === 1 ? '' : 's'}; the header has ${width} columns` });
      continue;
    }
    const read = (index: number): number | null => {
      const raw = cells[index].trim();
      if (raw === '') {
        errors.push({ row: line, column: header[index], message: `row ${line}, column "${header[index]}": empty value` });
        return null;
      }
      if (!numberPattern.test(raw)) {
        errors.push({ row: line, column: header[index], message: `row ${line}, column "${header[index]}": "${raw.slice(0, 40)}" is not a number` });
        return null;
      }
      return Number(raw);
    };
    if (timeIndex >= 0) {
      const t = read(timeIndex);
      if (t !== null) {
        times[r] = t * timeFactor;
        const dot = cells[timeIndex].trim().split(/[eE]/)[0].split('.')[1];
        timeDecimals.push(dot ? dot.length : 0);
      }
    }
    channelIndexes.forEach((index, c) => {
      const v = read(index);
      if (v !== null) channels[c][r] = v * scale;
    });
  }
  if (errors.length > 0) return { ok: false, message: errors[0].message, errors };
  if (n < minRecordSamples) return fail(`the record has ${n} sample${n === 1 ? '' : 's'}; at least ${minRecordSamples} are needed`);

  let sampleRateHz: number;
  if (timeIndex >= 0) {
    for (let r = 1; r < n; r++) {
      if (!(times[r] > times[r - 1])) {
        errors.push({
          row: dataRows[r].line,
          column: header[timeIndex],
          message: `time at row ${dataRows[r].line} (${times[r]} s) is not after the time at row ${dataRows[r - 1].line} (${times[r - 1]} s)`,
        });
        if (errors.length >= MAX_ERRORS) break;
      }
    }
    if (errors.length > 0) return { ok: false, message: errors[0].message, errors };
    // Interval from the least-squares line through (row index, time): less sensitive to rounded times than the end points.
    const iMean = (n - 1) / 2;
    let tMean = 0;
    for (let r = 0; r < n; r++) tMean += times[r];
    tMean /= n;
    let sit = 0;
    let sii = 0;
    for (let r = 0; r < n; r++) {
      sit += (r - iMean) * (times[r] - tMean);
      sii += (r - iMean) ** 2;
    }
    const meanDtS = sit / sii;
    // The printed times are rounded: allow half a unit of their last printed decimal on each of the interval's two ends.
    const resolutionS = 10 ** -Math.max(...timeDecimals) * timeFactor;
    const allowedS = 0.1 * meanDtS + resolutionS;
    for (let r = 1; r < n; r++) {
      const dt = times[r] - times[r - 1];
      if (Math.abs(dt - meanDtS) > allowedS) {
        return fail(
          `the time column is not evenly spaced: the interval ending at row ${dataRows[r].line} is ${dt.toPrecision(4)} s, the fitted interval ${meanDtS.toPrecision(4)} s`,
          dataRows[r].line,
          header[timeIndex],
        );
      }
    }
    sampleRateHz = 1 / meanDtS;
  } else {
    sampleRateHz = options.sampleRateHz!;
  }

  return {
    ok: true,
    timeColumn: timeIndex >= 0 ? header[timeIndex] : null,
    sampleCount: n,
    referredToInput: options.gainApplied,
    signals: channelIndexes.map((index, c) => ({
      label: header[index],
      physicalDimension: options.unit,
      siUnit: 'V' as const,
      sampleRateHz,
      samples: channels[c],
    })),
  };
}

export type RecordFormatResult = { ok: true; format: 'edf' | 'csv' } | { ok: false; message: string };

/**
 * Tells an EDF file from a CSV text file by content (the EDF version field "0" padded with spaces and an
 * ASCII fixed header; or decodable UTF-8 text without binary bytes and with at least two lines).
 * @param bytes the uploaded file
 */
export function detectRecordFormat(bytes: Uint8Array): RecordFormatResult {
  if (!(bytes instanceof Uint8Array) || bytes.length === 0) return { ok: false, message: 'the file is empty' };
  if (bytes[0] === 0xff && String.fromCharCode(...bytes.subarray(1, 8)) === 'BIOSEMI') {
    return { ok: false, message: 'this is a BDF (24-bit) file; only EDF (16-bit) and CSV are supported' };
  }
  const startsLikeEdf = bytes.length >= 8 && bytes[0] === 0x30 && bytes.subarray(1, 8).every((b) => b === 0x20);
  if (startsLikeEdf) {
    if (bytes.length >= 256 && bytes.subarray(0, 256).every((b) => b >= 32 && b <= 126)) return { ok: true, format: 'edf' };
    return { ok: false, message: 'the file starts like EDF but its 256-byte fixed header is truncated or not ASCII' };
  }
  let text: string;
  try {
    text = new TextDecoder('utf-8', { fatal: true }).decode(bytes.subarray(0, Math.min(bytes.length, 1 << 20)));
  } catch (e) {
    // A multi-byte character cut at the 1 MiB sample boundary is not an error of the file.
    if (bytes.length <= 1 << 20) return { ok: false, message: 'the file is neither EDF nor CSV text (it is not valid UTF-8)' };
    text = new TextDecoder('utf-8').decode(bytes.subarray(0, (1 << 20) - 4));
    void e;
  }
  if (looksBinary(text)) return { ok: false, message: 'the file is neither EDF nor CSV text (it contains binary data)' };
  const lines = text.split(/\r?\n/).filter((l) => l.trim() !== '');
  const singleColumnNumbers = lines.length >= 2 && lines.slice(1, 20).every((l) => /^\s*[+-]?(?:\d+(?:\.\d*)?|\.\d+)(?:[eE][+-]?\d+)?\s*$/.test(l));
  if (lines.length < 2 || (!/[,;\t]/.test(lines[0] + lines[1]) && !singleColumnNumbers)) {
    return { ok: false, message: 'the file is neither EDF nor CSV: it has no separated columns' };
  }
  return { ok: true, format: 'csv' };
}
