import 'server-only';
import { getRevisionForBench, type BenchRevision } from '@/db/queries/bench-records';
import type { MemberContext } from '@/db/queries/memberships';
import { AppError } from '@/features/auth/errors';
import { requireSession } from '@/features/auth/guard';
import { canReadBenchRecords } from '@/features/bench/access';

export const revisionNotFound = () => new AppError('not-found', 'No such revision in this workspace.');

/**
 * The session and a revision whose bench records it may read (session → load → role).
 * @throws AppError 401, 404 (not in the workspace), 403 (a regulator on an unreleased revision)
 */
export async function loadBenchRevision(revisionId: number): Promise<{ member: MemberContext; revision: BenchRevision }> {
  const member = await requireSession();
  const revision = await getRevisionForBench({ workspaceId: member.workspaceId, revisionId });
  if (!revision) throw revisionNotFound();
  if (!canReadBenchRecords(member, revision)) {
    throw new AppError('forbidden', 'Regulators see bench records of released revisions only; this revision has not been released.');
  }
  return { member, revision };
}
