import { NextResponse } from 'next/server';
import { listRevisionAuditEvents, listRevisionStateEvents } from '@/db/queries/revisions';
import { errorResponse } from '@/features/auth/errors';
import { toHistoryEntry } from '@/features/history/history-entry';
import { parseIdParam } from '@/app/api/programs/_shared/request';
import { loadReadableRevision } from '@/app/api/revisions/_shared/access';

type Context = { params: Promise<{ revisionId: string }> };

/** The revision's audit trail and state history (a regulator: released and superseded revisions only). */
export async function GET(_request: Request, context: Context) {
  try {
    const revisionId = parseIdParam((await context.params).revisionId, 'revision');
    const { member } = await loadReadableRevision(revisionId);
    const [events, states] = await Promise.all([
      listRevisionAuditEvents({ workspaceId: member.workspaceId, revisionId }),
      listRevisionStateEvents({ workspaceId: member.workspaceId, revisionId }),
    ]);
    return NextResponse.json({
      events: events.map((e) => toHistoryEntry(e)),
      states: states.map((s) => ({ ...s, id: String(s.id), at: s.at.toISOString() })),
    });
  } catch (error) {
    return errorResponse(error);
  }
}
