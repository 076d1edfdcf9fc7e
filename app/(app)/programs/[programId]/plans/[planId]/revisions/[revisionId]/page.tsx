import type { Metadata } from 'next';
import Link from 'next/link';
import { notFound } from 'next/navigation';
import { getReviewRecord, listEligibleReviewers } from '@/db/queries/reviews';
import { getRevisionById, listRevisionAuditEvents, listRevisionStateEvents } from '@/db/queries/revisions';
import { toHistoryEntry } from '@/features/history/history-entry';
import { HistoryTable } from '@/features/history/components/history-table';
import { CommentsPanel } from '@/features/reviews/components/comments-panel';
import { RequestReviewForm } from '@/features/reviews/components/request-review-form';
import { SignReviewForm } from '@/features/reviews/components/sign-review-form';
import { reviewerRoles } from '@/features/reviews/review-rules';
import { checkRowsOf, headlineRowsOf } from '@/features/revisions/compare';
import { ExportButtons } from '@/features/revisions/components/export-buttons';
import { StateBadge, VerdictText } from '@/features/revisions/components/state-badge';
import { isReleasedState, revisionStateLabels } from '@/features/revisions/revision-states';
import { planningAidCaution } from '@/lib/cautions';
import { canReadWorkInProgress, canRequestReview, canWriteAnything } from '@/lib/auth/permissions';
import { roleLabels } from '@/lib/auth/roles';
import type { ChannelReport } from '@/lib/engine/report';
import { loadPlanPage, parseId } from '@/app/(app)/programs/[programId]/plans/[planId]/_shared/load-plan';
import { PlanNav } from '@/app/(app)/programs/[programId]/plans/[planId]/_shared/plan-nav';

export const metadata: Metadata = { title: 'Revision' };
export const dynamic = 'force-dynamic';

const when = (d: Date) => d.toISOString().slice(0, 16).replace('T', ' ') + ' UTC';

export default async function RevisionPage({ params }: { params: Promise<{ programId: string; planId: string; revisionId: string }> }) {
  const raw = await params;
  const { member, plan, programId, planId } = await loadPlanPage(raw, `/programs/${raw.programId}/plans/${raw.planId}/revisions/${raw.revisionId}`);
  const revisionId = parseId(raw.revisionId);
  if (revisionId === null) notFound();
  const revision = await getRevisionById({ workspaceId: member.workspaceId, revisionId });
  if (!revision || revision.planId !== planId) notFound();
  const readsAll = canReadWorkInProgress(member);
  const nav = (
    <PlanNav programId={programId} planId={planId} programName={plan.programName} planName={plan.name} current={`Revision ${revision.label}`} showWorkspace={readsAll} />
  );
  if (!readsAll && !isReleasedState(revision.state)) {
    return (
      <section className="space-y-4">
        {nav}
        <p role="alert" className="rounded-lg border border-dashed border-ink-soft/30 p-6">
          Regulators see released revisions only; this revision has not been released.
        </p>
      </section>
    );
  }

  const [review, auditEvents, stateEvents] = await Promise.all([
    getReviewRecord({ workspaceId: member.workspaceId, revisionId }),
    listRevisionAuditEvents({ workspaceId: member.workspaceId, revisionId }),
    listRevisionStateEvents({ workspaceId: member.workspaceId, revisionId }),
  ]);
  const report = revision.report as ChannelReport;
  const checks = checkRowsOf(report);
  const latestRequest = review.requests.at(-1);
  const writes = canWriteAnything(member);
  const isAuthorOrRequester = member.userId === revision.createdByUserId || member.userId === latestRequest?.requestedByUserId;
  const canSign =
    writes &&
    revision.state === 'in-review' &&
    !!latestRequest &&
    !isAuthorOrRequester &&
    latestRequest.reviewers.some((r) => r.userId === member.userId) &&
    !review.signatures.some((s) => s.reviewRequestId === latestRequest.id && s.signerUserId === member.userId);
  const reviewerOptions =
    writes && canRequestReview(member) && revision.state === 'draft'
      ? (await listEligibleReviewers({ workspaceId: member.workspaceId, roles: reviewerRoles }))
          .filter((r) => r.userId !== member.userId && r.userId !== revision.createdByUserId)
          .map((r) => ({ userId: String(r.userId), name: r.name, role: roleLabels[r.role] }))
      : null;
  const commentsOpen = writes && (revision.state === 'draft' || revision.state === 'in-review');

  return (
    <section aria-labelledby="revision-heading" className="space-y-8">
      {nav}
      <header className="space-y-2">
        <h1 id="revision-heading" className="flex flex-wrap items-center gap-3 text-2xl font-semibold">
          Revision {revision.label} <StateBadge state={revision.state} />
        </h1>
        <p>{revision.changeSummary}</p>
        <dl className="grid grid-cols-[max-content_1fr] gap-x-4 gap-y-1 text-sm">
          <dt className="text-ink-soft">Frozen</dt>
          <dd>
            {when(revision.createdAt)} by {revision.createdByName} (plan version {revision.planVersion})
          </dd>
          <dt className="text-ink-soft">State</dt>
          <dd>
            {revisionStateLabels[revision.state]} since {when(revision.stateChangedAt)}
          </dd>
          <dt className="text-ink-soft">Content hash (SHA-256)</dt>
          <dd>
            <code className="break-all text-xs">{revision.contentHash}</code>
          </dd>
        </dl>
        <p className="text-xs text-ink-soft">{planningAidCaution}</p>
      </header>

      <section aria-labelledby="export-heading" className="space-y-2">
        <h2 id="export-heading" className="text-lg font-semibold">
          Design rationale
        </h2>
        <ExportButtons revisionId={String(revision.id)} label={revision.label} />
      </section>

      <section aria-labelledby="results-heading" className="grid gap-6 lg:grid-cols-2">
        <div>
          <h2 id="results-heading" className="mb-2 text-lg font-semibold">
            Headline results
          </h2>
          <table className="w-full text-sm">
            <tbody>
              {headlineRowsOf(report).map((row) => (
                <tr key={row.id} className="border-b border-ink-soft/10">
                  <th scope="row" className="py-1 pr-3 text-left font-normal text-ink-soft">
                    {row.label}
                  </th>
                  <td className="py-1 text-right tabular-nums">{row.text}</td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
        <div>
          <h2 className="mb-2 text-lg font-semibold">Checks</h2>
          <table className="w-full text-sm">
            <thead>
              <tr className="border-b border-ink-soft/30 text-left">
                <th scope="col" className="py-1 pr-2">Check</th>
                <th scope="col" className="py-1 pr-2 text-right">Value</th>
                <th scope="col" className="py-1 pr-2 text-right">Limit</th>
                <th scope="col" className="py-1">Verdict</th>
              </tr>
            </thead>
            <tbody>
              {checks.map((c) => (
                <tr key={c.id} className="border-b border-ink-soft/10">
                  <td className="py-1 pr-2">{c.title}</td>
                  <td className="py-1 pr-2 text-right tabular-nums">{c.valueText}</td>
                  <td className="py-1 pr-2 text-right tabular-nums">{c.limitText}</td>
                  <td className="py-1">
                    <VerdictText verdict={c.verdict} />
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      </section>

      <section aria-labelledby="review-heading" className="space-y-4">
        <h2 id="review-heading" className="text-lg font-semibold">
          Review
        </h2>
        {review.requests.length === 0 ? <p className="text-sm text-ink-soft">No review requested yet.</p> : null}
        {review.requests.map((r) => (
          <p key={r.id} className="text-sm">
            Requested by {r.requestedByName} on {when(r.requestedAt)} from {r.reviewers.map((v) => v.name).join(', ')} ({r.status})
            {r.message ? <span className="block text-ink-soft">“{r.message}”</span> : null}
          </p>
        ))}
        {reviewerOptions ? <RequestReviewForm revisionId={String(revision.id)} label={revision.label} options={reviewerOptions} /> : null}
        <div>
          <h3 className="font-semibold">Signatures</h3>
          {review.signatures.length === 0 ? (
            <p className="text-sm text-ink-soft">None yet.</p>
          ) : (
            <ul className="text-sm">
              {review.signatures.map((s) => (
                <li key={s.id}>
                  <span className="font-medium">{s.signerName}</span> ({roleLabels[s.signerRole]}) {s.meaning === 'approved' ? 'approved' : 'requested changes'} on{' '}
                  {when(s.signedAt)}, signing hash <code className="text-xs">{s.contentHash.slice(0, 16)}…</code>
                  {s.note ? <span className="block text-ink-soft">“{s.note}”</span> : null}
                </li>
              ))}
            </ul>
          )}
        </div>
        {canSign ? <SignReviewForm revisionId={String(revision.id)} label={revision.label} contentHash={revision.contentHash} /> : null}
        <CommentsPanel
          revisionId={String(revision.id)}
          canWrite={commentsOpen}
          checks={checks.map((c) => ({ id: c.id, title: c.title }))}
          comments={review.comments.map((c) => ({
            id: String(c.id),
            parentCommentId: c.parentCommentId === null ? null : String(c.parentCommentId),
            anchorKind: c.anchorKind,
            anchorId: c.anchorId,
            body: c.body,
            createdAt: c.createdAt.toISOString(),
            authorName: c.authorName,
            resolved: c.resolvedAt !== null,
            resolvedByName: c.resolvedByName,
          }))}
        />
      </section>

      <section aria-labelledby="revision-history-heading" className="space-y-3">
        <h2 id="revision-history-heading" className="text-lg font-semibold">
          History of revision {revision.label}
        </h2>
        <ol className="text-sm">
          {stateEvents.map((s) => (
            <li key={s.id}>
              {when(s.at)}: {s.fromState ? `${revisionStateLabels[s.fromState]} → ` : ''}
              {revisionStateLabels[s.toState]} ({s.actorName ?? 'system'}{s.reason ? `, ${s.reason}` : ''})
            </li>
          ))}
        </ol>
        <HistoryTable entries={auditEvents.map((e) => toHistoryEntry(e))} caption="Audit trail" />
        <Link href={`/programs/${programId}/plans/${planId}/revisions/compare?to=${revision.id}`} className="text-sm text-copper-dark underline-offset-2 hover:underline">
          Compare with another revision
        </Link>
      </section>
    </section>
  );
}
