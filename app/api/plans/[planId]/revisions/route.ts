import { NextResponse } from 'next/server';
import { getPlanById } from '@/db/queries/plans';
import { createRevision, listRevisions } from '@/db/queries/revisions';
import { AppError } from '@/features/auth/errors';
import { requireSession } from '@/features/auth/guard';
import { computePlan } from '@/features/plans/compute-plan';
import { planErrorResponse } from '@/app/api/plans/_shared/plan-error-response';
import { parseIdParam, parseJsonBody } from '@/app/api/programs/_shared/request';
import { contentHash } from '@/features/rationale-export/content-hash';
import { maxRevisionSequence, revisionLabel } from '@/features/revisions/revision-label';
import { releasedStates } from '@/features/revisions/revision-states';
import { canEditPlans, canReadWorkInProgress } from '@/lib/auth/permissions';
import type { ChannelPlan } from '@/lib/engine/plan';
import { freezeRevisionBodySchema } from '@/app/api/plans/[planId]/revisions/schema';
import { regulatorNeverWrites } from '@/app/api/revisions/_shared/access';
import { toRevisionSummaryDto } from '@/app/api/revisions/_shared/dto';

type Context = { params: Promise<{ planId: string }> };
const planNotFound = () => new AppError('not-found', 'No such plan in this workspace.');

/** The plan's revisions, newest first; a regulator sees released and superseded ones only. */
export async function GET(_request: Request, context: Context) {
  try {
    const planId = parseIdParam((await context.params).planId, 'plan');
    const member = await requireSession();
    const plan = await getPlanById({ workspaceId: member.workspaceId, planId });
    if (!plan) throw planNotFound();
    const revisions = await listRevisions({
      workspaceId: member.workspaceId,
      planId,
      states: canReadWorkInProgress(member) ? undefined : releasedStates,
    });
    return NextResponse.json({ revisions: revisions.map(toRevisionSummaryDto) });
  } catch (error) {
    return planErrorResponse(error);
  }
}

/**
 * Freezes the stored plan as its next revision (engineers and admins): the server validates the plan
 * again and recomputes its report, hashes both, and stores them immutably. 201 `{ revision }`;
 * 409 when the plan changed since `planVersion`; 422 for a bad body or an invalid stored plan.
 */
export async function POST(request: Request, context: Context) {
  try {
    const planId = parseIdParam((await context.params).planId, 'plan');
    const input = await parseJsonBody(request, freezeRevisionBodySchema);
    const member = await requireSession();
    const plan = await getPlanById({ workspaceId: member.workspaceId, planId });
    if (!plan) throw planNotFound();
    if (member.role === 'regulator') throw regulatorNeverWrites();
    if (!canEditPlans(member)) throw new AppError('forbidden', 'Only engineers and admins can freeze revisions.');
    if (plan.archivedAt || plan.programArchivedAt) {
      throw new AppError('conflict', 'This plan or its program is archived; restore it before freezing a revision.');
    }
    if (plan.version !== input.planVersion) {
      throw new AppError(
        'conflict',
        `The plan was saved again (version ${plan.version}) after you loaded version ${input.planVersion}; reload it and freeze again. Nothing was frozen.`,
      );
    }
    const computed = computePlan(plan.plan);
    const hash = contentHash({ plan: computed.plan as unknown as ChannelPlan, report: computed.report });
    const result = await createRevision({
      workspaceId: member.workspaceId,
      planId,
      userId: member.userId,
      changeSummary: input.changeSummary,
      planVersion: input.planVersion,
      content: { plan: computed.plan, report: computed.report, contentHash: hash, worstVerdict: computed.worstVerdict },
      labelFor: revisionLabel,
      maxSequence: maxRevisionSequence,
    });
    if (result.status === 'not-found') throw planNotFound();
    if (result.status === 'stale') {
      throw new AppError('conflict', `The plan was saved again (version ${result.currentVersion}) meanwhile; reload it and freeze again. Nothing was frozen.`);
    }
    if (result.status === 'too-many') throw new AppError('conflict', `A plan holds at most ${maxRevisionSequence} revisions.`);
    const revisions = await listRevisions({ workspaceId: member.workspaceId, planId });
    const created = revisions.find((r) => r.id === result.id)!;
    return NextResponse.json({ revision: toRevisionSummaryDto(created) }, { status: 201 });
  } catch (error) {
    return planErrorResponse(error);
  }
}
