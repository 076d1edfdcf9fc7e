import { NextResponse } from 'next/server';
import { getPlanById, savePlan, updatePlanMeta } from '@/db/queries/plans';
import { AppError } from '@/features/auth/errors';
import { requireSession } from '@/features/auth/guard';
import { computePlan } from '@/features/plans/compute-plan';
import { planErrorResponse } from '@/app/api/plans/_shared/plan-error-response';
import { parseIdParam, parseJsonBody } from '@/app/api/programs/_shared/request';
import { toPlanDetailDto, toPlanSummaryDto } from '@/features/plans/types';
import { canEditPlans, canReadWorkInProgress } from '@/lib/auth/permissions';
import { savePlanBodySchema, updatePlanBodySchema } from '@/app/api/plans/[planId]/schema';

type Context = { params: Promise<{ planId: string }> };

const planNotFound = () => new AppError('not-found', 'No such plan in this workspace.');
const draftsNotShared = () => new AppError('forbidden', 'Draft plans are not shared with regulators; released revisions are.');

/** One plan with its stored report (admins, engineers, reviewers). */
export async function GET(_request: Request, context: Context) {
  try {
    const planId = parseIdParam((await context.params).planId, 'plan');
    const member = await requireSession();
    const plan = await getPlanById({ workspaceId: member.workspaceId, planId });
    if (!plan) throw planNotFound();
    if (!canReadWorkInProgress(member)) throw draftsNotShared();
    return NextResponse.json({ plan: toPlanDetailDto(plan) });
  } catch (error) {
    return planErrorResponse(error);
  }
}

/**
 * Saves `{ plan, version }`: the server validates the plan again, recomputes the report (the
 * record), and writes only if `version` is still the stored one. 200 `{ version, report }`;
 * 409 stale with the stored plan; 422 with every invalid field.
 */
export async function PUT(request: Request, context: Context) {
  try {
    const planId = parseIdParam((await context.params).planId, 'plan');
    const input = await parseJsonBody(request, savePlanBodySchema);
    const member = await requireSession();
    const existing = await getPlanById({ workspaceId: member.workspaceId, planId });
    if (!existing) throw planNotFound();
    if (!canEditPlans(member)) throw new AppError('forbidden', 'Only engineers and admins can edit plans.');
    if (existing.archivedAt || existing.programArchivedAt) {
      throw new AppError('conflict', 'This plan or its program is archived; restore it before editing.');
    }
    const computed = computePlan(input.plan);
    const result = await savePlan({
      planId,
      workspaceId: member.workspaceId,
      expectedVersion: input.version,
      computed,
      userId: member.userId,
    });
    if (result.status === 'not-found') throw planNotFound();
    return NextResponse.json({ version: result.version, report: computed.report });
  } catch (error) {
    return planErrorResponse(error);
  }
}

/** Rename, archive or restore (engineers and admins). A rename also renames the plan body and bumps its version. */
export async function PATCH(request: Request, context: Context) {
  try {
    const planId = parseIdParam((await context.params).planId, 'plan');
    const input = await parseJsonBody(request, updatePlanBodySchema);
    const member = await requireSession();
    const existing = await getPlanById({ workspaceId: member.workspaceId, planId });
    if (!existing) throw planNotFound();
    if (!canEditPlans(member)) throw new AppError('forbidden', 'Only engineers and admins can change plans.');
    if (existing.programArchivedAt) throw new AppError('conflict', 'This program is archived; restore it before changing its plans.');
    const renamed =
      input.name !== undefined && input.name !== existing.name
        ? { name: input.name, computed: computePlan({ ...existing.plan, name: input.name }) }
        : undefined;
    const result = await updatePlanMeta({
      workspaceId: member.workspaceId,
      planId,
      userId: member.userId,
      archived: input.archived,
      renamed,
    });
    if (result.status === 'not-found') throw planNotFound();
    const updated = await getPlanById({ workspaceId: member.workspaceId, planId });
    if (!updated) throw planNotFound();
    return NextResponse.json({ plan: toPlanSummaryDto(updated) });
  } catch (error) {
    return planErrorResponse(error);
  }
}
