/**
 * Who may read a revision's bench records: everyone who reads work in progress, and regulators
 * for released (or superseded) revisions, which is what they may read at all.
 */
import { canReadWorkInProgress, canUploadBenchRecords, type Actor } from '@/lib/auth/permissions';

type RevisionState = 'draft' | 'in-review' | 'released' | 'changes-requested' | 'superseded';

export function canReadBenchRecords(actor: Actor, revision: { state: RevisionState }): boolean {
  return canReadWorkInProgress(actor) || revision.state === 'released' || revision.state === 'superseded';
}

/** Upload and withdraw: engineers and admins (lib/auth/permissions). */
export function canWriteBenchRecords(actor: Actor): boolean {
  return canUploadBenchRecords(actor);
}
