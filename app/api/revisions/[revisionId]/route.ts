import { NextResponse } from 'next/server';
import { getReviewRecord } from '@/db/queries/reviews';
import { errorResponse } from '@/features/auth/errors';
import { requireSession } from '@/features/auth/guard';
import { parseIdParam } from '@/app/api/programs/_shared/request';
import { canWriteAnything } from '@/lib/auth/permissions';
import { loadReadableRevision, regulatorNeverWrites } from '@/app/api/revisions/_shared/access';
import { toReviewRecordDto, toRevisionDetailDto } from '@/app/api/revisions/_shared/dto';

type Context = { params: Promise<{ revisionId: string }> };

/** One revision with its frozen plan and report and its review record. */
export async function GET(_request: Request, context: Context) {
  try {
    const revisionId = parseIdParam((await context.params).revisionId, 'revision');
    const { member, revision } = await loadReadableRevision(revisionId);
    const review = await getReviewRecord({ workspaceId: member.workspaceId, revisionId });
    return NextResponse.json({ revision: toRevisionDetailDto(revision), review: toReviewRecordDto(review) });
  } catch (error) {
    return errorResponse(error);
  }
}

/**
 * A revision's content never changes and a revision is never deleted: every attempt is refused
 * (after the session is checked, so a signed-out caller learns nothing), and nothing is written.
 */
async function refuseChange(context: Context) {
  try {
    parseIdParam((await context.params).revisionId, 'revision');
    const member = await requireSession();
    if (!canWriteAnything(member)) throw regulatorNeverWrites();
    return NextResponse.json(
      {
        error: {
          code: 'immutable',
          message: 'A revision cannot be changed or deleted; freeze a new revision from the plan instead. Nothing was changed.',
        },
      },
      { status: 405, headers: { Allow: 'GET' } },
    );
  } catch (error) {
    return errorResponse(error);
  }
}

export async function PUT(_request: Request, context: Context) {
  return refuseChange(context);
}
export async function PATCH(_request: Request, context: Context) {
  return refuseChange(context);
}
export async function DELETE(_request: Request, context: Context) {
  return refuseChange(context);
}
