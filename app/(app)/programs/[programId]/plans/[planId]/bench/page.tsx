import type { Metadata } from 'next';
import { notFound, redirect } from 'next/navigation';
import { getPlanHeadingForBench, listRevisionsForBench } from '@/db/queries/bench-records';
import { getCurrentMember } from '@/features/auth/guard';
import { canReadBenchRecords, canWriteBenchRecords } from '@/features/bench/access';
import { BenchWorkspace } from '@/features/bench/components/bench-workspace';
import { canReadWorkInProgress } from '@/lib/auth/permissions';
import { PlanNav } from '@/app/(app)/programs/[programId]/plans/[planId]/_shared/plan-nav';

export const metadata: Metadata = { title: 'Bench records' };
export const dynamic = 'force-dynamic';

const idPattern = /^[1-9][0-9]{0,15}$/;

export default async function BenchPage({ params }: { params: Promise<{ programId: string; planId: string }> }) {
  const { programId, planId } = await params;
  const member = await getCurrentMember();
  if (!member) redirect(`/sign-in?callbackUrl=/programs/${programId}/plans/${planId}/bench`);
  if (!idPattern.test(programId) || !idPattern.test(planId)) notFound();
  const plan = await getPlanHeadingForBench({ workspaceId: member.workspaceId, planId: Number(planId) });
  if (!plan || String(plan.programId) !== programId) notFound();
  const revisions = (await listRevisionsForBench({ workspaceId: member.workspaceId, planId: plan.id })).filter((r) => canReadBenchRecords(member, r));
  return (
    <section aria-labelledby="bench-heading" className="space-y-6">
      <div>
        <PlanNav programId={plan.programId} planId={plan.id} programName={plan.programName} planName={plan.name} current="Bench records" showWorkspace={canReadWorkInProgress(member)} />
        <h1 id="bench-heading" className="mt-4 text-2xl font-semibold">Bench records</h1>
        <p className="mt-1 text-ink-soft">Recordings from the prototype, attached to a revision, against what that revision predicted.</p>
      </div>
      {revisions.length === 0 ? (
        <p className="rounded-lg border border-dashed border-ink-soft/30 p-6 text-ink-soft">
          This plan has no revision{canWriteBenchRecords(member) ? ' yet. Freeze the plan as a revision first; bench records attach to a revision and are compared with its report.' : ' you can read.'}
        </p>
      ) : (
        <BenchWorkspace revisions={revisions.map((r) => ({ id: String(r.id), label: r.label, state: r.state }))} canUpload={canWriteBenchRecords(member)} />
      )}
    </section>
  );
}
