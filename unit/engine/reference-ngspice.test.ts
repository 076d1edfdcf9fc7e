/**
 * The engine against ngspice (Debian package ngspice, version 39 here; the version line is
 * printed and checked below), run in batch mode on the netlist `planToNetlist` writes for the
 * same plan: the demo plans, a fixture and seeded random valid plans.
 *
 *  - AC: mid-band gain and the response at the engine's −3 dB corners within 0.1 dB
 *    (netlist without the imbalance network and electrode mismatch, as the engine's response);
 *  - CMRR with deliberately mismatched resistors within 1 dB: `differenceAmpCmrrDb` (× G1) vs
 *    ngspice's differential/common-mode gain with ideal-CMRR op-amps, and the stage CMRR
 *    (`stageCmrrDb` for that resistor set) vs ngspice's worst case over the op-amps' CMRR signs;
 *  - .noise: the integrated noise referred to input within 5 % over the engine's band.
 * Everything runs in one ngspice process.
 */
import { beforeAll, describe, expect, it } from 'vitest';
import { differenceAmpCmrrDb, stageCmrrDb } from '@/lib/engine/cmrr';
import { evaluate } from '@/lib/engine/evaluate';
import { pulseTest } from '@/lib/engine/impulse';
import { resolvePlan } from '@/lib/engine/model';
import type { ChannelPlan } from '@/lib/engine/plan';
import { profileFor } from '@/lib/engine/profiles';
import type { ChannelReport } from '@/lib/engine/report';
import { planToNetlist, resolveInstrumentation, type InstrumentationResistors, type NetlistOptions } from '@/lib/engine/spice-netlist';
import { integrateDensityVrms, magnitude, magnitudeDbAt, ngspiceVersion, runNgspiceJobs, runNgspiceNetlist, type AcSweep, type NgspiceJobResult } from '@/scripts/ngspice';
import { demoPlans, mismatchedResistors, RANDOM_PLAN_COUNT, referencePlans } from '@/unit/helpers/ngspice-cases';
import { fixturePlan } from '@/unit/helpers/ngspice-plans';

const HALF_POWER_DB = -10 * Math.log10(2);
const signCombos = [
  { a1: 1, a2: -1, a3: 1 },
  { a1: 1, a2: -1, a3: -1 },
  { a1: -1, a2: 1, a3: 1 },
  { a1: -1, a2: 1, a3: -1 },
] as const;

interface Case {
  name: string;
  plan: ChannelPlan;
  report: ChannelReport;
  resistors: InstrumentationResistors;
  ac?: AcSweep;
  noise?: NgspiceJobResult;
  diffAc?: AcSweep;
  cmAc?: AcSweep;
  diffAcWithOpAmps?: AcSweep;
  cmAcSigns: AcSweep[];
  /** Common mode on the body at mains: with and without the differential filter capacitor. */
  bodyCm?: AcSweep;
  bodyCmNoCdiff?: AcSweep;
}

const cases: Case[] = referencePlans().map(({ name, plan }, index) => ({
  name,
  plan,
  report: evaluate(plan),
  resistors: mismatchedResistors(plan, 1000 + index),
  cmAcSigns: [],
}));
let version = '';

/** Transient impulse tests: the fixture with each high-pass, sources straight onto the amplifier (the engine's assumption) and through the electrodes. */
const impulseCases = ([1, 2] as const).flatMap((order) =>
  [0.05, 0.5].flatMap((fcHz) =>
    [true, false].map((bypassInput) => ({ order, fcHz, bypassInput, plan: { ...fixturePlan, highPass: { order, fcHz } } as ChannelPlan, tran: undefined as NgspiceJobResult['tran'] })),
  ),
);

const dbAtFirst = (sweep: AcSweep, node: 'ina') => 20 * Math.log10(magnitude(sweep.re[node][0], sweep.im[node][0]));

beforeAll(() => {
  version = ngspiceVersion();
  console.info(`ngspice reference: ${version}; ${demoPlans().length} demo plans, 1 fixture, ${RANDOM_PLAN_COUNT} random plans`);
  const jobs: { plan: ChannelPlan; options: NetlistOptions }[] = [];
  const slots: ((r: NgspiceJobResult) => void)[] = [];
  const add = (plan: ChannelPlan, options: NetlistOptions, store: (r: NgspiceJobResult) => void) => {
    jobs.push({ plan, options });
    slots.push(store);
  };
  const lowCmrrSweep = { startHz: 1e-3, stopHz: 1e-2, pointsPerDecade: 2 };
  for (const c of cases) {
    const stopHz = Math.max(c.plan.adc.sampleRateHz, 3 * c.report.response.highCornerHz);
    add(c.plan, { analysis: 'ac', imbalance: false, electrodeMismatch: false, stopHz }, (r) => (c.ac = r.ac));
    add(c.plan, { analysis: 'noise' }, (r) => (c.noise = r));
    add(c.plan, { analysis: 'ac', resistors: c.resistors, opAmpCmrr: false, ...lowCmrrSweep }, (r) => (c.diffAc = r.ac));
    add(c.plan, { analysis: 'cmrr', commonModeAt: 'amplifier', resistors: c.resistors, opAmpCmrr: false, ...lowCmrrSweep }, (r) => (c.cmAc = r.cmrr));
    add(c.plan, { analysis: 'ac', resistors: c.resistors, ...lowCmrrSweep }, (r) => (c.diffAcWithOpAmps = r.ac));
    const mainsSweep = { startHz: c.plan.mainsHz / 10, stopHz: c.plan.mainsHz * 10, pointsPerDecade: 10 };
    add(c.plan, { analysis: 'cmrr', opAmpCmrr: false, ...mainsSweep }, (r) => (c.bodyCm = r.cmrr));
    add(c.plan, { analysis: 'cmrr', opAmpCmrr: false, cDiff: false, ...mainsSweep }, (r) => (c.bodyCmNoCdiff = r.cmrr));
    for (const signs of signCombos) {
      add(c.plan, { analysis: 'cmrr', commonModeAt: 'amplifier', resistors: c.resistors, opAmpCmrrSigns: signs, ...lowCmrrSweep }, (r) => c.cmAcSigns.push(r.cmrr!));
    }
  }
  for (const ic of impulseCases) {
    // 3 mV × 100 ms from 0.1 s, then 0.4 s (the largest displacement and slope follow the pulse at once for these corners), 0.2 ms steps
    add(ic.plan, { analysis: 'tran', bypassInput: ic.bypassInput, tran: { stepS: 2e-4, stopS: 0.6, amplitudeV: 3e-3, startS: 0.1, widthS: 0.1 } }, (r) => (ic.tran = r.tran));
  }
  const t0 = Date.now();
  const results = runNgspiceJobs(jobs);
  console.info(`ngspice: ${jobs.length} analyses in ${Date.now() - t0} ms`);
  results.forEach((r, i) => slots[i](r));
});

describe('the reference tool', () => {
  it('is ngspice in batch mode', () => {
    expect(version).toMatch(/ngspice-\d+/);
  });
  it('runs the demo plans and at least 20 random plans', () => {
    expect(cases.length).toBeGreaterThanOrEqual(RANDOM_PLAN_COUNT + 1);
    expect(RANDOM_PLAN_COUNT).toBeGreaterThanOrEqual(20);
  });
});

describe('AC response vs ngspice .ac', () => {
  it.each(cases.map((c) => [c.name, c] as const))('%s: mid-band gain within 0.1 dB', (_, c) => {
    const r = c.report.response;
    const spiceDb = magnitudeDbAt(c.ac!, 'adc', r.midbandHz);
    expect(Math.abs(r.midbandGainDb - spiceDb), `at ${r.midbandHz} Hz: engine ${r.midbandGainDb} dB, ngspice ${spiceDb} dB`).toBeLessThan(0.1);
  });

  it.each(cases.map((c) => [c.name, c] as const))('%s: ngspice is −3.01 dB (± 0.1 dB) at the engine\'s corners', (_, c) => {
    const r = c.report.response;
    const midDb = magnitudeDbAt(c.ac!, 'adc', r.midbandHz);
    const highDb = magnitudeDbAt(c.ac!, 'adc', r.highCornerHz) - midDb;
    expect(Math.abs(highDb - HALF_POWER_DB), `high corner ${r.highCornerHz} Hz: ngspice ${highDb} dB relative to mid-band`).toBeLessThan(0.1);
    if (r.lowCornerHz > 0) {
      const lowDb = magnitudeDbAt(c.ac!, 'adc', r.lowCornerHz) - midDb;
      expect(Math.abs(lowDb - HALF_POWER_DB), `low corner ${r.lowCornerHz} Hz: ngspice ${lowDb} dB relative to mid-band`).toBeLessThan(0.1);
    } else {
      // DC-coupled: the engine finds no low corner; ngspice must stay above −3 dB down to the sweep start.
      const lowestDb = magnitudeDbAt(c.ac!, 'adc', c.ac!.frequencyHz[0]) - midDb;
      expect(lowestDb, `DC-coupled: ngspice ${lowestDb} dB at ${c.ac!.frequencyHz[0]} Hz`).toBeGreaterThan(HALF_POWER_DB - 0.1);
    }
  });

  it.each(cases.map((c) => [c.name, c] as const))('%s: the whole pass band and skirts agree within 0.1 dB (points within 20 dB of mid-band)', (_, c) => {
    const r = c.report.response;
    const stopHz = c.ac!.frequencyHz[c.ac!.frequencyHz.length - 1];
    const points = r.points.filter((p) => p.magDb > r.midbandGainDb - 20 && p.fHz >= 1e-3 && p.fHz <= stopHz);
    expect(points.length).toBeGreaterThan(20);
    for (const p of points) {
      const spiceDb = magnitudeDbAt(c.ac!, 'adc', p.fHz);
      expect(Math.abs(p.magDb - spiceDb), `at ${p.fHz} Hz: engine ${p.magDb} dB, ngspice ${spiceDb} dB`).toBeLessThan(0.1);
    }
  });
});

describe('CMRR with deliberately mismatched resistors vs ngspice (common-mode and differential gain at 1 mHz)', () => {
  it.each(cases.map((c) => [c.name, c] as const))('%s: G1 × differenceAmpCmrrDb within 1 dB (ideal-CMRR op-amps)', (_, c) => {
    const s = c.resistors;
    const g1 = 1 + (s.r1Ohm + s.r2Ohm) / s.rgOhm;
    const engineDb = 20 * Math.log10(g1) + differenceAmpCmrrDb({ r1Ohm: s.r3InvOhm, r2Ohm: s.r4InvOhm, r3Ohm: s.r3RefOhm, r4Ohm: s.r4RefOhm });
    const spiceDb = dbAtFirst(c.diffAc!, 'ina') - dbAtFirst(c.cmAc!, 'ina');
    expect(Math.abs(engineDb - spiceDb), `resistors ${JSON.stringify(s)}: engine ${engineDb} dB, ngspice ${spiceDb} dB`).toBeLessThan(1);
  });

  it.each(cases.map((c) => [c.name, c] as const))('%s: the stage CMRR at DC (resistors + op-amp CMRR, worst-case signs) within 1 dB', (_, c) => {
    const s = c.resistors;
    const diffDb = differenceAmpCmrrDb({ r1Ohm: s.r3InvOhm, r2Ohm: s.r4InvOhm, r3Ohm: s.r3RefOhm, r4Ohm: s.r4RefOhm });
    const resolved = resolvePlan(c.plan, profileFor(c.plan.profileId, c.plan.customProfile));
    const engineDb = stageCmrrDb(resolved, 0, { diffCmrr: 10 ** (diffDb / 20) });
    const worstCmDb = Math.max(...c.cmAcSigns.map((sweep) => dbAtFirst(sweep, 'ina')));
    const spiceDb = dbAtFirst(c.diffAcWithOpAmps!, 'ina') - worstCmDb;
    expect(c.cmAcSigns.length).toBe(signCombos.length);
    expect(Math.abs(engineDb - spiceDb), `op-amp CMRR ${c.plan.instrumentation.opAmp.cmrrDb} dB, G1 ${c.report.gains.g1}: engine ${engineDb} dB, ngspice ${spiceDb} dB`).toBeLessThan(1);
  });

  it('Sedra & Smith check on the same path: gain-100 difference amplifier with 1 % resistors worst case → about 68 dB', () => {
    // worst case: R3ref −1 %, R4ref +1 %, R3inv +1 %, R4inv −1 %: CMRR = 20·log10((1 + Gd)/(4t)) ≈ 68.1 dB
    const t = 0.01;
    const db = differenceAmpCmrrDb({ r1Ohm: 1e3 * (1 + t), r2Ohm: 100e3 * (1 - t), r3Ohm: 1e3 * (1 - t), r4Ohm: 100e3 * (1 + t) });
    expect(Math.abs(db - 20 * Math.log10(101 / 0.04))).toBeLessThan(0.1);
  });
});

describe('mains: conversion of body common mode by lead imbalance vs ngspice (1 V on the body, ideal-CMRR amplifier)', () => {
  /** |V(in+) − V(in−)| per volt of common mode at the mains frequency (on the sweep grid). */
  const conversionAt = (sweep: AcSweep, fHz: number) => {
    const i = sweep.frequencyHz.findIndex((f) => Math.abs(f / fHz - 1) < 1e-6);
    expect(i, `mains ${fHz} Hz on the sweep grid`).toBeGreaterThanOrEqual(0);
    return magnitude(sweep.re.in[i], sweep.im.in[i]);
  };
  const engineConversion = (c: Case) => c.report.interference.terms[0].rtiPpV / (c.report.interference.bodyCmV * 2 * Math.SQRT2);

  it.each(cases.map((c) => [c.name, c] as const))('%s: the engine\'s imbalance term within 0.1 dB of ngspice without Cdiff (the engine\'s model)', (_, c) => {
    const spice = conversionAt(c.bodyCmNoCdiff!, c.plan.mainsHz);
    const engine = engineConversion(c);
    if (engine === 0) {
      expect(spice, 'no imbalance, no mismatch: ngspice must show no conversion either').toBeLessThan(1e-12);
      return;
    }
    expect(Math.abs(20 * Math.log10(engine / spice)), `engine ${engine}, ngspice ${spice} (per volt of common mode)`).toBeLessThan(0.1);
  });

  it.each(cases.map((c) => [c.name, c] as const))('%s: with Cdiff in the circuit the engine never underestimates the conversion', (_, c) => {
    const spice = conversionAt(c.bodyCm!, c.plan.mainsHz);
    const engine = engineConversion(c);
    expect(engine, `engine ${engine}, ngspice with Cdiff ${spice}`).toBeGreaterThanOrEqual(spice * (1 - 1e-3));
  });
});

describe('noise referred to input vs ngspice .noise', () => {
  it.each(cases.map((c) => [c.name, c] as const))('%s: integrated RTI noise within 5 %', (_, c) => {
    const n = c.report.noise;
    const sweep = c.noise!;
    const midV = 10 ** (magnitudeDbAt(sweep.ac!, 'adc', c.report.response.midbandHz) / 20);
    const outputRmsV = integrateDensityVrms(sweep.noise!.frequencyHz, sweep.noise!.outputVPerRtHz, n.bandLowHz, n.bandHighHz);
    const spiceRtiV = outputRmsV / midV;
    const top = [...n.contributions].sort((a, b) => b.share - a.share).slice(0, 3).map((x) => `${x.name} ${(x.share * 100).toFixed(0)} %`);
    expect(Math.abs(n.rtiRmsV / spiceRtiV - 1), `band ${n.bandLowHz}–${n.bandHighHz} Hz: engine ${n.rtiRmsV} V rms, ngspice ${spiceRtiV} V rms (largest: ${top.join(', ')})`).toBeLessThan(0.05);
  });

  it('ngspice\'s own integral agrees with the log-log integration used above (fixture, full sweep)', () => {
    const c = cases.find((x) => x.name === 'fixture')!;
    const s = c.noise!.noise!;
    const mine = integrateDensityVrms(s.frequencyHz, s.outputVPerRtHz, s.frequencyHz[0], s.frequencyHz[s.frequencyHz.length - 1]);
    expect(Math.abs(mine / s.outputTotalVrms - 1)).toBeLessThan(0.002);
  });
});

describe('low-frequency impulse test vs ngspice .tran (3 mV × 100 ms)', () => {
  /** Largest |displacement| and |slope| at the high-pass output after the pulse, referred to input (÷ G1·Gd). */
  const measure = (tran: NonNullable<NgspiceJobResult['tran']>, plan: ChannelPlan, endS: number) => {
    const g = resolveInstrumentation(plan);
    const k = 1 / (g.g1 * g.gd);
    let displacementV = 0;
    let slopeVPerS = 0;
    for (let i = 1; i < tran.timeS.length; i += 1) {
      if (tran.timeS[i - 1] <= endS + 1e-6) continue;
      displacementV = Math.max(displacementV, Math.abs(tran.hp[i] - plan.supply.referenceV) * k);
      slopeVPerS = Math.max(slopeVPerS, (Math.abs(tran.hp[i] - tran.hp[i - 1]) * k) / (tran.timeS[i] - tran.timeS[i - 1]));
    }
    return { displacementV, slopeVPerS };
  };

  it.each(impulseCases.filter((c) => c.bypassInput))('order $order at $fcHz Hz (source on the amplifier inputs): pulseTest displacement and slope within 1 %', (ic) => {
    const spice = measure(ic.tran!, ic.plan, 0.2);
    const engine = pulseTest(ic.order, ic.fcHz, 3e-3, 0.1);
    expect(Math.abs(engine.displacementV / spice.displacementV - 1), `displacement: engine ${engine.displacementV} V, ngspice ${spice.displacementV} V`).toBeLessThan(0.01);
    expect(Math.abs(engine.slopeVPerS / spice.slopeVPerS - 1), `slope: engine ${engine.slopeVPerS} V/s, ngspice ${spice.slopeVPerS} V/s`).toBeLessThan(0.01);
  });

  it('through the fixture\'s electrodes (500 kΩ ∥ 20 nF) the displacement stays within 5 % of the high-pass-only figure (printed)', () => {
    for (const ic of impulseCases.filter((c) => !c.bypassInput)) {
      const spice = measure(ic.tran!, ic.plan, 0.2);
      const engine = pulseTest(ic.order, ic.fcHz, 3e-3, 0.1);
      console.info(`impulse test through the electrodes, order ${ic.order} at ${ic.fcHz} Hz: ngspice ${(spice.displacementV * 1e6).toFixed(1)} µV, ${(spice.slopeVPerS * 1e6).toFixed(1)} µV/s; engine (high-pass alone) ${(engine.displacementV * 1e6).toFixed(1)} µV, ${(engine.slopeVPerS * 1e6).toFixed(1)} µV/s`);
      expect(Math.abs(engine.displacementV / spice.displacementV - 1)).toBeLessThan(0.05);
    }
  });
});

describe('the netlist as exported (dot-analyses, no control block)', () => {
  const exportCases = [...demoPlans(), { name: 'fixture', plan: fixturePlan }].flatMap(({ name, plan }) =>
    (['ac', 'noise', 'cmrr', 'tran'] as const).map((analysis) => ({ name, plan, analysis })),
  );
  it.each(exportCases)('$name, $analysis: plain ASCII, runs in ngspice batch mode without errors or warnings and prints its results', ({ plan, analysis }) => {
    const netlist = planToNetlist(plan, { analysis, ...(analysis === 'tran' ? { tran: { stepS: 1e-3, stopS: 0.5 } } : { pointsPerDecade: 5 }) });
    expect(/^[\x09\x0a\x0d\x20-\x7e]*$/.test(netlist)).toBe(true);
    expect(netlist).toMatch(/^\.options TEMP=/m);
    expect(netlist.trimEnd().endsWith('.end')).toBe(true);
    const log = runNgspiceNetlist(netlist);
    expect(log, log).not.toMatch(/error|warning/i);
    expect(log).toMatch(analysis === 'noise' ? /onoise_total/ : analysis === 'tran' ? /Transient Analysis/i : /AC Analysis/i);
  });
});
