import type { Metadata } from 'next';
import { notFound, redirect } from 'next/navigation';
import { listParts } from '@/db/queries/parts';
import { getPlanById } from '@/db/queries/plans';
import { getCurrentMember } from '@/features/auth/guard';
import { PlanWorkspace } from '@/features/plan-workspace/components/plan-workspace';
import { toPartOptionDto } from '@/features/plans/types';
import { canEditPlans, canReadWorkInProgress } from '@/lib/auth/permissions';
import type { ChannelPlan } from '@/lib/engine/plan';
import { PlanNav } from './_shared/plan-nav';

export const metadata: Metadata = { title: 'Channel plan' };
export const dynamic = 'force-dynamic';

const parseId = (value: string) => (/^[1-9][0-9]{0,15}$/.test(value) ? Number(value) : null);

export default async function PlanPage({ params }: { params: Promise<{ programId: string; planId: string }> }) {
  const { programId: rawProgramId, planId: rawPlanId } = await params;
  const member = await getCurrentMember();
  if (!member) redirect(`/sign-in?callbackUrl=/programs/${encodeURIComponent(rawProgramId)}/plans/${encodeURIComponent(rawPlanId)}`);
  const programId = parseId(rawProgramId);
  const planId = parseId(rawPlanId);
  if (programId === null || planId === null) notFound();
  const plan = await getPlanById({ workspaceId: member.workspaceId, planId });
  // Scoped by workspace: a plan of another workspace, or one filed under another program, is not found.
  if (!plan || plan.programId !== programId) notFound();

  const breadcrumb = (
    <PlanNav programId={programId} planId={planId} programName={plan.programName} planName={plan.name} current="Workspace" showWorkspace={canReadWorkInProgress(member)} />
  );

  if (!canReadWorkInProgress(member)) {
    return (
      <section className="space-y-4">
        {breadcrumb}
        <p role="alert" className="rounded-lg border border-dashed border-ink-soft/30 p-6">
          Draft channel plans are not shared with regulators; released revisions are.
        </p>
      </section>
    );
  }

  const readOnlyReason = plan.programArchivedAt ? 'its program is archived' : plan.archivedAt ? 'this plan is archived' : null;
  const parts = (await listParts({ workspaceId: member.workspaceId })).map(toPartOptionDto);
  return (
    <section className="space-y-4" aria-label={`Channel plan ${plan.name}`}>
      {breadcrumb}
      {readOnlyReason ? (
        <p role="status" className="text-sm text-verdict-marginal">
          Read-only: {readOnlyReason}.
        </p>
      ) : null}
      <PlanWorkspace
        planId={String(plan.id)}
        programId={String(plan.programId)}
        initialPlan={plan.plan as unknown as ChannelPlan}
        initialVersion={plan.version}
        canEdit={canEditPlans(member) && readOnlyReason === null}
        parts={parts}
        planName={plan.name}
      />
    </section>
  );
}
