import 'server-only';
import type { ReviewRecord } from '@/db/queries/reviews';
import type { RevisionDetail, RevisionSummary } from '@/db/queries/revisions';

/** A revision as it travels to the browser (ids as strings, dates as ISO text, no bodies). */
export function toRevisionSummaryDto(row: RevisionSummary) {
  return {
    id: String(row.id),
    planId: String(row.planId),
    programId: String(row.programId),
    label: row.label,
    sequence: row.sequence,
    state: row.state,
    changeSummary: row.changeSummary,
    planVersion: row.planVersion,
    contentHash: row.contentHash,
    worstVerdict: row.worstVerdict,
    createdAt: row.createdAt.toISOString(),
    createdByName: row.createdByName,
    stateChangedAt: row.stateChangedAt.toISOString(),
    planName: row.planName,
    programName: row.programName,
  };
}

export function toRevisionDetailDto(row: RevisionDetail) {
  return { ...toRevisionSummaryDto(row), plan: row.plan, report: row.report };
}

export function toReviewRecordDto(record: ReviewRecord) {
  return {
    requests: record.requests.map((r) => ({
      id: String(r.id),
      status: r.status,
      message: r.message,
      requestedAt: r.requestedAt.toISOString(),
      closedAt: r.closedAt ? r.closedAt.toISOString() : null,
      requestedByName: r.requestedByName,
      reviewers: r.reviewers.map((v) => ({ userId: String(v.userId), name: v.name, role: v.role })),
    })),
    comments: record.comments.map((c) => ({
      id: String(c.id),
      parentCommentId: c.parentCommentId === null ? null : String(c.parentCommentId),
      anchorKind: c.anchorKind,
      anchorId: c.anchorId,
      body: c.body,
      createdAt: c.createdAt.toISOString(),
      authorName: c.authorName,
      resolved: c.resolvedAt !== null,
      resolvedAt: c.resolvedAt ? c.resolvedAt.toISOString() : null,
      resolvedByName: c.resolvedByName,
    })),
    signatures: record.signatures.map((s) => ({
      id: String(s.id),
      signerName: s.signerName,
      signerRole: s.signerRole,
      meaning: s.meaning,
      contentHash: s.contentHash,
      note: s.note,
      signedAt: s.signedAt.toISOString(),
    })),
  };
}
