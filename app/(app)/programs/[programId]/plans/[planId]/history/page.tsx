import type { Metadata } from 'next';
import { listPlanAuditEvents } from '@/db/queries/revisions';
import { HistoryTable } from '@/features/history/components/history-table';
import { toHistoryEntry } from '@/features/history/history-entry';
import { releasedStates } from '@/features/revisions/revision-states';
import { canReadWorkInProgress } from '@/lib/auth/permissions';
import { loadPlanPage } from '@/app/(app)/programs/[programId]/plans/[planId]/_shared/load-plan';
import { PlanNav } from '@/app/(app)/programs/[programId]/plans/[planId]/_shared/plan-nav';

export const metadata: Metadata = { title: 'History' };
export const dynamic = 'force-dynamic';

export default async function PlanHistoryPage({ params }: { params: Promise<{ programId: string; planId: string }> }) {
  const raw = await params;
  const { member, plan, programId, planId } = await loadPlanPage(raw, `/programs/${raw.programId}/plans/${raw.planId}/history`);
  const readsAll = canReadWorkInProgress(member);
  const events = await listPlanAuditEvents({ workspaceId: member.workspaceId, planId, revisionStates: readsAll ? undefined : releasedStates });
  return (
    <section aria-labelledby="history-heading" className="space-y-6">
      <PlanNav programId={programId} planId={planId} programName={plan.programName} planName={plan.name} current="History" showWorkspace={readsAll} />
      <h1 id="history-heading" className="text-2xl font-semibold">
        History of {plan.name}
      </h1>
      {!readsAll ? <p className="text-sm text-ink-soft">You see the trail of released and superseded revisions only.</p> : null}
      <HistoryTable entries={events.map((e) => toHistoryEntry(e))} caption="Audit trail (oldest first)" />
    </section>
  );
}
