import { describe, expect, it } from 'vitest';
import { opAmpSchema } from '@/lib/engine/plan';
import {
  amplifierPartToOpAmp,
  electrodePartSchema,
  instrumentationAmplifierPartSchema,
  operationalAmplifierPartSchema,
  partFieldSpecs,
  partSchema,
} from '@/lib/parts/part-kinds';

const opAmpPart = {
  name: 'generic precision op-amp',
  description: 'rail-to-rail output',
  sourceNote: 'assumed',
  status: 'approved',
  kind: 'operational-amplifier',
  enVPerRtHz: 12e-9,
  enCornerHz: 5,
  inAPerRtHz: 0.5e-12,
  inCornerHz: 50,
  cmrrDb: 100,
  gbwHz: 5e6,
  biasA: 10e-12,
  offsetV: 200e-6,
  inputCmFromNegV: -0.1,
  inputCmFromPosV: 1.2,
  outputFromNegV: 0.02,
  outputFromPosV: 0.02,
} as const;

describe('part kinds', () => {
  it('amplifier parts carry exactly the plan op-amp fields (plus the part fields)', () => {
    const planFields = Object.keys(opAmpSchema.shape).filter((f) => f !== 'source').sort();
    const partNumeric = partFieldSpecs('operational-amplifier')
      .filter((s) => s.type === 'quantity')
      .map((s) => s.field)
      .sort();
    expect(partNumeric).toEqual(planFields);
    const inaNumeric = partFieldSpecs('instrumentation-amplifier').filter((s) => s.type === 'quantity').map((s) => s.field);
    expect(inaNumeric).toEqual(expect.arrayContaining([...planFields, 'gainMin', 'gainMax', 'diffGain', 'rgConstantOhm']));
  });

  it('an op-amp part converts into a valid plan op-amp', () => {
    const part = operationalAmplifierPartSchema.parse(opAmpPart);
    const opAmp = amplifierPartToOpAmp(part);
    expect(opAmpSchema.safeParse(opAmp).success).toBe(true);
    expect(opAmp.enVPerRtHz).toBe(12e-9);
    expect(opAmp).not.toHaveProperty('inputCmOhm');
    const withCm = amplifierPartToOpAmp(operationalAmplifierPartSchema.parse({ ...opAmpPart, inputCmOhm: 10e9, inputCmF: 3e-12 }));
    expect(opAmpSchema.parse(withCm)).toMatchObject({ inputCmOhm: 10e9, inputCmF: 3e-12 });
    expect(opAmp.source).toBe('part library: generic precision op-amp (assumed)');
  });

  it('the union schema discriminates by kind', () => {
    expect(partSchema.safeParse(opAmpPart).success).toBe(true);
    expect(partSchema.safeParse({ ...opAmpPart, kind: 'converter' }).success).toBe(false);
  });

  it('range errors name the field and the limit', () => {
    const r = operationalAmplifierPartSchema.safeParse({ ...opAmpPart, enVPerRtHz: 8 });
    expect(r.success).toBe(false);
    expect(r.error?.issues.map((i) => [i.path.join('.'), i.message])).toEqual([['enVPerRtHz', 'voltage-noise density must be at most 1 µV/√Hz']]);
    const neg = operationalAmplifierPartSchema.safeParse({ ...opAmpPart, biasA: -1e-9 });
    expect(neg.error?.issues[0].message).toBe('input bias current must not be negative');
    const zero = operationalAmplifierPartSchema.safeParse({ ...opAmpPart, gbwHz: 0 });
    expect(zero.error?.issues[0].message).toBe('gain-bandwidth product must be greater than zero');
    const status = operationalAmplifierPartSchema.safeParse({ ...opAmpPart, status: 'obsolete' });
    expect(status.error?.issues[0].message).toBe('status must be one of approved, under-evaluation, not-for-new-designs');
  });

  it('cross-field rules: INA gain range, electrode offsets', () => {
    const ina = instrumentationAmplifierPartSchema.safeParse({ ...opAmpPart, kind: 'instrumentation-amplifier', gainMin: 10, gainMax: 5, diffGain: 1, rgConstantOhm: 50e3 });
    expect(ina.error?.issues.map((i) => i.message)).toEqual(['maximum gain must not be below the minimum gain']);
    const el = electrodePartSchema.safeParse({
      name: 'e', description: '', sourceNote: 'measured', status: 'approved', kind: 'electrode', electrodeType: 'dry',
      rsOhm: 1e3, rpOhm: 2e6, cpF: 10e-9, offsetTypicalV: 0.2, offsetMaxV: 0.1,
    });
    expect(el.error?.issues.map((i) => i.message)).toEqual(['maximum offset must not be below the typical offset']);
  });
});
