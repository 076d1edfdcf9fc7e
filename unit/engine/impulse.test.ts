import { describe, it } from 'vitest';
import { pulseTest } from '@/lib/engine/impulse';
import { expectClose } from './close';

// Engine notes worked check (first order: A·(1 − e^(−T/τ)), slope = displacement/τ), and SciPy 1.10
// signal.lsim of signal.butter(order, 2π·fc, 'high', analog=True) with a 3 mV × 100 ms pulse (dt = 50 µs).
const rows = [
  { order: 1 as const, fcHz: 0.05, dispV: 92.758e-6, slopeVPerS: 29.14e-6, source: 'engine notes ≈ 93 µV, 29 µV/s; SciPy lsim' },
  { order: 1 as const, fcHz: 0.5, dispV: 808.43e-6, slopeVPerS: 2.539e-3, source: 'engine notes 809 µV, 2.5 mV/s; SciPy lsim' },
  { order: 2 as const, fcHz: 0.05, dispV: 131.77e-6, slopeVPerS: 29.6e-6, source: 'engine notes ≈ 132 µV; SciPy lsim' },
];

describe('low-frequency impulse test', () => {
  it.each(rows)('order $order at $fcHz Hz ($source)', ({ order, fcHz, dispV, slopeVPerS }) => {
    const t = pulseTest(order, fcHz, 3e-3, 0.1);
    expectClose(t.displacementV, dispV, 2e-3, 'displacement');
    expectClose(t.slopeVPerS, slopeVPerS, 1e-2, 'slope');
  });
});
