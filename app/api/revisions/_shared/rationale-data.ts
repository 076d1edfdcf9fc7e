import 'server-only';
import type { ReviewRecord } from '@/db/queries/reviews';
import type { RevisionDetail } from '@/db/queries/revisions';
import type { BenchRow as RationaleBenchRow, RationaleInputData } from '@/features/rationale-export/rationale-input';

/** The plain data the design-rationale renderers take, from a stored revision and its review record. */
export function rationaleDataFor(
  revision: RevisionDetail,
  review: ReviewRecord,
  generatedBy: { name: string },
  generatedAt = new Date(),
  bench?: { rows: RationaleBenchRow[]; record: { fileName: string; channel: string; uploadedAt: string } },
): RationaleInputData {
  const reviewerNames = new Map<number, { name: string; role: string }>();
  for (const request of review.requests) for (const r of request.reviewers) reviewerNames.set(r.userId, { name: r.name, role: r.role ?? 'former member' });
  return {
    program: { name: revision.programName },
    plan: { name: revision.planName },
    revision: {
      label: revision.label,
      state: revision.state,
      createdAt: revision.createdAt,
      createdByName: revision.createdByName,
      changeSummary: revision.changeSummary,
      contentHash: revision.contentHash,
    },
    planInput: revision.plan,
    report: revision.report as RationaleInputData['report'],
    review: {
      requestedAt: review.requests[0]?.requestedAt,
      reviewers: [...reviewerNames.values()],
      comments: review.comments.map((c) => ({
        ...(c.anchorKind === 'stage' ? { stageId: c.anchorId } : { checkId: c.anchorId }),
        authorName: c.authorName,
        at: c.createdAt,
        body: c.body,
        resolved: c.resolvedAt !== null,
      })),
      signatures: review.signatures.map((s) => ({
        signerName: s.signerName,
        role: s.signerRole,
        meaning: s.meaning,
        at: s.signedAt,
        contentHash: s.contentHash,
      })),
    },
    ...(bench ? { bench: { recordName: `${bench.record.fileName} (channel ${bench.record.channel}, uploaded ${bench.record.uploadedAt.replace('T', ' ').slice(0, 16)} UTC)`, rows: bench.rows } } : {}),
    generatedAt,
    generatedByName: generatedBy.name,
  };
}
