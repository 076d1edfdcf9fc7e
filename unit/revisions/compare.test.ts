import { describe, expect, it } from 'vitest';
import { compareRevisions, diffChecks, diffPlanInputs, flattenLeaves } from '@/features/revisions/compare';
import { formatValue, unitForCheckUnit, unitForFieldName } from '@/features/revisions/quantity-text';
import { revisionLabel } from '@/features/revisions/revision-label';
import { canTransition } from '@/features/revisions/revision-states';
import { evaluate } from '@/lib/engine/evaluate';
import diagnosticCart from '@/lib/engine/demo-plans/diagnostic-cart-12-lead.json';
import type { Check } from '@/lib/engine/report';

describe('revisionLabel', () => {
  // Bijective base-26 numbering, as spreadsheet columns: A..Z, AA..ZZ, AAA.. (worked by hand).
  it.each([
    [1, 'A'],
    [2, 'B'],
    [26, 'Z'],
    [27, 'AA'],
    [28, 'AB'],
    [52, 'AZ'],
    [53, 'BA'],
    [702, 'ZZ'],
    [703, 'AAA'],
    [18278, 'ZZZ'],
  ])('%i → %s', (sequence, label) => {
    expect(revisionLabel(sequence)).toBe(label);
  });

  it.each([0, -1, 1.5, 18279, Number.NaN])('refuses %s', (sequence) => {
    expect(() => revisionLabel(sequence)).toThrow(/revision sequence must be a whole number from 1 to 18278/);
  });
});

describe('revision state transitions', () => {
  it('allow only draft → in-review → released | changes-requested and released → superseded', () => {
    const states = ['draft', 'in-review', 'released', 'changes-requested', 'superseded'] as const;
    const allowed = states.flatMap((from) => states.filter((to) => canTransition(from, to)).map((to) => `${from}>${to}`));
    expect(allowed.sort()).toEqual(
      ['draft>in-review', 'in-review>changes-requested', 'in-review>released', 'released>superseded'].sort(),
    );
  });
});

describe('units of check values', () => {
  it.each([
    ['Ω', 36_840_000, '36.84 MΩ'],
    ['V/s', 2.365e-5, '23.65 µV/s'],
    ['Hz', 0.04494, '44.94 mHz'],
    ['fraction of range', 0.1168, '11.68 %'],
    ['V/V', 10, '10 V/V'],
  ])('a check in %s of %s shows as %s', (unit, value, text) => {
    expect(formatValue(value, unitForCheckUnit(unit))).toBe(text);
  });
});

describe('units read from field names', () => {
  it.each([
    ['rgOhm', 19_900, '19.9 kΩ'],
    ['fcHz', 0.05, '50 mHz'],
    ['cpF', 47e-9, '47 nF'],
    ['offsetV', 0.3, '300 mV'],
    ['enVPerRtHz', 8e-9, '8 nV/√Hz'],
    ['inAPerRtHz', 1e-15, '1 fA/√Hz'],
    ['biasA', 2e-9, '2 nA'],
    ['mainsVrms', 230, '230 V rms'],
    ['cmrrDb', 110, '110 dB'],
    ['resistorTolerance', 0.001, '0.1 %'],
    ['temperatureK', 310, '310 K'],
    ['diffGain', 1, '1 V/V'],
    ['bits', 24, '24 bits'],
    ['slopeVPerS', 2.365e-5, '23.65 µV/s'],
  ])('%s = %s shows as %s', (name, value, text) => {
    expect(formatValue(value, unitForFieldName(name))).toBe(text);
  });

  it('shows booleans, texts and missing values plainly', () => {
    expect(formatValue(true, unitForFieldName('enabled'))).toBe('yes');
    expect(formatValue('bessel', unitForFieldName('kind'))).toBe('bessel');
    expect(formatValue(undefined, unitForFieldName('rgOhm'))).toBe('—');
  });
});

describe('diffPlanInputs', () => {
  it('lists only the leaves that differ, with dotted paths and units', () => {
    const older = { highPass: { order: 1, fcHz: 0.5 }, adc: { bits: 16 }, name: 'Patch' };
    const newer = { highPass: { order: 1, fcHz: 0.05 }, adc: { bits: 24 }, name: 'Patch' };
    expect(diffPlanInputs(older, newer)).toEqual([
      { path: 'highPass.fcHz', oldValue: 0.5, newValue: 0.05, oldText: '500 mHz', newText: '50 mHz' },
      { path: 'adc.bits', oldValue: 16, newValue: 24, oldText: '16 bits', newText: '24 bits' },
    ]);
  });

  it('reports added and removed fields', () => {
    const changes = diffPlanInputs({ instrumentation: { rgOhm: 1000 } }, { instrumentation: { targetGain: 50 } });
    expect(changes.map((c) => [c.path, c.oldText, c.newText])).toEqual([
      ['instrumentation.targetGain', '—', '50 V/V'],
      ['instrumentation.rgOhm', '1 kΩ', '—'],
    ]);
  });

  it('finds nothing between a plan and its deep copy', () => {
    expect(diffPlanInputs(diagnosticCart, structuredClone(diagnosticCart))).toEqual([]);
    expect(flattenLeaves(diagnosticCart).length).toBeGreaterThan(50);
  });
});

describe('compareRevisions on real engine reports', () => {
  // The diagnostic-cart demo plan (first-order high-pass at 0.045 Hz) against the same plan with
  // the corner moved to 0.5 Hz. Independent expectation: a first-order high-pass driven by a
  // rectangular pulse of amplitude A and length T leaves a baseline displacement A·(1 − e^(−T/τ)),
  // τ = 1/(2π·fc) (step response of a first-order CR network, any circuit-theory text; the
  // diagnostic-ECG impulse test uses A = 3 mV, T = 100 ms).
  const older = { plan: diagnosticCart, report: evaluate(diagnosticCart as never) };
  const moved = structuredClone(diagnosticCart) as typeof diagnosticCart;
  moved.highPass.fcHz = 0.5;
  const newer = { plan: moved, report: evaluate(moved as never) };
  const comparison = compareRevisions(older, newer);
  const displacement = (fcHz: number) => 3e-3 * (1 - Math.exp(-0.1 * 2 * Math.PI * fcHz));

  it('names the one input that changed', () => {
    expect(comparison.inputs).toEqual([
      { path: 'highPass.fcHz', oldValue: 0.045, newValue: 0.5, oldText: '45 mHz', newText: '500 mHz' },
    ]);
  });

  it('moves the impulse-test displacement as the closed form predicts', () => {
    const row = comparison.headlines.find((h) => h.id === 'impulseTest.displacementV')!;
    expect(row.changed).toBe(true);
    expect(row.oldValue! / displacement(0.045)).toBeCloseTo(1, 2); // ≈ 83.6 µV
    expect(row.newValue! / displacement(0.5)).toBeCloseTo(1, 2); // ≈ 808.6 µV
    expect(row.oldText).toBe('83.64 µV');
    expect(row.newText).toBe('808.8 µV');
  });

  it('flags the checks whose verdict changed and leaves the others', () => {
    const byId = new Map(comparison.checks.map((c) => [c.id, c]));
    expect(byId.get('impulse-displacement')).toMatchObject({ oldVerdict: 'meets', newVerdict: 'fails', verdictChanged: true, movement: 'worsened' });
    expect(byId.get('low-corner')).toMatchObject({ oldVerdict: 'meets', newVerdict: 'fails', verdictChanged: true });
    expect(byId.get('adc-resolution')).toMatchObject({ verdictChanged: false, movement: 'same' });
    // Every check of the profile is listed, changed or not.
    expect(comparison.checks).toHaveLength(newer.report.checks.length);
  });
});

describe('diffChecks', () => {
  const check = (id: string, value: number, verdict: Check['verdict']): Check => ({
    id,
    title: id,
    value,
    limit: 1e-3,
    unit: 'V',
    sense: 'atMost',
    margin: 0,
    verdict,
    source: 'test',
    sourceVerified: false,
    stageId: 'instrumentation',
  });

  it('marks improvements, additions and removals', () => {
    const rows = diffChecks([check('a', 2e-3, 'fails'), check('gone', 1e-4, 'meets')], [check('a', 5e-4, 'meets'), check('new', 1e-4, 'marginal')]);
    expect(rows.map((r) => [r.id, r.movement, r.oldValueText, r.newValueText, r.limitText])).toEqual([
      ['a', 'improved', '2 mV', '500 µV', '≤ 1 mV'],
      ['new', 'added', '—', '100 µV', '≤ 1 mV'],
      ['gone', 'removed', '100 µV', '—', '≤ 1 mV'],
    ]);
  });
});
