/**
 * Analysis of a bench record, referred to the channel input: DC offset, drift, in-band noise (rms and
 * peak-to-peak), mains amplitude and harmonics, clipping, and a spectrum for plotting; and the comparison
 * of those measurements with the plan's prediction.
 *
 * Method, in order, over the analysis window:
 * 1. Refer to input: x = recorded / gainToInput.
 * 2. Offset = mean of x; drift = slope of the least-squares line through x (V/s); x is detrended by that line.
 * 3. Mains: Hann-windowed spectrum (fft.js, zero-padded to ≥ 2× the window length) of the detrended x;
 *    the peak near k·mainsHz (within ±1 %, at least ±3 bins) is refined by maximising the windowed
 *    DTFT magnitude (golden-section search), so the estimate does not depend on the bin grid; amplitude
 *    = 2·|DTFT|/Σw (coherent gain of the Hann window). Harmonics 2–5 likewise, at k × the refined fundamental.
 * 4. Noise: every mains harmonic inside the band (and harmonics 1–5) is fitted by least squares at the
 *    refined frequencies and subtracted; the residual is even-extended (mirrored, so its periodic
 *    extension is continuous) and band-limited by an ideal (brick-wall) filter in the frequency domain:
 *    bins outside [bandLowHz, bandHighHz] are zeroed, and so are bins within ±mainsExclusionHz (default
 *    1 Hz) of each mains harmonic. The excluded width is reported; the noise figure is not rescaled for it.
 *    Noise rms and peak-to-peak are taken from that band-limited time signal over the window.
 * 5. Clipping: samples at or beyond the given limits, or (without limits) runs of equal samples at the
 *    record's extreme values ("flat tops", common practice, no source).
 * 6. Spectrum: one-sided amplitude spectral density of the detrended x (Hann window, V/√Hz), power-averaged
 *    into at most 400 log-spaced points.
 */
import { dft, nextPowerOfTwo, realFftPadded } from '@/lib/bench/spectral';
import type { RecordSignal } from '@/lib/bench/record-signal';

export interface AnalyzeOptions {
  /** Noise band, Hz. */
  bandLowHz: number;
  bandHighHz: number;
  mainsHz: 50 | 60;
  /** Length of the analysis window, s (e.g. 10 s for the diagnostic-ECG noise test). */
  windowS: number;
  /** Start of the window from the start of the record, s (default 0). */
  windowStartS?: number;
  /** Gain from the channel input to the recorded values, V/V (1 when the record is already referred to input). */
  gainToInput: number;
  /** Rails of the recorded signal, in volts as recorded (before dividing by the gain). */
  clipLimits?: { lowV: number; highV: number };
  /** Half-width of the band removed around each mains harmonic from the noise figure, Hz (default 1 Hz). */
  mainsExclusionHz?: number;
}

export interface MainsHarmonic {
  harmonic: number;
  frequencyHz: number;
  /** Amplitude (peak) referred to input, V. */
  amplitudeV: number;
}

export interface ClippingRun {
  startS: number;
  durationS: number;
  level: 'high' | 'low';
}

export interface RecordAnalysis {
  sampleRateHz: number;
  windowStartS: number;
  windowS: number;
  sampleCount: number;
  /** Mean over the window, referred to input, V. */
  offsetV: number;
  /** Slope of the least-squares line, referred to input, V/s. */
  driftVPerS: number;
  /** In-band noise, mains excluded, referred to input: rms and peak-to-peak over the window, V. */
  noiseRmsV: number;
  noisePpV: number;
  noiseBandLowHz: number;
  noiseBandHighHz: number;
  /** Total width of the band removed around mains harmonics inside the noise band, Hz. */
  mainsExcludedHz: number;
  mains: {
    /** Measured fundamental frequency, Hz. */
    frequencyHz: number;
    /** Fundamental amplitude (peak), referred to input, V. */
    amplitudeV: number;
    /** Fundamental peak-to-peak (2 × amplitude), referred to input, V. */
    ppV: number;
    /** Harmonics 2–5 (those below the Nyquist frequency). */
    harmonics: MainsHarmonic[];
    /** Peak-to-peak of the fitted mains waveform, fundamental and harmonics together, referred to input, V. */
    withHarmonicsPpV: number;
  };
  clipping: {
    method: 'limits' | 'flat-top';
    clipped: boolean;
    /** Samples at the rails over the whole record. */
    clippedSamples: number;
    /** The first runs (at most 50). */
    runs: ClippingRun[];
    runCount: number;
  };
  spectrum: { frequencyHz: number[]; asdVPerRtHz: number[] };
  notes: string[];
}

export type AnalyzeResult = { ok: true; analysis: RecordAnalysis } | { ok: false; message: string };

const MIN_WINDOW_SAMPLES = 64;
/** Largest window, samples (2^18: e.g. 2 min at 2 kHz); keeps the transforms within about 100 MB. */
export const MAX_WINDOW_SAMPLES = 262_144;
const SPECTRUM_POINTS = 400;

function hann(n: number): Float64Array {
  const w = new Float64Array(n);
  // Periodic-free symmetric Hann: w[i] = 0.5 − 0.5·cos(2πi/(n − 1)).
  for (let i = 0; i < n; i++) w[i] = 0.5 - 0.5 * Math.cos((2 * Math.PI * i) / (n - 1));
  return w;
}

/** |Σ y[i]·e^(−2πi·f·i/fs)| for one frequency (y already windowed). */
function dtftMagnitude(y: Float64Array, fHz: number, fsHz: number): number {
  const step = (2 * Math.PI * fHz) / fsHz;
  // Recurrence for cos/sin of i·step, re-anchored every 1024 samples against drift.
  let re = 0;
  let im = 0;
  const cs = Math.cos(step);
  const sn = Math.sin(step);
  let c = 1;
  let s = 0;
  for (let i = 0; i < y.length; i++) {
    if ((i & 1023) === 0) {
      c = Math.cos(step * i);
      s = Math.sin(step * i);
    }
    re += y[i] * c;
    im -= y[i] * s;
    const c2 = c * cs - s * sn;
    s = s * cs + c * sn;
    c = c2;
  }
  return Math.hypot(re, im);
}

/** Frequency of the largest windowed-DTFT magnitude in [lo, hi], by golden-section search. */
function refinePeak(y: Float64Array, loHz: number, hiHz: number, fsHz: number): number {
  const g = (Math.sqrt(5) - 1) / 2;
  let a = loHz;
  let b = hiHz;
  let c = b - g * (b - a);
  let d = a + g * (b - a);
  let fc = dtftMagnitude(y, c, fsHz);
  let fd = dtftMagnitude(y, d, fsHz);
  for (let i = 0; i < 40 && b - a > 1e-7 * hiHz; i++) {
    if (fc > fd) {
      b = d;
      d = c;
      fd = fc;
      c = b - g * (b - a);
      fc = dtftMagnitude(y, c, fsHz);
    } else {
      a = c;
      c = d;
      fc = fd;
      d = a + g * (b - a);
      fd = dtftMagnitude(y, d, fsHz);
    }
  }
  return (a + b) / 2;
}

/** Solves A·x = b (small, dense, symmetric positive definite) by Gaussian elimination with partial pivoting. */
function solve(a: number[][], b: number[]): number[] {
  const n = b.length;
  const m = a.map((row, i) => [...row, b[i]]);
  for (let col = 0; col < n; col++) {
    let pivot = col;
    for (let r = col + 1; r < n; r++) if (Math.abs(m[r][col]) > Math.abs(m[pivot][col])) pivot = r;
    [m[col], m[pivot]] = [m[pivot], m[col]];
    const p = m[col][col];
    if (Math.abs(p) < 1e-300) continue;
    for (let r = 0; r < n; r++) {
      if (r === col) continue;
      const factor = m[r][col] / p;
      if (factor === 0) continue;
      for (let k = col; k <= n; k++) m[r][k] -= factor * m[col][k];
    }
  }
  return m.map((row, i) => (Math.abs(row[i]) < 1e-300 ? 0 : row[n] / row[i]));
}

/** Least-squares fit of Σ (a_k cos + b_k sin)(2π f_k t) to y; returns the fitted waveform. */
function fitSinusoids(y: Float64Array, frequenciesHz: number[], fsHz: number): Float64Array {
  const n = y.length;
  const k = frequenciesHz.length;
  const basis: Float64Array[] = [];
  for (const f of frequenciesHz) {
    const c = new Float64Array(n);
    const s = new Float64Array(n);
    for (let i = 0; i < n; i++) {
      const phase = (2 * Math.PI * f * i) / fsHz;
      c[i] = Math.cos(phase);
      s[i] = Math.sin(phase);
    }
    basis.push(c, s);
  }
  const size = 2 * k;
  const ata: number[][] = Array.from({ length: size }, () => new Array<number>(size).fill(0));
  const aty = new Array<number>(size).fill(0);
  for (let p = 0; p < size; p++) {
    for (let q = p; q < size; q++) {
      let sum = 0;
      const bp = basis[p];
      const bq = basis[q];
      for (let i = 0; i < n; i++) sum += bp[i] * bq[i];
      ata[p][q] = sum;
      ata[q][p] = sum;
    }
    let sy = 0;
    for (let i = 0; i < n; i++) sy += basis[p][i] * y[i];
    aty[p] = sy;
  }
  const coef = solve(ata, aty);
  const fit = new Float64Array(n);
  for (let p = 0; p < size; p++) {
    const bp = basis[p];
    const cp = coef[p];
    for (let i = 0; i < n; i++) fit[i] += cp * bp[i];
  }
  return fit;
}

function detectClipping(samples: Float64Array, fsHz: number, limits: AnalyzeOptions['clipLimits']): RecordAnalysis['clipping'] {
  const runs: ClippingRun[] = [];
  let runCount = 0;
  let clippedSamples = 0;
  let method: 'limits' | 'flat-top';
  let isHigh: (v: number) => boolean;
  let isLow: (v: number) => boolean;
  let minRun: number;
  if (limits) {
    method = 'limits';
    // Within 0.1 % of the span from a rail counts as at the rail (converters rarely reach the exact code).
    const tolerance = 1e-3 * (limits.highV - limits.lowV);
    isHigh = (v) => v >= limits.highV - tolerance;
    isLow = (v) => v <= limits.lowV + tolerance;
    minRun = 1;
  } else {
    method = 'flat-top';
    let lo = Infinity;
    let hi = -Infinity;
    for (const v of samples) {
      if (v < lo) lo = v;
      if (v > hi) hi = v;
    }
    isHigh = (v) => v === hi;
    isLow = (v) => v === lo;
    // A run of equal values at the extreme, at least 4 samples and 2 ms long: common practice, no source.
    minRun = Math.max(4, Math.ceil(0.002 * fsHz));
    if (hi === lo) minRun = samples.length + 1; // a constant record has no top to clip
  }
  let i = 0;
  while (i < samples.length) {
    const level = isHigh(samples[i]) ? 'high' : isLow(samples[i]) ? 'low' : null;
    if (level === null) {
      i++;
      continue;
    }
    let j = i + 1;
    const test = level === 'high' ? isHigh : isLow;
    while (j < samples.length && test(samples[j])) j++;
    const length = j - i;
    if (length >= minRun) {
      runCount++;
      clippedSamples += length;
      if (runs.length < 50) runs.push({ startS: i / fsHz, durationS: length / fsHz, level });
    }
    i = j;
  }
  return { method, clipped: runCount > 0, clippedSamples, runs, runCount };
}

/**
 * Analyses one signal of a bench record over a window, referred to the channel input.
 *
 * @param signal the recorded signal, samples in volts
 * @param options band (Hz), mains frequency (Hz), window (s), gain to input (V/V), optional rails (V as recorded)
 * @returns the measurements, or a message naming the bad option or signal
 */
export function analyzeRecord(signal: RecordSignal, options: AnalyzeOptions): AnalyzeResult {
  const fs = signal?.sampleRateHz;
  if (!signal || !(signal.samples instanceof Float64Array)) return { ok: false, message: 'signal must have samples' };
  if (signal.siUnit !== 'V') return { ok: false, message: `signal "${signal.label}" is in "${signal.physicalDimension}", not a voltage` };
  if (!(Number.isFinite(fs) && fs > 0)) return { ok: false, message: 'sample rate must be a positive number of hertz' };
  const o = options;
  const nyquist = fs / 2;
  if (!(o.mainsHz === 50 || o.mainsHz === 60)) return { ok: false, message: 'mains frequency must be 50 or 60 Hz' };
  if (!(Number.isFinite(o.bandLowHz) && o.bandLowHz >= 0)) return { ok: false, message: 'band low edge must be zero or a positive number of hertz' };
  if (!(Number.isFinite(o.bandHighHz) && o.bandHighHz > o.bandLowHz)) return { ok: false, message: 'band high edge must be above the band low edge' };
  if (o.bandHighHz > nyquist) return { ok: false, message: `band high edge (${o.bandHighHz} Hz) must not exceed half the sample rate (${nyquist} Hz)` };
  if (!(Number.isFinite(o.gainToInput) && o.gainToInput > 0)) return { ok: false, message: 'gain to input must be a positive number' };
  if (!(Number.isFinite(o.windowS) && o.windowS > 0)) return { ok: false, message: 'window must be a positive number of seconds' };
  const startS = o.windowStartS ?? 0;
  if (!(Number.isFinite(startS) && startS >= 0)) return { ok: false, message: 'window start must be zero or a positive number of seconds' };
  const exclusionHz = o.mainsExclusionHz ?? 1;
  if (!(Number.isFinite(exclusionHz) && exclusionHz >= 0 && exclusionHz < o.mainsHz / 2)) {
    return { ok: false, message: `mains exclusion half-width must be from 0 to below ${o.mainsHz / 2} Hz` };
  }
  if (o.clipLimits && !(Number.isFinite(o.clipLimits.lowV) && Number.isFinite(o.clipLimits.highV) && o.clipLimits.highV > o.clipLimits.lowV)) {
    return { ok: false, message: 'clip limits: the high rail must be above the low rail' };
  }
  const recordS = signal.samples.length / fs;
  const first = Math.round(startS * fs);
  const n = Math.round(o.windowS * fs);
  if (first + n > signal.samples.length) {
    return { ok: false, message: `the window (${startS} s + ${o.windowS} s) is longer than the record (${recordS.toFixed(3)} s)` };
  }
  if (n < MIN_WINDOW_SAMPLES) return { ok: false, message: `the window holds ${n} samples; at least ${MIN_WINDOW_SAMPLES} are needed` };
  if (n > MAX_WINDOW_SAMPLES) {
    return { ok: false, message: `the window holds ${n.toLocaleString('en-US')} samples; at most ${MAX_WINDOW_SAMPLES.toLocaleString('en-US')} are analysed at once (shorten the window)` };
  }
  for (let i = 0; i < signal.samples.length; i++) {
    if (!Number.isFinite(signal.samples[i])) return { ok: false, message: `sample ${i + 1} is not a finite number` };
  }
  const notes: string[] = [];

  // 1–2. Refer to input, offset, drift, detrend.
  const x = new Float64Array(n);
  for (let i = 0; i < n; i++) x[i] = signal.samples[first + i] / o.gainToInput;
  let mean = 0;
  for (let i = 0; i < n; i++) mean += x[i];
  mean /= n;
  const tMid = (n - 1) / 2;
  let sxy = 0;
  let sxx = 0;
  for (let i = 0; i < n; i++) {
    sxy += (i - tMid) * (x[i] - mean);
    sxx += (i - tMid) ** 2;
  }
  const slopePerSample = sxy / sxx;
  const d = new Float64Array(n);
  for (let i = 0; i < n; i++) d[i] = x[i] - mean - slopePerSample * (i - tMid);

  // 3. Mains and harmonics from the Hann-windowed spectrum, refined off the bin grid.
  const w = hann(n);
  let wSum = 0;
  let w2Sum = 0;
  const yw = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    yw[i] = d[i] * w[i];
    wSum += w[i];
    w2Sum += w[i] * w[i];
  }
  const size = nextPowerOfTwo(2 * n);
  const spec = realFftPadded(yw, size);
  const binHz = fs / size;
  const magAt = (bin: number) => Math.hypot(spec[2 * bin], spec[2 * bin + 1]);
  const findHarmonic = (targetHz: number): number => {
    const halfWidthHz = Math.max(0.01 * targetHz, 3 * binHz, 2 / o.windowS);
    const lo = Math.max(1, Math.floor((targetHz - halfWidthHz) / binHz));
    const hi = Math.min(size / 2 - 1, Math.ceil((targetHz + halfWidthHz) / binHz));
    let best = lo;
    for (let b = lo; b <= hi; b++) if (magAt(b) > magAt(best)) best = b;
    return refinePeak(yw, Math.max(binHz / 2, (best - 1) * binHz), Math.min(nyquist, (best + 1) * binHz), fs);
  };
  const amplitude = (fHz: number) => (2 * dtftMagnitude(yw, fHz, fs)) / wSum;

  if (o.mainsHz >= nyquist) return { ok: false, message: `the sample rate (${fs} Hz) is too low to see ${o.mainsHz} Hz mains` };
  const f1 = findHarmonic(o.mainsHz);
  const harmonics: MainsHarmonic[] = [];
  for (let k = 2; k <= 5; k++) {
    const target = k * f1;
    if (target >= nyquist - 2 * binHz) break;
    const fk = findHarmonic(target);
    harmonics.push({ harmonic: k, frequencyHz: fk, amplitudeV: amplitude(fk) });
  }
  const a1 = amplitude(f1);

  // 4. Subtract the mains waveform (least squares), then band-limit in the frequency domain.
  const fitFrequencies = [f1, ...harmonics.map((h) => h.frequencyHz)];
  for (let k = 6; k * f1 <= Math.min(o.bandHighHz + exclusionHz, nyquist - 2 * binHz); k++) fitFrequencies.push(k * f1);
  const mainsFit = fitSinusoids(d, fitFrequencies, fs);
  let fitHi = -Infinity;
  let fitLo = Infinity;
  for (let i = 0; i < n; i++) {
    if (mainsFit[i] > fitHi) fitHi = mainsFit[i];
    if (mainsFit[i] < fitLo) fitLo = mainsFit[i];
  }
  const extended = 2 * n;
  const data = new Float64Array(2 * extended);
  for (let i = 0; i < n; i++) {
    const r = d[i] - mainsFit[i];
    data[2 * i] = r;
    data[2 * (extended - 1 - i)] = r;
  }
  const spectrum = dft(data);
  const extBinHz = fs / extended;
  const harmonicCount = Math.floor((nyquist + exclusionHz) / f1);
  let excludedBins = 0;
  for (let j = 0; j < extended; j++) {
    const fj = (j <= extended / 2 ? j : extended - j) * extBinHz;
    let keep = fj >= o.bandLowHz && fj <= o.bandHighHz;
    if (keep && exclusionHz > 0) {
      const k = Math.max(1, Math.min(harmonicCount, Math.round(fj / f1)));
      if (Math.abs(fj - k * f1) <= exclusionHz) {
        keep = false;
        if (j <= extended / 2 && j > 0) excludedBins++;
      }
    }
    if (!keep) {
      spectrum[2 * j] = 0;
      spectrum[2 * j + 1] = 0;
    }
  }
  const filtered = dft(spectrum, true);
  let sumSq = 0;
  let hi = -Infinity;
  let lo = Infinity;
  for (let i = 0; i < n; i++) {
    const v = filtered[2 * i];
    sumSq += v * v;
    if (v > hi) hi = v;
    if (v < lo) lo = v;
  }
  const lowestResolvableHz = 1 / (2 * o.windowS);
  if (o.bandLowHz > 0 && o.bandLowHz < lowestResolvableHz) {
    notes.push(`the band's low edge (${o.bandLowHz} Hz) is below the window's frequency resolution (${lowestResolvableHz.toPrecision(3)} Hz); the detrending removes what lies below it`);
  }

  // 6. Spectrum for plotting: one-sided ASD, PSD = 2|X|²/(fs·Σw²), power-averaged into log-spaced points.
  const freqOut: number[] = [];
  const asdOut: number[] = [];
  const firstBin = 1;
  const lastBin = size / 2;
  const logLo = Math.log(firstBin);
  const logHi = Math.log(lastBin + 1);
  let b = firstBin;
  for (let p = 0; p < SPECTRUM_POINTS && b <= lastBin; p++) {
    const edge = Math.max(b + 1, Math.floor(Math.exp(logLo + ((p + 1) * (logHi - logLo)) / SPECTRUM_POINTS)));
    let power = 0;
    let fsum = 0;
    let count = 0;
    for (; b < edge && b <= lastBin; b++) {
      const m = magAt(b);
      power += (2 * m * m) / (fs * w2Sum);
      fsum += b * binHz;
      count++;
    }
    if (count > 0) {
      freqOut.push(fsum / count);
      asdOut.push(Math.sqrt(power / count));
    }
  }

  const clipping = detectClipping(signal.samples, fs, o.clipLimits);
  const clippedInWindow = clipping.runs.some((r) => r.startS + r.durationS > first / fs && r.startS < (first + n) / fs);
  if (clippedInWindow) notes.push('the signal clips inside the window: offset, noise and mains figures there are not reliable');

  return {
    ok: true,
    analysis: {
      sampleRateHz: fs,
      windowStartS: first / fs,
      windowS: n / fs,
      sampleCount: n,
      offsetV: mean,
      driftVPerS: slopePerSample * fs,
      noiseRmsV: Math.sqrt(sumSq / n),
      noisePpV: hi - lo,
      noiseBandLowHz: o.bandLowHz,
      noiseBandHighHz: o.bandHighHz,
      mainsExcludedHz: excludedBins * extBinHz,
      mains: { frequencyHz: f1, amplitudeV: a1, ppV: 2 * a1, harmonics, withHarmonicsPpV: fitHi - fitLo },
      clipping,
      spectrum: { frequencyHz: freqOut, asdVPerRtHz: asdOut },
      notes,
    },
  };
}

export interface PredictedLevels {
  /** Predicted DC offset referred to input (worst-case magnitude), V. */
  offsetV: number;
  noiseRmsV: number;
  noisePpV: number;
  /** Predicted mains interference at the mains frequency, peak-to-peak, referred to input, V. */
  mainsPpV: number;
}

/** Allowed ratio measured/predicted per quantity. */
export type PredictionSpread = Partial<Record<keyof PredictedLevels, { lowRatio: number; highRatio: number }>>;

export interface ComparisonRow {
  quantity: keyof PredictedLevels;
  label: string;
  predicted: number;
  /** Measured value (magnitude for the offset), V. */
  measured: number;
  /** measured / predicted, null when nothing was predicted. */
  ratio: number | null;
  lowRatio: number;
  highRatio: number;
  verdict: 'within' | 'above' | 'below' | 'no-prediction';
}

/**
 * Default spread: measured within a factor of 2 of the prediction (common practice, no source); the
 * offset prediction is a worst-case bound, so any smaller measured offset is within.
 */
export const defaultPredictionSpread: Required<PredictionSpread> = {
  offsetV: { lowRatio: 0, highRatio: 1 },
  noiseRmsV: { lowRatio: 0.5, highRatio: 2 },
  noisePpV: { lowRatio: 0.5, highRatio: 2 },
  mainsPpV: { lowRatio: 0.5, highRatio: 2 },
};

const labels: Record<keyof PredictedLevels, string> = {
  offsetV: 'DC offset (RTI)',
  noiseRmsV: 'in-band noise rms (RTI)',
  noisePpV: 'in-band noise peak-to-peak (RTI)',
  mainsPpV: 'mains peak-to-peak at the mains frequency (RTI)',
};

/**
 * Compares measured levels with the plan's prediction.
 * @param measured the record's analysis
 * @param predicted the plan's predicted levels, V
 * @param spread allowed measured/predicted ratio per quantity (defaults: {@link defaultPredictionSpread})
 * @returns one row per quantity with predicted, measured, ratio and verdict
 */
export function comparePrediction(measured: RecordAnalysis, predicted: PredictedLevels, spread: PredictionSpread = {}): ComparisonRow[] {
  const values: Record<keyof PredictedLevels, number> = {
    offsetV: Math.abs(measured.offsetV),
    noiseRmsV: measured.noiseRmsV,
    noisePpV: measured.noisePpV,
    mainsPpV: measured.mains.ppV,
  };
  return (Object.keys(labels) as Array<keyof PredictedLevels>).map((quantity) => {
    const { lowRatio, highRatio } = spread[quantity] ?? defaultPredictionSpread[quantity];
    const p = Math.abs(predicted[quantity]);
    const m = values[quantity];
    if (!(Number.isFinite(p) && p > 0)) {
      return { quantity, label: labels[quantity], predicted: predicted[quantity], measured: m, ratio: null, lowRatio, highRatio, verdict: 'no-prediction' as const };
    }
    const ratio = m / p;
    const verdict = ratio > highRatio ? 'above' : ratio < lowRatio ? 'below' : 'within';
    return { quantity, label: labels[quantity], predicted: p, measured: m, ratio, lowRatio, highRatio, verdict };
  });
}
