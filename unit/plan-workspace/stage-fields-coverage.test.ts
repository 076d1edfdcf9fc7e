import { describe, expect, it } from 'vitest';
import cart from '@/lib/engine/demo-plans/diagnostic-cart-12-lead.json';
import emg from '@/lib/engine/demo-plans/emg-sleeve.json';
import patchHighGain from '@/lib/engine/demo-plans/wearable-ecg-patch-high-gain.json';
import patch from '@/lib/engine/demo-plans/wearable-ecg-patch.json';
import { findField } from '@/features/plan-workspace/stage-fields';
import { textToValue, valueToText } from '@/features/plan-workspace/plan-edit';

function leaves(value: unknown, path: string[] = []): string[][] {
  if (value !== null && typeof value === 'object' && !Array.isArray(value)) {
    return Object.entries(value as Record<string, unknown>).flatMap(([k, v]) => leaves(v, [...path, k]));
  }
  return [path];
}

describe('stage forms cover the plan', () => {
  const plans = { cart, emg, patchHighGain, patch } as Record<string, Record<string, unknown>>;
  it.each(Object.keys(plans))('every value of the demo plan %s has a form field that reads it back', (name) => {
    const plan = plans[name];
    for (const path of leaves(plan)) {
      if (path[0] === 'schemaVersion' || path[0] === 'customProfile') continue;
      const found = findField(path);
      expect(found, `no form field for ${path.join('.')}`).toBeDefined();
      if (!found) continue;
      const value = path.reduce<unknown>((v, k) => (v as Record<string, unknown>)[k], plan);
      if (found.field.kind === 'boolean') continue;
      const back = textToValue(found.field, valueToText(found.field, value));
      expect(back.ok, `${path.join('.')}: ${valueToText(found.field, value)}`).toBe(true);
      if (back.ok && typeof value === 'number') {
        const rel = value === 0 ? Math.abs(back.value as number) : Math.abs(((back.value as number) - value) / value);
        expect(rel, path.join('.')).toBeLessThan(1e-5);
      } else if (back.ok) {
        expect(back.value).toEqual(value);
      }
    }
  });
});
