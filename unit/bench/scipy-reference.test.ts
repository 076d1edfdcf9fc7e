/**
 * Cross-check of the bench analysis against NumPy/SciPy (Debian python3-scipy, run as /usr/bin/python3):
 * the same record analysed by an independent implementation of the same definitions.
 * - offset and drift: numpy.polyfit of degree 1;
 * - mains: nonlinear least squares (scipy.optimize.least_squares) of a sine at a free frequency;
 * - in-band noise: numpy.fft on the mirrored residual, bins zeroed outside the band and within ±1 Hz of harmonics;
 * - spectrum floor: scipy.signal.welch (Hann, density, one-sided), median over 200–480 Hz.
 */
import { execFileSync } from 'node:child_process';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { analyzeRecord } from '@/lib/bench/analyze';
import { synthesize } from './signal-fixtures';

const script = String.raw`
import json, sys
import numpy as np
from scipy import optimize, signal
d = json.load(open(sys.argv[1]))
fs = d['fs']; x = np.array(d['x']) / d['gain']; n = len(x); t = np.arange(n) / fs
slope, intercept = np.polyfit(t, x, 1)
offset = x.mean()
r = x - (intercept + slope * t)
def model(p, f):
    return p[0] * np.cos(2 * np.pi * f * t) + p[1] * np.sin(2 * np.pi * f * t)
def fit(f0):
    res = optimize.least_squares(lambda p: model(p[:2], p[2]) - r, [0, 0, f0], x_scale=[1e-5, 1e-5, 1e-2])
    return res.x
p1 = fit(d['mains'])
harm = {}
resid = r - model(p1[:2], p1[2])
for k in (2, 3):
    # Harmonic amplitudes by linear least squares at k × the fitted fundamental.
    A = np.column_stack([np.cos(2*np.pi*k*p1[2]*t), np.sin(2*np.pi*k*p1[2]*t)])
    c, *_ = np.linalg.lstsq(A, resid, rcond=None)
    harm[k] = float(np.hypot(*c))
    resid = resid - A @ c
ext = np.concatenate([resid, resid[::-1]])
X = np.fft.fft(ext)
f = np.abs(np.fft.fftfreq(len(ext), 1 / fs))
keep = (f >= d['lo']) & (f <= d['hi'])
k = np.maximum(1, np.round(f / p1[2]))
keep &= ~(np.abs(f - k * p1[2]) <= 1.0)
y = np.real(np.fft.ifft(np.where(keep, X, 0)))[:n]
fw, pxx = signal.welch(r, fs=fs, window='hann', nperseg=2048, scaling='density')
sel = (fw > 200) & (fw < 480)
print(json.dumps({'offset': offset, 'drift': slope, 'mainsHz': float(p1[2]), 'mainsA': float(np.hypot(p1[0], p1[1])),
  'h2': harm[2], 'h3': harm[3], 'rms': float(np.sqrt(np.mean(y**2))), 'pp': float(y.max() - y.min()),
  'asdFloor': float(np.sqrt(np.median(pxx[sel])))}))
`;

describe('bench analysis against NumPy/SciPy', () => {
  it('agrees on offset, drift, mains, harmonics, in-band noise and the spectrum floor', () => {
    const truth = {
      fsHz: 1000, durationS: 10, gain: 250, offsetV: 310e-6, driftVPerS: -12e-6, mainsHz: 50.05, mainsAmplitudeV: 55e-6,
      harmonicsV: { 3: 6e-6 }, noiseRmsV: 4e-6, seed: 31337,
    };
    const samples = synthesize(truth);
    const dir = mkdtempSync(join(tmpdir(), 'cs-bench-'));
    try {
      const input = join(dir, 'record.json');
      const code = join(dir, 'reference.py');
      writeFileSync(input, JSON.stringify({ fs: 1000, gain: truth.gain, mains: 50, lo: 0.5, hi: 150, x: Array.from(samples) }));
      writeFileSync(code, script);
      const ref = JSON.parse(execFileSync('/usr/bin/python3', [code, input], { encoding: 'utf8', timeout: 60_000 }));
      const r = analyzeRecord(
        { label: 'x', physicalDimension: 'V', siUnit: 'V', sampleRateHz: 1000, samples },
        { bandLowHz: 0.5, bandHighHz: 150, mainsHz: 50, windowS: 10, gainToInput: truth.gain },
      );
      if (!r.ok) throw new Error(r.message);
      const a = r.analysis;
      const rel = (x: number, y: number) => Math.abs(x - y) / Math.abs(y);
      // Same definitions on the same data: offset and drift agree to rounding.
      expect(rel(a.offsetV, ref.offset)).toBeLessThan(1e-9);
      expect(rel(a.driftVPerS, ref.drift)).toBeLessThan(1e-6);
      // Different mains estimators (Hann-windowed DTFT peak vs unwindowed nonlinear least squares): both carry noise of
      // order σ·√2/√n ≈ 57 nV; tolerance 0.3 µV on 55 µV, 0.01 Hz on the frequency.
      expect(Math.abs(a.mains.frequencyHz - ref.mainsHz)).toBeLessThan(0.01);
      expect(Math.abs(a.mains.amplitudeV - ref.mainsA)).toBeLessThan(0.3e-6);
      expect(Math.abs(a.mains.harmonics[1].amplitudeV - ref.h3)).toBeLessThan(0.3e-6);
      // The noise pipeline matches when the harmonics removed agree: tolerance 0.5 %.
      expect(rel(a.noiseRmsV, ref.rms)).toBeLessThan(0.005);
      expect(rel(a.noisePpV, ref.pp)).toBeLessThan(0.02);
      // Welch (averaged, 2048-point segments) against our single long periodogram, power-averaged: tolerance 5 %.
      const floor = a.spectrum.asdVPerRtHz.filter((_, i) => a.spectrum.frequencyHz[i] > 200 && a.spectrum.frequencyHz[i] < 480).sort((p, q) => p - q);
      expect(rel(floor[Math.floor(floor.length / 2)], ref.asdFloor)).toBeLessThan(0.05);
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
  });
});
