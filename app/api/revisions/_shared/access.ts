import 'server-only';
import type { MemberContext } from '@/db/queries/memberships';
import { getRevisionById, type RevisionDetail } from '@/db/queries/revisions';
import { AppError } from '@/features/auth/errors';
import { requireSession } from '@/features/auth/guard';
import { isReleasedState } from '@/features/revisions/revision-states';
import { canReadWorkInProgress, canWriteAnything } from '@/lib/auth/permissions';

export const revisionNotFound = () => new AppError('not-found', 'No such revision in this workspace.');
export const regulatorReadsReleasedOnly = () =>
  new AppError('forbidden', 'Regulators see released revisions only; this revision has not been released.');
export const regulatorNeverWrites = () => new AppError('forbidden', 'Regulators have read-only access; nothing was changed.');

/** True when the member may read this revision: everyone for released/superseded ones, regulators nothing else. */
export function canReadRevision(member: Pick<MemberContext, 'role'>, revision: Pick<RevisionDetail, 'state'>): boolean {
  return canReadWorkInProgress(member) || isReleasedState(revision.state);
}

/**
 * The session and the revision it may read (order: session → load → role).
 * @throws AppError 401 signed out, 404 not in the workspace, 403 a regulator on an unreleased revision
 */
export async function loadReadableRevision(revisionId: number): Promise<{ member: MemberContext; revision: RevisionDetail }> {
  const member = await requireSession();
  const revision = await getRevisionById({ workspaceId: member.workspaceId, revisionId });
  if (!revision) throw revisionNotFound();
  if (!canReadRevision(member, revision)) throw regulatorReadsReleasedOnly();
  return { member, revision };
}

/**
 * The session and the revision for a write: the regulator is refused before anything is loaded
 * beyond existence.
 * @throws AppError 401, 404, 403
 */
export async function loadRevisionForWrite(revisionId: number): Promise<{ member: MemberContext; revision: RevisionDetail }> {
  const member = await requireSession();
  const revision = await getRevisionById({ workspaceId: member.workspaceId, revisionId });
  if (!revision) throw revisionNotFound();
  if (!canWriteAnything(member)) throw regulatorNeverWrites();
  return { member, revision };
}
