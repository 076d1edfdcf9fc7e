import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { parsePlan, PlanValidationError, safeParsePlan } from '@/lib/engine/validate';
import patch from '@/lib/engine/demo-plans/wearable-ecg-patch.json';
import highGain from '@/lib/engine/demo-plans/wearable-ecg-patch-high-gain.json';
import cart from '@/lib/engine/demo-plans/diagnostic-cart-12-lead.json';
import emg from '@/lib/engine/demo-plans/emg-sleeve.json';

const clone = <T>(v: T): T => structuredClone(v);

function issuesOf(input: unknown) {
  const r = safeParsePlan(input);
  if (r.success) throw new Error('expected the plan to be refused');
  return r.error.issues;
}

describe('parsePlan', () => {
  it('accepts every demo plan', () => {
    for (const p of [patch, highGain, cart, emg]) expect(safeParsePlan(p).success).toBe(true);
  });

  it('names the field and the reason for a negative gain resistor', () => {
    const p = clone(patch);
    p.instrumentation.rgOhm = -10;
    expect(issuesOf(p)).toEqual([{ path: 'instrumentation.rgOhm', message: 'gain resistance Rg must be greater than zero' }]);
  });

  it('lists every offending field at once, including the cross-field rules', () => {
    const p = clone(patch) as Record<string, any>;
    p.instrumentation.r3Ohm = 0;
    p.electrodes.rpOhm = Number.NaN;
    p.supply.negativeV = 5; // above the positive rail
    p.gainStage.lowPass.fcHz = 300; // above Nyquist of 500 Hz sampling
    p.profileId = 'holter';
    expect(issuesOf(p)).toEqual(
      expect.arrayContaining([
        { path: 'instrumentation.r3Ohm', message: 'difference-stage resistance R3 must be greater than zero' },
        { path: 'electrodes.rpOhm', message: 'electrode parallel resistance must be a finite number' },
        { path: 'supply.positiveV', message: 'positive rail must be above the negative rail' },
        { path: 'gainStage.lowPass.fcHz', message: 'low-pass corner must be below the Nyquist frequency (250 Hz)' },
        { path: 'profileId', message: 'unknown requirement profile' },
      ]),
    );
    expect(issuesOf(p)).toHaveLength(5);
  });

  it('says which field is missing', () => {
    const p = clone(patch) as Record<string, any>;
    delete p.adc.bits;
    delete p.highPass;
    expect(issuesOf(p)).toEqual(
      expect.arrayContaining([
        { path: 'highPass', message: 'is required' },
        { path: 'adc.bits', message: 'is required' },
      ]),
    );
    expect(issuesOf(p)).toHaveLength(2);
  });

  it('refuses both Rg and a target gain', () => {
    const p = clone(patch) as Record<string, any>;
    p.instrumentation.targetGain = 5;
    expect(issuesOf(p)).toEqual([{ path: 'instrumentation.rgOhm', message: 'give exactly one of gain resistance Rg or target first-stage gain' }]);
  });

  it('refuses a reference outside the rails and an unknown low-pass kind', () => {
    const p = clone(patch) as Record<string, any>;
    p.supply.referenceV = 4;
    p.gainStage.lowPass.kind = 'chebyshev';
    expect(issuesOf(p)).toEqual(
      expect.arrayContaining([
        { path: 'supply.referenceV', message: 'reference voltage must lie between the rails' },
        { path: 'gainStage.lowPass.kind', message: 'low-pass kind must be butterworth or bessel' },
      ]),
    );
  });

  it('throws PlanValidationError with a readable message', () => {
    expect(() => parsePlan('not a plan')).toThrow(PlanValidationError);
    expect(() => parsePlan('not a plan')).toThrow('Invalid channel plan: the plan must be a JSON object');
  });

  it('only ever throws PlanValidationError, for any input', () => {
    fc.assert(
      fc.property(fc.anything(), (input) => {
        try {
          parsePlan(input);
          return false; // nothing random is a valid plan
        } catch (e) {
          return e instanceof PlanValidationError && e.issues.length > 0;
        }
      }),
      { numRuns: 300 },
    );
  });

  it('only ever throws PlanValidationError when one field of a valid plan is replaced', () => {
    const leafPaths: string[][] = [];
    const walk = (v: unknown, path: string[]) => {
      if (v !== null && typeof v === 'object') for (const [k, c] of Object.entries(v)) walk(c, [...path, k]);
      else leafPaths.push(path);
    };
    walk(cart, []);
    fc.assert(
      fc.property(fc.constantFrom(...leafPaths), fc.oneof(fc.double(), fc.string(), fc.constant(null), fc.constant(undefined), fc.integer()), (path, value) => {
        const p = clone(cart) as Record<string, any>;
        let o = p;
        for (const k of path.slice(0, -1)) o = o[k];
        o[path[path.length - 1]] = value;
        const r = safeParsePlan(p);
        if (r.success) return true;
        return r.error instanceof PlanValidationError && r.error.issues.every((i) => typeof i.path === 'string' && i.message.length > 0);
      }),
      { numRuns: 400 },
    );
  });
});
