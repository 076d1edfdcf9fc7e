import { NextResponse } from 'next/server';
import { listWorkspaceRevisions } from '@/db/queries/revisions';
import { errorResponse } from '@/features/auth/errors';
import { requireSession } from '@/features/auth/guard';
import { releasedStates } from '@/features/revisions/revision-states';
import { toRevisionSummaryDto } from '@/app/api/revisions/_shared/dto';

/** The workspace's released and superseded revisions (every role; the regulator's entry list). */
export async function GET() {
  try {
    const member = await requireSession();
    const revisions = await listWorkspaceRevisions({ workspaceId: member.workspaceId, states: releasedStates });
    return NextResponse.json({ revisions: revisions.map(toRevisionSummaryDto) });
  } catch (error) {
    return errorResponse(error);
  }
}
