import { describe, expect, it } from 'vitest';
import { dft, realFftPadded } from '@/lib/bench/spectral';

/** The DFT by its definition, X[k] = Σ x[n]·e^(−2πi·kn/N), O(N²): the reference. */
function directDft(x: Float64Array, inverse = false): Float64Array {
  const n = x.length / 2;
  const out = new Float64Array(2 * n);
  const sign = inverse ? 1 : -1;
  for (let k = 0; k < n; k++) {
    let re = 0;
    let im = 0;
    for (let j = 0; j < n; j++) {
      const a = (sign * 2 * Math.PI * ((k * j) % n)) / n;
      re += x[2 * j] * Math.cos(a) - x[2 * j + 1] * Math.sin(a);
      im += x[2 * j] * Math.sin(a) + x[2 * j + 1] * Math.cos(a);
    }
    out[2 * k] = inverse ? re / n : re;
    out[2 * k + 1] = inverse ? im / n : im;
  }
  return out;
}

const maxAbsDiff = (a: Float64Array, b: Float64Array) => a.reduce((m, v, i) => Math.max(m, Math.abs(v - b[i])), 0);

describe('dft (Bluestein for any length, fft.js for powers of two)', () => {
  it.each([1, 2, 3, 7, 12, 16, 100, 257, 1000])('matches the definition for N = %i, forward and inverse', (n) => {
    const x = new Float64Array(2 * n).map((_, i) => Math.sin(1.7 * i) + 0.01 * i - (i % 3));
    const scale = Math.max(...Array.from(directDft(x)).map(Math.abs));
    expect(maxAbsDiff(dft(x), directDft(x)) / scale).toBeLessThan(1e-11);
    expect(maxAbsDiff(dft(dft(x), true), x)).toBeLessThan(1e-11);
  });

  it('realFftPadded equals the DFT of the zero-padded sequence', () => {
    const x = [1, -2, 3.5, 0.25, 7];
    const padded = new Float64Array(16);
    x.forEach((v, i) => (padded[2 * i] = v));
    expect(maxAbsDiff(realFftPadded(x, 8), directDft(padded))).toBeLessThan(1e-12);
  });
});
