import { NextResponse } from 'next/server';
import { signReview } from '@/db/queries/reviews';
import { getUserById } from '@/db/queries/users';
import { AppError, errorResponse } from '@/features/auth/errors';
import { verifyPassword } from '@/features/auth/password';
import { parseIdParam, parseJsonBody } from '@/app/api/programs/_shared/request';
import { reviewDecisionMail, reviewLink } from '@/features/reviews/review-mail';
import { reviewOutcome } from '@/features/reviews/review-rules';
import { revisionStateLabels } from '@/features/revisions/revision-states';
import { loadRevisionForWrite, revisionNotFound } from '@/app/api/revisions/_shared/access';
import { appUrl, sendReviewMails } from '@/app/api/revisions/_shared/mail';
import { signReviewBodySchema } from '@/app/api/revisions/[revisionId]/signatures/schema';

type Context = { params: Promise<{ revisionId: string }> };

export const wrongSignaturePasswordMessage = 'The password is not correct; nothing was signed.';

/**
 * A requested reviewer approves or asks for changes, signing with their password. The signature
 * records who, when, what it means and the content hash signed. When it completes the review the
 * revision is released (the older release superseded) or marked changes requested; the requester
 * is e-mailed each decision. 201 `{ signature: { id, meaning }, outcome, state }`.
 */
export async function POST(request: Request, context: Context) {
  try {
    const revisionId = parseIdParam((await context.params).revisionId, 'revision');
    const input = await parseJsonBody(request, signReviewBodySchema);
    const { member, revision } = await loadRevisionForWrite(revisionId);
    const user = await getUserById({ id: member.userId });
    if (!(await verifyPassword(input.password, user?.passwordHash ?? null))) {
      throw new AppError('invalid-input', `password: ${wrongSignaturePasswordMessage}`, { password: [wrongSignaturePasswordMessage] });
    }
    const result = await signReview({
      workspaceId: member.workspaceId,
      revisionId,
      signerUserId: member.userId,
      signerRole: member.role,
      meaning: input.meaning,
      contentHash: input.contentHash,
      note: input.note,
      decide: reviewOutcome,
    });
    switch (result.status) {
      case 'not-found':
        throw revisionNotFound();
      case 'superseded':
        throw new AppError('conflict', `Revision ${result.label} is superseded by a newer release; it can no longer be reviewed. Nothing was signed.`);
      case 'not-in-review':
        throw new AppError(
          'conflict',
          `Revision ${result.label} is ${revisionStateLabels[result.state as keyof typeof revisionStateLabels].toLowerCase()}, not in review; nothing was signed.`,
        );
      case 'own-revision':
        throw new AppError('forbidden', 'The author of a revision and the person who asked for its review cannot sign it. Nothing was signed.');
      case 'not-a-reviewer':
        throw new AppError('forbidden', 'Only the reviewers named in the review request can sign it. Nothing was signed.');
      case 'already-signed':
        throw new AppError(
          'conflict',
          `You already signed this review (${result.meaning === 'approved' ? 'approved' : 'changes requested'} at ${result.signedAt.toISOString()}); a signature cannot be given twice. Nothing was signed.`,
        );
      case 'hash-mismatch':
        throw new AppError(
          'conflict',
          `The content hash you signed does not match revision ${revision.label} (${revision.contentHash}); reload the revision. Nothing was signed.`,
        );
      case 'signed':
        break;
    }
    const mailFailedFor = await sendReviewMails([
      reviewDecisionMail({
        to: result.requester.email,
        signerName: member.name,
        meaning: input.meaning,
        planName: revision.planName,
        revisionLabel: revision.label,
        note: input.note,
        outcome: result.outcome,
        link: reviewLink(appUrl(), revisionId),
      }),
    ]);
    const state = result.outcome === 'approved' ? 'released' : result.outcome === 'changes-requested' ? 'changes-requested' : 'in-review';
    return NextResponse.json(
      { signature: { id: String(result.signatureId), meaning: input.meaning }, outcome: result.outcome, state, mailFailedFor },
      { status: 201 },
    );
  } catch (error) {
    return errorResponse(error);
  }
}
