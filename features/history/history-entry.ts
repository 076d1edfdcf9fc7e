/**
 * Audit events as the history view shows them: who, when, what, and what changed (before → after).
 * Pure: takes stored events, returns plain data.
 */
import type { HistoryEvent } from '@/db/queries/revisions';

export interface HistoryChange {
  path: string;
  before: string;
  after: string;
}

export interface HistoryEntry {
  id: string;
  at: string;
  actorName: string;
  action: string;
  actionLabel: string;
  entityType: string;
  entityId: string;
  /** Leaf values that differ between before and after (at most `maxChanges`). */
  changes: HistoryChange[];
  /** How many further differences were left out. */
  moreChanges: number;
  /** Scalar facts of the event's after-image when there is no before-image (a creation). */
  details: HistoryChange[];
}

const actionLabels: Record<string, string> = {
  'plan.created': 'Plan created',
  'plan.duplicated': 'Plan duplicated',
  'plan.imported': 'Plan imported from a rationale JSON',
  'plan.saved': 'Plan saved',
  'plan.renamed': 'Plan renamed',
  'plan.archived': 'Plan archived',
  'plan.restored': 'Plan restored',
  'revision.created': 'Revision frozen',
  'revision.state-changed': 'Revision state changed',
  'revision.exported': 'Revision exported',
  'review.requested': 'Review requested',
  'review.comment-added': 'Comment added',
  'review.reply-added': 'Reply added',
  'review.comment-resolved': 'Comment resolved',
  'review.comment-reopened': 'Comment reopened',
  'review.signed': 'Review signed',
};

/** A readable name for an audit action ("revision.created" → "Revision frozen"). */
export function actionLabel(action: string): string {
  return actionLabels[action] ?? action;
}

const maxTextChars = 160;

/** A stored value as short text. */
export function valueText(value: unknown): string {
  if (value === undefined) return '—';
  if (value === null) return 'none';
  const text = typeof value === 'string' ? value : JSON.stringify(value);
  return text.length > maxTextChars ? `${text.slice(0, maxTextChars - 1)}…` : text;
}

function leaves(value: unknown, prefix: string, out: Map<string, unknown>): void {
  if (value === null || typeof value !== 'object' || Array.isArray(value)) {
    out.set(prefix, value);
    return;
  }
  for (const [key, v] of Object.entries(value as Record<string, unknown>)) leaves(v, prefix ? `${prefix}.${key}` : key, out);
}

/**
 * The leaf values that differ between two JSON values, in a stable order.
 * @example diffJson({ state: 'draft' }, { state: 'in-review' }) // [{ path: 'state', before: 'draft', after: 'in-review' }]
 */
export function diffJson(before: unknown, after: unknown): HistoryChange[] {
  const a = new Map<string, unknown>();
  const b = new Map<string, unknown>();
  leaves(before ?? {}, '', a);
  leaves(after ?? {}, '', b);
  const paths = [...new Set([...a.keys(), ...b.keys()])];
  return paths
    .filter((path) => JSON.stringify(a.get(path)) !== JSON.stringify(b.get(path)))
    .map((path) => ({ path, before: valueText(a.get(path)), after: valueText(b.get(path)) }));
}

// The driver may hand JSON columns back as text.
function parseIfText(value: unknown): unknown {
  if (typeof value !== 'string') return value;
  try {
    return JSON.parse(value);
  } catch {
    return value;
  }
}

/** The history view's entry for one audit event. */
export function toHistoryEntry(raw: HistoryEvent, maxChanges = 30): HistoryEntry {
  const event = { ...raw, before: parseIfText(raw.before), after: parseIfText(raw.after) };
  const hasBefore = event.before !== null && event.before !== undefined;
  const all = hasBefore ? diffJson(event.before, event.after) : [];
  const details =
    !hasBefore && event.after && typeof event.after === 'object'
      ? Object.entries(event.after as Record<string, unknown>)
          .filter(([, v]) => v === null || typeof v !== 'object' || Array.isArray(v))
          .map(([path, v]) => ({ path, before: '—', after: valueText(v) }))
      : [];
  return {
    id: String(event.id),
    at: event.at.toISOString(),
    actorName: event.actorName ?? 'system',
    action: event.action,
    actionLabel: actionLabel(event.action),
    entityType: event.entityType,
    entityId: event.entityId,
    changes: all.slice(0, maxChanges),
    moreChanges: Math.max(0, all.length - maxChanges),
    details,
  };
}
