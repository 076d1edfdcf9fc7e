'use client';
/**
 * The result views as tabs (Levels, Noise, Mains, Response, Waveforms, Tolerance, Checks), with
 * the cautions always visible above them. Arrow keys move between tabs (WAI-ARIA tabs pattern).
 */
import { memo, useRef, useState, type KeyboardEvent } from 'react';
import type { ChannelPlan } from '@/lib/engine/plan';
import type { ChannelReport } from '@/lib/engine/report';
import type { StageId } from '@/features/plan-workspace/stage-fields';
import { planningAidCaution } from '@/lib/cautions';
import { saturatedNodes, verdictCounts } from '@/features/plan-workspace/report-view';
import { LevelsView } from '@/features/plan-workspace/components/views/levels-view';
import { NoiseView } from '@/features/plan-workspace/components/views/noise-view';
import { MainsView } from '@/features/plan-workspace/components/views/mains-view';
import { ResponseView } from '@/features/plan-workspace/components/views/response-view';
import { WaveformsView } from '@/features/plan-workspace/components/views/waveforms-view';
import { ToleranceView } from '@/features/plan-workspace/components/views/tolerance-view';
import { ChecksView } from '@/features/plan-workspace/components/views/checks-view';
import { useToleranceRun } from '@/features/plan-workspace/hooks/use-tolerance-run';

const tabs = ['Levels', 'Noise', 'Mains', 'Response', 'Waveforms', 'Tolerance', 'Checks'] as const;
type Tab = (typeof tabs)[number];

interface ResultViewsProps {
  report: ChannelReport;
  /** The validated plan the report belongs to. */
  plan: ChannelPlan | null;
  canEdit: boolean;
  onOpenStage: (id: StageId) => void;
  onApplySuggestion: (path: string, value: number, title: string) => void;
}

/**
 * Memoised: the views (and their Plotly figures) re-render only when a new report arrives, not
 * on every keystroke in a stage form.
 */
export const ResultViews = memo(function ResultViews({ report, plan, canEdit, onOpenStage, onApplySuggestion }: ResultViewsProps) {
  const [active, setActive] = useState<Tab>('Levels');
  const refs = useRef<Record<string, HTMLButtonElement | null>>({});
  const counts = verdictCounts(report.checks);
  const saturated = saturatedNodes(report);
  // Held here (not in the view) so a run survives switching tabs.
  const tolerance = useToleranceRun();

  const onKeyDown = (event: KeyboardEvent<HTMLButtonElement>) => {
    const i = tabs.indexOf(active);
    let next: number | null = null;
    if (event.key === 'ArrowRight') next = (i + 1) % tabs.length;
    if (event.key === 'ArrowLeft') next = (i - 1 + tabs.length) % tabs.length;
    if (event.key === 'Home') next = 0;
    if (event.key === 'End') next = tabs.length - 1;
    if (next === null) return;
    event.preventDefault();
    setActive(tabs[next]);
    refs.current[tabs[next]]?.focus();
  };

  return (
    <section aria-label="Results" className="space-y-3">
      <aside aria-label="Cautions" className="rounded border-l-4 border-copper bg-copper-light/60 px-3 py-2 text-xs leading-relaxed text-ink">
        <strong className="font-semibold">Caution. </strong>
        {planningAidCaution}
      </aside>
      {saturated.length > 0 && (
        <div role="alert" className="flex flex-wrap items-center justify-between gap-2 rounded border border-verdict-fails bg-verdict-fails/5 px-3 py-2 text-sm text-verdict-fails">
          <span>
            <strong>Saturation:</strong> {saturated.map((s) => s.nodeName).join(', ')} {saturated.length === 1 ? 'saturates' : 'saturate'} with the worst-case
            offset and signal.
          </span>
          {active !== 'Levels' && (
            <button type="button" className="font-medium underline underline-offset-2" onClick={() => setActive('Levels')}>
              Show levels
            </button>
          )}
        </div>
      )}
      <div className="flex flex-wrap items-end justify-between gap-2 border-b border-slate-300">
        <div role="tablist" aria-label="Result views" className="flex flex-wrap gap-1">
          {tabs.map((t) => (
            <button
              key={t}
              ref={(el) => {
                refs.current[t] = el;
              }}
              role="tab"
              id={`tab-${t}`}
              type="button"
              aria-selected={active === t}
              aria-controls={`panel-${t}`}
              tabIndex={active === t ? 0 : -1}
              onKeyDown={onKeyDown}
              onClick={() => setActive(t)}
              className={`-mb-px rounded-t border px-3 py-1.5 text-sm font-medium focus-visible:outline-2 focus-visible:outline-copper ${
                active === t ? 'border-slate-300 border-b-white bg-white text-ink' : 'border-transparent text-ink-soft hover:text-ink'
              }`}
            >
              {t}
              {t === 'Checks' && counts.fails > 0 && <span className="ml-1 rounded bg-verdict-fails px-1 text-xs text-white">{counts.fails}</span>}
            </button>
          ))}
        </div>
        <p className="pb-1 text-xs text-ink-soft">
          {report.profile.name}: {counts.meets} meet, {counts.marginal} marginal, {counts.fails} fail
        </p>
      </div>
      <div role="tabpanel" id={`panel-${active}`} aria-labelledby={`tab-${active}`} tabIndex={0} className="focus-visible:outline-2 focus-visible:outline-copper">
        {active === 'Levels' && <LevelsView report={report} />}
        {active === 'Noise' && <NoiseView report={report} />}
        {active === 'Mains' && <MainsView report={report} mainsHz={plan?.mainsHz} />}
        {active === 'Response' && <ResponseView report={report} plan={plan} />}
        {active === 'Waveforms' && <WaveformsView plan={plan} canEdit={canEdit} />}
        {active === 'Tolerance' && <ToleranceView plan={plan} canEdit={canEdit} state={tolerance.state} onStart={tolerance.start} onCancel={tolerance.cancel} />}
        {active === 'Checks' && <ChecksView report={report} canEdit={canEdit} onOpenStage={onOpenStage} onApplySuggestion={onApplySuggestion} />}
      </div>
    </section>
  );
});
