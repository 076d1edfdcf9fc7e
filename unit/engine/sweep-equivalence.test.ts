/**
 * The frequency response and the noise budget are computed by allocation-free sweeps
 * (`stageResponsesInto`, `stageGainsSquaredInto`, `filterResponseInto`, plain loops over numbers). This file keeps the
 * straightforward per-point computation they replaced — every stage as a Complex object from
 * `stageResponsesAt`, impedances from `leadImpedanceOhm`, dB as 10·log10|H|², phases from atan2 —
 * as the oracle, and checks that both give the same report: the same keys in the same order, the
 * same point counts, and every number within 1e-9 relative.
 */
import { readdirSync, readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { argumentDeg, magnitudeSquared, powerRatioToDb, ratioToDb, type Complex } from '@/lib/engine/complex';
import { BOLTZMANN_J_PER_K, NOISE_PP_PER_RMS } from '@/lib/engine/constants';
import { filterResponseInto, highPassAt, highPassSweep, lowPassAt, lowPassMagnitudeSquared, lowPassSweep, type LowPassKind } from '@/lib/engine/filters';
import { electrodeImpedanceOhm, leadImpedanceOhm, parallelRcOhm, resolvePlan, type Resolved } from '@/lib/engine/model';
import { noiseBudget } from '@/lib/engine/noise';
import { profileFor } from '@/lib/engine/profiles';
import type { FrequencyResponse, NoiseContribution, NoiseReport, ResponsePoint, StageId } from '@/lib/engine/report';
import {
  chainConstants,
  closedLoopStageAt,
  findCrossingHz,
  frequencyResponse,
  GAIN_SQUARED_BUFFER_LENGTH,
  GAIN_SQUARED_OFFSET,
  logGrid,
  midbandFrequencyHz,
  STAGE_BUFFER_LENGTH,
  STAGE_OFFSET,
  stageGainsSquaredInto,
  stageResponsesAt,
  stageResponsesInto,
  totalMagnitudeAt,
} from '@/lib/engine/response';
import { parsePlan } from '@/lib/engine/validate';

const REL_TOL = 1e-9;

// ---------------------------------------------------------------------------------------------
// The oracle: the per-point formulas, one Complex object per stage and frequency.
// ---------------------------------------------------------------------------------------------

function referenceUnwrap(points: ResponsePoint[]): void {
  let offset = 0;
  for (let i = 1; i < points.length; i++) {
    const raw = points[i].phaseDeg + offset;
    const prev = points[i - 1].phaseDeg;
    let delta = raw - prev;
    while (delta > 180) { offset -= 360; delta -= 360; }
    while (delta < -180) { offset += 360; delta += 360; }
    points[i].phaseDeg = prev + delta;
  }
}

function referencePoint(fHz: number, h: Complex): ResponsePoint {
  return { fHz, magDb: 10 * Math.log10(magnitudeSquared(h)), phaseDeg: (Math.atan2(h.im, h.re) * 180) / Math.PI };
}

function referenceFrequencyResponse(r: Resolved, pointCount: number): FrequencyResponse {
  const fs = r.plan.adc.sampleRateHz;
  const grid = logGrid(1e-3, fs, pointCount);
  const total: ResponsePoint[] = [];
  const stages: Record<'input' | 'instrumentation' | 'high-pass' | 'gain-stage', ResponsePoint[]> = {
    input: [], instrumentation: [], 'high-pass': [], 'gain-stage': [],
  };
  for (const f of grid) {
    const s = stageResponsesAt(r, f);
    total.push(referencePoint(f, s.total));
    stages.input.push(referencePoint(f, s.input));
    stages.instrumentation.push(referencePoint(f, s.instrumentation));
    stages['high-pass'].push(referencePoint(f, s.highPass));
    stages['gain-stage'].push(referencePoint(f, s.gainStage));
  }
  referenceUnwrap(total);
  for (const key of Object.keys(stages) as (keyof typeof stages)[]) referenceUnwrap(stages[key]);
  const midHz = midbandFrequencyHz(r);
  const mid = totalMagnitudeAt(r, midHz);
  const mag = (f: number) => totalMagnitudeAt(r, f);
  const target = mid / Math.SQRT2;
  const low = r.plan.highPass.order === 0 && mag(1e-6) > target ? 0 : findCrossingHz(mag, target, 1e-6, midHz);
  const high = findCrossingHz(mag, target, midHz, fs * 1e3);
  const aliasHz = Math.max(fs - r.profile.band.highHz, fs / 2);
  return {
    lowCornerHz: low ?? 0,
    highCornerHz: high ?? fs * 1e3,
    midbandGainDb: ratioToDb(mid),
    midbandHz: midHz,
    aliasAttenuationDb: ratioToDb(mid / mag(aliasHz)),
    attenuationAtNyquistDb: ratioToDb(mid / mag(fs / 2)),
    points: total,
    stages: [
      { id: 'input', points: stages.input },
      { id: 'instrumentation', points: stages.instrumentation },
      { id: 'high-pass', points: stages['high-pass'] },
      { id: 'gain-stage', points: stages['gain-stage'] },
    ],
  };
}

const REFERENCE_CONTRIBUTORS: readonly { name: string; stageId: StageId }[] = [
  { name: 'electrode thermal noise', stageId: 'electrodes' },
  { name: 'imbalance network thermal noise', stageId: 'electrodes' },
  { name: 'protection resistors thermal noise', stageId: 'protection' },
  { name: 'input op-amp voltage noise', stageId: 'instrumentation' },
  { name: 'input op-amp current noise × source impedance', stageId: 'instrumentation' },
  { name: 'gain-setting resistors R, Rg', stageId: 'instrumentation' },
  { name: 'difference stage', stageId: 'instrumentation' },
  { name: 'gain-stage op-amp', stageId: 'gain-stage' },
  { name: 'filter network', stageId: 'gain-stage' },
  { name: 'ADC input noise', stageId: 'adc' },
  { name: 'ADC quantization', stageId: 'adc' },
];

const en2 = (en: number, fc: number, f: number) => en * en * (1 + fc / f);

function referenceNoiseBudget(r: Resolved, pointCount: number): NoiseReport {
  const p = r.plan;
  const kT4 = 4 * BOLTZMANN_J_PER_K * p.temperatureK;
  const fs = p.adc.sampleRateHz;
  const windowS = r.profile.checks.noisePpV?.windowS ?? 10;
  const bandLowHz = Math.min(1 / windowS, fs / 20);
  const bandHighHz = fs / 2;
  const grid = logGrid(bandLowHz, bandHighHz, pointCount);
  const n = grid.length;
  const midMag = totalMagnitudeAt(r, midbandFrequencyHz(r));
  const mid2 = midMag * midMag;
  const op1 = p.instrumentation.opAmp;
  const op2 = p.gainStage.opAmp;
  const lp = p.gainStage.lowPass;
  const e = p.electrodes;
  const r34 = (r.r3Ohm * r.r4Ohm) / (r.r3Ohm + r.r4Ohm);
  const rgTerm = Number.isFinite(r.rgOhm) ? kT4 * r.rgOhm * ((r.g1 - 1) / r.g1) ** 2 : 0;
  const lsbV = p.adc.fullScaleV / 2 ** p.adc.bits;
  const adcDensity2 = (p.adc.inputNoiseVrms * p.adc.inputNoiseVrms) / (fs / 2);
  const quantDensity2 = (lsbV * lsbV) / 12 / (fs / 2);
  // One closure per contributor: its RTI power density at grid point i, V²/Hz.
  const at = (i: number): number[] => {
    const f = grid[i];
    const s = stageResponsesAt(r, f);
    const hpGs = magnitudeSquared(s.highPass) * magnitudeSquared(s.gainStage);
    const full = magnitudeSquared(s.total) / mid2;
    const afterInput = (magnitudeSquared(s.instrumentation) * hpGs) / mid2;
    const afterDiff = (magnitudeSquared(closedLoopStageAt(1, 1 + r.gd, op1.gbwHz, f)) * hpGs) / mid2;
    const lp2 = lowPassMagnitudeSquared(lp.kind, lp.order, lp.fcHz, f);
    const gainStageOnly = (magnitudeSquared(closedLoopStageAt(r.g2, r.g2, op2.gbwHz, f)) * lp2) / mid2;
    const ze = electrodeImpedanceOhm(e.rsOhm, e.rpOhm, e.cpF, f);
    const z1 = leadImpedanceOhm(r, f, { mismatch: r.electrodeMismatch, withImbalance: true });
    const z2 = leadImpedanceOhm(r, f);
    const en1 = en2(op1.enVPerRtHz, op1.enCornerHz, f);
    const in1 = en2(op1.inAPerRtHz, op1.inCornerHz, f);
    return [
      kT4 * (ze.re * (2 + r.electrodeMismatch)) * full,
      kT4 * parallelRcOhm(e.imbalanceROhm, e.imbalanceCF, f).re * full,
      kT4 * 2 * p.protection.seriesROhm * full,
      2 * en1 * afterInput,
      in1 * (magnitudeSquared(z1) + magnitudeSquared(z2)) * full,
      ((kT4 * 2 * r.rOhm) / (r.g1 * r.g1) + rgTerm) * afterInput,
      (1 + r.gd) ** 2 * (en1 + 2 * kT4 * r34 + 2 * in1 * r34 * r34) * afterDiff,
      en2(op2.enVPerRtHz, op2.enCornerHz, f) * gainStageOnly,
      p.gainStage.filterNoiseVPerRtHz ** 2 * (lp2 / mid2),
      adcDensity2 / mid2,
      quantDensity2 / mid2,
    ];
  };
  const density = REFERENCE_CONTRIBUTORS.map(() => new Array<number>(n));
  for (let i = 0; i < n; i++) at(i).forEach((d, k) => (density[k][i] = d));
  const dl = Math.log(grid[1] / grid[0]);
  const power = density.map((d) => {
    let sum = 0;
    for (let i = 1; i < n; i++) sum += ((d[i - 1] * grid[i - 1] + d[i] * grid[i]) / 2) * dl;
    return sum;
  });
  const totalPower = power.reduce((a, b) => a + b, 0);
  const contributions: NoiseContribution[] = REFERENCE_CONTRIBUTORS.map((c, k) => ({
    name: c.name,
    rmsV: Math.sqrt(power[k]),
    share: totalPower > 0 ? power[k] / totalPower : 0,
    stageId: c.stageId,
  }));
  const densityPoints: NoiseReport['densityPoints'] = [];
  for (let i = 0; i < n; i += 2) {
    const byContributor: Record<string, number> = {};
    let tot = 0;
    REFERENCE_CONTRIBUTORS.forEach((c, k) => {
      byContributor[c.name] = Math.sqrt(density[k][i]);
      tot += density[k][i];
    });
    densityPoints.push({ fHz: grid[i], totalVPerRtHz: Math.sqrt(tot), byContributor });
  }
  const rtiRmsV = Math.sqrt(totalPower);
  return { rtiRmsV, rtiPpV: rtiRmsV * NOISE_PP_PER_RMS, floorRmsV: contributions[0].rmsV, bandLowHz, bandHighHz, contributions, densityPoints };
}

// ---------------------------------------------------------------------------------------------
// Comparison: same structure (keys in order, lengths), numbers within REL_TOL relative.
// ---------------------------------------------------------------------------------------------

type Mismatch = { path: string; actual: unknown; expected: unknown };

/** Walks both values together and collects every difference; numbers must agree within REL_TOL of the larger magnitude (0 only with 0). */
function differences(actual: unknown, expected: unknown, path = '', out: Mismatch[] = []): Mismatch[] {
  if (typeof expected === 'number') {
    const ok =
      typeof actual === 'number' &&
      (actual === expected || Math.abs(actual - expected) <= REL_TOL * Math.max(Math.abs(actual), Math.abs(expected)));
    if (!ok) out.push({ path, actual, expected });
  } else if (Array.isArray(expected)) {
    if (!Array.isArray(actual) || actual.length !== expected.length) out.push({ path: `${path}.length`, actual: Array.isArray(actual) ? actual.length : actual, expected: expected.length });
    else expected.forEach((v, i) => differences(actual[i], v, `${path}[${i}]`, out));
  } else if (expected !== null && typeof expected === 'object') {
    const expectedKeys = Object.keys(expected);
    const actualKeys = actual !== null && typeof actual === 'object' ? Object.keys(actual) : [];
    if (actualKeys.join('|') !== expectedKeys.join('|')) out.push({ path: `${path} keys`, actual: actualKeys, expected: expectedKeys });
    else for (const k of expectedKeys) differences((actual as Record<string, unknown>)[k], (expected as Record<string, unknown>)[k], `${path}.${k}`, out);
  } else if (actual !== expected) {
    out.push({ path, actual, expected });
  }
  return out;
}

function expectSame(actual: unknown, expected: unknown): void {
  const found = differences(actual, expected);
  expect(found.slice(0, 5), `${found.length} differences`).toEqual([]);
}

// ---------------------------------------------------------------------------------------------
// Plans: the demo plans and variants that take the other branches (DC-coupled, Rp = 0, an
// imbalance network, other filter families and orders).
// ---------------------------------------------------------------------------------------------

const demoDir = new URL('../../lib/engine/demo-plans/', import.meta.url);
const demoPlans: Record<string, unknown> = Object.fromEntries(
  readdirSync(demoDir)
    .filter((f) => f.endsWith('.json'))
    .sort()
    .map((f) => [f, JSON.parse(readFileSync(new URL(f, demoDir), 'utf8')) as unknown]),
);

type PlanInput = Record<string, any>;

function variant(base: unknown, edit: (p: PlanInput) => void): unknown {
  const p = structuredClone(base) as PlanInput;
  edit(p);
  return p;
}

const demo = (file: string): unknown => {
  expect(demoPlans, `demo plan ${file}`).toHaveProperty([file]);
  return demoPlans[file];
};

const variants: Record<string, unknown> = {
  'emg sleeve, DC-coupled': variant(demo('emg-sleeve.json'), (p) => { p.highPass.order = 0; }),
  'wearable patch, DC-coupled, 51 kΩ ∥ 47 nF imbalance': variant(demo('wearable-ecg-patch.json'), (p) => {
    p.highPass.order = 0;
    p.electrodes.imbalanceROhm = 51e3;
    p.electrodes.imbalanceCF = 47e-9;
  }),
  'cart, Butterworth order 8 low-pass, second-order high-pass': variant(demo('diagnostic-cart-12-lead.json'), (p) => {
    p.gainStage.lowPass = { ...p.gainStage.lowPass, kind: 'butterworth', order: 8 };
    p.highPass.order = 2;
  }),
  'high-gain patch, Bessel order 1 low-pass, no protection filter': variant(demo('wearable-ecg-patch-high-gain.json'), (p) => {
    p.gainStage.lowPass = { ...p.gainStage.lowPass, kind: 'bessel', order: 1 };
    p.protection.filter.enabled = false;
  }),
};

/** A case: plan input, and an edit applied after validation (for values the schema refuses but the formulas handle). */
type Case = { input: unknown; afterValidation?: (p: PlanInput) => void };

const resolve = ({ input, afterValidation }: Case): Resolved => {
  const plan = parsePlan(input);
  afterValidation?.(plan as PlanInput);
  return resolvePlan(plan, profileFor(plan.profileId, plan.customProfile));
};

const cases: [string, Case][] = [
  ...Object.entries({ ...demoPlans, ...variants }).map(([name, input]): [string, Case] => [name, { input }]),
  // Rp = 0 (a purely resistive electrode): the branch parallelRcOhm takes for R = 0.
  ['emg sleeve, Rp = 0', { input: demo('emg-sleeve.json'), afterValidation: (p) => { p.electrodes.rpOhm = 0; } }],
];

describe('frequency response: sweep vs the per-point computation', () => {
  it('covers every demo plan', () => {
    expect(Object.keys(demoPlans).length).toBeGreaterThanOrEqual(4);
  });

  it.each(cases)('%s: the same report at 200 and 631 points', (_, input) => {
    const r = resolve(input);
    for (const n of [200, 631]) {
      const actual = frequencyResponse(r, n);
      expect(actual.points).toHaveLength(n);
      expect(actual.stages.map((s) => s.id)).toEqual(['input', 'instrumentation', 'high-pass', 'gain-stage']);
      expectSame(actual, referenceFrequencyResponse(r, n));
    }
  });

  it.each(cases)('%s: stageResponsesInto gives the stage values of stageResponsesAt', (_, input) => {
    const r = resolve(input);
    const c = chainConstants(r);
    const buffer = new Float64Array(STAGE_BUFFER_LENGTH);
    const got: Record<string, Complex>[] = [];
    const want: Record<string, Complex>[] = [];
    for (const f of logGrid(1e-4, 1e6, 500)) {
      stageResponsesInto(c, f, buffer);
      got.push(Object.fromEntries(Object.entries(STAGE_OFFSET).map(([name, at]) => [name, { re: buffer[at], im: buffer[at + 1] }])));
      want.push(stageResponsesAt(r, f));
    }
    expectSame(got, want.map((s) => ({ input: s.input, instrumentation: s.instrumentation, highPass: s.highPass, gainStage: s.gainStage, total: s.total })));
  });
});

describe('squared magnitudes: sweep vs the per-point computation', () => {
  it.each(cases)('%s: stageGainsSquaredInto gives |H|² of stageResponsesAt and of the gain stage parts', (_, input) => {
    const r = resolve(input);
    const c = chainConstants(r);
    const buffer = new Float64Array(GAIN_SQUARED_BUFFER_LENGTH);
    const p = r.plan;
    const lp = p.gainStage.lowPass;
    const got: Record<string, number>[] = [];
    const want: Record<string, number>[] = [];
    for (const f of logGrid(1e-4, 1e6, 500)) {
      stageGainsSquaredInto(c, f, buffer);
      got.push(Object.fromEntries(Object.entries(GAIN_SQUARED_OFFSET).map(([name, at]) => [name, buffer[at]])));
      const s = stageResponsesAt(r, f);
      want.push({
        input: magnitudeSquared(s.input),
        instrumentation: magnitudeSquared(s.instrumentation),
        highPass: magnitudeSquared(s.highPass),
        gainStage: magnitudeSquared(s.gainStage),
        total: magnitudeSquared(s.total),
        differenceStageShape: magnitudeSquared(closedLoopStageAt(1, 1 + r.gd, p.instrumentation.opAmp.gbwHz, f)),
        gainStageAmplifier: magnitudeSquared(closedLoopStageAt(r.g2, r.g2, p.gainStage.opAmp.gbwHz, f)),
        lowPass: lowPassMagnitudeSquared(lp.kind, lp.order, lp.fcHz, f),
      });
    }
    expectSame(got, want);
  });
});

describe('noise budget: sweep vs the per-point computation', () => {
  it.each(cases)('%s: the same report at 240 and 631 points', (_, input) => {
    const r = resolve(input);
    for (const n of [240, 631]) {
      const actual = noiseBudget(r, n);
      expect(actual.densityPoints).toHaveLength(Math.ceil(n / 2));
      expect(Object.keys(actual.densityPoints[0].byContributor)).toEqual(REFERENCE_CONTRIBUTORS.map((c) => c.name));
      expectSame(actual, referenceNoiseBudget(r, n));
    }
  });
});

describe('allocation-free helpers', () => {
  it('filterResponseInto gives lowPassAt and highPassAt', () => {
    const out = new Float64Array(4);
    const kinds: LowPassKind[] = ['butterworth', 'bessel'];
    for (const f of [0, 1e-3, 0.05, 1, 37, 150, 151, 1e4, 1e7]) {
      for (const kind of kinds) {
        for (let order = 1; order <= 8; order++) {
          filterResponseInto(lowPassSweep(kind, order, 150), f, out, 2);
          expectSame({ re: out[2], im: out[3] }, lowPassAt(kind, order, 150, f));
        }
      }
      for (let order = 1; order <= 4; order++) {
        filterResponseInto(highPassSweep(order, 0.05), f, out, 0);
        expectSame({ re: out[0], im: out[1] }, highPassAt(order, 0.05, f));
      }
    }
  });

  it('the prepared filters reject what lowPassAt and highPassAt reject', () => {
    expect(() => lowPassSweep('bessel', 9, 1)).toThrow('low-pass order must be a whole number from 1 to 8 (got 9)');
    expect(() => highPassSweep(5, 1)).toThrow('high-pass order must be a whole number from 1 to 4 (got 5)');
    expect(() => lowPassSweep('butterworth', 2, -1)).toThrow('corner frequency must be a positive finite number of hertz (got -1)');
  });

  it('argumentDeg is the atan2 argument in every quadrant and on the axes', () => {
    const values = [-3, -1, -1e-300, -0, 0, 1e-300, 1e-12, 0.5, 1, 7, 1e12];
    for (const re of values) {
      for (const im of values) {
        const expected = (Math.atan2(im, re) * 180) / Math.PI;
        const actual = argumentDeg(re, im);
        expect(Object.is(actual, expected) || Math.abs(actual - expected) <= REL_TOL * Math.abs(expected), `argumentDeg(${re}, ${im}) = ${actual}, atan2 gives ${expected}`).toBe(true);
      }
    }
  });

  it('powerRatioToDb is 10·log10', () => {
    for (const x of [1e-300, 1e-20, 0.5, 1 - 2 ** -52, 1, 1 + 2 ** -52, 2, 100, 1e20]) {
      const expected = 10 * Math.log10(x);
      const actual = powerRatioToDb(x);
      expect(actual === expected || Math.abs(actual - expected) <= REL_TOL * Math.abs(expected), `powerRatioToDb(${x}) = ${actual}, 10·log10 gives ${expected}`).toBe(true);
    }
  });
});
