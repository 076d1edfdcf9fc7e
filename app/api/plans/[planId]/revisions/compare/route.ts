import { NextResponse } from 'next/server';
import { getPlanById } from '@/db/queries/plans';
import { getRevisionById } from '@/db/queries/revisions';
import { AppError, errorResponse } from '@/features/auth/errors';
import { requireSession } from '@/features/auth/guard';
import { parseIdParam } from '@/app/api/programs/_shared/request';
import { compareRevisions } from '@/features/revisions/compare';
import type { ChannelReport } from '@/lib/engine/report';
import { canReadRevision, regulatorReadsReleasedOnly, revisionNotFound } from '@/app/api/revisions/_shared/access';
import { toRevisionSummaryDto } from '@/app/api/revisions/_shared/dto';

type Context = { params: Promise<{ planId: string }> };

/** GET ?from=<revisionId>&to=<revisionId>: two revisions of the plan compared (older → newer as given). */
export async function GET(request: Request, context: Context) {
  try {
    const planId = parseIdParam((await context.params).planId, 'plan');
    const search = new URL(request.url).searchParams;
    const fromRaw = search.get('from');
    const toRaw = search.get('to');
    if (!fromRaw || !toRaw) throw new AppError('invalid-input', 'Give two revisions to compare: ?from=<revision id>&to=<revision id>.');
    const fromId = parseIdParam(fromRaw, 'revision (from)');
    const toId = parseIdParam(toRaw, 'revision (to)');
    const member = await requireSession();
    const plan = await getPlanById({ workspaceId: member.workspaceId, planId });
    if (!plan) throw new AppError('not-found', 'No such plan in this workspace.');
    const [from, to] = await Promise.all([
      getRevisionById({ workspaceId: member.workspaceId, revisionId: fromId }),
      getRevisionById({ workspaceId: member.workspaceId, revisionId: toId }),
    ]);
    if (!from || !to || from.planId !== planId || to.planId !== planId) throw revisionNotFound();
    if (!canReadRevision(member, from) || !canReadRevision(member, to)) throw regulatorReadsReleasedOnly();
    const comparison = compareRevisions(
      { plan: from.plan, report: from.report as ChannelReport },
      { plan: to.plan, report: to.report as ChannelReport },
    );
    return NextResponse.json({ from: toRevisionSummaryDto(from), to: toRevisionSummaryDto(to), comparison });
  } catch (error) {
    return errorResponse(error);
  }
}
