/**
 * Demo revisions and reviews for the "Larkspur Biosignals" workspace (all invented): the 12-lead
 * diagnostic cart plan has revision A released (reviewed and signed by the demo reviewer), and the
 * two-lead wearable patch has revision A under review with one open comment on its high-pass.
 * Called by `db/seed.ts` after the plans exist. Idempotent: a plan that already has revisions is
 * left as it is (revisions are immutable; the database refuses to change or delete them).
 * Every row is recorded in the audit trail as the app would record it.
 *
 * The content hash is SHA-256 of the canonical JSON of { plan, report } (RFC 8785 rules for plain
 * data: keys sorted by UTF-16 code units, no whitespace, numbers as JSON.stringify writes them), the
 * same rule as features/rationale-export/content-hash.ts; db/ cannot import features/, so it is
 * written out here and a test checks that both give the same hash for the seeded revisions.
 */
import { createHash } from 'node:crypto';
import { and, eq } from 'drizzle-orm';
import type { Database } from '@/db/connection';
import {
  auditEvents,
  channelPlans,
  planRevisions,
  reviewComments,
  reviewRequestReviewers,
  reviewRequests,
  reviewSignatures,
  revisionStateEvents,
} from '@/db/schema';
import type { Role } from '@/lib/auth/roles';
import { evaluate } from '@/lib/engine/evaluate';
import { parsePlan } from '@/lib/engine/validate';

export const demoReleasedPlanName = 'Larkspur 12-lead diagnostic cart front end';
export const demoInReviewPlanName = 'Larkspur two-lead wearable ECG patch';

function canonical(value: unknown): string {
  if (value === null || typeof value !== 'object') return JSON.stringify(value);
  if (Array.isArray(value)) return `[${value.map((v) => (v === undefined ? 'null' : canonical(v))).join(',')}]`;
  const record = value as Record<string, unknown>;
  return `{${Object.keys(record)
    .sort()
    .filter((k) => record[k] !== undefined)
    .map((k) => `${JSON.stringify(k)}:${canonical(record[k])}`)
    .join(',')}}`;
}

/** SHA-256 (hex) of the canonical JSON of { plan, report }. */
export function seedContentHash(plan: unknown, report: unknown): string {
  return createHash('sha256').update(canonical({ plan, report }), 'utf8').digest('hex');
}

const worstOf = (checks: { verdict: 'meets' | 'marginal' | 'fails' }[]) =>
  checks.some((c) => c.verdict === 'fails') ? 'fails' : checks.some((c) => c.verdict === 'marginal') ? 'marginal' : checks.length ? 'meets' : null;

export interface SeededReviews {
  releasedRevisionId: number | null;
  inReviewRevisionId: number | null;
}

/** Adds the demo revisions and reviews (see the module comment). */
export async function seedReviewData(
  db: Database,
  { workspaceId, userIds }: { workspaceId: number; userIds: Record<Role, number> },
): Promise<SeededReviews> {
  const engineer = userIds.engineer;
  const reviewer = userIds.reviewer;

  async function freezeA(planName: string, changeSummary: string) {
    return db.transaction(async (tx) => {
      const [plan] = await tx
        .select({ id: channelPlans.id, plan: channelPlans.plan, version: channelPlans.version })
        .from(channelPlans)
        .where(and(eq(channelPlans.workspaceId, workspaceId), eq(channelPlans.name, planName)))
        .for('update');
      if (!plan) return null;
      const [existing] = await tx.select({ id: planRevisions.id }).from(planRevisions).where(eq(planRevisions.planId, plan.id)).limit(1);
      if (existing) return null;
      const validated = parsePlan(plan.plan);
      const report = evaluate(validated);
      const frozenPlan = JSON.parse(JSON.stringify(validated)) as Record<string, unknown>;
      const frozenReport = JSON.parse(JSON.stringify(report)) as unknown;
      const contentHash = seedContentHash(frozenPlan, frozenReport);
      const [created] = await tx
        .insert(planRevisions)
        .values({
          workspaceId,
          planId: plan.id,
          sequence: 1,
          label: 'A',
          changeSummary,
          planVersion: plan.version,
          plan: frozenPlan,
          report: frozenReport,
          contentHash,
          worstVerdict: worstOf(report.checks),
          createdByUserId: engineer,
          state: 'draft',
        })
        .$returningId();
      const revisionId = created.id;
      const audit = (actorUserId: number, action: string, before: unknown, after: unknown) =>
        tx.insert(auditEvents).values({ workspaceId, actorUserId, action, entityType: 'plan-revision', entityId: String(revisionId), before, after });
      const moveState = async (actorUserId: number, from: 'draft' | 'in-review', to: 'in-review' | 'released', reason: string) => {
        await tx.update(planRevisions).set({ state: to, stateChangedAt: new Date() }).where(eq(planRevisions.id, revisionId));
        await tx.insert(revisionStateEvents).values({ workspaceId, revisionId, fromState: from, toState: to, actorUserId, reason });
        await audit(actorUserId, 'revision.state-changed', { state: from }, { state: to, reason, seeded: true });
      };

      await tx.insert(revisionStateEvents).values({ workspaceId, revisionId, fromState: null, toState: 'draft', actorUserId: engineer, reason: 'frozen from the plan' });
      await audit(engineer, 'revision.created', null, {
        planId: plan.id,
        label: 'A',
        sequence: 1,
        planVersion: plan.version,
        changeSummary,
        contentHash,
        state: 'draft',
        seeded: true,
      });
      const message = 'Please review the first frozen design.';
      const [request] = await tx.insert(reviewRequests).values({ workspaceId, revisionId, requestedByUserId: engineer, message, status: 'open' }).$returningId();
      await tx.insert(reviewRequestReviewers).values({ reviewRequestId: request.id, reviewerUserId: reviewer });
      await moveState(engineer, 'draft', 'in-review', 'review requested');
      await audit(engineer, 'review.requested', null, { reviewRequestId: request.id, reviewerUserIds: [reviewer], message, seeded: true });
      return { revisionId, requestId: request.id, contentHash };
    });
  }

  // Released: the diagnostic cart, approved by the demo reviewer.
  let releasedRevisionId: number | null = null;
  const cart = await freezeA(demoReleasedPlanName, 'First frozen design of the 12-lead front end for the design review.');
  if (cart) {
    releasedRevisionId = cart.revisionId;
    await db.transaction(async (tx) => {
      const [signature] = await tx
        .insert(reviewSignatures)
        .values({
          workspaceId,
          revisionId: cart.revisionId,
          reviewRequestId: cart.requestId,
          signerUserId: reviewer,
          signerRole: 'reviewer',
          meaning: 'approved',
          contentHash: cart.contentHash,
          note: 'Impulse test and common-mode rejection checked against the profile.',
        })
        .$returningId();
      await tx.insert(auditEvents).values({
        workspaceId,
        actorUserId: reviewer,
        action: 'review.signed',
        entityType: 'plan-revision',
        entityId: String(cart.revisionId),
        before: null,
        after: { signatureId: signature.id, reviewRequestId: cart.requestId, meaning: 'approved', contentHash: cart.contentHash, signerRole: 'reviewer', seeded: true },
      });
      await tx.update(reviewRequests).set({ status: 'approved', closedAt: new Date() }).where(eq(reviewRequests.id, cart.requestId));
      await tx.update(planRevisions).set({ state: 'released', stateChangedAt: new Date() }).where(eq(planRevisions.id, cart.revisionId));
      await tx.insert(revisionStateEvents).values({
        workspaceId,
        revisionId: cart.revisionId,
        fromState: 'in-review',
        toState: 'released',
        actorUserId: reviewer,
        reason: 'every requested reviewer approved',
      });
      await tx.insert(auditEvents).values({
        workspaceId,
        actorUserId: reviewer,
        action: 'revision.state-changed',
        entityType: 'plan-revision',
        entityId: String(cart.revisionId),
        before: { state: 'in-review' },
        after: { state: 'released', reason: 'every requested reviewer approved', seeded: true },
      });
    });
  }

  // Under review: the wearable patch, with one open comment on its high-pass.
  let inReviewRevisionId: number | null = null;
  const patch = await freezeA(demoInReviewPlanName, 'First frozen design of the wearable patch for the design review.');
  if (patch) {
    inReviewRevisionId = patch.revisionId;
    await db.transaction(async (tx) => {
      const body = 'Is a 0.5 Hz corner acceptable for the monitoring profile? Please show the recovery time after motion.';
      const [created] = await tx
        .insert(reviewComments)
        .values({ workspaceId, revisionId: patch.revisionId, authorUserId: reviewer, anchorKind: 'stage', anchorId: 'high-pass', body })
        .$returningId();
      await tx.insert(auditEvents).values({
        workspaceId,
        actorUserId: reviewer,
        action: 'review.comment-added',
        entityType: 'plan-revision',
        entityId: String(patch.revisionId),
        before: null,
        after: { commentId: created.id, parentCommentId: null, anchor: { kind: 'stage', id: 'high-pass' }, body, seeded: true },
      });
    });
  }
  return { releasedRevisionId, inReviewRevisionId };
}
