import { describe, expect, it } from 'vitest';
import { analyzeRecord, comparePrediction, type AnalyzeOptions, type RecordAnalysis } from '@/lib/bench/analyze';
import type { RecordSignal } from '@/lib/bench/record-signal';
import { seededUniform, synthesize, type SyntheticTruth } from './signal-fixtures';

const truth: SyntheticTruth = {
  fsHz: 1000,
  durationS: 10,
  gain: 500,
  offsetV: 150e-6,
  driftVPerS: 20e-6,
  mainsHz: 50,
  mainsAmplitudeV: 40e-6,
  harmonicsV: { 3: 8e-6 },
  noiseRmsV: 5e-6,
  seed: 20250314,
};
const options: AnalyzeOptions = { bandLowHz: 0.5, bandHighHz: 150, mainsHz: 50, windowS: 10, gainToInput: truth.gain };
const signalOf = (samples: Float64Array, fsHz = truth.fsHz): RecordSignal => ({ label: 'lead I', physicalDimension: 'V', siUnit: 'V', sampleRateHz: fsHz, samples });

function analyse(samples: Float64Array, o: AnalyzeOptions = options): RecordAnalysis {
  const r = analyzeRecord(signalOf(samples), o);
  if (!r.ok) throw new Error(r.message);
  return r.analysis;
}

describe('analyzeRecord on a synthetic record with known truth', () => {
  const a = analyse(synthesize(truth));
  const n = truth.fsHz * truth.durationS;

  it('offset: mean of offset + drift over the window', () => {
    // Truth: 150 µV + 20 µV/s × mean time (n − 1)/(2 fs) = 249.99 µV; the noise moves the mean by σ/√n = 50 nV (1σ);
    // the mains averages out over 500 whole cycles. Tolerance 0.2 µV = 4σ.
    const expected = truth.offsetV + truth.driftVPerS * ((n - 1) / (2 * truth.fsHz));
    expect(Math.abs(a.offsetV - expected)).toBeLessThan(0.2e-6);
  });

  it('drift: least-squares slope', () => {
    // Slope standard error σ/√(Σ(t − t̄)²) = 5 µV/√(n·T²/12) ≈ 17 nV/s; tolerance 0.1 µV/s (≈ 6σ).
    expect(Math.abs(a.driftVPerS - truth.driftVPerS)).toBeLessThan(0.1e-6);
  });

  it('mains fundamental and third harmonic amplitude, frequency', () => {
    // Noise in a Hann-windowed coherent amplitude estimate: σ·√(2Σw²)/Σw = σ·√3/√n ≈ 87 nV (1σ); tolerance 0.4 µV (≈ 4.5σ).
    expect(Math.abs(a.mains.amplitudeV - 40e-6)).toBeLessThan(0.4e-6);
    expect(Math.abs(a.mains.ppV - 80e-6)).toBeLessThan(0.8e-6);
    expect(Math.abs(a.mains.frequencyHz - 50)).toBeLessThan(0.01);
    const h3 = a.mains.harmonics.find((h) => h.harmonic === 3)!;
    expect(Math.abs(h3.amplitudeV - 8e-6)).toBeLessThan(0.4e-6);
    expect(Math.abs(h3.frequencyHz - 150)).toBeLessThan(0.03);
    // Harmonics that are absent read at the noise floor (well below 1 µV).
    for (const k of [2, 4, 5]) expect(a.mains.harmonics.find((h) => h.harmonic === k)!.amplitudeV).toBeLessThan(1e-6);
  });

  it('in-band noise rms, mains bands excluded', () => {
    // Excluded: ±1 Hz around 50 and 100 Hz, and 149–150 Hz below the band edge: 5 Hz (+ one 0.05 Hz bin at the edges).
    expect(a.mainsExcludedHz).toBeGreaterThanOrEqual(5 - 1e-9);
    expect(a.mainsExcludedHz).toBeLessThanOrEqual(5.2);
    // White noise spreads σ² evenly over 0…fs/2, so the band keeps σ²·B/(fs/2), B = 149.5 Hz − excluded.
    // The band holds ≈ 2·B·T ≈ 2890 independent degrees of freedom: rms relative standard error √(1/(2·2890)) ≈ 1.3 %;
    // tolerance 5 % (≈ 4σ).
    const expected = truth.noiseRmsV * Math.sqrt((149.5 - a.mainsExcludedHz) / 500);
    expect(Math.abs(a.noiseRmsV - expected) / expected).toBeLessThan(0.05);
    // Peak-to-peak of ≈ 2890 independent Gaussian values: about 7 σ; [5.5 σ, 9 σ] holds with overwhelming probability.
    expect(a.noisePpV / a.noiseRmsV).toBeGreaterThan(5.5);
    expect(a.noisePpV / a.noiseRmsV).toBeLessThan(9);
  });

  it('spectrum: white-noise floor at σ·√(2/fs)', () => {
    // One-sided ASD of white noise with variance σ² sampled at fs is σ·√(2/fs) = 223.6 nV/√Hz
    // (e.g. Heinzel, Rüdiger & Schilling, "Spectrum and spectral density estimation by the DFT", 2002).
    const floor = truth.noiseRmsV * Math.sqrt(2 / truth.fsHz);
    const band = a.spectrum.asdVPerRtHz.filter((_, i) => a.spectrum.frequencyHz[i] > 200 && a.spectrum.frequencyHz[i] < 480);
    const median = [...band].sort((x, y) => x - y)[Math.floor(band.length / 2)];
    expect(band.length).toBeGreaterThan(10);
    expect(Math.abs(median - floor) / floor).toBeLessThan(0.05);
    expect(a.spectrum.frequencyHz.length).toBeLessThanOrEqual(400);
    // The mains line stands out: at 50 Hz the point holds the line.
    const i50 = a.spectrum.frequencyHz.findIndex((f) => f > 49.9);
    expect(a.spectrum.asdVPerRtHz[i50]).toBeGreaterThan(20 * floor);
  });

  it('no clipping in a clean record', () => {
    expect(a.clipping).toMatchObject({ method: 'flat-top', clipped: false, runCount: 0 });
  });
});

describe('analyzeRecord: noise peak-to-peak on a band-limited signal of known waveform', () => {
  it('recovers rms and peak-to-peak of a multi-tone signal inside the band', () => {
    // 30 tones of 1 µV between 2 and 140 Hz, at least 3 Hz from any mains harmonic: all in band, nothing excluded,
    // so the band-limited signal is the signal itself; its rms is √(30/2) µV (sum of sines of distinct frequencies,
    // approximately, over a finite window) and its peak-to-peak is computed here from the waveform.
    const u = seededUniform(7);
    const tones: Array<[number, number]> = [];
    while (tones.length < 30) {
      const f = 2 + 138 * u();
      if (Math.abs(f - 50 * Math.round(f / 50)) < 3) continue;
      tones.push([f, 2 * Math.PI * u()]);
    }
    const fs = 1000;
    const n = 10_000;
    const input = new Float64Array(n);
    for (let i = 0; i < n; i++) for (const [f, p] of tones) input[i] += 1e-6 * Math.sin((2 * Math.PI * f * i) / fs + p);
    let sq = 0;
    let hi = -Infinity;
    let lo = Infinity;
    for (const v of input) {
      sq += v * v;
      hi = Math.max(hi, v);
      lo = Math.min(lo, v);
    }
    const a = analyse(input.map((v) => v * 10), { ...options, gainToInput: 10 });
    // The window edges (the mirrored extension's kinks) and the removed mean/slope leak a little out of band
    // (measured here: under 0.1 %): tolerance 0.5 % on rms and on peak-to-peak.
    expect(Math.abs(a.noiseRmsV - Math.sqrt(sq / n)) / Math.sqrt(sq / n)).toBeLessThan(0.005);
    expect(Math.abs(a.noisePpV - (hi - lo)) / (hi - lo)).toBeLessThan(0.005);
  });
});

describe('analyzeRecord: mains at 60 Hz off the nominal frequency, another window', () => {
  it('finds 59.9 Hz and its amplitude; the window start is honoured', () => {
    const t: SyntheticTruth = { ...truth, mainsHz: 59.9, mainsAmplitudeV: 25e-6, harmonicsV: {}, durationS: 12, seed: 99 };
    const a = analyse(synthesize(t), { ...options, mainsHz: 60, windowS: 10, windowStartS: 2 });
    expect(Math.abs(a.mains.frequencyHz - 59.9)).toBeLessThan(0.01);
    expect(Math.abs(a.mains.amplitudeV - 25e-6)).toBeLessThan(0.4e-6);
    expect(a.windowStartS).toBe(2);
    // Offset over 2…12 s: 150 µV + 20 µV/s × 6.9995 s.
    expect(Math.abs(a.offsetV - (150e-6 + 20e-6 * (2 + 9999 / 2000)))).toBeLessThan(0.2e-6);
  });
});

describe('clipping', () => {
  const clampAt = (samples: Float64Array, limit: number) => samples.map((v) => Math.max(-limit, Math.min(limit, v)));

  it('counts samples at the given rails', () => {
    // A record referred to 0 V: offset removed so the peaks (±(40 + noise) µV × 500 ≈ ±25 mV) hit ±18 mV rails.
    const raw = synthesize({ ...truth, offsetV: 0, driftVPerS: 0, harmonicsV: {} });
    const limit = 0.018;
    const clipped = clampAt(raw, limit);
    let beyond = 0;
    let near = 0;
    for (const v of raw) {
      if (Math.abs(v) >= limit) beyond++;
      if (Math.abs(v) >= limit - 1e-3 * 2 * limit) near++;
    }
    const a = analyse(clipped, { ...options, clipLimits: { lowV: -limit, highV: limit } });
    expect(a.clipping.method).toBe('limits');
    expect(a.clipping.clipped).toBe(true);
    // Every clamped sample is counted, plus those within 0.1 % of the span of a rail.
    expect(a.clipping.clippedSamples).toBeGreaterThanOrEqual(beyond);
    expect(a.clipping.clippedSamples).toBeLessThanOrEqual(near);
    expect(a.clipping.runs[0].level === 'high' || a.clipping.runs[0].level === 'low').toBe(true);
    expect(a.notes).toContain('the signal clips inside the window: offset, noise and mains figures there are not reliable');
  });

  it('finds flat tops without limits', () => {
    // A 1 Hz sine of 1 V clamped at ±0.8 V stays on each rail for 2·acos(0.8)/(2π) s ≈ 205 ms per cycle.
    const fs = 1000;
    const s = new Float64Array(10_000).map((_, i) => Math.max(-0.8, Math.min(0.8, Math.sin((2 * Math.PI * i) / fs))));
    const r = analyzeRecord(signalOf(s), { ...options, gainToInput: 1 });
    expect(r.ok).toBe(true);
    if (!r.ok) return;
    expect(r.analysis.clipping.method).toBe('flat-top');
    expect(r.analysis.clipping.runCount).toBe(20); // 10 cycles × 2 rails
    const expectedRunS = (2 * Math.acos(0.8)) / (2 * Math.PI);
    expect(Math.abs(r.analysis.clipping.runs[0].durationS - expectedRunS)).toBeLessThan(0.003);
  });
});

describe('analyzeRecord refuses bad options and signals', () => {
  const s = synthesize(truth);
  it.each([
    [{ bandHighHz: 600 }, 'band high edge (600 Hz) must not exceed half the sample rate (500 Hz)'],
    [{ bandHighHz: 0.2 }, 'band high edge must be above the band low edge'],
    [{ windowS: 11 }, 'the window (0 s + 11 s) is longer than the record (10.000 s)'],
    [{ gainToInput: 0 }, 'gain to input must be a positive number'],
    [{ windowS: 0.05 }, 'the window holds 50 samples; at least 64 are needed'],
    [{ windowStartS: 9.5, windowS: 1 }, 'the window (9.5 s + 1 s) is longer than the record (10.000 s)'],
    [{ mainsHz: 55 as 50 }, 'mains frequency must be 50 or 60 Hz'],
    [{ clipLimits: { lowV: 1, highV: -1 } }, 'clip limits: the high rail must be above the low rail'],
  ] as Array<[Partial<AnalyzeOptions>, string]>)('%j', (change, message) => {
    expect(analyzeRecord(signalOf(s), { ...options, ...change })).toEqual({ ok: false, message });
  });
  it('refuses a window beyond the size limit', () => {
    const long = new Float64Array(300_000);
    expect(analyzeRecord(signalOf(long), { ...options, windowS: 300 })).toEqual({
      ok: false,
      message: 'the window holds 300,000 samples; at most 262,144 are analysed at once (shorten the window)',
    });
  });
  it('refuses a non-voltage signal and non-finite samples', () => {
    expect(analyzeRecord({ ...signalOf(s), siUnit: null, physicalDimension: 'degC' }, options)).toEqual({ ok: false, message: 'signal "lead I" is in "degC", not a voltage' });
    const bad = s.slice();
    bad[5] = Number.NaN;
    expect(analyzeRecord(signalOf(bad), options)).toEqual({ ok: false, message: 'sample 6 is not a finite number' });
  });
});

describe('comparePrediction', () => {
  const a = analyse(synthesize(truth));
  it('gives ratio and verdict per quantity', () => {
    const rows = comparePrediction(a, { offsetV: 300e-3, noiseRmsV: a.noiseRmsV / 3, noisePpV: a.noisePpV, mainsPpV: 0 });
    expect(rows.map((r) => [r.quantity, r.verdict])).toEqual([
      ['offsetV', 'within'],
      ['noiseRmsV', 'above'],
      ['noisePpV', 'within'],
      ['mainsPpV', 'no-prediction'],
    ]);
    expect(rows[1].ratio).toBeCloseTo(3, 12);
    expect(rows[0].measured).toBe(Math.abs(a.offsetV));
    expect(rows[3].ratio).toBeNull();
  });
  it('honours a custom spread', () => {
    const rows = comparePrediction(a, { offsetV: 1e-3, noiseRmsV: a.noiseRmsV * 1.5, noisePpV: a.noisePpV, mainsPpV: a.mains.ppV }, { noiseRmsV: { lowRatio: 0.9, highRatio: 1.1 } });
    expect(rows[1].verdict).toBe('below');
    expect(rows[3].verdict).toBe('within');
  });
});
