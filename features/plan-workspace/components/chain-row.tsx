'use client';
/**
 * The chain drawn as a row of stage cards, left to right along the signal path, with the
 * optional stages below. Each card is a button that opens the stage's form and shows the
 * stage's key values and the worst verdict of its checks.
 */
import type { ChannelReport, Verdict } from '@/lib/engine/report';
import { optionalStageIds, signalPathStageIds, stages, type StageId } from '@/features/plan-workspace/stage-fields';
import { stageSummary, worstVerdictByStage } from '@/features/plan-workspace/report-view';
import type { PlanDraft } from '@/features/plan-workspace/plan-edit';
import { VerdictBadge } from '@/features/plan-workspace/components/verdict-badge';

interface ChainRowProps {
  plan: PlanDraft;
  report: ChannelReport | null;
  openStage: StageId | null;
  onOpen: (id: StageId) => void;
  /** Stages with an invalid field (typed text that does not parse, or a validation issue). */
  invalidStages: Set<StageId>;
}

export function ChainRow({ plan, report, openStage, onOpen, invalidStages }: ChainRowProps) {
  const verdicts = report ? worstVerdictByStage(report.checks) : {};
  const card = (id: StageId) => (
    <StageCard
      key={id}
      id={id}
      lines={stageSummary(id, plan, report)}
      verdict={verdicts[id] ?? null}
      open={openStage === id}
      invalid={invalidStages.has(id)}
      onOpen={onOpen}
    />
  );
  return (
    <nav aria-label="Channel stages" className="space-y-3">
      <div className="flex items-stretch gap-1.5 overflow-x-auto pb-1">
        {card('profile')}
        <div className="w-px shrink-0 bg-slate-300" aria-hidden="true" />
        {signalPathStageIds.map((id, i) => (
          <div key={id} className="flex min-w-0 flex-1 items-stretch gap-1.5">
            {i > 0 && (
              <span aria-hidden="true" className="flex items-center text-lg text-copper">
                →
              </span>
            )}
            {card(id)}
          </div>
        ))}
      </div>
      <div className="flex items-stretch gap-2">
        <span className="flex items-center text-xs uppercase tracking-wide text-ink-soft">Optional</span>
        {optionalStageIds.map(card)}
      </div>
    </nav>
  );
}

function StageCard({
  id,
  lines,
  verdict,
  open,
  invalid,
  onOpen,
}: {
  id: StageId;
  lines: string[];
  verdict: Verdict | null;
  open: boolean;
  invalid: boolean;
  onOpen: (id: StageId) => void;
}) {
  const info = stages[id];
  const border = open ? 'border-copper ring-2 ring-copper/40' : verdict === 'fails' ? 'border-verdict-fails' : 'border-slate-300';
  return (
    <button
      type="button"
      aria-label={`Open ${info.noun}`}
      aria-expanded={open}
      aria-controls="stage-panel"
      onClick={() => onOpen(id)}
      className={`flex min-w-[8.5rem] max-w-[14rem] flex-1 flex-col rounded-lg border bg-white p-2.5 text-left shadow-sm transition hover:border-copper focus-visible:outline-2 focus-visible:outline-offset-2 focus-visible:outline-copper ${border}`}
    >
      <span className="flex items-center justify-between gap-1">
        <span className="text-sm font-semibold text-ink">{info.title}</span>
      </span>
      <span className="mt-1 space-y-0.5 text-xs text-ink-soft">
        {lines.map((l, i) => (
          <span key={i} className="block truncate" title={l}>
            {l}
          </span>
        ))}
      </span>
      <span className="mt-auto flex flex-wrap gap-1 pt-2">
        {verdict ? <VerdictBadge verdict={verdict} /> : <span className="text-xs text-ink-soft">no checks</span>}
        {invalid && <span className="rounded bg-verdict-fails/10 px-1.5 py-0.5 text-xs font-medium text-verdict-fails">invalid input</span>}
      </span>
    </button>
  );
}
