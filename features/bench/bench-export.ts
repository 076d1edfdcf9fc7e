import 'server-only';
import { getLatestActiveBenchRecord } from '@/db/queries/bench-records';
import type { ComparisonRow } from '@/lib/bench/analyze';
import { toExportRows, type BenchExportRow } from '@/features/bench/record-analysis';

/**
 * The bench comparison of a revision for the design-rationale export: the rows of its newest record
 * that is not withdrawn, or undefined when it has none. The caller has already checked that the
 * member may read the revision.
 * @returns `{ rows: [{ quantity, predicted, measured, ratio, within }] }` plus which record they come from
 */
export async function getBenchExportForRevision({
  workspaceId,
  revisionId,
}: {
  workspaceId: number;
  revisionId: number;
}): Promise<{ rows: BenchExportRow[]; record: { id: string; fileName: string; sha256: string; channel: string; uploadedAt: string } } | undefined> {
  const record = await getLatestActiveBenchRecord({ workspaceId, revisionId });
  if (!record) return undefined;
  return {
    rows: toExportRows(record.comparison as ComparisonRow[]),
    record: { id: String(record.id), fileName: record.fileName, sha256: record.sha256, channel: record.channel, uploadedAt: record.createdAt.toISOString() },
  };
}
