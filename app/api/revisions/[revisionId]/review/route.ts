import { NextResponse } from 'next/server';
import { getReviewRecord, requestReview } from '@/db/queries/reviews';
import { AppError, errorResponse } from '@/features/auth/errors';
import { parseIdParam, parseJsonBody } from '@/app/api/programs/_shared/request';
import { reviewLink, reviewRequestMail } from '@/features/reviews/review-mail';
import { reviewerRoles } from '@/features/reviews/review-rules';
import { revisionStateLabels } from '@/features/revisions/revision-states';
import { canRequestReview } from '@/lib/auth/permissions';
import { loadReadableRevision, loadRevisionForWrite, revisionNotFound } from '@/app/api/revisions/_shared/access';
import { toReviewRecordDto } from '@/app/api/revisions/_shared/dto';
import { appUrl, sendReviewMails } from '@/app/api/revisions/_shared/mail';
import { requestReviewBodySchema } from '@/app/api/revisions/[revisionId]/review/schema';

type Context = { params: Promise<{ revisionId: string }> };

/** The revision's review record: requests, reviewers, comments, signatures. */
export async function GET(_request: Request, context: Context) {
  try {
    const revisionId = parseIdParam((await context.params).revisionId, 'revision');
    const { member } = await loadReadableRevision(revisionId);
    return NextResponse.json({ review: toReviewRecordDto(await getReviewRecord({ workspaceId: member.workspaceId, revisionId })) });
  } catch (error) {
    return errorResponse(error);
  }
}

/**
 * Asks chosen reviewers to review a draft revision (engineers and admins). The revision moves to
 * in review, and each reviewer gets an e-mail with a link to it. 201 `{ reviewRequestId, mailFailedFor }`.
 */
export async function POST(request: Request, context: Context) {
  try {
    const revisionId = parseIdParam((await context.params).revisionId, 'revision');
    const input = await parseJsonBody(request, requestReviewBodySchema);
    const { member, revision } = await loadRevisionForWrite(revisionId);
    if (!canRequestReview(member)) throw new AppError('forbidden', 'Only engineers and admins can request a review.');
    const result = await requestReview({
      workspaceId: member.workspaceId,
      revisionId,
      requesterUserId: member.userId,
      reviewerUserIds: input.reviewerUserIds,
      reviewerRoles,
      message: input.message,
    });
    if (result.status === 'not-found') throw revisionNotFound();
    if (result.status === 'wrong-state') {
      throw new AppError(
        'conflict',
        `Revision ${revision.label} is ${revisionStateLabels[result.state as keyof typeof revisionStateLabels].toLowerCase()}; only a draft revision can be sent for review. Nothing was changed.`,
      );
    }
    if (result.status === 'bad-reviewers') {
      throw new AppError('invalid-input', `reviewerUserIds: ${result.problems.join('; ')}`, { reviewerUserIds: result.problems });
    }
    const link = reviewLink(appUrl(), revisionId);
    const mailFailedFor = await sendReviewMails(
      result.reviewers.map((reviewer) =>
        reviewRequestMail({
          to: reviewer.email,
          reviewerName: reviewer.name,
          requesterName: member.name,
          planName: revision.planName,
          programName: revision.programName,
          revisionLabel: revision.label,
          changeSummary: revision.changeSummary,
          message: input.message,
          link,
        }),
      ),
    );
    return NextResponse.json({ reviewRequestId: String(result.reviewRequestId), mailFailedFor }, { status: 201 });
  } catch (error) {
    return errorResponse(error);
  }
}
