import { describe, expect, it } from 'vitest';
import { magnitude } from '@/lib/engine/complex';
import { equivalentNoiseBandwidthHz, firstOrderLowPassAt, highPassAt, lowPassAt, rcCornerHz } from '@/lib/engine/filters';
import { expectClose } from './close';

describe('low-pass and high-pass responses', () => {
  it('is −3 dB at the corner for every family and order', () => {
    for (const kind of ['butterworth', 'bessel'] as const) {
      for (let n = 1; n <= 8; n++) expectClose(magnitude(lowPassAt(kind, n, 123, 123)), Math.SQRT1_2, 1e-9, `${kind} order ${n}`);
    }
    for (let n = 1; n <= 4; n++) expectClose(magnitude(highPassAt(n, 0.5, 0.5)), Math.SQRT1_2, 1e-9, `high-pass order ${n}`);
  });

  // Reference: SciPy 1.10, signal.bessel(n, 1, 'low', analog=True, norm='mag') and signal.butter(3, 1, 'high', analog=True),
  // evaluated with signal.freqs at the normalised frequency given.
  const scipyRows = [
    { kind: 'bessel' as const, order: 2, x: 0.37, re: 0.83844879, im: -0.46146457 },
    { kind: 'bessel' as const, order: 5, x: 0.37, re: 0.59558331, im: -0.74767192 },
    { kind: 'bessel' as const, order: 8, x: 0.37, re: 0.36681396, im: -0.88147843 },
  ];
  it.each(scipyRows)('matches SciPy for $kind order $order at f/fc = $x', ({ kind, order, x, re, im }) => {
    const h = lowPassAt(kind, order, 10, 10 * x);
    expectClose(h.re, re, 1e-6, 'real part');
    expectClose(h.im, im, 1e-6, 'imaginary part');
  });
  it('matches SciPy for a third-order Butterworth high-pass', () => {
    const h = highPassAt(3, 1, 0.3);
    expectClose(h.re, -0.01545973, 1e-6, 'real part');
    expectClose(h.im, -0.02212387, 1e-6, 'imaginary part');
  });

  it('gives the RC corner 1/(2πRC) (Horowitz & Hill §1.7)', () => {
    expectClose(rcCornerHz(1e3, 159.155e-9), 1000, 1e-5, 'corner of 1 kΩ, 159.155 nF');
    expectClose(magnitude(firstOrderLowPassAt(1000, 1000)), Math.SQRT1_2, 1e-12, 'first-order at fc');
  });

  // Winder, Analog and Digital Filter Design, table of noise bandwidths: Butterworth orders 1–4.
  it.each([
    [1, 1.5708],
    [2, 1.1107],
    [3, 1.0472],
    [4, 1.0262],
  ])('Butterworth order %i has a noise bandwidth of %f × fc', (order, ratio) => {
    expectClose(equivalentNoiseBandwidthHz('butterworth', order, 1), ratio, 1e-4, `order ${order}`);
  });

  it('refuses orders and frequencies out of range with a clear message', () => {
    expect(() => lowPassAt('bessel', 9, 1, 1)).toThrow('low-pass order must be a whole number from 1 to 8 (got 9)');
    expect(() => highPassAt(5, 1, 1)).toThrow('high-pass order must be a whole number from 1 to 4 (got 5)');
    expect(() => lowPassAt('butterworth', 2, -1, 1)).toThrow('corner frequency must be a positive finite number of hertz (got -1)');
  });
});
