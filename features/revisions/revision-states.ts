/**
 * The life of a revision. Its content never changes; only its state moves, along these arrows
 * (the database trigger in drizzle/0004_revisions-immutable.sql refuses any other move):
 *   draft → in-review → released | changes-requested;  released → superseded (by a newer release).
 * A revision whose review asked for changes stays as it is; the fix goes into the next revision.
 */
export const revisionStates = ['draft', 'in-review', 'released', 'changes-requested', 'superseded'] as const;
export type RevisionState = (typeof revisionStates)[number];

const allowed: Record<RevisionState, readonly RevisionState[]> = {
  draft: ['in-review'],
  'in-review': ['released', 'changes-requested'],
  released: ['superseded'],
  'changes-requested': [],
  superseded: [],
};

/** True when a revision may move from `from` to `to`. */
export function canTransition(from: RevisionState, to: RevisionState): boolean {
  return allowed[from].includes(to);
}

/** States a regulator may read: what was released (and later superseded). */
export const releasedStates: readonly RevisionState[] = ['released', 'superseded'];

/** True when the state is one a regulator may read. */
export function isReleasedState(state: RevisionState): boolean {
  return releasedStates.includes(state);
}

/** Human-readable state names. */
export const revisionStateLabels: Record<RevisionState, string> = {
  draft: 'Draft',
  'in-review': 'In review',
  released: 'Released',
  'changes-requested': 'Changes requested',
  superseded: 'Superseded',
};
