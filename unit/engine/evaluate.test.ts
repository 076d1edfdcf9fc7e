import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { evaluate } from '@/lib/engine/evaluate';
import { firstStageGain } from '@/lib/engine/model';
import { firstStageOutputs } from '@/lib/engine/levels';
import { differenceAmpCmrrDb, differenceAmpGains, worstCaseDifferenceCmrr } from '@/lib/engine/cmrr';
import { idealSnrDb, lsbV } from '@/lib/engine/adc';
import { requiredCmImpedanceOhm } from '@/lib/engine/interference';
import { parallelRcOhm } from '@/lib/engine/model';
import { magnitude } from '@/lib/engine/complex';
import { runMonteCarlo, runMonteCarloSync } from '@/lib/engine/monte-carlo';
import { expectClose } from './close';
import patch from '@/lib/engine/demo-plans/wearable-ecg-patch.json';
import highGain from '@/lib/engine/demo-plans/wearable-ecg-patch-high-gain.json';
import cart from '@/lib/engine/demo-plans/diagnostic-cart-12-lead.json';
import emg from '@/lib/engine/demo-plans/emg-sleeve.json';

const clone = <T>(v: T): T => structuredClone(v);

function setPath(plan: Record<string, any>, path: string, value: number) {
  const keys = path.split('.');
  let o = plan;
  for (const k of keys.slice(0, -1)) o = o[k];
  o[keys[keys.length - 1]] = value;
}

describe('handbook values', () => {
  // Sedra & Smith, Microelectronic Circuits, instrumentation amplifier example: Rg = 1 kΩ, R = 0.5 MΩ.
  it('three-op-amp first stage: G1 = 1001 and outputs 5 ± 5.005 V', () => {
    expect(firstStageGain(0.5e6, 1e3)).toBeCloseTo(1001, 9);
    const { vaV, vbV } = firstStageOutputs(5, 0.01, 1001);
    expectClose(vaV, 5 + 5.005, 1e-12, 'VA');
    expectClose(vbV, 5 - 5.005, 1e-9, 'VB');
  });

  // Sedra & Smith: difference amplifier of gain 100 with 1 % resistors → Acm ≈ 0.04, CMRR ≈ 68 dB (worst case).
  it('difference amplifier with 1 % resistors: 68 dB worst case', () => {
    let worst = Infinity;
    let worstAcm = 0;
    for (let m = 0; m < 16; m++) {
      const s = (b: number) => ((m >> b) & 1 ? 1.01 : 0.99);
      const r = { r1Ohm: 1e3 * s(0), r2Ohm: 100e3 * s(1), r3Ohm: 1e3 * s(2), r4Ohm: 100e3 * s(3) };
      const db = differenceAmpCmrrDb(r);
      if (db < worst) {
        worst = db;
        worstAcm = Math.abs(differenceAmpGains(r).commonModeGain);
      }
    }
    expectClose(worst, 68, 2e-3, 'worst-case CMRR dB');
    expectClose(worstAcm, 0.04, 2e-2, 'worst-case common-mode gain');
    expectClose(20 * Math.log10(worstCaseDifferenceCmrr(100, 0.01)), 68, 2e-3, '(1 + Gd)/(4t)');
  });

  // Kester, ADI MT-001: ideal SNR = 6.02N + 1.76 dB.
  it('ideal converter SNR and LSB', () => {
    expect(idealSnrDb(16)).toBeCloseTo(98.08, 10);
    expect(idealSnrDb(24)).toBeCloseTo(146.24, 10);
    expectClose(lsbV(3, 16), 3 / 65536, 1e-15, 'LSB');
  });

  // Engine notes, derived check values: 10 V rms → 1 mV p-v is 89.0 dB; 51 kΩ ∥ 47 nF (|Z| ≈ 40.7 kΩ at 50 Hz)
  // needs ≈ 1.15 GΩ common-mode input impedance for the 1 mV limit without right-leg drive.
  it('common-mode test figures', () => {
    const z = magnitude(parallelRcOhm(51e3, 47e-9, 50));
    expectClose(z, 40.7e3, 2e-3, '|51 kΩ ∥ 47 nF| at 50 Hz');
    expectClose(requiredCmImpedanceOhm(10, z, 1e-3 / (2 * Math.SQRT2)), 1.15e9, 5e-3, 'required Zcm');
    // A plan whose only path is the amplifier CMRR: rejecting 10 V rms to 1 mV p-p takes 89.0 dB.
    const p = clone(cart) as Record<string, any>;
    p.body = { mode: 'direct', cmVrms: 10 };
    const r = evaluate(p);
    const cmTerm = r.interference.terms.find((t) => t.name === 'amplifier CMRR')!;
    const cmrrForOneMv = 20 * Math.log10((10 * 2 * Math.SQRT2) / 1e-3);
    expectClose(cmrrForOneMv, 89.0, 1e-3, '89.0 dB');
    expectClose(cmTerm.rtiPpV, 1e-3 * 10 ** ((cmrrForOneMv - r.cmrr.mainsDb) / 20), 1e-9, 'CMRR term');
  });
});

describe('evaluate on the demo plans', () => {
  it('the three base plans pass every check', () => {
    for (const plan of [patch, cart, emg]) {
      const failing = evaluate(plan).checks.filter((c) => c.verdict === 'fails').map((c) => c.id);
      expect(failing, plan.name).toEqual([]);
    }
  });

  it('the high-gain patch fails on offset, and its suggestion fixes it', () => {
    const r = evaluate(highGain);
    expect(r.checks.find((c) => c.id === 'first-stage-gain')?.verdict).toBe('fails');
    const s = r.suggestions.find((x) => x.checkId === 'first-stage-gain');
    expect(s).toBeDefined();
    const fixed = clone(highGain) as Record<string, any>;
    for (const sug of r.suggestions.filter((x) => x.checkId === 'first-stage-gain')) setPath(fixed, sug.patch.path, sug.patch.value);
    const after = evaluate(fixed);
    expect(after.checks.filter((c) => c.verdict === 'fails').map((c) => c.id)).toEqual([]);
  });

  it.each(['targetGain', 'rgOhm'] as const)(
    'a noise failure caused after the first stage gets a larger G1 (stated as %s) with the same total gain, which fixes it',
    (stated) => {
      // The cart with its gain moved to the second stage (G1 = 2, G2 = 100) and a noisy gain-stage
      // op-amp (800 nV/√Hz): referred to input that noise is divided by G1·Gd, so it dominates
      // (the cascade principle of Friis, Proc. IRE 1944, in its voltage form).
      const noisy = clone(cart) as Record<string, any>;
      noisy.gainStage.opAmp.enVPerRtHz = 800e-9;
      noisy.gainStage.gain = 100;
      if (stated === 'targetGain') noisy.instrumentation.targetGain = 2;
      else {
        delete noisy.instrumentation.targetGain;
        noisy.instrumentation.rgOhm = 2 * noisy.instrumentation.rOhm; // G1 = 1 + 2R/Rg = 2
      }
      const r = evaluate(noisy);
      expect(r.gains.g1).toBeCloseTo(2, 12);
      const noiseCheck = r.checks.find((c) => c.id === 'noise')!;
      expect(noiseCheck.verdict).toBe('fails');
      const top = [...r.noise.contributions].sort((x, y) => y.rmsV - x.rmsV)[0];
      expect(top.name).toBe('gain-stage op-amp');
      const suggested = r.suggestions.filter((x) => x.checkId === 'noise');
      expect(suggested.map((x) => x.id)).toEqual(['noise-first-stage-gain', 'gain-split-after-noise']);
      expect(suggested[0].patch.path).toBe(`instrumentation.${stated}`); // as the plan states G1
      const fixed = clone(noisy);
      for (const sug of suggested) setPath(fixed, sug.patch.path, sug.patch.value);
      const after = evaluate(fixed);
      expect(after.gains.g1).toBeGreaterThan(2);
      expect(after.gains.g1).toBeLessThanOrEqual(0.9 * r.maxFirstStageGain);
      expect(after.checks.find((c) => c.id === 'noise')!.value).toBeLessThanOrEqual(0.9 * noiseCheck.limit);
      // The same total gain, within the 3-significant-digit rounding of Rg and G2.
      expect(Math.abs(after.gains.totalGain / r.gains.totalGain - 1)).toBeLessThan(0.01);
      expect(after.checks.filter((c) => c.verdict !== 'meets').map((c) => c.id)).toEqual([]);
      // The smallest such G1: one step lower (target gain) does not reach 90 % of the limit.
      if (stated === 'targetGain') {
        const lower = clone(fixed);
        lower.instrumentation.targetGain -= 1;
        lower.gainStage.gain = Math.round((r.gains.totalGain / lower.instrumentation.targetGain) * 1000) / 1000;
        expect(evaluate(lower).checks.find((c) => c.id === 'noise')!.value).toBeGreaterThan(0.9 * noiseCheck.limit);
      }
    },
  );

  it('a noise failure made at the input (2 MΩ electrodes) gets no gain suggestion', () => {
    // Electrode thermal noise and the input current noise through the electrodes are at the input:
    // no gain change helps, so nothing is offered (the check still links to its stage).
    const dry = clone(cart) as Record<string, any>;
    dry.electrodes.rsOhm = 2e6;
    const r = evaluate(dry);
    expect(r.checks.find((c) => c.id === 'noise')!.verdict).toBe('fails');
    expect(r.maxFirstStageGain * 0.9).toBeGreaterThan(r.gains.g1 + 1); // G1 could rise, but it would not help
    expect(r.suggestions.filter((x) => x.checkId === 'noise')).toEqual([]);
  });

  it('the closed-form largest gain puts the worst node exactly on its limit', () => {
    const r = evaluate(cart);
    const p = clone(cart) as Record<string, any>;
    p.instrumentation.targetGain = r.maxFirstStageGain;
    const at = evaluate(p).stages.find((s) => s.id === 'instrumentation')!;
    expect(Math.min(...at.nodes.map((n) => n.headroomV))).toBeCloseTo(0, 9);
  });

  it('finds the corners and mid-band gain of the chain', () => {
    const r = evaluate(cart);
    expectClose(r.response.midbandGainDb, 20 * Math.log10(200), 2e-3, 'mid-band gain (G1·Gd·G2 = 200)');
    expectClose(r.response.lowCornerHz, 0.045, 1e-2, 'low corner ≈ high-pass corner');
    expect(r.response.points).toHaveLength(200);
    expect(evaluate(cart, { responsePoints: 2000 }).response.points).toHaveLength(2000);
  });

  it('is deterministic', () => {
    expect(JSON.stringify(evaluate(emg))).toBe(JSON.stringify(evaluate(emg)));
  });

  it('has every report field other tools read', () => {
    const r = evaluate(patch);
    for (const k of ['stages', 'maxFirstStageGain', 'commonModeWindow', 'response', 'impulseTest', 'recovery', 'noise', 'cmrr', 'interference', 'adc', 'checks', 'patientCurrents', 'suggestions', 'warnings']) {
      expect(r).toHaveProperty(k);
    }
    expect(r.stages.find((s) => s.id === 'instrumentation')!.nodes.map((n) => n.name)).toEqual(expect.arrayContaining(['VA', 'VB', 'VOUT']));
    expect(r.commonModeWindow.vertices.length).toBe(6);
  });
});

describe('properties', () => {
  it('gains are never negative', () => {
    fc.assert(
      fc.property(fc.double({ min: 1, max: 1000, noNaN: true }), fc.double({ min: 0.1, max: 10, noNaN: true }), fc.double({ min: 1, max: 500, noNaN: true }), (g1, gd, g2) => {
        const p = clone(cart) as Record<string, any>;
        p.instrumentation.targetGain = g1;
        p.instrumentation.diffGain = gd;
        p.gainStage.gain = g2;
        const r = evaluate(p, { responsePoints: 20, noisePoints: 40 });
        return r.stages.every((s) => s.gain >= 0) && r.maxFirstStageGain >= 0 && r.gains.totalGain >= 0;
      }),
      { numRuns: 40 },
    );
  });

  it('headroom shrinks as the offset grows', () => {
    fc.assert(
      fc.property(fc.double({ min: 0.3, max: 1, noNaN: true }), fc.double({ min: 0.001, max: 0.2, noNaN: true }), (a, step) => {
        const head = (offsetV: number) => {
          const p = clone(cart) as Record<string, any>;
          p.electrodes.offsetV = offsetV;
          return Math.min(...evaluate(p, { responsePoints: 20, noisePoints: 40 }).stages.find((s) => s.id === 'instrumentation')!.nodes.map((n) => n.headroomV));
        };
        return head(a + step) <= head(a);
      }),
      { numRuns: 30 },
    );
  });

  it('more resistor tolerance never raises CMRR', () => {
    fc.assert(
      fc.property(fc.double({ min: 1e-5, max: 0.05, noNaN: true }), fc.double({ min: 1e-6, max: 0.05, noNaN: true }), (t, dt) => {
        const cmrr = (tol: number) => {
          const p = clone(emg) as Record<string, any>;
          p.instrumentation.resistorTolerance = tol;
          return evaluate(p, { responsePoints: 20, noisePoints: 40 }).cmrr;
        };
        const lo = cmrr(t);
        const hi = cmrr(t + dt);
        return hi.mainsDb <= lo.mainsDb && hi.resistorLimitedDb <= lo.resistorLimitedDb;
      }),
      { numRuns: 30 },
    );
  });
});

describe('Monte Carlo', () => {
  it('is reproducible, stays above the worst-case bound, and reports yield', () => {
    const a = runMonteCarloSync(cart, { trials: 2000, seed: 42, distribution: 'uniform' });
    const b = runMonteCarloSync(cart, { trials: 2000, seed: 42, distribution: 'uniform' });
    expect(a.cmrrDb).toEqual(b.cmrrDb);
    const worst = evaluate(cart).cmrr.mainsDb;
    // Uniform sampling within the tolerance can never be worse than the worst-case sum (0.01 dB for rounding of the linearised bound).
    expect(a.summary.cmrrDb.min).toBeGreaterThanOrEqual(worst - 0.01);
    expect(a.yield.overall).toBeGreaterThan(0.99);
    expect(Math.abs(a.summary.gainError.max)).toBeLessThan(4 * 1e-4 * 1.01);
  });

  it('reports progress and can be cancelled', async () => {
    const seen: number[] = [];
    const r = await runMonteCarlo(patch, { trials: 10000, seed: 1, distribution: 'normal', onProgress: (d) => seen.push(d) });
    expect(seen[seen.length - 1]).toBe(10000);
    expect(r.trials).toBe(10000);
    const controller = new AbortController();
    const run = runMonteCarlo(patch, { trials: 100000, seed: 1, distribution: 'uniform', onProgress: (d) => d >= 4000 && controller.abort(new Error('stopped by the user')) , signal: controller.signal });
    await expect(run).rejects.toThrow('stopped by the user');
  });
});
