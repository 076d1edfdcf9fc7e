/**
 * Time-domain simulation checked against closed forms: the McSharry ECG's beat period, clipping
 * at node limits, the high-pass time constant, the impulse-test displacement, the bilinear
 * sections' corners, and the ADC's quantization.
 */
import { describe, expect, it } from 'vitest';
import { mcSharryEcg } from '@/lib/engine/ecg-model';
import { planSchema, type ChannelPlan } from '@/lib/engine/plan';
import {
  bilinearSection,
  clipSegments,
  decimateMinMax,
  highPass1,
  highPass2,
  lowPass2,
  simulateChain,
  simulateImpulseTest,
  simulateWaveforms,
  type Biquad,
} from '@/lib/engine/waveforms';
import { evaluate } from '@/lib/engine/evaluate';
import { demoPlans } from '@/unit/helpers/ngspice-cases';
import { fixturePlan, fixturePlanInput } from '@/unit/helpers/ngspice-plans';

function withPlan(patch: (p: typeof fixturePlanInput) => void): ChannelPlan {
  const copy = structuredClone(fixturePlanInput);
  patch(copy);
  return planSchema.parse(copy);
}

/** |H(e^{jωT})| of a biquad. */
function biquadMagnitude(s: Biquad, fHz: number, fsHz: number): number {
  const w = (2 * Math.PI * fHz) / fsHz;
  const z1 = { re: Math.cos(w), im: -Math.sin(w) };
  const z2 = { re: Math.cos(2 * w), im: -Math.sin(2 * w) };
  const nRe = s.b0 + s.b1 * z1.re + s.b2 * z2.re;
  const nIm = s.b1 * z1.im + s.b2 * z2.im;
  const dRe = 1 + s.a1 * z1.re + s.a2 * z2.re;
  const dIm = s.a1 * z1.im + s.a2 * z2.im;
  return Math.hypot(nRe, nIm) / Math.hypot(dRe, dIm);
}

/** Indices of R peaks: local maxima above half the largest sample, at least 200 ms apart. */
function rPeaks(x: Float64Array, fsHz: number): number[] {
  let max = -Infinity;
  for (const v of x) max = Math.max(max, v);
  const out: number[] = [];
  const gap = Math.round(0.2 * fsHz);
  for (let i = 1; i < x.length - 1; i += 1) {
    if (x[i] > 0.5 * max && x[i] >= x[i - 1] && x[i] > x[i + 1]) {
      if (out.length === 0 || i - out[out.length - 1] > gap) out.push(i);
    }
  }
  return out;
}

describe('McSharry ECG model (McSharry et al., IEEE Trans. Biomed. Eng. 2003: ω = 2π/RR sets the beat period)', () => {
  it.each([45, 60, 72, 100, 150])('%i bpm: mean RR interval within 0.5 % of 60/HR, R peak at the configured amplitude', (bpm) => {
    const fs = 1000;
    const x = mcSharryEcg({ heartRateBpm: bpm, durationS: 20, sampleRateHz: fs, amplitudeV: 1e-3 });
    const peaks = rPeaks(x, fs);
    const intervalsS = peaks.slice(1).map((p, i) => (p - peaks[i]) / fs);
    const expectedS = 60 / bpm;
    expect(peaks.length, `found ${peaks.length} R peaks in 20 s at ${bpm} bpm`).toBeGreaterThanOrEqual(Math.floor((20 * bpm) / 60) - 1);
    const meanS = intervalsS.reduce((a, b) => a + b, 0) / intervalsS.length;
    expect(Math.abs(meanS / expectedS - 1), `mean RR ${meanS} s, expected ${expectedS} s`).toBeLessThan(0.005);
    for (const rr of intervalsS) expect(Math.abs(rr - expectedS)).toBeLessThanOrEqual(2 / fs);
    const peakValues = peaks.map((p) => x[p]);
    expect(Math.max(...peakValues)).toBeCloseTo(1e-3, 8);
  });

  it('has a QRS: a negative S wave after each R peak, and a T wave (a positive bump 150–400 ms after R at 60 bpm)', () => {
    const fs = 1000;
    const x = mcSharryEcg({ heartRateBpm: 60, durationS: 5, sampleRateHz: fs, amplitudeV: 1e-3 });
    const peaks = rPeaks(x, fs);
    const r = peaks[1];
    const sMin = Math.min(...Array.from(x.subarray(r, r + 60)));
    const tMax = Math.max(...Array.from(x.subarray(r + 150, r + 400)));
    expect(sMin).toBeLessThan(0);
    expect(tMax).toBeGreaterThan(0.05e-3);
    expect(tMax).toBeLessThan(0.5e-3);
  });

  it('refuses an impossible heart rate with a message naming it', () => {
    expect(() => mcSharryEcg({ heartRateBpm: 0, durationS: 1, sampleRateHz: 500, amplitudeV: 1e-3 })).toThrow(/heart rate must be between 0 and 400 bpm \(got 0\)/);
  });
});

describe('bilinear sections keep the analog corners (pre-warped; Oppenheim & Schafer §7.2)', () => {
  const fs = 2000;
  it('first-order high-pass at 0.05 Hz: −3.0103 dB at the corner, −20 dB per decade below it', () => {
    const s = highPass1(2 * Math.PI * 0.05, fs);
    expect(20 * Math.log10(biquadMagnitude(s, 0.05, fs))).toBeCloseTo(-3.0103, 3);
    // analog 1st-order: |H(f)| = (f/fc)/√(1+(f/fc)²); at f = fc/100 this is −40.0004 dB
    expect(20 * Math.log10(biquadMagnitude(s, 0.0005, fs))).toBeCloseTo(-40.0004, 2);
  });
  it('second-order Butterworth low-pass at 150 Hz: −3.0103 dB at 150 Hz, −40 dB/decade (−12.30 dB at 300 Hz analog)', () => {
    const s = lowPass2(2 * Math.PI * 150, Math.SQRT1_2, fs);
    expect(20 * Math.log10(biquadMagnitude(s, 150, fs))).toBeCloseTo(-3.0103, 3);
    // analog Butterworth 2: |H|² = 1/(1 + (f/fc)^4): at 2 fc → −12.304 dB; bilinear warping makes the discrete one steeper
    const at300 = 20 * Math.log10(biquadMagnitude(s, 300, fs));
    expect(at300).toBeLessThan(-12.3);
    expect(at300).toBeGreaterThan(-14);
  });
  it('a general section reproduces the analog DC gain exactly', () => {
    const s = bilinearSection([3, 0, 0], [2, 1, 0.5], 1000, 10);
    expect((s.b0 + s.b1 + s.b2) / (1 + s.a1 + s.a2)).toBeCloseTo(1.5, 9);
  });
});

describe('high-pass removes a DC offset with the right time constant', () => {
  it('first order, 0.5 Hz: after the offset appears the high-pass output decays as e^(−t/τ), τ = 1/(2π·fc)', () => {
    const plan = withPlan((p) => {
      p.highPass = { order: 1, fcHz: 0.5 };
      p.electrodes.offsetV = 0.05;
      p.profileId = 'surface-emg'; // profile offset tolerance below 50 mV? use the plan's 50 mV via the context
    });
    const sim = simulateChain(plan, {
      durationS: 3,
      sampleRateHz: 2000,
      seed: 1,
      include: { signal: false, drift: false, mains: false, noise: false, offset: true },
      offsetStartS: 0.5,
      context: { offsetV: 0.05 },
    });
    const fs = 2000;
    const g1gd = 4 * 1; // fixture: G1 = 4, Gd = 1
    const vref = plan.supply.referenceV;
    const tau = 1 / (2 * Math.PI * 0.5);
    const i0 = Math.ceil(0.5 * fs);
    // just after the step the full G1·Gd·offset reaches the high-pass output
    expect(sim.nodes.hp[i0] - vref).toBeCloseTo(g1gd * 0.05, 3);
    for (const k of [0.5, 1, 2, 4]) {
      const i = i0 + Math.round(k * tau * fs);
      const expected = g1gd * 0.05 * Math.exp(-(i - i0) / fs / tau);
      const got = sim.nodes.hp[i] - vref;
      expect(Math.abs(got / expected - 1), `at ${k} τ: got ${got} V, expected ${expected} V`).toBeLessThan(0.01);
    }
    // before the offset appears, the output sits at the reference; the instrumentation output carries the offset (no high-pass there)
    expect(sim.nodes.hp[i0 - 10]).toBeCloseTo(vref, 9);
    expect(sim.nodes.ina[sim.nodes.ina.length - 1] - vref).toBeCloseTo(g1gd * 0.05, 6);
  });

  it('a settled record (offset present from the start): the high-pass output carries no offset', () => {
    const sim = simulateChain(fixturePlan, { durationS: 2, sampleRateHz: 1000, seed: 2, include: { signal: false, drift: false, mains: false, noise: false } });
    const vref = fixturePlan.supply.referenceV;
    expect(Math.max(...Array.from(sim.nodes.hp, (v) => Math.abs(v - vref)))).toBeLessThan(1e-9);
    // worst-case DC input without the signal: the profile's 300 mV offset + bias 1 nA × 51 kΩ imbalance
    // + two op-amp offsets of 50 µV (the three-op-amp levels analysis), × G1·Gd = 4 on the instrumentation output
    const dcInputV = 0.3 + 1e-9 * 51e3 + 2 * 50e-6;
    expect(sim.nodes.ina[0] - vref).toBeCloseTo(dcInputV * 4, 9);
  });
});

describe('clipping at node limits', () => {
  it('a first-stage gain too high for the offset clips VA and VB at the op-amp swing for the whole record', () => {
    // G1 = 30 with 300 mV: VA = 1.5 + 30·0.3/2 = 6 V > 2.95 V (3 V rail − 50 mV swing), VB = −3 V < 0.05 V
    const plan = withPlan((p) => {
      p.instrumentation = { ...p.instrumentation, targetGain: 30 };
    });
    const result = simulateWaveforms(plan, { durationS: 2, sampleRateHz: 1000, seed: 3 });
    const va = result.traces.find((t) => t.node === 'va')!;
    const vb = result.traces.find((t) => t.node === 'vb')!;
    expect(va.limits).toEqual({ minV: 0.05, maxV: 2.95 });
    expect(va.clippedFraction).toBe(1);
    expect(vb.clippedFraction).toBe(1);
    expect(Math.max(...va.values)).toBe(2.95);
    expect(Math.min(...vb.values)).toBe(0.05);
    expect(va.clippedSegments).toEqual([{ startS: 0, endS: 2 }]);
  });

  it('the working fixture clips nowhere', () => {
    const result = simulateWaveforms(fixturePlan, { durationS: 4, sampleRateHz: 1000, seed: 4 });
    for (const t of result.traces) expect(t.clippedFraction, `${t.node} clipped`).toBe(0);
  });

  it('an ADC range too small for the R peaks clips only around the peaks, once per beat', () => {
    // total gain 4 × 1 × 40 = 160: a 5 mV R peak is 0.8 V above mid-scale; a 1.2 V full scale (±0.6 V) clips it, the baseline stays inside
    const plan = withPlan((p) => {
      p.adc = { ...p.adc, fullScaleV: 1.2 };
    });
    const sim = simulateChain(plan, { durationS: 5, sampleRateHz: 2000, seed: 5, heartRateBpm: 60, include: { drift: false, mains: false, noise: false } });
    const segments = clipSegments(sim.clipped.adc, 2000);
    expect(segments.length).toBeGreaterThanOrEqual(4);
    expect(segments.length).toBeLessThanOrEqual(6);
    for (const s of segments) expect(s.endS - s.startS).toBeLessThan(0.1);
    for (let k = 1; k < segments.length; k += 1) expect(segments[k].startS - segments[k - 1].startS).toBeCloseTo(1, 1);
    expect(Math.max(...sim.nodes.adc)).toBe(1.5 + 0.6);
    // the node before the converter is not clipped (3 V rails)
    expect(sim.clipped.lp.every((f) => f === 0)).toBe(true);
  });
});

describe('ADC sampling and quantization', () => {
  it('codes are floor((v − bottom)/LSB) at the converter rate, LSB = FS/2^N', () => {
    const sim = simulateChain(fixturePlan, { durationS: 1, sampleRateHz: 4000, seed: 6 });
    const lsb = 3 / 2 ** 16;
    expect(sim.adc.lsbV).toBe(lsb);
    expect(sim.adc.timeS.length).toBe(1000);
    for (let k = 0; k < sim.adc.codes.length; k += 97) {
      const i = Math.floor(sim.adc.timeS[k] * 4000 + 1e-9);
      expect(sim.adc.codes[k]).toBe(Math.floor(sim.nodes.adc[i] / lsb));
      expect(Math.abs(sim.adc.valuesV[k] - sim.nodes.adc[i])).toBeLessThanOrEqual(lsb / 2 + 1e-15);
    }
  });
});

describe('determinism and display form', () => {
  it('the same seed gives the same record; another seed changes the noise', () => {
    const opts = { durationS: 1, sampleRateHz: 1000, context: { noiseRmsV: 5e-6 } };
    const a = simulateWaveforms(fixturePlan, { ...opts, seed: 7 });
    const b = simulateWaveforms(fixturePlan, { ...opts, seed: 7 });
    const c = simulateWaveforms(fixturePlan, { ...opts, seed: 8 });
    expect(b).toEqual(a);
    expect(c.traces[7].values).not.toEqual(a.traces[7].values);
  });

  it('min/max decimation keeps the extremes', () => {
    const x = Float64Array.from({ length: 10000 }, (_, i) => Math.sin(i / 50) + (i === 5123 ? 10 : 0));
    const d = decimateMinMax(x, 1000, 500);
    expect(d.values.length).toBeLessThanOrEqual(500);
    expect(Math.max(...d.values)).toBe(Math.max(...x));
    expect(Math.min(...d.values)).toBe(Math.min(...x));
    expect(d.timeS[d.values.indexOf(Math.max(...d.values))]).toBeCloseTo(5.123, 6);
  });

  it('EMG and EEG inputs have the configured scale', () => {
    const emg = simulateChain(fixturePlan, { durationS: 4, sampleRateHz: 4000, seed: 9, signal: 'emg', include: { offset: false, drift: false, mains: false, noise: false }, context: { signalAmplitudeV: 4e-3 } });
    const eeg = simulateChain(fixturePlan, { durationS: 4, sampleRateHz: 1000, seed: 9, signal: 'eeg', include: { offset: false, drift: false, mains: false, noise: false }, context: { signalAmplitudeV: 1e-3 } });
    // EMG burst rms = amplitude/4 (0.5–1.5 s of each 2 s period holds the burst, flat part 0.7–1.3 s)
    const burst = emg.input.subarray(Math.round(0.7 * 4000), Math.round(1.3 * 4000));
    const rms = Math.sqrt(burst.reduce((a, v) => a + v * v, 0) / burst.length);
    expect(rms).toBeGreaterThan(0.7e-3);
    expect(rms).toBeLessThan(1.3e-3);
    const rest = emg.input.subarray(Math.round(1.6 * 4000), Math.round(2.4 * 4000));
    expect(rest.every((v) => v === 0)).toBe(true);
    const eegPeak = Math.max(...Array.from(eeg.input, Math.abs));
    expect(eegPeak).toBeGreaterThan(0.3e-3);
    expect(eegPeak).toBeLessThan(1e-3);
  });

  it('bad options are refused with a message naming the field', () => {
    expect(() => simulateWaveforms(fixturePlan, { durationS: 0, sampleRateHz: 1000, seed: 1 })).toThrow(/durationS must be/);
    expect(() => simulateWaveforms(fixturePlan, { durationS: 1, sampleRateHz: 200, seed: 1 })).toThrow(/sampleRateHz must be at least 2.2 × the low-pass corner \(330 Hz\)/);
    expect(() => simulateWaveforms(fixturePlan, { durationS: 1, sampleRateHz: 1000, seed: 1.5 })).toThrow(/seed must be a whole number/);
  });

  it('10 s at 2 kHz (timing printed, not asserted)', () => {
    const t0 = performance.now();
    const result = simulateWaveforms(fixturePlan, { durationS: 10, sampleRateHz: 2000, seed: 10 });
    const ms = performance.now() - t0;
    console.info(`simulateWaveforms: 10 s at 2 kHz in ${ms.toFixed(1)} ms`);
    expect(result.traces.every((t) => t.values.length <= 2000)).toBe(true);
    expect(result.durationS).toBe(10);
  });
});

describe('low-frequency impulse test in the time domain (3 mV × 100 ms)', () => {
  // Closed form for a first-order high-pass: displacement = A(1 − e^(−T/τ)), slope = displacement/τ
  // (worked figures: 0.05 Hz → 93 µV, 29 µV/s; 0.5 Hz → 809 µV, 2.5 mV/s).
  const closedForm = (fcHz: number) => {
    const tau = 1 / (2 * Math.PI * fcHz);
    const d = 3e-3 * (1 - Math.exp(-0.1 / tau));
    return { displacementV: d, slopeVPerS: d / tau };
  };
  it.each([0.05, 0.32, 0.5])('first order at %f Hz: displacement and slope within 1 % of the closed form', (fcHz) => {
    const plan = withPlan((p) => {
      p.highPass = { order: 1, fcHz };
    });
    const r = simulateImpulseTest(plan);
    const ref = closedForm(fcHz);
    expect(Math.abs(r.displacementV / ref.displacementV - 1), `displacement ${r.displacementV} vs ${ref.displacementV}`).toBeLessThan(0.01);
    expect(Math.abs(r.slopeVPerS / ref.slopeVPerS - 1), `slope ${r.slopeVPerS} vs ${ref.slopeVPerS}`).toBeLessThan(0.01);
  });

  it('0.05 Hz first order: about 93 µV (passes 0.1 mV); second-order Butterworth at 0.05 Hz: about 132 µV (fails)', () => {
    const first = simulateImpulseTest(withPlan((p) => { p.highPass = { order: 1, fcHz: 0.05 }; }));
    const second = simulateImpulseTest(withPlan((p) => { p.highPass = { order: 2, fcHz: 0.05 }; }));
    expect(first.displacementV).toBeGreaterThan(92e-6);
    expect(first.displacementV).toBeLessThan(94e-6);
    expect(second.displacementV).toBeGreaterThan(130e-6);
    expect(second.displacementV).toBeLessThan(134e-6);
  });

  it('returns the 3 mV × 100 ms input and the output referred to input', () => {
    const r = simulateImpulseTest(fixturePlan);
    expect(r.amplitudeV).toBe(3e-3);
    expect(r.widthS).toBe(0.1);
    expect(Math.max(...r.input.values)).toBe(3e-3);
    // the chain's output during the pulse is close to the pulse (the 0.05 Hz high-pass barely droops in 100 ms)
    const during = r.output.values.filter((_, i) => r.output.timeS[i] > r.startS + 0.05 && r.output.timeS[i] < r.endS - 0.001);
    expect(Math.min(...during)).toBeGreaterThan(2.85e-3);
  });

  it('a second-order high-pass step response matches its closed form e^(−at)(cos bt − (a/b) sin bt) (Ogata)', () => {
    const fs = 1000;
    const fc = 1;
    const x = new Float64Array(3000).fill(1);
    x[0] = 0;
    const s = highPass2(2 * Math.PI * fc, Math.SQRT1_2, fs);
    let s1 = 0;
    let s2 = 0;
    const y = Array.from(x, (xi) => {
      const yi = s.b0 * xi + s1;
      s1 = s.b1 * xi - s.a1 * yi + s2;
      s2 = s.b2 * xi - s.a2 * yi;
      return yi;
    });
    const w = 2 * Math.PI * fc;
    const a = w * Math.SQRT1_2;
    const b = w * Math.SQRT1_2;
    for (const tS of [0.1, 0.3, 0.6, 1.0]) {
      const expected = Math.exp(-a * tS) * (Math.cos(b * tS) - (a / b) * Math.sin(b * tS));
      // the step lands half a sample late under the trapezoidal rule
      const got = y[Math.round(tS * fs + 0.5)];
      expect(Math.abs(got - expected), `t = ${tS}: ${got} vs ${expected}`).toBeLessThan(0.005);
    }
  });
});

describe('the simulation takes its limits, interference and noise from the report', () => {
  it('node ranges are the report\'s stage limits; mains and common mode are the report\'s interference figures', () => {
    const report = evaluate(fixturePlan);
    const result = simulateWaveforms(fixturePlan, { durationS: 1, sampleRateHz: 2000, seed: 11, report });
    const va = report.stages.find((s) => s.id === 'instrumentation')!.nodes.find((n) => n.name === 'VA')!;
    expect(result.context.limits.va).toEqual({ minV: va.lowLimitV, maxV: va.highLimitV });
    const adc = report.stages.find((s) => s.id === 'adc')!.nodes[0];
    expect(result.context.limits.adc).toEqual({ minV: adc.lowLimitV, maxV: adc.highLimitV });
    expect(result.context.mainsDifferentialPeakV).toBe(report.interference.rtiPpV / 2);
    expect(result.context.commonModeMainsPeakV).toBeCloseTo(report.interference.bodyCmV * Math.SQRT2, 15);
    expect(result.context.noiseRmsV).toBe(report.noise.rtiRmsV);
  });

  it('the mains terms alone: the differential input is a sine of the report\'s p-p/2, VA carries the body common mode', () => {
    const report = evaluate(fixturePlan);
    const sim = simulateChain(fixturePlan, { durationS: 1, sampleRateHz: 2000, seed: 12, report, include: { signal: false, offset: false, drift: false, noise: false, mains: true } });
    const peak = Math.max(...Array.from(sim.input, Math.abs));
    expect(peak / (report.interference.rtiPpV / 2)).toBeCloseTo(1, 3);
    // VA − Vcm = G1·Vd/2, so (VA + VB)/2 is the common mode alone
    const cmPeak = Math.max(...Array.from(sim.nodes.va, (v, i) => Math.abs((v + sim.nodes.vb[i]) / 2 - fixturePlan.supply.referenceV)));
    expect(cmPeak / (report.interference.bodyCmV * Math.SQRT2)).toBeCloseTo(1, 3);
  });

  it('the noise alone: the rms at the converter referred to input is near the report\'s RTI rms (white approximation, within 10 %)', () => {
    const report = evaluate(fixturePlan);
    const sim = simulateChain(fixturePlan, { durationS: 20, sampleRateHz: 2000, seed: 13, report, include: { signal: false, offset: false, drift: false, mains: false, noise: true } });
    const vref = fixturePlan.supply.referenceV;
    const tail = sim.nodes.lp.subarray(4000);
    const mean = tail.reduce((a, v) => a + v, 0) / tail.length;
    const rms = Math.sqrt(tail.reduce((a, v) => a + (v - mean) ** 2, 0) / tail.length) / report.gains.totalGain;
    expect(Math.abs(mean - vref)).toBeLessThan(1e-2);
    expect(Math.abs(rms / report.noise.rtiRmsV - 1), `simulated ${rms} V rms vs report ${report.noise.rtiRmsV} V rms`).toBeLessThan(0.1);
  });

  it.each(demoPlans().map((d) => [d.name, d.plan] as const))('%s: nodes the report finds out of range are clipped in the simulation, the others never', (_, plan) => {
    const report = evaluate(plan);
    const sampleRateHz = Math.max(2000, 4 * plan.gainStage.lowPass.fcHz);
    const result = simulateWaveforms(plan, { durationS: 5, sampleRateHz, seed: 14, report, include: { drift: false } });
    const byNode = Object.fromEntries(result.traces.map((t) => [t.node, t.clippedFraction]));
    const inst = report.stages.find((s) => s.id === 'instrumentation')!.nodes;
    const vaHeadroom = inst.find((n) => n.name === 'VA')!.headroomV;
    const voutHeadroom = inst.find((n) => n.name === 'VOUT')!.headroomV;
    if (vaHeadroom < 0) expect(byNode.va).toBeGreaterThan(0.9);
    else expect(byNode.va).toBe(0);
    if (voutHeadroom < 0) expect(byNode.ina).toBeGreaterThan(0.9);
    else expect(byNode.ina).toBe(0);
    const failing = report.checks.filter((c) => c.id.startsWith('headroom-') && c.verdict === 'fails').length;
    const clippedNodes = result.traces.filter((t) => t.clippedFraction > 0).length;
    expect(clippedNodes > 0).toBe(failing > 0);
  });
});
