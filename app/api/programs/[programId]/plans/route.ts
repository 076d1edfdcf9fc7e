import { NextResponse } from 'next/server';
import { createPlan, getPlanById, listPlans } from '@/db/queries/plans';
import { getProgramById } from '@/db/queries/programs';
import { AppError } from '@/features/auth/errors';
import { requireSession } from '@/features/auth/guard';
import { blankPlan } from '@/features/plans/blank-plan';
import { computePlan } from '@/features/plans/compute-plan';
import { planErrorResponse } from '@/app/api/plans/_shared/plan-error-response';
import { parseIdParam, parseJsonBody } from '@/app/api/programs/_shared/request';
import { getDemoTemplate } from '@/features/plans/templates';
import { toPlanSummaryDto } from '@/features/plans/types';
import { canEditPlans, canReadWorkInProgress } from '@/lib/auth/permissions';
import { createPlanBodySchema, listPlansQuerySchema } from '@/app/api/programs/[programId]/plans/schema';

type Context = { params: Promise<{ programId: string }> };

const programNotFound = () => new AppError('not-found', 'No such program in this workspace.');

/** The program's plans (drafts: admins, engineers and reviewers). */
export async function GET(request: Request, context: Context) {
  try {
    const programId = parseIdParam((await context.params).programId, 'program');
    const query = listPlansQuerySchema.safeParse(Object.fromEntries(new URL(request.url).searchParams));
    if (!query.success) throw new AppError('invalid-input', query.error.issues.map((i) => i.message).join('; '));
    const member = await requireSession();
    const program = await getProgramById({ workspaceId: member.workspaceId, programId });
    if (!program) throw programNotFound();
    if (!canReadWorkInProgress(member)) throw new AppError('forbidden', 'Draft plans are not shared with regulators; released revisions are.');
    const rows = await listPlans({ workspaceId: member.workspaceId, programId, includeArchived: query.data.archived === 'include' });
    return NextResponse.json({ plans: rows.map(toPlanSummaryDto) });
  } catch (error) {
    return planErrorResponse(error);
  }
}

/** Creates a plan: blank, from a demo template, or as a copy of a plan of the workspace (engineers and admins). */
export async function POST(request: Request, context: Context) {
  try {
    const programId = parseIdParam((await context.params).programId, 'program');
    const input = await parseJsonBody(request, createPlanBodySchema);
    const member = await requireSession();
    const program = await getProgramById({ workspaceId: member.workspaceId, programId });
    if (!program) throw programNotFound();
    if (!canEditPlans(member)) throw new AppError('forbidden', 'Only engineers and admins can create plans.');
    if (program.archivedAt) throw new AppError('conflict', 'This program is archived; restore it before adding plans.');

    let body: unknown;
    let name: string;
    if (input.source === 'blank') {
      name = input.name;
      body = blankPlan(name);
    } else if (input.source === 'template') {
      const template = getDemoTemplate(input.templateId);
      name = input.name ?? template.name;
      body = { ...template.plan, name };
    } else {
      const source = await getPlanById({ workspaceId: member.workspaceId, planId: input.planId });
      if (!source) throw new AppError('not-found', 'No such plan to duplicate in this workspace.');
      name = input.name ?? `Copy of ${source.name}`.slice(0, 200);
      body = { ...source.plan, name };
    }
    const computed = computePlan(body);
    const origin =
      input.source === 'blank'
        ? ({ kind: 'blank' } as const)
        : input.source === 'template'
          ? ({ kind: 'template', templateId: input.templateId } as const)
          : ({ kind: 'duplicate', sourcePlanId: input.planId } as const);
    const result = await createPlan({ workspaceId: member.workspaceId, programId, userId: member.userId, name, computed, origin });
    if (result.status === 'not-found') throw programNotFound();
    if (result.status === 'program-archived') throw new AppError('conflict', 'This program is archived; restore it before adding plans.');
    const created = await getPlanById({ workspaceId: member.workspaceId, planId: result.id });
    if (!created) throw new Error(`plan ${result.id} not readable right after creation`);
    return NextResponse.json({ plan: toPlanSummaryDto(created) }, { status: 201 });
  } catch (error) {
    return planErrorResponse(error);
  }
}
