import { NextResponse } from 'next/server';
import { getReviewCommentById, setReviewCommentResolved } from '@/db/queries/reviews';
import { getRevisionById } from '@/db/queries/revisions';
import { AppError, errorResponse } from '@/features/auth/errors';
import { requireSession } from '@/features/auth/guard';
import { parseIdParam, parseJsonBody } from '@/app/api/programs/_shared/request';
import { canComment } from '@/features/reviews/review-rules';
import { revisionStateLabels } from '@/features/revisions/revision-states';
import { regulatorNeverWrites } from '@/app/api/revisions/_shared/access';
import { resolveCommentBodySchema } from '@/app/api/reviews/comments/[commentId]/schema';

type Context = { params: Promise<{ commentId: string }> };
const commentNotFound = () => new AppError('not-found', 'No such comment in this workspace.');

/** Resolves or reopens a comment thread (everyone but the regulator) while its revision is a draft or in review. */
export async function PATCH(request: Request, context: Context) {
  try {
    const commentId = parseIdParam((await context.params).commentId, 'comment');
    const input = await parseJsonBody(request, resolveCommentBodySchema);
    const member = await requireSession();
    const comment = await getReviewCommentById({ workspaceId: member.workspaceId, commentId });
    if (!comment) throw commentNotFound();
    if (!canComment(member.role)) throw regulatorNeverWrites();
    if (comment.parentCommentId !== null) {
      throw new AppError('invalid-input', 'commentId: replies are resolved with their thread; resolve the first comment of the thread', {
        commentId: ['resolve the first comment of the thread'],
      });
    }
    const revision = await getRevisionById({ workspaceId: member.workspaceId, revisionId: comment.revisionId });
    if (!revision) throw commentNotFound();
    if (revision.state !== 'draft' && revision.state !== 'in-review') {
      throw new AppError(
        'conflict',
        `Revision ${revision.label} is ${revisionStateLabels[revision.state].toLowerCase()}; its review record is closed. Nothing was changed.`,
      );
    }
    const result = await setReviewCommentResolved({ workspaceId: member.workspaceId, commentId, userId: member.userId, resolved: input.resolved });
    if (result.status === 'not-found') throw commentNotFound();
    return NextResponse.json({ comment: { id: String(commentId), resolved: input.resolved }, changed: result.status === 'changed' });
  } catch (error) {
    return errorResponse(error);
  }
}
