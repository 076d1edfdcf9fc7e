import { NextResponse } from 'next/server';
import { addReviewComment } from '@/db/queries/reviews';
import { AppError, errorResponse } from '@/features/auth/errors';
import { parseIdParam, parseJsonBody } from '@/app/api/programs/_shared/request';
import { canComment } from '@/features/reviews/review-rules';
import { revisionStateLabels } from '@/features/revisions/revision-states';
import { loadRevisionForWrite, revisionNotFound } from '@/app/api/revisions/_shared/access';
import { addCommentBodySchema } from '@/app/api/revisions/[revisionId]/comments/schema';

type Context = { params: Promise<{ revisionId: string }> };

/** States in which the review record is open to comments. */
const openStates = new Set(['draft', 'in-review']);

/**
 * A comment anchored to a stage or a check, or a reply to a comment (everyone but the regulator),
 * while the revision is a draft or in review. 201 `{ comment: { id, anchorKind, anchorId } }`.
 */
export async function POST(request: Request, context: Context) {
  try {
    const revisionId = parseIdParam((await context.params).revisionId, 'revision');
    const input = await parseJsonBody(request, addCommentBodySchema);
    const { member, revision } = await loadRevisionForWrite(revisionId);
    if (!canComment(member.role)) throw new AppError('forbidden', 'Your role cannot comment.');
    if (!openStates.has(revision.state)) {
      throw new AppError(
        'conflict',
        `Revision ${revision.label} is ${revisionStateLabels[revision.state].toLowerCase()}; its review record is closed to new comments. Nothing was changed.`,
      );
    }
    if ('anchorKind' in input && input.anchorKind === 'check') {
      const checkIds = ((revision.report as { checks?: { id: string }[] }).checks ?? []).map((c) => c.id);
      if (!checkIds.includes(input.anchorId)) {
        throw new AppError('invalid-input', `anchorId: revision ${revision.label} has no check "${input.anchorId}"`, {
          anchorId: [`revision ${revision.label} has no check "${input.anchorId}"`],
        });
      }
    }
    const result = await addReviewComment({
      workspaceId: member.workspaceId,
      revisionId,
      authorUserId: member.userId,
      body: input.body,
      ...('parentCommentId' in input
        ? { parentCommentId: input.parentCommentId }
        : { anchor: { kind: input.anchorKind, id: input.anchorId } }),
    });
    if (result.status === 'not-found') throw revisionNotFound();
    if (result.status === 'parent-not-found') {
      throw new AppError('invalid-input', 'parentCommentId: no such comment on this revision', {
        parentCommentId: ['no such comment on this revision'],
      });
    }
    return NextResponse.json({ comment: { id: String(result.id), anchorKind: result.anchorKind, anchorId: result.anchorId } }, { status: 201 });
  } catch (error) {
    return errorResponse(error);
  }
}
