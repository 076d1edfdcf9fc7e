'use client';
/**
 * The save button and the message shown when someone else saved first (409): the user's
 * edits stay in the workspace; they can load the other version or look at what changed.
 */
import { useState } from 'react';
import type { SavePlanStale } from '@/features/plan-workspace/api/save-plan';
import { diffPlans, type PlanDraft } from '@/features/plan-workspace/plan-edit';

export type SaveStatus =
  | { kind: 'idle' }
  | { kind: 'saving' }
  | { kind: 'saved'; message: string }
  | { kind: 'info'; message: string }
  | { kind: 'error'; message: string };

export function SaveBar({ onSave, saving, status }: { onSave: () => void; saving: boolean; status: SaveStatus }) {
  return (
    <button
      type="button"
      onClick={onSave}
      disabled={saving}
      aria-busy={saving || undefined}
      className="rounded bg-copper px-4 py-1.5 text-sm font-semibold text-white shadow-sm hover:bg-copper-dark focus-visible:outline-2 focus-visible:outline-offset-2 focus-visible:outline-copper disabled:opacity-60"
    >
      {saving || status.kind === 'saving' ? 'Saving…' : 'Save plan'}
    </button>
  );
}

/** Formats the server's ISO timestamp for people (local time); the raw text when it is not a date. */
function formatWhen(iso: string): string {
  const d = new Date(iso);
  if (Number.isNaN(d.getTime())) return iso;
  return d.toLocaleString(undefined, { dateStyle: 'medium', timeStyle: 'short' });
}

export function ConflictPanel({
  conflict,
  baseline,
  draft,
  onReload,
  onDismiss,
}: {
  conflict: SavePlanStale['current'];
  /** The plan as it was when this workspace loaded it (or last saved it). */
  baseline: PlanDraft;
  draft: PlanDraft;
  onReload: () => void;
  onDismiss: () => void;
}) {
  const [showChanges, setShowChanges] = useState(false);
  const theirChanges = diffPlans(baseline, conflict.plan);
  const myChanges = diffPlans(baseline, draft);
  const mine = new Set(myChanges.map((c) => c.path.join('.')));
  const yours = new Map(myChanges.map((c) => [c.path.join('.'), c.afterText]));
  return (
    <section role="alert" aria-labelledby="conflict-title" className="rounded-lg border border-verdict-marginal bg-verdict-marginal/5 p-4">
      <h3 id="conflict-title" className="font-semibold text-ink">
        Someone else saved this plan (by {conflict.updatedByName} at {formatWhen(conflict.updatedAt)}). Your changes are kept here.
      </h3>
      <p className="mt-1 text-sm text-ink-soft">
        Your save was not applied, so nothing of theirs was overwritten. Load their version (your unsaved edits are then replaced), or look at what
        they changed and carry your edits over.
      </p>
      <div className="mt-3 flex flex-wrap gap-2">
        <button type="button" onClick={onReload} className="rounded border border-ink px-3 py-1 text-sm font-medium hover:bg-white focus-visible:outline-2 focus-visible:outline-copper">
          Reload their version
        </button>
        <button
          type="button"
          aria-expanded={showChanges}
          aria-controls="their-changes"
          onClick={() => setShowChanges((v) => !v)}
          className="rounded border border-ink px-3 py-1 text-sm font-medium hover:bg-white focus-visible:outline-2 focus-visible:outline-copper"
        >
          {showChanges ? 'Hide their changes' : 'Show their changes'}
        </button>
        <button type="button" onClick={onDismiss} className="rounded px-3 py-1 text-sm text-ink-soft hover:underline">
          Keep editing
        </button>
      </div>
      {showChanges && (
        <div id="their-changes" className="mt-3">
          {theirChanges.length === 0 ? (
            <p className="text-sm">Their version has the same values as the one you started from.</p>
          ) : (
            <table className="w-full text-sm">
              <caption className="sr-only">Fields changed in their version</caption>
              <thead>
                <tr className="text-left text-xs text-ink-soft">
                  <th scope="col" className="py-1 pr-3">Field</th>
                  <th scope="col" className="py-1 pr-3">Before</th>
                  <th scope="col" className="py-1 pr-3">Their value</th>
                  <th scope="col" className="py-1 pr-3">Your value here</th>
                </tr>
              </thead>
              <tbody>
                {theirChanges.map((c) => (
                  <tr key={c.path.join('.')} className="border-t border-slate-200">
                    <td className="py-1 pr-3 font-medium">{c.label}</td>
                    <td className="py-1 pr-3 tabular-nums">{c.beforeText}</td>
                    <td className="py-1 pr-3 tabular-nums">→ {c.afterText}</td>
                    <td className="py-1 pr-3 tabular-nums">{mine.has(c.path.join('.')) ? yours.get(c.path.join('.')) : 'unchanged'}</td>
                  </tr>
                ))}
              </tbody>
            </table>
          )}
        </div>
      )}
    </section>
  );
}
