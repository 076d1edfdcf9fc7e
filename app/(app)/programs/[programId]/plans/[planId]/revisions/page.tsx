import type { Metadata } from 'next';
import Link from 'next/link';
import { listRevisions } from '@/db/queries/revisions';
import { FreezeRevisionForm } from '@/features/revisions/components/freeze-revision-form';
import { StateBadge, VerdictText } from '@/features/revisions/components/state-badge';
import { maxRevisionSequence, revisionLabel } from '@/features/revisions/revision-label';
import { releasedStates } from '@/features/revisions/revision-states';
import { canEditPlans, canReadWorkInProgress } from '@/lib/auth/permissions';
import { loadPlanPage } from '@/app/(app)/programs/[programId]/plans/[planId]/_shared/load-plan';
import { PlanNav } from '@/app/(app)/programs/[programId]/plans/[planId]/_shared/plan-nav';

export const metadata: Metadata = { title: 'Revisions' };
export const dynamic = 'force-dynamic';

export default async function RevisionsPage({ params }: { params: Promise<{ programId: string; planId: string }> }) {
  const raw = await params;
  const { member, plan, programId, planId } = await loadPlanPage(raw, `/programs/${raw.programId}/plans/${raw.planId}/revisions`);
  const readsAll = canReadWorkInProgress(member);
  const revisions = await listRevisions({ workspaceId: member.workspaceId, planId, states: readsAll ? undefined : releasedStates });
  const canFreeze = canEditPlans(member) && !plan.archivedAt && !plan.programArchivedAt;
  const nextSequence = (revisions[0]?.sequence ?? 0) + 1;
  const base = `/programs/${programId}/plans/${planId}`;

  return (
    <section aria-labelledby="revisions-heading" className="space-y-6">
      <PlanNav programId={programId} planId={planId} programName={plan.programName} planName={plan.name} current="Revisions" showWorkspace={readsAll} />
      <h1 id="revisions-heading" className="text-2xl font-semibold">
        Revisions of {plan.name}
      </h1>
      {!readsAll ? <p className="text-sm text-ink-soft">You see released and superseded revisions only.</p> : null}
      {revisions.length === 0 ? (
        <p className="rounded-lg border border-dashed border-ink-soft/30 p-6 text-ink-soft">No revisions yet.</p>
      ) : (
        <table className="w-full border-collapse text-sm">
          <thead>
            <tr className="border-b border-ink-soft/30 text-left">
              <th scope="col" className="py-1 pr-3">Revision</th>
              <th scope="col" className="py-1 pr-3">State</th>
              <th scope="col" className="py-1 pr-3">Change summary</th>
              <th scope="col" className="py-1 pr-3">Worst check</th>
              <th scope="col" className="py-1 pr-3">Frozen</th>
              <th scope="col" className="py-1">Content hash</th>
            </tr>
          </thead>
          <tbody>
            {revisions.map((r) => (
              <tr key={r.id} className="border-b border-ink-soft/10 align-top">
                <td className="py-1 pr-3">
                  <Link href={`${base}/revisions/${r.id}`} className="font-semibold text-copper-dark underline-offset-2 hover:underline">
                    Revision {r.label}
                  </Link>
                </td>
                <td className="py-1 pr-3">
                  <StateBadge state={r.state} />
                </td>
                <td className="py-1 pr-3">{r.changeSummary}</td>
                <td className="py-1 pr-3">
                  <VerdictText verdict={r.worstVerdict} />
                </td>
                <td className="py-1 pr-3 text-ink-soft">
                  {r.createdAt.toISOString().slice(0, 16).replace('T', ' ')} UTC by {r.createdByName}
                </td>
                <td className="py-1">
                  <code className="text-xs">{r.contentHash.slice(0, 12)}…</code>
                </td>
              </tr>
            ))}
          </tbody>
        </table>
      )}
      {canFreeze && nextSequence <= maxRevisionSequence ? (
        <FreezeRevisionForm planId={String(planId)} planVersion={plan.version} nextLabel={revisionLabel(nextSequence)} />
      ) : null}
    </section>
  );
}
