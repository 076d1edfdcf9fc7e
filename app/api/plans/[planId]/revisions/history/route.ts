import { NextResponse } from 'next/server';
import { getPlanById } from '@/db/queries/plans';
import { listPlanAuditEvents } from '@/db/queries/revisions';
import { AppError, errorResponse } from '@/features/auth/errors';
import { requireSession } from '@/features/auth/guard';
import { toHistoryEntry } from '@/features/history/history-entry';
import { parseIdParam } from '@/app/api/programs/_shared/request';
import { releasedStates } from '@/features/revisions/revision-states';
import { canReadWorkInProgress } from '@/lib/auth/permissions';

type Context = { params: Promise<{ planId: string }> };

/** The plan's audit trail (its own events and its revisions'); a regulator sees released revisions' events only. */
export async function GET(_request: Request, context: Context) {
  try {
    const planId = parseIdParam((await context.params).planId, 'plan');
    const member = await requireSession();
    const plan = await getPlanById({ workspaceId: member.workspaceId, planId });
    if (!plan) throw new AppError('not-found', 'No such plan in this workspace.');
    const events = await listPlanAuditEvents({
      workspaceId: member.workspaceId,
      planId,
      revisionStates: canReadWorkInProgress(member) ? undefined : releasedStates,
    });
    return NextResponse.json({ events: events.map(toHistoryEntry) });
  } catch (error) {
    return errorResponse(error);
  }
}
