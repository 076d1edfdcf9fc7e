import { revisionStateLabels, type RevisionState } from '@/features/revisions/revision-states';

const tone: Record<RevisionState, string> = {
  draft: 'bg-ink-soft/10 text-ink',
  'in-review': 'bg-copper-light text-copper-dark',
  released: 'bg-verdict-meets/10 text-verdict-meets',
  'changes-requested': 'bg-verdict-marginal/10 text-verdict-marginal',
  superseded: 'bg-ink-soft/10 text-ink-soft',
};

/** A revision's state as a small labelled badge. */
export function StateBadge({ state }: { state: RevisionState }) {
  return (
    <span className={`inline-block rounded px-2 py-0.5 text-xs font-semibold ${tone[state]}`} data-state={state}>
      {revisionStateLabels[state]}
    </span>
  );
}

const verdictTone = { meets: 'text-verdict-meets', marginal: 'text-verdict-marginal', fails: 'text-verdict-fails' } as const;

/** A check verdict as a word in its colour (never colour alone). */
export function VerdictText({ verdict }: { verdict: 'meets' | 'marginal' | 'fails' | null }) {
  if (!verdict) return <span className="text-ink-soft">—</span>;
  return <span className={`font-semibold ${verdictTone[verdict]}`}>{verdict}</span>;
}
