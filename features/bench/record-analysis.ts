/**
 * Bench records on the server: the upload settings (zod), reading the file by its content (EDF or
 * CSV, through lib/bench), the analysis with the revision's plan (its profile's band, the plan's mains
 * frequency, the profile's noise window) and the comparison with the revision's stored report.
 * No database, no I/O: bytes and JSON in, typed results out.
 */
import { z } from 'zod';
import { analyzeRecord, comparePrediction, MAX_WINDOW_SAMPLES, type ComparisonRow, type PredictedLevels, type RecordAnalysis } from '@/lib/bench/analyze';
import { detectRecordFormat, readCsvRecord } from '@/lib/bench/csv-record';
import { readEdf } from '@/lib/bench/edf';
import type { RecordSignal } from '@/lib/bench/record-signal';
import { profileFor } from '@/lib/engine/profiles';
import type { ChannelReport } from '@/lib/engine/report';

/** Largest bench record accepted: 20 MB (20 × 1024 × 1024 bytes). */
export const BENCH_MAX_BYTES = 20 * 1024 * 1024;
/** Noise window used when the profile names none, s (the diagnostic-ECG noise test's 10 s; common practice, no source for other profiles). */
export const DEFAULT_NOISE_WINDOW_S = 10;

const optionalNumber = (label: string) =>
  z
    .string()
    .trim()
    .optional()
    .transform((v, ctx) => {
      if (v === undefined || v === '') return undefined;
      const n = Number(v);
      if (!Number.isFinite(n)) {
        ctx.addIssue({ code: 'custom', message: `${label} must be a number` });
        return z.NEVER;
      }
      return n;
    });

/** The text fields of a bench upload (multipart, the file in `file`). */
export const benchUploadFieldsSchema = z
  .object({
    /** EDF signal label or CSV column header; the first voltage signal when omitted. */
    channel: z.string().trim().max(120, { message: 'channel must be at most 120 characters' }).optional(),
    /** Unit of the CSV values (EDF files state their own). */
    unit: z.enum(['V', 'mV', 'uV'], { error: 'unit must be V, mV or uV' }).optional(),
    gainMode: z.enum(['referred-to-input', 'gain-to-apply'], { error: 'gain mode must be referred-to-input or gain-to-apply' }),
    /** Gain from the channel input to the recorded values, V/V (for gain-to-apply). */
    gainVPerV: optionalNumber('gain'),
    /** CSV without a time column: the sample rate, Hz. */
    sampleRateHz: optionalNumber('sample rate'),
    note: z.string().trim().max(500, { message: 'note must be at most 500 characters' }).optional().default(''),
  })
  .superRefine((v, ctx) => {
    if (v.gainMode === 'gain-to-apply') {
      if (v.gainVPerV === undefined) ctx.addIssue({ code: 'custom', path: ['gainVPerV'], message: 'gain is required when the record still carries the channel gain' });
      else if (!(v.gainVPerV > 0 && v.gainVPerV <= 1e7)) ctx.addIssue({ code: 'custom', path: ['gainVPerV'], message: 'gain must be greater than 0 and at most 10,000,000 V/V' });
    }
    if (v.sampleRateHz !== undefined && !(v.sampleRateHz > 0 && v.sampleRateHz <= 1e7)) {
      ctx.addIssue({ code: 'custom', path: ['sampleRateHz'], message: 'sample rate must be greater than 0 and at most 10 MHz' });
    }
  });
export type BenchUploadFields = z.infer<typeof benchUploadFieldsSchema>;

export type ReadRecordResult =
  | { ok: true; format: 'edf' | 'csv'; signal: RecordSignal; channels: string[]; durationS: number }
  | { ok: false; field: 'file' | 'channel' | 'unit' | 'sampleRateHz'; message: string };

/**
 * Reads the uploaded file by its content and picks the channel.
 * CSV values are read as recorded (in `unit`); the gain is applied by the analysis.
 */
export function readBenchRecord(bytes: Uint8Array, settings: Pick<BenchUploadFields, 'channel' | 'unit' | 'sampleRateHz'>): ReadRecordResult {
  if (bytes.length > BENCH_MAX_BYTES) {
    return { ok: false, field: 'file', message: `the file is ${(bytes.length / (1024 * 1024)).toFixed(1)} MB; the limit is 20 MB` };
  }
  const format = detectRecordFormat(bytes);
  if (!format.ok) return { ok: false, field: 'file', message: format.message };
  let signals: RecordSignal[];
  if (format.format === 'edf') {
    const edf = readEdf(bytes);
    if (!edf.ok) return { ok: false, field: 'file', message: `EDF: ${edf.message}` };
    signals = edf.signals;
  } else {
    if (!settings.unit) return { ok: false, field: 'unit', message: 'unit is required for a CSV record (V, mV or uV)' };
    const text = new TextDecoder('utf-8').decode(bytes);
    const csv = readCsvRecord(text, { unit: settings.unit, gainApplied: false, sampleRateHz: settings.sampleRateHz });
    if (!csv.ok) {
      const details = csv.errors.slice(0, 5).map((e) => (e.row > 0 ? `row ${e.row}${e.column ? `, column "${e.column}"` : ''}: ${e.message}` : e.message));
      const unique = [...new Set([csv.message, ...details])];
      return { ok: false, field: /sample rate/i.test(csv.message) ? 'sampleRateHz' : 'file', message: `CSV: ${unique.join('; ')}` };
    }
    signals = csv.signals;
  }
  const channels = signals.map((s) => s.label);
  const voltage = signals.filter((s) => s.siUnit === 'V');
  if (voltage.length === 0) return { ok: false, field: 'file', message: 'the record has no voltage signal (no channel in V, mV or uV)' };
  let signal: RecordSignal | undefined;
  if (settings.channel) {
    signal = signals.find((s) => s.label.trim() === settings.channel);
    if (!signal) return { ok: false, field: 'channel', message: `channel "${settings.channel}" is not in the record; it has ${channels.map((c) => `"${c}"`).join(', ')}` };
    if (signal.siUnit !== 'V') return { ok: false, field: 'channel', message: `channel "${settings.channel}" is in "${signal.physicalDimension}", not a voltage` };
  } else {
    signal = voltage[0];
  }
  return { ok: true, format: format.format, signal, channels, durationS: signal.samples.length / signal.sampleRateHz };
}

/** What the analysis takes from the revision's plan and profile. */
export interface BenchConditions {
  bandLowHz: number;
  bandHighHz: number;
  mainsHz: 50 | 60;
  /** The profile's noise window, s. */
  profileWindowS: number;
  profileName: string;
}

/**
 * The band and window of the revision's profile and the plan's mains frequency.
 * @param plan the revision's frozen plan (validated when it was frozen)
 */
export function benchConditions(plan: Record<string, unknown>): BenchConditions {
  const profile = profileFor(String(plan.profileId), plan.customProfile);
  return {
    bandLowHz: profile.band.lowHz,
    bandHighHz: profile.band.highHz,
    mainsHz: plan.mainsHz === 60 ? 60 : 50,
    profileWindowS: profile.checks.noisePpV?.windowS ?? DEFAULT_NOISE_WINDOW_S,
    profileName: profile.name,
  };
}

/**
 * The prediction the record is compared with, from the revision's stored report:
 * offset = the worst-case DC input of the levels analysis (a bound: electrode offset, bias and
 * lead-off terms, op-amp offsets and the signal); noise = the report's RTI rms and peak-to-peak;
 * mains = the interference referred to input, peak-to-peak.
 */
export function predictedLevels(report: unknown): PredictedLevels {
  const r = report as Partial<ChannelReport> | null;
  const num = (v: unknown) => (typeof v === 'number' && Number.isFinite(v) ? v : NaN);
  return {
    offsetV: num(r?.worstCaseInputV),
    noiseRmsV: num(r?.noise?.rtiRmsV),
    noisePpV: num(r?.noise?.rtiPpV),
    mainsPpV: num(r?.interference?.rtiPpV),
  };
}

export type BenchAnalysisResult =
  | { ok: true; analysis: RecordAnalysis; comparison: ComparisonRow[]; predicted: PredictedLevels; conditions: BenchConditions; notes: string[] }
  | { ok: false; message: string };

/**
 * Analyses the signal with the revision's conditions and compares it with the prediction.
 * The window is the profile's noise window, shortened to the record (or to the analysis limit) with a note.
 * @param gainVPerV gain from the channel input to the recorded values (1 when referred to input)
 */
export function analyzeForRevision(signal: RecordSignal, gainVPerV: number, plan: Record<string, unknown>, report: unknown): BenchAnalysisResult {
  const conditions = benchConditions(plan);
  const notes: string[] = [];
  const recordS = signal.samples.length / signal.sampleRateHz;
  let windowS = conditions.profileWindowS;
  if (windowS * signal.sampleRateHz > signal.samples.length) {
    windowS = recordS;
    notes.push(`The record lasts ${recordS.toPrecision(4)} s, shorter than the profile's ${conditions.profileWindowS} s noise window; the whole record was analysed.`);
  }
  if (Math.round(windowS * signal.sampleRateHz) > MAX_WINDOW_SAMPLES) {
    windowS = Math.floor(MAX_WINDOW_SAMPLES / signal.sampleRateHz);
    notes.push(`The window was shortened to ${windowS} s (${MAX_WINDOW_SAMPLES.toLocaleString('en-US')} samples are analysed at most).`);
  }
  // A shortened window holds whole samples only, so it never reaches past the record by rounding.
  if (windowS !== conditions.profileWindowS) windowS = Math.floor(windowS * signal.sampleRateHz) / signal.sampleRateHz;
  const nyquistHz = signal.sampleRateHz / 2;
  if (conditions.bandHighHz > nyquistHz) {
    return {
      ok: false,
      message: `the record is sampled at ${signal.sampleRateHz} Hz; the plan's band reaches ${conditions.bandHighHz} Hz, which needs at least ${2 * conditions.bandHighHz} Hz`,
    };
  }
  const result = analyzeRecord(signal, {
    bandLowHz: conditions.bandLowHz,
    bandHighHz: conditions.bandHighHz,
    mainsHz: conditions.mainsHz,
    windowS,
    gainToInput: gainVPerV,
  });
  if (!result.ok) return { ok: false, message: `analysis: ${result.message}` };
  const predicted = predictedLevels(report);
  const comparison = comparePrediction(result.analysis, predicted);
  return { ok: true, analysis: result.analysis, comparison, predicted, conditions, notes: [...notes, ...result.analysis.notes] };
}

/** The measurements as stored with the record (the spectrum is recomputed from the file when shown). */
export function storedAnalysis(result: Extract<BenchAnalysisResult, { ok: true }>): Record<string, unknown> {
  const { spectrum: _spectrum, ...measurements } = result.analysis;
  return { ...measurements, conditions: result.conditions, predicted: result.predicted, notes: result.notes };
}

/** The comparison rows in the shape the design-rationale export takes. */
export interface BenchExportRow {
  quantity: string;
  /** Every compared quantity is a voltage referred to input. */
  unit: 'V';
  predicted: number;
  measured: number;
  ratio: number | null;
  within: boolean;
}

/** Comparison rows → the export's rows (label as the quantity; `within` true only for the verdict "within"). */
export function toExportRows(rows: readonly ComparisonRow[]): BenchExportRow[] {
  return rows.map((r) => ({ quantity: r.label, unit: 'V' as const, predicted: r.predicted, measured: r.measured, ratio: r.ratio, within: r.verdict === 'within' }));
}

/**
 * A trace for plotting: the analysis window referred to input, reduced to at most `maxPoints`
 * points by keeping each bucket's minimum and maximum in time order (so peaks and clipping stay visible).
 */
export function traceForPlot(signal: RecordSignal, gainVPerV: number, windowS: number, maxPoints = 4000): { tS: number[]; inputV: number[] } {
  const fs = signal.sampleRateHz;
  const n = Math.min(signal.samples.length, Math.max(1, Math.round(windowS * fs)));
  const tS: number[] = [];
  const inputV: number[] = [];
  if (n <= maxPoints) {
    for (let i = 0; i < n; i++) {
      tS.push(i / fs);
      inputV.push(signal.samples[i] / gainVPerV);
    }
    return { tS, inputV };
  }
  const buckets = Math.floor(maxPoints / 2);
  for (let b = 0; b < buckets; b++) {
    const start = Math.floor((b * n) / buckets);
    const end = Math.floor(((b + 1) * n) / buckets);
    let lo = start;
    let hi = start;
    for (let i = start; i < end; i++) {
      if (signal.samples[i] < signal.samples[lo]) lo = i;
      if (signal.samples[i] > signal.samples[hi]) hi = i;
    }
    for (const i of lo <= hi ? [lo, hi] : [hi, lo]) {
      tS.push(i / fs);
      inputV.push(signal.samples[i] / gainVPerV);
    }
  }
  return { tS, inputV };
}
