import type { Metadata } from 'next';
import { listRevisions, getRevisionById } from '@/db/queries/revisions';
import { compareRevisions } from '@/features/revisions/compare';
import { VerdictText } from '@/features/revisions/components/state-badge';
import { releasedStates } from '@/features/revisions/revision-states';
import { canReadWorkInProgress } from '@/lib/auth/permissions';
import type { ChannelReport } from '@/lib/engine/report';
import { loadPlanPage, parseId } from '@/app/(app)/programs/[programId]/plans/[planId]/_shared/load-plan';
import { PlanNav } from '@/app/(app)/programs/[programId]/plans/[planId]/_shared/plan-nav';

export const metadata: Metadata = { title: 'Compare revisions' };
export const dynamic = 'force-dynamic';

const movementText = { improved: 'improved', worsened: 'worsened', same: 'unchanged', 'value-changed': 'value moved', added: 'new check', removed: 'no longer checked' } as const;

export default async function ComparePage({
  params,
  searchParams,
}: {
  params: Promise<{ programId: string; planId: string }>;
  searchParams: Promise<{ from?: string; to?: string }>;
}) {
  const raw = await params;
  const query = await searchParams;
  const { member, plan, programId, planId } = await loadPlanPage(raw, `/programs/${raw.programId}/plans/${raw.planId}/revisions/compare`);
  const readsAll = canReadWorkInProgress(member);
  const revisions = await listRevisions({ workspaceId: member.workspaceId, planId, states: readsAll ? undefined : releasedStates });
  const toId = parseId(query.to ?? '') ?? revisions[0]?.id ?? null;
  const toIndex = revisions.findIndex((r) => r.id === toId);
  const fromId = parseId(query.from ?? '') ?? revisions[toIndex + 1]?.id ?? null;
  const visible = new Set(revisions.map((r) => r.id));
  const [from, to] =
    fromId !== null && toId !== null && visible.has(fromId) && visible.has(toId)
      ? await Promise.all([
          getRevisionById({ workspaceId: member.workspaceId, revisionId: fromId }),
          getRevisionById({ workspaceId: member.workspaceId, revisionId: toId }),
        ])
      : [null, null];
  const comparison =
    from && to ? compareRevisions({ plan: from.plan, report: from.report as ChannelReport }, { plan: to.plan, report: to.report as ChannelReport }) : null;

  const select = (name: string, label: string, value: number | null) => (
    <label className="flex flex-col text-sm">
      {label}
      <select name={name} defaultValue={value ?? undefined} className="rounded-md border border-ink-soft/40 p-1.5">
        {revisions.map((r) => (
          <option key={r.id} value={r.id}>
            Revision {r.label} ({r.state})
          </option>
        ))}
      </select>
    </label>
  );

  return (
    <section aria-labelledby="compare-heading" className="space-y-6">
      <PlanNav programId={programId} planId={planId} programName={plan.programName} planName={plan.name} current="Compare" showWorkspace={readsAll} />
      <h1 id="compare-heading" className="text-2xl font-semibold">
        Compare revisions
      </h1>
      {revisions.length < 2 ? (
        <p className="rounded-lg border border-dashed border-ink-soft/30 p-6 text-ink-soft">Two revisions are needed to compare.</p>
      ) : (
        <form method="get" className="flex flex-wrap items-end gap-3" aria-label="Choose revisions">
          {select('from', 'Older', fromId)}
          {select('to', 'Newer', toId)}
          <button type="submit" className="rounded-md bg-copper-dark px-4 py-2 text-white">
            Compare
          </button>
        </form>
      )}
      {from && to && comparison ? (
        <>
          <h2 className="text-lg font-semibold">
            Revision {from.label} → revision {to.label}
          </h2>
          <section aria-labelledby="inputs-heading">
            <h3 id="inputs-heading" className="mb-2 font-semibold">
              Inputs that changed ({comparison.inputs.length})
            </h3>
            {comparison.inputs.length === 0 ? (
              <p className="text-sm text-ink-soft">No input changed.</p>
            ) : (
              <table className="w-full text-sm">
                <thead>
                  <tr className="border-b border-ink-soft/30 text-left">
                    <th scope="col" className="py-1 pr-3">Input</th>
                    <th scope="col" className="py-1 pr-3">Revision {from.label}</th>
                    <th scope="col" className="py-1">Revision {to.label}</th>
                  </tr>
                </thead>
                <tbody>
                  {comparison.inputs.map((c) => (
                    <tr key={c.path} className="border-b border-ink-soft/10">
                      <td className="py-1 pr-3">
                        <code className="text-xs">{c.path}</code>
                      </td>
                      <td className="py-1 pr-3 tabular-nums">{c.oldText}</td>
                      <td className="py-1 tabular-nums">{c.newText}</td>
                    </tr>
                  ))}
                </tbody>
              </table>
            )}
          </section>
          <section aria-labelledby="headlines-heading">
            <h3 id="headlines-heading" className="mb-2 font-semibold">
              Headline results
            </h3>
            <table className="w-full text-sm">
              <tbody>
                {comparison.headlines.map((h) => (
                  <tr key={h.id} className={`border-b border-ink-soft/10 ${h.changed ? 'bg-copper-light/40' : ''}`}>
                    <th scope="row" className="py-1 pr-3 text-left font-normal">
                      {h.label}
                    </th>
                    <td className="py-1 pr-3 tabular-nums">{h.oldText}</td>
                    <td className="py-1 pr-3 tabular-nums">→ {h.newText}</td>
                    <td className="py-1 text-xs text-ink-soft">{h.changed ? 'moved' : 'unchanged'}</td>
                  </tr>
                ))}
              </tbody>
            </table>
          </section>
          <section aria-labelledby="checks-compare-heading">
            <h3 id="checks-compare-heading" className="mb-2 font-semibold">
              Checks
            </h3>
            <table className="w-full text-sm">
              <thead>
                <tr className="border-b border-ink-soft/30 text-left">
                  <th scope="col" className="py-1 pr-3">Check</th>
                  <th scope="col" className="py-1 pr-3">Value {from.label} → {to.label}</th>
                  <th scope="col" className="py-1 pr-3">Limit</th>
                  <th scope="col" className="py-1 pr-3">Verdict</th>
                  <th scope="col" className="py-1">Movement</th>
                </tr>
              </thead>
              <tbody>
                {comparison.checks.map((c) => (
                  <tr key={c.id} className={`border-b border-ink-soft/10 ${c.verdictChanged ? 'bg-copper-light font-medium' : ''}`} data-verdict-changed={c.verdictChanged || undefined}>
                    <td className="py-1 pr-3">{c.title}</td>
                    <td className="py-1 pr-3 tabular-nums">
                      {c.oldValueText} → {c.newValueText}
                    </td>
                    <td className="py-1 pr-3 tabular-nums">{c.limitText}</td>
                    <td className="py-1 pr-3">
                      <VerdictText verdict={c.oldVerdict} /> → <VerdictText verdict={c.newVerdict} />
                      {c.verdictChanged ? <span className="ml-1 text-xs">(verdict changed)</span> : null}
                    </td>
                    <td className="py-1">{movementText[c.movement]}</td>
                  </tr>
                ))}
              </tbody>
            </table>
          </section>
        </>
      ) : null}
    </section>
  );
}
