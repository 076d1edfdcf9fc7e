/**
 * What a review comment can be anchored to: one stage of the chain, or one check of the report.
 */

/** The stages of the chain, in signal order. */
export const reviewStageIds = [
  'electrodes',
  'protection',
  'instrumentation',
  'high-pass',
  'gain-stage',
  'converter',
  'right-leg-drive',
  'lead-off',
] as const;
export type ReviewStageId = (typeof reviewStageIds)[number];

export const reviewStageLabels: Record<ReviewStageId, string> = {
  electrodes: 'Electrodes',
  protection: 'Input protection',
  instrumentation: 'Instrumentation amplifier',
  'high-pass': 'High-pass',
  'gain-stage': 'Gain and anti-alias stage',
  converter: 'Converter',
  'right-leg-drive': 'Right-leg drive',
  'lead-off': 'Lead-off detection',
};

/** The engine names the converter stage `adc`; reviews call it `converter`. */
export function reviewStageForEngineStage(stageId: string): ReviewStageId | null {
  if (stageId === 'adc') return 'converter';
  return (reviewStageIds as readonly string[]).includes(stageId) ? (stageId as ReviewStageId) : null;
}

export type CommentAnchor = { kind: 'stage'; id: ReviewStageId } | { kind: 'check'; id: string };

/** The anchor as people read it: "High-pass" or "check impulse-displacement". */
export function anchorLabel(anchor: { kind: 'stage' | 'check'; id: string }, checkTitles: Record<string, string> = {}): string {
  if (anchor.kind === 'stage') return reviewStageLabels[anchor.id as ReviewStageId] ?? anchor.id;
  return `Check: ${checkTitles[anchor.id] ?? anchor.id}`;
}
