/**
 * Who takes part in a review, and when a review is decided. Pure.
 *
 * - Reviewers are chosen among members whose role is reviewer or admin.
 * - Neither the author of the revision nor the person who asked for the review may sign it.
 * - One request for changes decides the review (changes requested); otherwise the revision is
 *   released once every requested reviewer has approved.
 */
import { canCommentOnReview, canDecideReview } from '@/lib/auth/permissions';
import { roles, type Role } from '@/lib/auth/roles';

/** Roles that may be asked to review and sign. */
export const reviewerRoles: readonly Role[] = roles.filter((role) => canDecideReview({ role }));

export function isEligibleReviewerRole(role: Role): boolean {
  return canDecideReview({ role });
}

/** Comments and replies: everyone but the regulator (who never writes). */
export function canComment(role: Role): boolean {
  return canCommentOnReview({ role });
}

export type ReviewOutcome = 'pending' | 'approved' | 'changes-requested';

/**
 * The state of a review from its requested reviewers and the signatures given so far.
 * @example reviewOutcome([1, 2], [{ signerUserId: 1, meaning: 'approved' }]) // 'pending'
 */
export function reviewOutcome(
  reviewerUserIds: readonly number[],
  signatures: readonly { signerUserId: number; meaning: 'approved' | 'changes-requested' }[],
): ReviewOutcome {
  if (signatures.some((s) => s.meaning === 'changes-requested')) return 'changes-requested';
  const approved = new Set(signatures.filter((s) => s.meaning === 'approved').map((s) => s.signerUserId));
  return reviewerUserIds.length > 0 && reviewerUserIds.every((id) => approved.has(id)) ? 'approved' : 'pending';
}
