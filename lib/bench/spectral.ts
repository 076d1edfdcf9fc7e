/**
 * Discrete Fourier transforms for the bench analysis: power-of-two FFTs by fft.js, and a DFT of any
 * length by Bluestein's chirp-z algorithm (L. Bluestein, "A linear filtering approach to the
 * computation of the discrete Fourier transform", IEEE Trans. Audio Electroacoust. 18 (1970) 451–455),
 * built on the power-of-two FFT. Convention: X[k] = Σ x[n]·e^(−2πi·kn/N); the inverse divides by N.
 *
 * Complex arrays are interleaved: [re0, im0, re1, im1, ...].
 */
import FFT from 'fft.js';

const fftCache = new Map<number, FFT>();

function fftOf(size: number): FFT {
  let f = fftCache.get(size);
  if (!f) {
    f = new FFT(size);
    if (fftCache.size > 8) fftCache.clear();
    fftCache.set(size, f);
  }
  return f;
}

/** Smallest power of two ≥ n (and ≥ 2). */
export function nextPowerOfTwo(n: number): number {
  let p = 2;
  while (p < n) p *= 2;
  return p;
}

/**
 * Forward FFT of a real sequence zero-padded to a power of two.
 * @param x the samples
 * @param size transform length, a power of two ≥ x.length
 * @returns the full complex spectrum, interleaved, `size` bins
 */
export function realFftPadded(x: ArrayLike<number>, size: number): Float64Array {
  const input = new Float64Array(size);
  for (let i = 0; i < x.length; i++) input[i] = x[i];
  const out = new Float64Array(2 * size);
  const f = fftOf(size);
  f.realTransform(out, input);
  f.completeSpectrum(out);
  return out;
}

/**
 * DFT of any length by Bluestein's algorithm.
 * @param data complex input, interleaved, N = data.length / 2 points
 * @param inverse when true, computes the inverse DFT (conjugate kernel, divided by N)
 * @returns complex output, interleaved
 */
export function dft(data: Float64Array, inverse = false): Float64Array {
  const n = data.length / 2;
  if (n < 1 || !Number.isInteger(n)) throw new Error('dft: input must hold whole complex points');
  if ((n & (n - 1)) === 0 && n >= 2) {
    const f = fftOf(n);
    const out = new Float64Array(2 * n);
    if (inverse) f.inverseTransform(out, data);
    else f.transform(out, data);
    return out;
  }
  const m = nextPowerOfTwo(2 * n - 1);
  const sign = inverse ? 1 : -1;
  // Chirp w[k] = exp(sign·iπk²/N); k² is reduced modulo 2N so the angle stays accurate for large k.
  const chirpRe = new Float64Array(n);
  const chirpIm = new Float64Array(n);
  for (let k = 0; k < n; k++) {
    const k2 = (k * k) % (2 * n);
    const angle = (Math.PI * k2) / n;
    chirpRe[k] = Math.cos(angle);
    chirpIm[k] = sign * Math.sin(angle);
  }
  const a = new Float64Array(2 * m);
  for (let k = 0; k < n; k++) {
    const xr = data[2 * k];
    const xi = data[2 * k + 1];
    a[2 * k] = xr * chirpRe[k] - xi * chirpIm[k];
    a[2 * k + 1] = xr * chirpIm[k] + xi * chirpRe[k];
  }
  const b = new Float64Array(2 * m);
  b[0] = chirpRe[0];
  b[1] = -chirpIm[0];
  for (let k = 1; k < n; k++) {
    b[2 * k] = chirpRe[k];
    b[2 * k + 1] = -chirpIm[k];
    b[2 * (m - k)] = chirpRe[k];
    b[2 * (m - k) + 1] = -chirpIm[k];
  }
  const f = fftOf(m);
  const fa = new Float64Array(2 * m);
  const fb = new Float64Array(2 * m);
  f.transform(fa, a);
  f.transform(fb, b);
  for (let k = 0; k < m; k++) {
    const re = fa[2 * k] * fb[2 * k] - fa[2 * k + 1] * fb[2 * k + 1];
    const im = fa[2 * k] * fb[2 * k + 1] + fa[2 * k + 1] * fb[2 * k];
    fa[2 * k] = re;
    fa[2 * k + 1] = im;
  }
  const conv = new Float64Array(2 * m);
  f.inverseTransform(conv, fa);
  const out = new Float64Array(2 * n);
  const norm = inverse ? 1 / n : 1;
  for (let k = 0; k < n; k++) {
    const cr = conv[2 * k];
    const ci = conv[2 * k + 1];
    out[2 * k] = (cr * chirpRe[k] - ci * chirpIm[k]) * norm;
    out[2 * k + 1] = (cr * chirpIm[k] + ci * chirpRe[k]) * norm;
  }
  return out;
}
