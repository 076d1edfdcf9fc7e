/**
 * Reader and writer for the European Data Format (EDF), following the published specification:
 * B. Kemp, A. Värri, A. C. Rosa, K. D. Nielsen, J. Gade, "A simple format for exchange of digitized
 * polygraphic recordings", Electroencephalography and Clinical Neurophysiology 82 (1992) 391–393.
 *
 * Layout: a 256-byte fixed header, then ns × 256 bytes of signal headers (each field stored for all
 * signals in turn), all fields printable ASCII padded with spaces; then the data records, each holding
 * for every signal its `samples per record` values as 16-bit two's-complement little-endian integers.
 * physical = (digital − dmin)·(pmax − pmin)/(dmax − dmin) + pmin.
 *
 * EDF+ files (reserved field "EDF+C") read as EDF; their "EDF Annotations" signals are skipped and
 * counted. Discontinuous EDF+ ("EDF+D") is refused, since its records are not contiguous in time.
 *
 * Pure: bytes in, typed results out.
 */
import { voltsPerUnit, type RecordSignal } from '@/lib/bench/record-signal';

export interface EdfSignalHeader {
  label: string;
  transducer: string;
  physicalDimension: string;
  physicalMin: number;
  physicalMax: number;
  digitalMin: number;
  digitalMax: number;
  prefiltering: string;
  samplesPerRecord: number;
  reserved: string;
}

export interface EdfHeader {
  version: string;
  patientId: string;
  recordingId: string;
  /** As recorded, dd.mm.yy. */
  startDate: string;
  /** As recorded, hh.mm.ss. */
  startTime: string;
  /** Start as an ISO 8601 local date-time (years 85–99 → 19xx, 00–84 → 20xx, per the specification's clipping date). */
  startIso: string;
  headerBytes: number;
  reserved: string;
  dataRecords: number;
  recordDurationS: number;
  signalCount: number;
  /** "EDF+C" for continuous EDF+, null for plain EDF. */
  edfPlus: 'EDF+C' | null;
  /** Number of "EDF Annotations" signals skipped. */
  annotationSignals: number;
  signals: EdfSignalHeader[];
}

export type EdfReadResult = { ok: true; header: EdfHeader; signals: RecordSignal[] } | { ok: false; message: string };

const FIXED_HEADER_BYTES = 256;
const SIGNAL_HEADER_BYTES = 256;
/** Largest signal count accepted (a sanity limit, not from the specification). */
const MAX_SIGNALS = 1024;

/** Signal-header fields and their widths, in file order (Kemp et al. 1992, table 1). */
const signalFields = [
  ['label', 16],
  ['transducer type', 80],
  ['physical dimension', 8],
  ['physical minimum', 8],
  ['physical maximum', 8],
  ['digital minimum', 8],
  ['digital maximum', 8],
  ['prefiltering', 80],
  ['number of samples in each data record', 8],
  ['reserved', 32],
] as const;

class EdfError extends Error {}

function ascii(bytes: Uint8Array, start: number, length: number, what: string): string {
  let s = '';
  for (let i = start; i < start + length; i++) {
    const b = bytes[i];
    if (b < 32 || b > 126) {
      throw new EdfError(`EDF header field "${what}" holds a byte (${b}) that is not printable ASCII, at offset ${i}`);
    }
    s += String.fromCharCode(b);
  }
  return s;
}

function integerField(text: string, what: string): number {
  const t = text.trim();
  if (!/^[+-]?\d+$/.test(t)) throw new EdfError(`EDF header field "${what}" is not a whole number: "${t}"`);
  return Number(t);
}

function numberField(text: string, what: string): number {
  const t = text.trim();
  if (!/^[+-]?(?:\d+(?:\.\d*)?|\.\d+)(?:[eE][+-]?\d+)?$/.test(t)) throw new EdfError(`EDF header field "${what}" is not a number: "${t}"`);
  return Number(t);
}

function parseStart(date: string, time: string): string {
  const d = /^(\d\d)\.(\d\d)\.(\d\d)$/.exec(date);
  if (!d) throw new EdfError(`EDF header field "start date" must be dd.mm.yy: "${date}"`);
  const t = /^(\d\d)\.(\d\d)\.(\d\d)$/.exec(time);
  if (!t) throw new EdfError(`EDF header field "start time" must be hh.mm.ss: "${time}"`);
  const [day, month, yy] = [Number(d[1]), Number(d[2]), Number(d[3])];
  const [hh, mm, ss] = [Number(t[1]), Number(t[2]), Number(t[3])];
  if (day < 1 || day > 31 || month < 1 || month > 12) throw new EdfError(`EDF header field "start date" is not a valid date: "${date}"`);
  if (hh > 23 || mm > 59 || ss > 59) throw new EdfError(`EDF header field "start time" is not a valid time: "${time}"`);
  const year = yy >= 85 ? 1900 + yy : 2000 + yy;
  const p = (n: number) => String(n).padStart(2, '0');
  return `${year}-${p(month)}-${p(day)}T${p(hh)}:${p(mm)}:${p(ss)}`;
}

/**
 * Reads an EDF file, validating the header strictly against the specification and the file size.
 *
 * @param bytes the whole file
 * @returns the header and the signals (samples converted to volts when the physical dimension is
 *   nV, uV, mV or V; otherwise left in the recorded unit with `siUnit: null`), or a message naming
 *   the problem (truncated header, header byte count, record count against the file size,
 *   non-numeric fields, digital minimum not below maximum, ...)
 */
export function readEdf(bytes: Uint8Array): EdfReadResult {
  try {
    return readEdfOrThrow(bytes);
  } catch (e) {
    if (e instanceof EdfError) return { ok: false, message: e.message };
    return { ok: false, message: `EDF file could not be read: ${e instanceof Error ? e.message : String(e)}` };
  }
}

function readEdfOrThrow(bytes: Uint8Array): EdfReadResult {
  if (!(bytes instanceof Uint8Array)) throw new EdfError('EDF input must be bytes (Uint8Array)');
  if (bytes.length < FIXED_HEADER_BYTES) {
    throw new EdfError(`EDF header is truncated: the file has ${bytes.length} bytes, the fixed header alone needs ${FIXED_HEADER_BYTES}`);
  }
  let pos = 0;
  const take = (length: number, what: string) => {
    const s = ascii(bytes, pos, length, what);
    pos += length;
    return s;
  };
  const version = take(8, 'version').trim();
  if (version !== '0') throw new EdfError(`EDF header field "version" must be "0", found "${version}"`);
  const patientId = take(80, 'patient identification').trimEnd();
  const recordingId = take(80, 'recording identification').trimEnd();
  const startDate = take(8, 'start date').trim();
  const startTime = take(8, 'start time').trim();
  const headerBytes = integerField(take(8, 'number of bytes in header record'), 'number of bytes in header record');
  const reserved = take(44, 'reserved').trimEnd();
  const dataRecords = integerField(take(8, 'number of data records'), 'number of data records');
  const recordDurationS = numberField(take(8, 'duration of a data record'), 'duration of a data record');
  const signalCount = integerField(take(4, 'number of signals'), 'number of signals');
  const startIso = parseStart(startDate, startTime);

  if (signalCount < 1) throw new EdfError(`EDF header field "number of signals" must be at least 1, found ${signalCount}`);
  if (signalCount > MAX_SIGNALS) throw new EdfError(`EDF header announces ${signalCount} signals; at most ${MAX_SIGNALS} are accepted`);
  const expectedHeaderBytes = FIXED_HEADER_BYTES + SIGNAL_HEADER_BYTES * signalCount;
  if (headerBytes !== expectedHeaderBytes) {
    throw new EdfError(
      `EDF header field "number of bytes in header record" is ${headerBytes}, but ${signalCount} signal${signalCount === 1 ? '' : 's'} need ${expectedHeaderBytes} (256 + 256 × ${signalCount})`,
    );
  }
  if (bytes.length < headerBytes) {
    throw new EdfError(`EDF header is truncated: the header record needs ${headerBytes} bytes, the file has ${bytes.length}`);
  }
  if (reserved.startsWith('EDF+D')) throw new EdfError('discontinuous EDF+ (EDF+D) records are not supported; export as continuous EDF or EDF+C');
  const edfPlus = reserved.startsWith('EDF+C') ? 'EDF+C' : null;
  if (dataRecords === -1) throw new EdfError('EDF header field "number of data records" is -1 (unknown): the recording was not closed properly');
  if (dataRecords < 1) throw new EdfError(`EDF header field "number of data records" must be at least 1, found ${dataRecords}`);
  if (!(recordDurationS > 0)) throw new EdfError(`EDF header field "duration of a data record" must be greater than zero, found ${recordDurationS}`);

  const columns: string[][] = [];
  for (const [what, width] of signalFields) {
    const values: string[] = [];
    for (let s = 0; s < signalCount; s++) values.push(take(width, `${what} (signal ${s + 1})`));
    columns.push(values);
  }
  const signals: EdfSignalHeader[] = [];
  for (let s = 0; s < signalCount; s++) {
    const label = columns[0][s].trim();
    const name = `signal ${s + 1} ("${label}")`;
    const num = (i: number) => numberField(columns[i][s], `${signalFields[i][0]}, ${name}`);
    const int = (i: number) => integerField(columns[i][s], `${signalFields[i][0]}, ${name}`);
    const header: EdfSignalHeader = {
      label,
      transducer: columns[1][s].trim(),
      physicalDimension: columns[2][s].trim(),
      physicalMin: num(3),
      physicalMax: num(4),
      digitalMin: int(5),
      digitalMax: int(6),
      prefiltering: columns[7][s].trim(),
      samplesPerRecord: int(8),
      reserved: columns[9][s].trim(),
    };
    if (header.digitalMin >= header.digitalMax) {
      throw new EdfError(`${name}: digital minimum (${header.digitalMin}) must be below digital maximum (${header.digitalMax})`);
    }
    if (header.digitalMin < -32768 || header.digitalMax > 32767) {
      throw new EdfError(`${name}: digital range ${header.digitalMin}…${header.digitalMax} exceeds the 16-bit range −32768…32767`);
    }
    if (header.physicalMin === header.physicalMax) {
      throw new EdfError(`${name}: physical minimum equals physical maximum (${header.physicalMin})`);
    }
    if (header.samplesPerRecord < 1) {
      throw new EdfError(`${name}: number of samples in each data record must be at least 1, found ${header.samplesPerRecord}`);
    }
    signals.push(header);
  }

  const recordBytes = signals.reduce((sum, h) => sum + 2 * h.samplesPerRecord, 0);
  const dataBytes = bytes.length - headerBytes;
  const expectedDataBytes = dataRecords * recordBytes;
  if (dataBytes !== expectedDataBytes) {
    const holds = Number.isInteger(dataBytes / recordBytes) ? `${dataBytes / recordBytes} records` : `${(dataBytes / recordBytes).toFixed(2)} records`;
    throw new EdfError(
      `EDF file size does not match the header: ${dataRecords} data records of ${recordBytes} bytes need ${expectedDataBytes} bytes after the header, the file has ${dataBytes} (${holds})`,
    );
  }

  const view = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength);
  const out: RecordSignal[] = [];
  const decoded = signals.map((h) => new Float64Array(h.samplesPerRecord * dataRecords));
  let offset = headerBytes;
  for (let r = 0; r < dataRecords; r++) {
    for (let s = 0; s < signalCount; s++) {
      const h = signals[s];
      const target = decoded[s];
      const scale = (h.physicalMax - h.physicalMin) / (h.digitalMax - h.digitalMin);
      const base = r * h.samplesPerRecord;
      for (let i = 0; i < h.samplesPerRecord; i++) {
        const digital = view.getInt16(offset, true);
        offset += 2;
        target[base + i] = (digital - h.digitalMin) * scale + h.physicalMin;
      }
    }
  }
  let annotationSignals = 0;
  for (let s = 0; s < signalCount; s++) {
    const h = signals[s];
    if (edfPlus && h.label === 'EDF Annotations') {
      annotationSignals++;
      continue;
    }
    const factor = voltsPerUnit(h.physicalDimension);
    const samples = decoded[s];
    if (factor !== null && factor !== 1) for (let i = 0; i < samples.length; i++) samples[i] *= factor;
    out.push({
      label: h.label,
      physicalDimension: h.physicalDimension,
      siUnit: factor === null ? null : 'V',
      sampleRateHz: h.samplesPerRecord / recordDurationS,
      samples,
    });
  }

  return {
    ok: true,
    header: {
      version,
      patientId,
      recordingId,
      startDate,
      startTime,
      startIso,
      headerBytes,
      reserved,
      dataRecords,
      recordDurationS,
      signalCount,
      edfPlus,
      annotationSignals,
      signals,
    },
    signals: out,
  };
}

export interface EdfWriteSignal {
  label: string;
  /** Samples in volts. */
  samplesV: ArrayLike<number>;
  sampleRateHz: number;
  /** Unit the file stores; samples are converted from volts into it. */
  physicalDimension: 'uV' | 'mV' | 'V';
  /** Physical range in volts; defaults to the samples' range, rounded outward to fit the 8-character field. */
  physicalMinV?: number;
  physicalMaxV?: number;
  /** Digital range; defaults to −32768…32767. */
  digitalMin?: number;
  digitalMax?: number;
  transducer?: string;
  prefiltering?: string;
}

export interface EdfWriteInput {
  patientId?: string;
  recordingId?: string;
  /** Start of the recording; written from its UTC fields. Defaults to 2000-01-01T00:00:00Z. */
  start?: Date;
  /** Duration of a data record, s. */
  recordDurationS: number;
  signals: EdfWriteSignal[];
}

export type EdfWriteResult = { ok: true; bytes: Uint8Array } | { ok: false; message: string };

/**
 * Formats a number into at most 8 ASCII characters, rounding toward `direction` so that a
 * physical range written with it still covers the data.
 */
function edfNumber(value: number, direction: 'down' | 'up' | 'nearest', what: string): string {
  for (let decimals = 7; decimals >= 0; decimals--) {
    const scale = 10 ** decimals;
    const scaled = value * scale;
    const rounded = direction === 'down' ? Math.floor(scaled + 1e-9) : direction === 'up' ? Math.ceil(scaled - 1e-9) : Math.round(scaled);
    let s = (rounded / scale).toFixed(decimals);
    if (s.includes('.')) s = s.replace(/0+$/, '').replace(/\.$/, '');
    if (s === '-0') s = '0';
    if (s.length <= 8) return s;
  }
  throw new EdfError(`${what} (${value}) does not fit the 8-character EDF field; store the signal in a larger unit`);
}

function field(text: string, width: number, what: string): string {
  if (text.length > width) throw new EdfError(`${what} is longer than its ${width}-character EDF field: "${text}"`);
  if (!/^[\x20-\x7e]*$/.test(text)) throw new EdfError(`${what} must be printable ASCII: "${text}"`);
  return text.padEnd(width, ' ');
}

/**
 * Writes signals as an EDF file (plain EDF, version "0").
 * The sample count of each signal must be a whole number of data records, the same number for all.
 *
 * @returns the file's bytes, or a message naming the problem
 */
export function writeEdf(input: EdfWriteInput): EdfWriteResult {
  try {
    return { ok: true, bytes: writeEdfOrThrow(input) };
  } catch (e) {
    if (e instanceof EdfError) return { ok: false, message: e.message };
    return { ok: false, message: `EDF file could not be written: ${e instanceof Error ? e.message : String(e)}` };
  }
}

function writeEdfOrThrow(input: EdfWriteInput): Uint8Array {
  const ns = input.signals.length;
  if (ns < 1) throw new EdfError('an EDF file needs at least one signal');
  if (!(input.recordDurationS > 0) || !Number.isFinite(input.recordDurationS)) throw new EdfError('record duration must be a positive number of seconds');
  const durationText = edfNumber(input.recordDurationS, 'nearest', 'record duration');
  if (Math.abs(Number(durationText) - input.recordDurationS) > 1e-12 * input.recordDurationS) {
    throw new EdfError(`record duration ${input.recordDurationS} s cannot be written exactly in 8 characters`);
  }

  let records = -1;
  const prepared = input.signals.map((s, index) => {
    const name = `signal ${index + 1} ("${s.label}")`;
    const perRecordExact = s.sampleRateHz * input.recordDurationS;
    const perRecord = Math.round(perRecordExact);
    if (!(perRecord >= 1) || Math.abs(perRecord - perRecordExact) > 1e-9 * perRecordExact) {
      throw new EdfError(`${name}: sample rate × record duration must be a whole number of samples, got ${perRecordExact}`);
    }
    if (s.samplesV.length === 0 || s.samplesV.length % perRecord !== 0) {
      throw new EdfError(`${name}: ${s.samplesV.length} samples are not a whole number of ${perRecord}-sample data records`);
    }
    const n = s.samplesV.length / perRecord;
    if (records === -1) records = n;
    else if (records !== n) throw new EdfError(`${name}: spans ${n} data records, the first signal ${records}`);
    const factor = voltsPerUnit(s.physicalDimension);
    if (factor === null) throw new EdfError(`${name}: physical dimension must be uV, mV or V`);
    let lo = Infinity;
    let hi = -Infinity;
    for (let i = 0; i < s.samplesV.length; i++) {
      const v = s.samplesV[i];
      if (!Number.isFinite(v)) throw new EdfError(`${name}: sample ${i + 1} is not a finite number`);
      if (v < lo) lo = v;
      if (v > hi) hi = v;
    }
    const pMinGiven = s.physicalMinV === undefined ? lo : s.physicalMinV;
    const pMaxGiven = s.physicalMaxV === undefined ? hi : s.physicalMaxV;
    let pMin = pMinGiven / factor;
    let pMax = pMaxGiven / factor;
    if (pMax <= pMin) {
      if (s.physicalMinV !== undefined && s.physicalMaxV !== undefined) throw new EdfError(`${name}: physical maximum must be above the physical minimum`);
      pMin -= 1;
      pMax += 1;
    }
    const pMinText = edfNumber(pMin, 'down', `${name}: physical minimum`);
    const pMaxText = edfNumber(pMax, 'up', `${name}: physical maximum`);
    const dMin = s.digitalMin ?? -32768;
    const dMax = s.digitalMax ?? 32767;
    if (!Number.isInteger(dMin) || !Number.isInteger(dMax) || dMin < -32768 || dMax > 32767 || dMin >= dMax) {
      throw new EdfError(`${name}: digital range must be whole numbers with −32768 ≤ minimum < maximum ≤ 32767`);
    }
    return { s, name, perRecord, factor, pMin: Number(pMinText), pMax: Number(pMaxText), pMinText, pMaxText, dMin, dMax };
  });

  const headerBytes = 256 + 256 * ns;
  const start = input.start ?? new Date(Date.UTC(2000, 0, 1));
  const p2 = (n: number) => String(n).padStart(2, '0');
  const yy = start.getUTCFullYear();
  if (yy < 1985 || yy > 2084) throw new EdfError('start year must lie between 1985 and 2084 (two-digit EDF year)');
  let header =
    field('0', 8, 'version') +
    field(input.patientId ?? 'X', 80, 'patient identification') +
    field(input.recordingId ?? 'X', 80, 'recording identification') +
    `${p2(start.getUTCDate())}.${p2(start.getUTCMonth() + 1)}.${p2(yy % 100)}` +
    `${p2(start.getUTCHours())}.${p2(start.getUTCMinutes())}.${p2(start.getUTCSeconds())}` +
    field(String(headerBytes), 8, 'header bytes') +
    field('', 44, 'reserved') +
    field(String(records), 8, 'number of data records') +
    field(durationText, 8, 'record duration') +
    field(String(ns), 4, 'number of signals');
  const perSignal = (f: (x: (typeof prepared)[number]) => string) => prepared.map(f).join('');
  header += perSignal((x) => field(x.s.label, 16, `${x.name}: label`));
  header += perSignal((x) => field(x.s.transducer ?? '', 80, `${x.name}: transducer type`));
  header += perSignal((x) => field(x.s.physicalDimension, 8, `${x.name}: physical dimension`));
  header += perSignal((x) => field(x.pMinText, 8, `${x.name}: physical minimum`));
  header += perSignal((x) => field(x.pMaxText, 8, `${x.name}: physical maximum`));
  header += perSignal((x) => field(String(x.dMin), 8, `${x.name}: digital minimum`));
  header += perSignal((x) => field(String(x.dMax), 8, `${x.name}: digital maximum`));
  header += perSignal((x) => field(x.s.prefiltering ?? '', 80, `${x.name}: prefiltering`));
  header += perSignal((x) => field(String(x.perRecord), 8, `${x.name}: samples per record`));
  header += perSignal(() => field('', 32, 'reserved'));
  if (header.length !== headerBytes) throw new Error(`internal: EDF header is ${header.length} bytes, expected ${headerBytes}`);

  const recordBytes = prepared.reduce((sum, x) => sum + 2 * x.perRecord, 0);
  const out = new Uint8Array(headerBytes + records * recordBytes);
  for (let i = 0; i < headerBytes; i++) out[i] = header.charCodeAt(i);
  const view = new DataView(out.buffer);
  let offset = headerBytes;
  for (let r = 0; r < records; r++) {
    for (const x of prepared) {
      // digital = (physical − pmin)·(dmax − dmin)/(pmax − pmin) + dmin, the inverse of the reader's mapping, with the written (rounded) pmin/pmax.
      const scale = (x.dMax - x.dMin) / (x.pMax - x.pMin);
      for (let i = 0; i < x.perRecord; i++) {
        const physical = x.s.samplesV[r * x.perRecord + i] / x.factor;
        const digital = Math.min(x.dMax, Math.max(x.dMin, Math.round((physical - x.pMin) * scale + x.dMin)));
        view.setInt16(offset, digital, true);
        offset += 2;
      }
    }
  }
  return out;
}
