import { describe, expect, it } from 'vitest';
import { detectRecordFormat, readCsvRecord } from '@/lib/bench/csv-record';
import { writeEdf } from '@/lib/bench/edf';
import { analyzeRecord, type AnalyzeOptions } from '@/lib/bench/analyze';
import { synthesize, type SyntheticTruth } from './signal-fixtures';

const enc = (s: string) => new TextEncoder().encode(s);
const rows = (n: number, f: (i: number) => string) => Array.from({ length: n }, (_, i) => f(i)).join('\n');

describe('readCsvRecord', () => {
  it('reads a time column and channels, converts units and refers to input', () => {
    const csv = 'time (ms),ch1,ch2\n' + rows(20, (i) => `${i * 2},${i},${-i * 0.5}`);
    const r = readCsvRecord(csv, { unit: 'mV', gainApplied: true, gain: 100 });
    if (!r.ok) throw new Error(r.message);
    expect(r.timeColumn).toBe('time (ms)');
    expect(r.signals.map((s) => s.label)).toEqual(['ch1', 'ch2']);
    expect(r.signals[0].sampleRateHz).toBeCloseTo(500, 9); // 2 ms steps
    // 7 mV at the output / gain 100 = 70 µV at the input.
    expect(r.signals[0].samples[7]).toBeCloseTo(70e-6, 15);
    expect(r.signals[1].samples[4]).toBeCloseTo(-20e-6, 15);
    expect(r.referredToInput).toBe(true);
  });

  it('takes the sample rate when there is no time column; headerless files get numbered columns', () => {
    const r = readCsvRecord(rows(16, (i) => `${i};${2 * i}`), { unit: 'uV', gainApplied: false, sampleRateHz: 250 });
    if (!r.ok) throw new Error(r.message);
    expect(r.signals.map((s) => s.label)).toEqual(['column 1', 'column 2']);
    expect(r.signals[1].samples[3]).toBeCloseTo(6e-6, 15);
    expect(r.signals[0].sampleRateHz).toBe(250);
  });

  it('reads a single headerless column with a given sample rate', () => {
    const r = readCsvRecord(rows(16, (i) => `${i * 0.1}`), { unit: 'V', gainApplied: false, sampleRateHz: 100 });
    if (!r.ok) throw new Error(r.message);
    expect(r.signals).toHaveLength(1);
    expect(r.signals[0].samples[15]).toBeCloseTo(1.5, 12);
  });

  it('accepts times printed with limited resolution (300 Hz printed to 1 ms)', () => {
    // Rounding to 1 ms leaves ±0.5 ms on each time (σ = 1 ms/√12); over 300 samples the least-squares interval
    // has a standard error of σ/√(n(n² − 1)/12) ≈ 0.19 µs, i.e. 0.006 % of 3.33 ms: tolerance 0.1 Hz (≈ 5σ).
    const csv = 't,v\n' + rows(300, (i) => `${(i / 300).toFixed(3)},${i}`);
    const r = readCsvRecord(csv, { unit: 'V', gainApplied: false });
    expect(r.ok).toBe(true);
    if (r.ok) expect(Math.abs(r.signals[0].sampleRateHz - 300)).toBeLessThan(0.1);
  });

  it.each([
    ['ragged rows', 't,a,b\n' + rows(20, (i) => (i === 5 ? `${i},1` : `${i},1,2`)), 'row 7 has 2 values; the header has 3 columns'],
    ['text in a numeric column', 't,a\n' + rows(20, (i) => (i === 3 ? `${i},1.2.3` : `${i},1`)), 'row 5, column "a": "1.2.3" is not a number'],
    ['an empty cell', 't,a\n' + rows(20, (i) => (i === 9 ? `${i},` : `${i},1`)), 'row 11, column "a": empty value'],
    ['time going backwards', 't,a\n' + rows(20, (i) => `${i === 10 ? 8.5 : i},1`), 'time at row 12 (8.5 s) is not after the time at row 11 (9 s)'],
    ['a repeated time', 't,a\n' + rows(20, (i) => `${i === 10 ? 9 : i},1`), 'time at row 12 (9 s) is not after the time at row 11 (9 s)'],
    // Times 0…9 then 15…24: least-squares interval 1 + 5·Σ_{i=10..19}(i − 9.5)/Σ_{i=0..19}(i − 9.5)² = 1 + 250/665 = 1.376 s.
    ['uneven sampling', 't,a\n' + rows(20, (i) => `${i < 10 ? i : i + 5},1`), 'the time column is not evenly spaced: the interval ending at row 12 is 6.000 s, the fitted interval 1.376 s'],
    ['too few samples', 't,a\n' + rows(5, (i) => `${i},1`), 'the record has 5 samples; at least 16 are needed'],
    ['no time and no rate', 'a,b\n' + rows(20, () => '1,2'), 'no time column found: name it with timeColumn, or give the sample rate'],
    ['binary content', 'a,b\n\u0000\u0001\u0002', 'the record is not CSV text (it contains binary data)'],
  ])('refuses %s', (_, csv, message) => {
    const r = readCsvRecord(csv, { unit: 'V', gainApplied: false });
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.message).toBe(message);
  });

  it('lists every bad row (up to 20), each with its row number', () => {
    const r = readCsvRecord('t,a\n' + rows(30, (i) => (i % 10 === 0 ? `${i},x` : `${i},1`)), { unit: 'V', gainApplied: false });
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.errors.map((e) => e.row)).toEqual([2, 12, 22]);
  });

  it('requires the gain when the values include it, and a named time column to exist', () => {
    const csv = 't,a\n' + rows(20, (i) => `${i},1`);
    expect(readCsvRecord(csv, { unit: 'V', gainApplied: true })).toMatchObject({ ok: false, message: 'gain must be a positive number when the recorded values include the channel gain' });
    expect(readCsvRecord(csv, { unit: 'V', gainApplied: false, timeColumn: 'seconds' })).toMatchObject({ ok: false, message: 'time column "seconds" is not in the header (columns: t, a)' });
  });
});

describe('the same record written as CSV gives the same analysis', () => {
  const truth: SyntheticTruth = {
    fsHz: 1000, durationS: 10, gain: 200, offsetV: -80e-6, driftVPerS: -5e-6, mainsHz: 60, mainsAmplitudeV: 30e-6, harmonicsV: { 2: 4e-6 }, noiseRmsV: 3e-6, seed: 777,
  };
  const options: AnalyzeOptions = { bandLowHz: 0.05, bandHighHz: 150, mainsHz: 60, windowS: 10, gainToInput: truth.gain };

  it('reading the CSV (mV at the output, times in s) matches analysing the samples directly', () => {
    const samples = synthesize(truth);
    // Printed in mV with 7 decimals: a rounding step of 1e-7 mV = 0.1 nV at the output, negligible against 3 µV × 200 of noise.
    const csv = 'time (s),lead I (mV)\n' + Array.from(samples, (v, i) => `${(i / 1000).toFixed(3)},${(v * 1e3).toFixed(7)}`).join('\n');
    const r = readCsvRecord(csv, { unit: 'mV', gainApplied: true, gain: truth.gain });
    if (!r.ok) throw new Error(r.message);
    const direct = analyzeRecord({ label: 'x', physicalDimension: 'V', siUnit: 'V', sampleRateHz: 1000, samples }, options);
    // The CSV reader already divided by the gain: the record is referred to input.
    const fromCsv = analyzeRecord(r.signals[0], { ...options, gainToInput: 1 });
    if (!direct.ok || !fromCsv.ok) throw new Error('analysis failed');
    const a = direct.analysis;
    const b = fromCsv.analysis;
    expect(Math.abs(b.sampleRateHz - 1000)).toBeLessThan(1e-6);
    expect(Math.abs(a.offsetV - b.offsetV)).toBeLessThan(1e-12);
    expect(Math.abs(a.noiseRmsV - b.noiseRmsV) / a.noiseRmsV).toBeLessThan(1e-6);
    expect(Math.abs(a.mains.amplitudeV - b.mains.amplitudeV)).toBeLessThan(1e-11);
    // And both against the truth: mains 30 µV at 60 Hz (tolerance as in analyze.test: ≈ 4.5σ of σ·√3/√n ≈ 52 nV).
    expect(Math.abs(b.mains.amplitudeV - 30e-6)).toBeLessThan(0.25e-6);
    expect(Math.abs(b.mains.harmonics[0].amplitudeV - 4e-6)).toBeLessThan(0.25e-6);
    expect(Math.abs(b.driftVPerS - truth.driftVPerS)).toBeLessThan(0.1e-6);
    expect(b.notes).toEqual([]);
  });
});

describe('detectRecordFormat looks at the content, not the name', () => {
  it('recognises EDF and CSV', () => {
    const edf = writeEdf({ recordDurationS: 1, signals: [{ label: 'a', samplesV: [0, 1e-3], sampleRateHz: 2, physicalDimension: 'mV' }] });
    if (!edf.ok) throw new Error(edf.message);
    expect(detectRecordFormat(edf.bytes)).toEqual({ ok: true, format: 'edf' });
    expect(detectRecordFormat(enc('time,ch1\n0,1\n0.001,2\n'))).toEqual({ ok: true, format: 'csv' });
    expect(detectRecordFormat(enc('0.1\n0.2\n0.3\n'))).toEqual({ ok: true, format: 'csv' });
  });
  it('refuses binary, BDF, prose and truncated EDF', () => {
    const random = new Uint8Array(1000).map((_, i) => (i * 97 + 13) % 256);
    expect(detectRecordFormat(random)).toEqual({ ok: false, message: 'the file is neither EDF nor CSV text (it is not valid UTF-8)' });
    const bdf = new Uint8Array(256).fill(32);
    bdf.set([0xff, ...enc('BIOSEMI')]);
    expect(detectRecordFormat(bdf)).toEqual({ ok: false, message: 'this is a BDF (24-bit) file; only EDF (16-bit) and CSV are supported' });
    expect(detectRecordFormat(enc('A letter, not a record.'))).toEqual({ ok: false, message: 'the file is neither EDF nor CSV: it has no separated columns' });
    expect(detectRecordFormat(enc('0       short'))).toEqual({ ok: false, message: 'the file starts like EDF but its 256-byte fixed header is truncated or not ASCII' });
    expect(detectRecordFormat(new Uint8Array(0))).toEqual({ ok: false, message: 'the file is empty' });
    expect(detectRecordFormat(enc('a,b\n\u0000\u0000,1\n'))).toEqual({ ok: false, message: 'the file is neither EDF nor CSV text (it contains binary data)' });
  });
});
