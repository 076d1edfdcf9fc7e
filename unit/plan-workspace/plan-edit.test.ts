import { describe, expect, it } from 'vitest';
import {
  applyFieldEdit,
  applyPart,
  diffPlans,
  firstStageGain,
  gainResistorFor,
  plansEqual,
  setAt,
  textToValue,
  valueToText,
  type PartOption,
} from '@/features/plan-workspace/plan-edit';
import { allFields, findField, stageFields, stageOfPath, type FieldDef } from '@/features/plan-workspace/stage-fields';

const field = (dotted: string): FieldDef => {
  const found = findField(dotted.split('.'));
  if (!found) throw new Error(`no field ${dotted}`);
  return found.field;
};

describe('textToValue', () => {
  it('parses quantities typed with units into SI values', () => {
    expect(textToValue(field('instrumentation.rgOhm'), '51 kΩ')).toEqual({ ok: true, value: 51_000 });
    const c = textToValue(field('electrodes.imbalanceCF'), '47n F');
    expect(c.ok && Math.abs((c.value as number) - 47e-9) / 47e-9).toBeLessThan(1e-12);
    expect(textToValue(field('highPass.fcHz'), '0.05 Hz')).toEqual({ ok: true, value: 0.05 });
    expect(textToValue(field('electrodes.offsetV'), '300 mV')).toEqual({ ok: true, value: 0.3 });
    const en = textToValue(field('instrumentation.opAmp.enVPerRtHz'), '8 nV/√Hz');
    expect(en.ok && Math.abs((en.value as number) - 8e-9) / 8e-9).toBeLessThan(1e-12);
  });

  it('names the field and the reason when the dimension is wrong', () => {
    expect(textToValue(field('instrumentation.rgOhm'), '47 nF')).toEqual({
      ok: false,
      message: 'Rg: expected a resistance (Ω), got a capacitance',
    });
    const r = textToValue(field('highPass.fcHz'), '');
    expect(r).toEqual({ ok: false, message: 'fc: a value is required' });
  });

  it('treats an empty optional quantity as "not set"', () => {
    expect(textToValue(field('signalAmplitudeV'), '  ')).toEqual({ ok: true, value: undefined });
  });

  it('reads per-cent fields as per cent, with or without the sign', () => {
    expect(textToValue(field('instrumentation.resistorTolerance'), '0.1')).toEqual({ ok: true, value: 0.001 });
    expect(textToValue(field('instrumentation.resistorTolerance'), '1 %')).toEqual({ ok: true, value: 0.01 });
    expect(textToValue(field('instrumentation.resistorTolerance'), '100 ppm').ok).toBe(true);
  });

  it('accepts a trailing unit word on plain numbers and refuses fractions of a bit', () => {
    expect(textToValue(field('adc.bits'), '16 bits')).toEqual({ ok: true, value: 16 });
    expect(textToValue(field('adc.bits'), '16.5')).toEqual({ ok: false, message: 'bits: must be a whole number' });
    expect(textToValue(field('instrumentation.diffGain'), '1 V/V')).toEqual({ ok: true, value: 1 });
    expect(textToValue(field('temperatureK'), '298.15 K')).toEqual({ ok: true, value: 298.15 });
    const bad = textToValue(field('gainStage.gain'), '5 kΩ');
    expect(bad.ok).toBe(false);
    if (!bad.ok) expect(bad.message.startsWith('G2: ')).toBe(true);
  });

  it('maps select text back to the option value with its type', () => {
    expect(textToValue(field('highPass.order'), '2')).toEqual({ ok: true, value: 2 });
    expect(textToValue(field('mainsHz'), '60')).toEqual({ ok: true, value: 60 });
    expect(textToValue(field('profileId'), 'eeg')).toEqual({ ok: true, value: 'eeg' });
    expect(textToValue(field('highPass.order'), '3').ok).toBe(false);
  });
});

describe('valueToText ⇄ textToValue round trip', () => {
  it('reads back every quantity and per-cent field to the same value', () => {
    const samples: Record<string, number> = { ohm: 49_900, F: 4.7e-9, Hz: 0.67, V: -0.0015, A: 6e-9, 'V/rtHz': 8e-9, 'A/rtHz': 2e-15, dB: 110, s: 0.1 };
    for (const { field: f } of allFields) {
      let value: number;
      if (f.kind === 'quantity') value = samples[f.unit];
      else if (f.kind === 'percent') value = 0.0005;
      else continue;
      const back = textToValue(f, valueToText(f, value));
      expect(back.ok, `${f.label}: ${valueToText(f, value)}`).toBe(true);
      if (back.ok) expect(Math.abs((back.value as number) - value) / Math.abs(value)).toBeLessThan(1e-9);
    }
  });
  it('shows values in engineering notation with the unit', () => {
    expect(valueToText(field('instrumentation.rgOhm'), 51_000)).toBe('51 kΩ');
    expect(valueToText(field('electrodes.imbalanceCF'), 47e-9)).toBe('47 nF');
    expect(valueToText(field('instrumentation.resistorTolerance'), 0.001)).toBe('0.1 %');
    expect(valueToText(field('instrumentation.opAmp.cmrrDb'), 110)).toBe('110 dB');
  });
});

describe('setAt and applyFieldEdit', () => {
  const plan = { instrumentation: { rOhm: 25_000, rgOhm: 5_000, diffGain: 1 }, body: { mode: 'coupling', mainsVrms: 230, bodyToMainsF: 3e-12, bodyToGroundF: 3e-10 } };
  it('copies along the path and leaves the original untouched', () => {
    const next = setAt(plan, ['instrumentation', 'rgOhm'], 10_000);
    expect(next.instrumentation.rgOhm).toBe(10_000);
    expect(plan.instrumentation.rgOhm).toBe(5_000);
    expect(next.body).toBe(plan.body);
  });
  it('lets Rg and the target gain exclude each other', () => {
    const byGain = applyFieldEdit(plan, ['instrumentation', 'targetGain'], 11) as typeof plan & { instrumentation: { targetGain?: number } };
    expect(byGain.instrumentation.targetGain).toBe(11);
    expect('rgOhm' in byGain.instrumentation).toBe(false);
    const byRg = applyFieldEdit(byGain, ['instrumentation', 'rgOhm'], 2_000) as typeof byGain;
    expect(byRg.instrumentation.rgOhm).toBe(2_000);
    expect('targetGain' in byRg.instrumentation).toBe(false);
  });
  it('replaces the body object when the model changes', () => {
    const direct = applyFieldEdit(plan, ['body', 'mode'], 'direct') as { body: Record<string, unknown> };
    expect(Object.keys(direct.body).sort()).toEqual(['cmVrms', 'mode']);
  });
});

describe('three-op-amp gain helpers', () => {
  it('match the Sedra & Smith example: R = 0.5 MΩ, Rg = 1 kΩ gives G1 = 1001', () => {
    // Sedra & Smith, Microelectronic Circuits, instrumentation-amplifier example.
    expect(firstStageGain(0.5e6, 1e3)).toBe(1001);
    expect(gainResistorFor(0.5e6, 1001)).toBeCloseTo(1e3, 9);
    expect(gainResistorFor(25e3, 1)).toBe(Number.POSITIVE_INFINITY);
  });
});

describe('diffPlans', () => {
  it('lists changed leaves with labels and formatted values', () => {
    const a = { instrumentation: { rgOhm: 5_000, rOhm: 25_000 }, highPass: { order: 1, fcHz: 0.05 } };
    const b = { instrumentation: { rOhm: 25_000, targetGain: 11 }, highPass: { order: 1, fcHz: 0.5 } };
    const changes = diffPlans(a, b);
    const byLabel = Object.fromEntries(changes.map((c) => [c.label, `${c.beforeText} → ${c.afterText}`]));
    expect(byLabel).toEqual({
      'Gain resistance Rg': '5 kΩ → (not set)',
      'First-stage gain': '(not set) → 11',
      'High-pass corner': '50 mHz → 500 mHz',
    });
    expect(changes.find((c) => c.label === 'High-pass corner')?.stageId).toBe('highPass');
    expect(plansEqual(a, { highPass: { fcHz: 0.05, order: 1 }, instrumentation: { rOhm: 25_000, rgOhm: 5_000 } })).toBe(true);
    expect(plansEqual(a, b)).toBe(false);
  });
});

describe('applyPart', () => {
  const plan = { instrumentation: { rOhm: 25_000, diffGain: 1, opAmp: { enVPerRtHz: 20e-9, gbwHz: 1e6, source: '' } }, adc: { bits: 16, fullScaleV: 3 } };
  it('fills an instrumentation stage from an INA part: R = K/2 from G1 = 1 + K/Rg', () => {
    const part: PartOption = {
      id: 'p1',
      kind: 'instrumentation-amplifier',
      name: 'generic low-noise INA',
      status: 'approved',
      sourceNote: 'assumed',
      values: { enVPerRtHz: 8e-9, gbwHz: 1.5e6, rgConstantOhm: 49_400, diffGain: 1, gainMin: 1, gainMax: 1000 },
    };
    const { plan: next, changed } = applyPart(plan, 'instrumentation', part);
    const inst = (next as typeof plan).instrumentation;
    expect(inst.rOhm).toBe(24_700);
    expect(inst.opAmp.enVPerRtHz).toBe(8e-9);
    expect(inst.opAmp.gbwHz).toBe(1.5e6);
    expect(inst.opAmp.source).toBe('part library: generic low-noise INA (assumed)');
    expect(changed.map((p) => p.join('.')).sort()).toEqual([
      'instrumentation.opAmp.enVPerRtHz',
      'instrumentation.opAmp.gbwHz',
      'instrumentation.opAmp.source',
      'instrumentation.rOhm',
    ]);
    expect((next as Record<string, unknown>).gainMin).toBeUndefined();
  });
  it('ignores a part of another kind', () => {
    const part: PartOption = { id: 'c', kind: 'converter', name: 'x', status: 'approved', sourceNote: 'y', values: { bits: 24 } };
    expect(applyPart(plan, 'instrumentation', part).changed).toEqual([]);
    expect((applyPart(plan, 'adc', part).plan as typeof plan).adc.bits).toBe(24);
  });
});

describe('stage fields', () => {
  it('have unique labels within each stage form (accessible names)', () => {
    for (const fields of Object.values(stageFields)) {
      const labels = fields.map((f) => f.label);
      expect(new Set(labels).size).toBe(labels.length);
    }
  });
  it('map plan paths to stages', () => {
    expect(stageOfPath(['body', 'mainsVrms'])).toBe('electrodes');
    expect(stageOfPath(['supply', 'positiveV'])).toBe('profile');
    expect(stageOfPath(['gainStage', 'lowPass', 'fcHz'])).toBe('gainStage');
  });
});
