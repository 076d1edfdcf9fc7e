/**
 * Reference checks of the engine's filter responses against SciPy (Debian python3-scipy 1.10.1
 * with NumPy 1.24.2, run by /usr/bin/python3; the versions actually used are printed and
 * checked below): scipy.signal.butter / bessel(..., analog=True, norm='mag') with freqs_zpk,
 * scipy.integrate.quad for noise bandwidths, scipy.signal.lsim for the impulse test.
 */
import { beforeAll, describe, expect, it } from 'vitest';
import { highPassAt, lowPassAt, equivalentNoiseBandwidthHz, type LowPassKind } from '@/lib/engine/filters';
import { pulseTest } from '@/lib/engine/impulse';
import { planSchema } from '@/lib/engine/plan';
import { simulateImpulseTest } from '@/lib/engine/waveforms';
import { fixturePlanInput } from '@/unit/helpers/ngspice-plans';
import { normalizedLowPassPoles } from '@/lib/engine/spice-netlist';
import { runScipy, type ScipyBatch, type ScipyRequest } from '@/unit/helpers/scipy';

const families: LowPassKind[] = ['butterworth', 'bessel'];
const lowPassOrders = [1, 2, 3, 4, 5, 6, 7, 8];
const highPassOrders = [1, 2, 3, 4];
/** Frequencies relative to the corner: pass band, corner, transition, stop band. */
const relativeFrequencies = [0.01, 0.1, 0.3, 0.5, 0.7, 0.9, 1, 1.1, 1.5, 2, 3, 5, 10, 30, 100];
const lowPassFcHz = 150;
const highPassFcHz = 0.05;

const lowPassCases = families.flatMap((family) => lowPassOrders.map((order) => ({ family, order })));
/** Impulse-test cases: 3 mV × 100 ms through first- and second-order high-passes. */
const impulseCases = ([1, 2] as const).flatMap((hpOrder) => [0.05, 0.32, 0.5, 0.67].map((fcHz) => ({ hpOrder, fcHz })));
const PULSE = { amplitudeV: 3e-3, widthS: 0.1, delayS: 0.2 };

interface Labeled {
  label: string;
  request: ScipyRequest;
}

const requests: Labeled[] = [
  ...lowPassCases.map(({ family, order }) => ({
    label: `lowpass ${family} ${order}`,
    request: { kind: 'lowpass', family, order, fcHz: lowPassFcHz, fHz: relativeFrequencies.map((r) => r * lowPassFcHz) } as ScipyRequest,
  })),
  ...highPassOrders.map((order) => ({
    label: `highpass ${order}`,
    request: { kind: 'highpass', order, fcHz: highPassFcHz, fHz: relativeFrequencies.map((r) => r * highPassFcHz) } as ScipyRequest,
  })),
  ...lowPassCases.map(({ family, order }) => ({ label: `poles ${family} ${order}`, request: { kind: 'poles', family, order } as ScipyRequest })),
  ...lowPassCases.map(({ family, order }) => ({ label: `enbw ${family} ${order}`, request: { kind: 'enbw', family, order } as ScipyRequest })),
  ...impulseCases.map(({ hpOrder, fcHz }) => ({
    label: `lsim ${hpOrder} ${fcHz}`,
    // 6 time constants after the pulse, 0.2 ms steps
    request: { kind: 'lsim', hpOrder, fcHz, ...PULSE, durationS: PULSE.delayS + PULSE.widthS + 6 / (2 * Math.PI * fcHz), stepS: 2e-4 } as ScipyRequest,
  })),
];

let batch: ScipyBatch;
const result = (label: string) => batch.results[requests.findIndex((r) => r.label === label)];

/** Phase difference wrapped into (−π, π]. */
function phaseDifferenceRad(a: number, b: number): number {
  let d = a - b;
  while (d > Math.PI) d -= 2 * Math.PI;
  while (d <= -Math.PI) d += 2 * Math.PI;
  return d;
}

beforeAll(() => {
  batch = runScipy(requests.map((r) => r.request));
  // The tool and version the numbers below come from.
  console.info(`SciPy reference: scipy ${batch.versions.scipy}, numpy ${batch.versions.numpy}`);
});

describe('SciPy is the tool the comments name', () => {
  it('reports a 1.x SciPy', () => {
    expect(batch.versions.scipy).toMatch(/^1\.\d+/);
  });
});

describe('low-pass responses vs scipy.signal.butter / bessel(norm="mag"), analog', () => {
  it.each(lowPassCases)('$family order $order: magnitude within 1e-6 dB, phase within 1e-6 rad', ({ family, order }) => {
    const ref = result(`lowpass ${family} ${order}`) as { re: number[]; im: number[] };
    relativeFrequencies.forEach((r, k) => {
      const fHz = r * lowPassFcHz;
      const h = lowPassAt(family, order, lowPassFcHz, fHz);
      const engineDb = 20 * Math.log10(Math.hypot(h.re, h.im));
      const scipyDb = 20 * Math.log10(Math.hypot(ref.re[k], ref.im[k]));
      const dPhase = phaseDifferenceRad(Math.atan2(h.im, h.re), Math.atan2(ref.im[k], ref.re[k]));
      expect(Math.abs(engineDb - scipyDb), `${family} ${order} at ${fHz} Hz: engine ${engineDb} dB, SciPy ${scipyDb} dB`).toBeLessThan(1e-6);
      expect(Math.abs(dPhase), `${family} ${order} at ${fHz} Hz: phase differs by ${dPhase} rad`).toBeLessThan(1e-6);
    });
  });

  it('every family and order is −3.0103 dB at the corner in SciPy too (the normalisation both use)', () => {
    for (const { family, order } of lowPassCases) {
      const ref = result(`lowpass ${family} ${order}`) as { re: number[]; im: number[] };
      const k = relativeFrequencies.indexOf(1);
      expect(20 * Math.log10(Math.hypot(ref.re[k], ref.im[k]))).toBeCloseTo(-10 * Math.log10(2), 6);
    }
  });
});

describe('Butterworth high-pass responses vs scipy.signal.butter(btype="high"), analog', () => {
  it.each(highPassOrders)('order %i: magnitude within 1e-6 dB, phase within 1e-6 rad', (order) => {
    const ref = result(`highpass ${order}`) as { re: number[]; im: number[] };
    relativeFrequencies.forEach((r, k) => {
      const fHz = r * highPassFcHz;
      const h = highPassAt(order, highPassFcHz, fHz);
      const engineDb = 20 * Math.log10(Math.hypot(h.re, h.im));
      const scipyDb = 20 * Math.log10(Math.hypot(ref.re[k], ref.im[k]));
      const dPhase = phaseDifferenceRad(Math.atan2(h.im, h.re), Math.atan2(ref.im[k], ref.re[k]));
      expect(Math.abs(engineDb - scipyDb), `order ${order} at ${fHz} Hz: engine ${engineDb} dB, SciPy ${scipyDb} dB`).toBeLessThan(1e-6);
      expect(Math.abs(dPhase), `order ${order} at ${fHz} Hz: phase differs by ${dPhase} rad`).toBeLessThan(1e-6);
    });
  });
});

describe('noise bandwidth vs scipy.integrate.quad of |H|²', () => {
  it.each(lowPassCases)('$family order $order within 0.01 %', ({ family, order }) => {
    const ref = result(`enbw ${family} ${order}`) as { ratio: number };
    const engine = equivalentNoiseBandwidthHz(family, order, 1);
    expect(Math.abs(engine / ref.ratio - 1), `engine ${engine}, SciPy ${ref.ratio}`).toBeLessThan(1e-4);
  });

  it('SciPy reproduces the handbook table (Winder, Analog and Digital Filter Design: Butterworth 1.5708, 1.1107, 1.0472, 1.0262)', () => {
    const table = [1.5708, 1.1107, 1.0472, 1.0262];
    table.forEach((value, i) => {
      expect((result(`enbw butterworth ${i + 1}`) as { ratio: number }).ratio).toBeCloseTo(value, 3);
    });
  });
});

describe('the netlist export uses the same normalized poles as SciPy', () => {
  it.each(lowPassCases)('$family order $order poles within 1e-9', ({ family, order }) => {
    const ref = result(`poles ${family} ${order}`) as { re: number[]; im: number[] };
    const mine = normalizedLowPassPoles(family, order);
    const key = (p: [number, number]) => p[1] * 1000 + p[0];
    const a = mine.map((p) => [p[0], p[1]] as [number, number]).sort((x, y) => key(x) - key(y));
    const b = ref.re.map((re, i) => [re, ref.im[i]] as [number, number]).sort((x, y) => key(x) - key(y));
    expect(a.length).toBe(b.length);
    a.forEach((p, i) => {
      expect(Math.hypot(p[0] - b[i][0], p[1] - b[i][1]), `pole ${i}: ${p} vs SciPy ${b[i]}`).toBeLessThan(1e-9);
    });
  });
});

describe('low-frequency impulse test (3 mV × 100 ms) vs scipy.signal.lsim of the Butterworth high-pass', () => {
  it.each(impulseCases)('order $hpOrder at $fcHz Hz: engine pulseTest displacement and slope within 0.5 %', ({ hpOrder, fcHz }) => {
    const ref = result(`lsim ${hpOrder} ${fcHz}`) as { displacementV: number; slopeVPerS: number };
    const engine = pulseTest(hpOrder, fcHz, PULSE.amplitudeV, PULSE.widthS);
    expect(Math.abs(engine.displacementV / ref.displacementV - 1), `displacement: engine ${engine.displacementV} V, SciPy ${ref.displacementV} V`).toBeLessThan(0.005);
    expect(Math.abs(engine.slopeVPerS / ref.slopeVPerS - 1), `slope: engine ${engine.slopeVPerS} V/s, SciPy ${ref.slopeVPerS} V/s`).toBeLessThan(0.005);
  });

  it.each(impulseCases)('order $hpOrder at $fcHz Hz: the discrete-time simulateImpulseTest within 1 %', ({ hpOrder, fcHz }) => {
    const ref = result(`lsim ${hpOrder} ${fcHz}`) as { displacementV: number; slopeVPerS: number };
    const input = structuredClone(fixturePlanInput);
    input.highPass = { order: hpOrder, fcHz };
    const sim = simulateImpulseTest(planSchema.parse(input), { amplitudeV: PULSE.amplitudeV, widthS: PULSE.widthS, windowS: 6 / (2 * Math.PI * fcHz) });
    expect(Math.abs(sim.displacementV / ref.displacementV - 1), `displacement: simulation ${sim.displacementV} V, SciPy ${ref.displacementV} V`).toBeLessThan(0.01);
    expect(Math.abs(sim.slopeVPerS / ref.slopeVPerS - 1), `slope: simulation ${sim.slopeVPerS} V/s, SciPy ${ref.slopeVPerS} V/s`).toBeLessThan(0.01);
  });

  it('SciPy reproduces the worked figures: 0.05 Hz first order ≈ 93 µV and 29 µV/s, 0.5 Hz ≈ 809 µV; second order at 0.05 Hz ≈ 132 µV', () => {
    const d = (o: number, f: number) => (result(`lsim ${o} ${f}`) as { displacementV: number }).displacementV;
    expect(d(1, 0.05)).toBeCloseTo(93e-6, 6);
    expect((result('lsim 1 0.05') as { slopeVPerS: number }).slopeVPerS).toBeCloseTo(29e-6, 6);
    expect(d(1, 0.5)).toBeCloseTo(809e-6, 5);
    expect(d(2, 0.05)).toBeCloseTo(132e-6, 6);
  });
});
