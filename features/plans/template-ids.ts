/** The demo plans a new plan can start from (JSON in lib/engine/demo-plans/). */
export const demoTemplateIds = [
  'wearable-ecg-patch',
  'wearable-ecg-patch-high-gain',
  'diagnostic-cart-12-lead',
  'emg-sleeve',
] as const;
export type DemoTemplateId = (typeof demoTemplateIds)[number];

/** Names shown when choosing a template. */
export const demoTemplateLabels: Record<DemoTemplateId, string> = {
  'wearable-ecg-patch': 'Two-lead wearable ECG patch (3.0 V, dry electrodes)',
  'wearable-ecg-patch-high-gain': 'Wearable ECG patch, first-stage gain too high (fails)',
  'diagnostic-cart-12-lead': '12-lead diagnostic cart front end (±5 V)',
  'emg-sleeve': 'Surface-EMG sleeve',
};
