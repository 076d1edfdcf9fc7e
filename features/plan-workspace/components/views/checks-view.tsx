'use client';
/**
 * Checks: every check of the profile with value, limit, unit, margin and verdict; the source,
 * marked "from memory" when it is not verified; a failing check links to the stage that causes
 * it and shows the engine's suggestion with an Apply button.
 */
import type { ChannelReport } from '@/lib/engine/report';
import { stages, type StageId } from '@/features/plan-workspace/stage-fields';
import { checkUnitLabel, formatCheckValue, workspaceStageId } from '@/features/plan-workspace/report-view';
import { formatPercent } from '@/features/plan-workspace/format';
import { VerdictBadge } from '@/features/plan-workspace/components/verdict-badge';

interface ChecksViewProps {
  report: ChannelReport;
  canEdit: boolean;
  onOpenStage: (id: StageId) => void;
  onApplySuggestion: (path: string, value: number, title: string) => void;
}

const verdictRowTint = { meets: '', marginal: 'bg-verdict-marginal/5', fails: 'bg-verdict-fails/5' } as const;

export function ChecksView({ report, canEdit, onOpenStage, onApplySuggestion }: ChecksViewProps) {
  return (
    <div className="space-y-3">
      <div className="overflow-x-auto rounded border border-slate-200 bg-white">
        <table className="w-full min-w-[960px] text-sm">
          <caption className="sr-only">Checks of the requirement profile {report.profile.name}</caption>
          <thead className="bg-slate-50 text-left text-xs text-ink-soft">
            <tr>
              <th scope="col" className="px-2 py-2">Check</th>
              <th scope="col" className="px-2 py-2 text-right">Value</th>
              <th scope="col" className="px-2 py-2 text-right">Limit</th>
              <th scope="col" className="px-2 py-2">Unit</th>
              <th scope="col" className="px-2 py-2 text-right">Margin</th>
              <th scope="col" className="px-2 py-2">Verdict</th>
              <th scope="col" className="px-2 py-2">Source</th>
              <th scope="col" className="px-2 py-2">Stage and suggestion</th>
            </tr>
          </thead>
          <tbody>
            {report.checks.map((c) => {
              const stageId = workspaceStageId(c.stageId);
              const suggestions = report.suggestions.filter((s) => s.checkId === c.id);
              const limitText = `${c.sense === 'atMost' ? '≤' : '≥'} ${formatCheckValue(c.limit, c.unit)}`;
              return (
                <tr key={c.id} className={`border-t border-slate-200 align-top ${verdictRowTint[c.verdict]}`}>
                  <th scope="row" className="px-2 py-2 text-left font-medium">
                    {c.title}
                  </th>
                  <td className="whitespace-nowrap px-2 py-2 text-right tabular-nums">{formatCheckValue(c.value, c.unit)}</td>
                  <td className="whitespace-nowrap px-2 py-2 text-right tabular-nums">{limitText}</td>
                  <td className="whitespace-nowrap px-2 py-2 text-ink-soft">{checkUnitLabel(c.unit)}</td>
                  <td className={`whitespace-nowrap px-2 py-2 text-right tabular-nums ${c.margin < 0 ? 'text-verdict-fails' : ''}`}>{formatPercent(c.margin)}</td>
                  <td className="px-2 py-2">
                    <VerdictBadge verdict={c.verdict} />
                  </td>
                  <td className="max-w-[260px] px-2 py-2 text-xs text-ink-soft">
                    {c.source}
                    {!c.sourceVerified && !/common practice/i.test(c.source) && (
                      <span className="ml-1 rounded bg-verdict-marginal/10 px-1 font-semibold text-verdict-marginal">from memory</span>
                    )}
                    {!c.sourceVerified && /common practice/i.test(c.source) && <span className="ml-1 font-semibold">(not from a standard)</span>}
                  </td>
                  <td className="px-2 py-2">
                    {c.verdict !== 'meets' && (
                      <button type="button" className="text-xs font-medium text-copper-dark underline underline-offset-2" onClick={() => onOpenStage(stageId)}>
                        Open {stages[stageId].noun}
                      </button>
                    )}
                    {c.verdict !== 'meets' &&
                      suggestions.map((s) => (
                        <div key={s.id} className="mt-1 rounded border border-copper/30 bg-copper-light/40 p-1.5 text-xs">
                          <p className="font-medium">{s.title}</p>
                          <p className="text-ink-soft">{s.detail}</p>
                          {canEdit && (
                            <button
                              type="button"
                              aria-label="Apply suggestion"
                              title={`Apply suggestion: ${s.title}`}
                              onClick={() => onApplySuggestion(s.patch.path, s.patch.value, s.title)}
                              className="mt-1 rounded bg-copper px-2 py-0.5 font-semibold text-white hover:bg-copper-dark focus-visible:outline-2 focus-visible:outline-copper"
                            >
                              Apply
                            </button>
                          )}
                        </div>
                      ))}
                  </td>
                </tr>
              );
            })}
          </tbody>
        </table>
      </div>
      {report.warnings.length > 0 && (
        <section aria-label="Engine warnings" className="rounded border border-verdict-marginal/40 bg-white p-3 text-sm">
          <h4 className="font-semibold">Warnings</h4>
          <ul className="mt-1 list-disc pl-5">
            {report.warnings.map((w) => (
              <li key={w.id}>{w.message}</li>
            ))}
          </ul>
        </section>
      )}
      {report.assumptions.length > 0 && (
        <details className="rounded border border-slate-200 bg-white p-3 text-sm">
          <summary className="cursor-pointer font-semibold">Assumptions ({report.assumptions.length})</summary>
          <ul className="mt-1 list-disc pl-5 text-ink-soft">
            {report.assumptions.map((a, i) => (
              <li key={i}>{a}</li>
            ))}
          </ul>
        </details>
      )}
    </div>
  );
}
