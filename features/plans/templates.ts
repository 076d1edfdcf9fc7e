/**
 * The demo plans a new plan can start from. The JSON files are the engine's demo plans
 * (lib/engine/demo-plans/); each is validated again by `computePlan` when a plan is created.
 */
import diagnosticCart from '@/lib/engine/demo-plans/diagnostic-cart-12-lead.json';
import emgSleeve from '@/lib/engine/demo-plans/emg-sleeve.json';
import wearablePatchHighGain from '@/lib/engine/demo-plans/wearable-ecg-patch-high-gain.json';
import wearablePatch from '@/lib/engine/demo-plans/wearable-ecg-patch.json';
import { demoTemplateLabels, type DemoTemplateId } from '@/features/plans/template-ids';

const templatePlans: Record<DemoTemplateId, Record<string, unknown>> = {
  'wearable-ecg-patch': wearablePatch as Record<string, unknown>,
  'wearable-ecg-patch-high-gain': wearablePatchHighGain as Record<string, unknown>,
  'diagnostic-cart-12-lead': diagnosticCart as Record<string, unknown>,
  'emg-sleeve': emgSleeve as Record<string, unknown>,
};

/**
 * A deep copy of a demo plan, with its own name.
 * @param id one of `demoTemplateIds`
 */
export function getDemoTemplate(id: DemoTemplateId): { name: string; label: string; plan: Record<string, unknown> } {
  const plan = structuredClone(templatePlans[id]);
  const name = typeof plan.name === 'string' && plan.name.trim() !== '' ? plan.name : demoTemplateLabels[id];
  return { name, label: demoTemplateLabels[id], plan };
}
