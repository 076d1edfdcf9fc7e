import { describe, expect, it } from 'vitest';
import { readEdf, writeEdf } from '@/lib/bench/edf';
import { analyzeRecord, type AnalyzeOptions } from '@/lib/bench/analyze';
import { synthesize, type SyntheticTruth } from './signal-fixtures';

/**
 * An EDF file built field by field from the published specification (Kemp et al., 1992), independently of
 * writeEdf: fixed header 8+80+80+8+8+8+44+8+8+4 = 256 bytes; per signal 16+80+8+8+8+8+8+80+8+32 = 256 bytes,
 * each field stored for all signals in turn; records of int16 little-endian samples, signal after signal.
 */
interface HandSignal {
  label: string;
  dim: string;
  pmin: string;
  pmax: string;
  dmin: string;
  dmax: string;
  spr: number;
  digital: number[]; // all records concatenated
}
function pad(s: string, w: number) {
  if (s.length > w) throw new Error(`"${s}" longer than ${w}`);
  return s.padEnd(w, ' ');
}
function handEdf(signals: HandSignal[], records: number, durationS: string, overrides: Partial<Record<'version' | 'headerBytes' | 'records' | 'reserved' | 'ns', string>> = {}): Uint8Array {
  const ns = signals.length;
  let h = pad(overrides.version ?? '0', 8) + pad('X F 01-JAN-1970 Larkspur_test', 80) + pad('Startdate 14-MAR-2025 bench prototype A', 80);
  h += '14.03.25' + '09.30.00' + pad(overrides.headerBytes ?? String(256 * (ns + 1)), 8) + pad(overrides.reserved ?? '', 44);
  h += pad(overrides.records ?? String(records), 8) + pad(durationS, 8) + pad(overrides.ns ?? String(ns), 4);
  const each = (f: (s: HandSignal) => string, w: number) => signals.map((s) => pad(f(s), w)).join('');
  h += each((s) => s.label, 16) + each(() => 'AgAgCl electrode', 80) + each((s) => s.dim, 8) + each((s) => s.pmin, 8) + each((s) => s.pmax, 8);
  h += each((s) => s.dmin, 8) + each((s) => s.dmax, 8) + each(() => 'HP:0.05Hz LP:150Hz', 80) + each((s) => String(s.spr), 8) + each(() => '', 32);
  const recordBytes = signals.reduce((t, s) => t + 2 * s.spr, 0);
  const bytes = new Uint8Array(h.length + records * recordBytes);
  for (let i = 0; i < h.length; i++) bytes[i] = h.charCodeAt(i);
  const view = new DataView(bytes.buffer);
  let o = h.length;
  for (let r = 0; r < records; r++) {
    for (const s of signals) {
      for (let i = 0; i < s.spr; i++) {
        view.setInt16(o, s.digital[r * s.spr + i], true);
        o += 2;
      }
    }
  }
  return bytes;
}

const ecg: HandSignal = { label: 'ECG I', dim: 'uV', pmin: '-3200', pmax: '3200', dmin: '-2048', dmax: '2047', spr: 4, digital: [-2048, 2047, 0, 100, -1, 1, 500, -500] };
const temp: HandSignal = { label: 'Temp', dim: 'degC', pmin: '20', pmax: '45', dmin: '0', dmax: '1000', spr: 1, digital: [400, 410] };

describe('readEdf on a file built from the specification', () => {
  const file = handEdf([ecg, temp], 2, '0.5');

  it('reads the header fields', () => {
    const r = readEdf(file);
    expect(r.ok).toBe(true);
    if (!r.ok) return;
    expect(r.header).toMatchObject({
      version: '0',
      patientId: 'X F 01-JAN-1970 Larkspur_test',
      startDate: '14.03.25',
      startTime: '09.30.00',
      startIso: '2025-03-14T09:30:00',
      headerBytes: 768,
      dataRecords: 2,
      recordDurationS: 0.5,
      signalCount: 2,
      edfPlus: null,
    });
    expect(r.header.signals[0]).toMatchObject({ label: 'ECG I', physicalDimension: 'uV', digitalMin: -2048, digitalMax: 2047, samplesPerRecord: 4, prefiltering: 'HP:0.05Hz LP:150Hz' });
  });

  it('converts digital to physical and to volts; sample rate = samples per record / duration', () => {
    const r = readEdf(file);
    if (!r.ok) throw new Error(r.message);
    const [s1, s2] = r.signals;
    expect(s1.sampleRateHz).toBe(8);
    expect(s2.sampleRateHz).toBe(2);
    // physical = (d − dmin)·(pmax − pmin)/(dmax − dmin) + pmin, in µV, then × 1e-6 V/µV.
    const expected = ecg.digital.map((d) => (((d + 2048) * 6400) / 4095 - 3200) * 1e-6);
    s1.samples.forEach((v, i) => expect(Math.abs(v - expected[i])).toBeLessThan(1e-15));
    expect(s1.samples[0]).toBeCloseTo(-3200e-6, 15);
    expect(s1.samples[1]).toBeCloseTo(3200e-6, 15);
    expect(s1.siUnit).toBe('V');
    // A non-voltage signal stays in its unit: (400 − 0)·25/1000 + 20 = 30 °C.
    expect(s2.siUnit).toBeNull();
    expect(Array.from(s2.samples)).toEqual([30, 30.25]);
  });

  it('skips EDF+ annotation signals', () => {
    const ann: HandSignal = { label: 'EDF Annotations', dim: '', pmin: '-1', pmax: '1', dmin: '-32768', dmax: '32767', spr: 2, digital: [0, 0, 0, 0] };
    const r = readEdf(handEdf([ecg, ann], 2, '0.5', { reserved: 'EDF+C' }));
    expect(r.ok && r.signals.map((s) => s.label)).toEqual(['ECG I']);
    expect(r.ok && r.header.annotationSignals).toBe(1);
  });
});

describe('readEdf refuses malformed files with a clear message', () => {
  // Record size: 4 + 1 samples × 2 bytes = 10 bytes.
  const good = handEdf([ecg, temp], 2, '0.5');
  const withField = (offset: number, text: string) => {
    const b = good.slice();
    for (let i = 0; i < text.length; i++) b[offset + i] = text.charCodeAt(i);
    return b;
  };
  it.each([
    ['truncated fixed header', good.slice(0, 100), 'EDF header is truncated: the file has 100 bytes, the fixed header alone needs 256'],
    ['truncated signal headers', good.slice(0, 600), 'EDF header is truncated: the header record needs 768 bytes, the file has 600'],
    [
      'header byte count mismatch',
      withField(184, '512     '),
      'EDF header field "number of bytes in header record" is 512, but 2 signals need 768 (256 + 256 × 2)',
    ],
    [
      'more records announced than present',
      withField(236, '3       '),
      'EDF file size does not match the header: 3 data records of 10 bytes need 30 bytes after the header, the file has 20 (2 records)',
    ],
    [
      'bytes left over',
      new Uint8Array([...good, 1, 2, 3]),
      'EDF file size does not match the header: 2 data records of 10 bytes need 20 bytes after the header, the file has 23 (2.30 records)',
    ],
    ['non-numeric record count', withField(236, 'many    '), 'EDF header field "number of data records" is not a whole number: "many"'],
    ['non-numeric duration', withField(244, 'half    '), 'EDF header field "duration of a data record" is not a number: "half"'],
    // The physical minimum of signal 1 is at 256 + 2×(16 + 80 + 8) = 464.
    ['non-numeric physical minimum', withField(464, '-3k2    '), 'EDF header field "physical minimum, signal 1 ("ECG I")" is not a number: "-3k2"'],
    ['unknown record count', withField(236, '-1      '), 'EDF header field "number of data records" is -1 (unknown): the recording was not closed properly'],
    ['wrong version', withField(0, '1       '), 'EDF header field "version" must be "0", found "1"'],
    ['non-ASCII byte', withField(20, '\u00e9'), 'EDF header field "patient identification" holds a byte (233) that is not printable ASCII, at offset 20'],
    ['bad start date', withField(168, '32.13.25'), 'EDF header field "start date" is not a valid date: "32.13.25"'],
  ])('%s', (_, bytes, message) => {
    expect(readEdf(bytes as Uint8Array)).toEqual({ ok: false, message });
  });

  it('refuses digital minimum not below digital maximum', () => {
    const r = readEdf(handEdf([{ ...ecg, dmin: '2047', dmax: '2047' }], 2, '0.5'));
    expect(r).toEqual({ ok: false, message: 'signal 1 ("ECG I"): digital minimum (2047) must be below digital maximum (2047)' });
  });
  it('refuses equal physical limits and discontinuous EDF+', () => {
    expect(readEdf(handEdf([{ ...ecg, pmin: '5', pmax: '5' }], 2, '0.5'))).toEqual({ ok: false, message: 'signal 1 ("ECG I"): physical minimum equals physical maximum (5)' });
    expect(readEdf(handEdf([ecg], 2, '0.5', { reserved: 'EDF+D' }))).toEqual({
      ok: false,
      message: 'discontinuous EDF+ (EDF+D) records are not supported; export as continuous EDF or EDF+C',
    });
  });
});

describe('writeEdf', () => {
  it('writes the header at the positions of the specification', () => {
    const samplesV = Array.from({ length: 20 }, (_, i) => (i - 10) * 1e-4);
    const r = writeEdf({ recordDurationS: 1, start: new Date(Date.UTC(2025, 2, 14, 9, 30, 5)), signals: [{ label: 'CH1', samplesV, sampleRateHz: 10, physicalDimension: 'mV' }] });
    if (!r.ok) throw new Error(r.message);
    const text = (a: number, b: number) => String.fromCharCode(...r.bytes.subarray(a, b));
    expect(text(0, 8)).toBe('0       ');
    expect(text(168, 176)).toBe('14.03.25');
    expect(text(176, 184)).toBe('09.30.05');
    expect(text(184, 192)).toBe('512     ');
    expect(text(236, 244)).toBe('2       ');
    expect(text(244, 252)).toBe('1       ');
    expect(text(252, 256)).toBe('1   ');
    expect(text(256, 272)).toBe('CH1'.padEnd(16));
    expect(text(352, 360)).toBe('mV      ');
    expect(text(360, 368)).toBe('-1      '); // −1 mV, the smallest sample
    expect(text(368, 376)).toBe('0.9     '); // +0.9 mV, the largest
    expect(text(376, 384)).toBe('-32768  ');
    expect(text(384, 392)).toBe('32767   ');
    expect(text(472, 480)).toBe('10      ');
    expect(r.bytes.length).toBe(512 + 2 * 10 * 2);
    // First sample −1 mV is the physical minimum: digital minimum −32768.
    expect(new DataView(r.bytes.buffer).getInt16(512, true)).toBe(-32768);
  });

  it('refuses sample counts that are not whole records, and rates that do not fit', () => {
    expect(writeEdf({ recordDurationS: 1, signals: [{ label: 'a', samplesV: [1, 2, 3], sampleRateHz: 2, physicalDimension: 'V' }] })).toEqual({
      ok: false,
      message: 'signal 1 ("a"): 3 samples are not a whole number of 2-sample data records',
    });
    expect(writeEdf({ recordDurationS: 1, signals: [{ label: 'a', samplesV: [1, 2], sampleRateHz: 2.5, physicalDimension: 'V' }] })).toEqual({
      ok: false,
      message: 'signal 1 ("a"): sample rate × record duration must be a whole number of samples, got 2.5',
    });
    expect(writeEdf({ recordDurationS: 1, signals: [{ label: 'a label longer than 16', samplesV: [1, 2], sampleRateHz: 2, physicalDimension: 'V' }] }).ok).toBe(false);
  });
});

describe('the same record written as EDF gives the same analysis', () => {
  const truth: SyntheticTruth = {
    fsHz: 1000, durationS: 10, gain: 500, offsetV: 150e-6, driftVPerS: 20e-6, mainsHz: 50, mainsAmplitudeV: 40e-6, harmonicsV: { 3: 8e-6 }, noiseRmsV: 5e-6, seed: 4242,
  };
  const options: AnalyzeOptions = { bandLowHz: 0.5, bandHighHz: 150, mainsHz: 50, windowS: 10, gainToInput: truth.gain };

  it('round-trips through writeEdf and readEdf within the 16-bit quantization', () => {
    const samples = synthesize(truth);
    const w = writeEdf({ recordDurationS: 1, signals: [{ label: 'lead I', samplesV: samples, sampleRateHz: 1000, physicalDimension: 'mV' }] });
    if (!w.ok) throw new Error(w.message);
    const r = readEdf(w.bytes);
    if (!r.ok) throw new Error(r.message);
    const back = r.signals[0];
    expect(back.sampleRateHz).toBe(1000);
    expect(back.samples.length).toBe(samples.length);
    // The step of the 16-bit code over the written physical range (rounded outward to the field's digits).
    const h = r.header.signals[0];
    const lsbV = ((h.physicalMax - h.physicalMin) / 65535) * 1e-3;
    let maxErr = 0;
    samples.forEach((v, i) => (maxErr = Math.max(maxErr, Math.abs(v - back.samples[i]))));
    expect(maxErr).toBeLessThanOrEqual(lsbV / 2 + 1e-12);

    const a = analyzeRecord({ label: 'x', physicalDimension: 'V', siUnit: 'V', sampleRateHz: 1000, samples }, options);
    const b = analyzeRecord(back, options);
    if (!a.ok || !b.ok) throw new Error('analysis failed');
    // Quantization adds LSB/√12 ≈ 0.5 nV rms (referred to input) against ≈ 2.7 µV of noise, and shifts the mean by under half an LSB.
    const lsbRtiV = lsbV / truth.gain;
    expect(Math.abs(a.analysis.offsetV - b.analysis.offsetV)).toBeLessThan(lsbRtiV);
    expect(Math.abs(a.analysis.noiseRmsV - b.analysis.noiseRmsV) / a.analysis.noiseRmsV).toBeLessThan(1e-3);
    expect(Math.abs(a.analysis.mains.amplitudeV - b.analysis.mains.amplitudeV)).toBeLessThan(lsbRtiV);
    expect(Math.abs(a.analysis.noisePpV - b.analysis.noisePpV)).toBeLessThan(4 * lsbRtiV);
  });
});
