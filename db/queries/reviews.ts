import 'server-only';
import { and, asc, desc, eq, inArray } from 'drizzle-orm';
import { alias } from 'drizzle-orm/mysql-core';
import { getDb } from '@/db/client';
import { insertAuditEvent } from '@/db/queries/audit-events';
import { changeRevisionState, releaseRevision, revisionEntityType } from '@/db/queries/revisions';
import {
  memberships,
  planRevisions,
  reviewComments,
  reviewRequestReviewers,
  reviewRequests,
  reviewSignatures,
  users,
  type Role,
} from '@/db/schema';

/** Members who can be asked to review (role reviewer or admin), by name. */
export async function listEligibleReviewers({ workspaceId, roles }: { workspaceId: number; roles: readonly Role[] }) {
  return getDb()
    .select({ userId: users.id, name: users.name, email: users.email, role: memberships.role })
    .from(memberships)
    .innerJoin(users, eq(users.id, memberships.userId))
    .where(and(eq(memberships.workspaceId, workspaceId), inArray(memberships.role, [...roles])))
    .orderBy(asc(users.name));
}

export type RequestReviewResult =
  | { status: 'requested'; reviewRequestId: number; reviewers: { userId: number; name: string; email: string }[] }
  | { status: 'not-found' }
  | { status: 'wrong-state'; state: string }
  | { status: 'bad-reviewers'; problems: string[] };

/**
 * Opens a review of a draft revision with the chosen reviewers and moves it to in-review, with the
 * audit events, in one transaction. Every reviewer must be a member with one of `reviewerRoles`,
 * and neither the requester nor the revision's author.
 */
export async function requestReview({
  workspaceId,
  revisionId,
  requesterUserId,
  reviewerUserIds,
  reviewerRoles,
  message,
}: {
  workspaceId: number;
  revisionId: number;
  requesterUserId: number;
  reviewerUserIds: number[];
  reviewerRoles: readonly Role[];
  message: string;
}): Promise<RequestReviewResult> {
  return getDb().transaction(async (tx) => {
    const [revision] = await tx
      .select({ id: planRevisions.id, state: planRevisions.state, createdByUserId: planRevisions.createdByUserId })
      .from(planRevisions)
      .where(and(eq(planRevisions.id, revisionId), eq(planRevisions.workspaceId, workspaceId)))
      .for('update');
    if (!revision) return { status: 'not-found' } as const;
    if (revision.state !== 'draft') return { status: 'wrong-state', state: revision.state } as const;

    const members = await tx
      .select({ userId: users.id, name: users.name, email: users.email, role: memberships.role })
      .from(memberships)
      .innerJoin(users, eq(users.id, memberships.userId))
      .where(and(eq(memberships.workspaceId, workspaceId), inArray(memberships.userId, reviewerUserIds)));
    const byId = new Map(members.map((m) => [m.userId, m]));
    const problems: string[] = [];
    for (const id of reviewerUserIds) {
      const member = byId.get(id);
      if (!member) problems.push(`member ${id} is not in this workspace`);
      else if (!reviewerRoles.includes(member.role)) problems.push(`${member.name} is ${member.role}; only reviewers and admins can review`);
      else if (id === requesterUserId) problems.push(`${member.name} is asking for the review and cannot review it`);
      else if (id === revision.createdByUserId) problems.push(`${member.name} froze this revision and cannot review it`);
    }
    if (problems.length > 0) return { status: 'bad-reviewers', problems } as const;

    const [request] = await tx
      .insert(reviewRequests)
      .values({ workspaceId, revisionId, requestedByUserId: requesterUserId, message, status: 'open' })
      .$returningId();
    await tx.insert(reviewRequestReviewers).values(reviewerUserIds.map((reviewerUserId) => ({ reviewRequestId: request.id, reviewerUserId })));
    await changeRevisionState(tx, {
      workspaceId,
      revisionId,
      from: 'draft',
      to: 'in-review',
      actorUserId: requesterUserId,
      reason: 'review requested',
    });
    await insertAuditEvent(tx, {
      workspaceId,
      actorUserId: requesterUserId,
      action: 'review.requested',
      entityType: revisionEntityType,
      entityId: revisionId,
      before: null,
      after: { reviewRequestId: request.id, reviewerUserIds, reviewerNames: reviewerUserIds.map((id) => byId.get(id)!.name), message },
    });
    return {
      status: 'requested',
      reviewRequestId: request.id,
      reviewers: reviewerUserIds.map((id) => {
        const m = byId.get(id)!;
        return { userId: m.userId, name: m.name, email: m.email };
      }),
    } as const;
  });
}

export interface ReviewRecord {
  requests: {
    id: number;
    status: string;
    message: string;
    requestedAt: Date;
    closedAt: Date | null;
    requestedByUserId: number;
    requestedByName: string;
    requestedByEmail: string;
    reviewers: { userId: number; name: string; role: Role | null }[];
  }[];
  comments: {
    id: number;
    parentCommentId: number | null;
    anchorKind: 'stage' | 'check';
    anchorId: string;
    body: string;
    createdAt: Date;
    authorUserId: number;
    authorName: string;
    resolvedAt: Date | null;
    resolvedByName: string | null;
  }[];
  signatures: {
    id: number;
    reviewRequestId: number;
    signerUserId: number;
    signerName: string;
    signerRole: Role;
    meaning: 'approved' | 'changes-requested';
    contentHash: string;
    note: string;
    signedAt: Date;
  }[];
}

/** Everything of a revision's review: requests with their reviewers, comments, signatures. */
export async function getReviewRecord({ workspaceId, revisionId }: { workspaceId: number; revisionId: number }): Promise<ReviewRecord> {
  const db = getDb();
  const requester = alias(users, 'requester');
  const requests = await db
    .select({
      id: reviewRequests.id,
      status: reviewRequests.status,
      message: reviewRequests.message,
      requestedAt: reviewRequests.requestedAt,
      closedAt: reviewRequests.closedAt,
      requestedByUserId: reviewRequests.requestedByUserId,
      requestedByName: requester.name,
      requestedByEmail: requester.email,
    })
    .from(reviewRequests)
    .innerJoin(requester, eq(requester.id, reviewRequests.requestedByUserId))
    .where(and(eq(reviewRequests.revisionId, revisionId), eq(reviewRequests.workspaceId, workspaceId)))
    .orderBy(asc(reviewRequests.requestedAt), asc(reviewRequests.id));
  const requestIds = requests.map((r) => r.id);
  const reviewerRows =
    requestIds.length === 0
      ? []
      : await db
          .select({ reviewRequestId: reviewRequestReviewers.reviewRequestId, userId: users.id, name: users.name, role: memberships.role })
          .from(reviewRequestReviewers)
          .innerJoin(users, eq(users.id, reviewRequestReviewers.reviewerUserId))
          .leftJoin(memberships, and(eq(memberships.userId, users.id), eq(memberships.workspaceId, workspaceId)))
          .where(inArray(reviewRequestReviewers.reviewRequestId, requestIds))
          .orderBy(asc(users.name));

  const commentAuthor = alias(users, 'comment_author');
  const resolver = alias(users, 'comment_resolver');
  const comments = await db
    .select({
      id: reviewComments.id,
      parentCommentId: reviewComments.parentCommentId,
      anchorKind: reviewComments.anchorKind,
      anchorId: reviewComments.anchorId,
      body: reviewComments.body,
      createdAt: reviewComments.createdAt,
      authorUserId: reviewComments.authorUserId,
      authorName: commentAuthor.name,
      resolvedAt: reviewComments.resolvedAt,
      resolvedByName: resolver.name,
    })
    .from(reviewComments)
    .innerJoin(commentAuthor, eq(commentAuthor.id, reviewComments.authorUserId))
    .leftJoin(resolver, eq(resolver.id, reviewComments.resolvedByUserId))
    .where(and(eq(reviewComments.revisionId, revisionId), eq(reviewComments.workspaceId, workspaceId)))
    .orderBy(asc(reviewComments.createdAt), asc(reviewComments.id));

  const signer = alias(users, 'signer');
  const signatures = await db
    .select({
      id: reviewSignatures.id,
      reviewRequestId: reviewSignatures.reviewRequestId,
      signerUserId: reviewSignatures.signerUserId,
      signerName: signer.name,
      signerRole: reviewSignatures.signerRole,
      meaning: reviewSignatures.meaning,
      contentHash: reviewSignatures.contentHash,
      note: reviewSignatures.note,
      signedAt: reviewSignatures.signedAt,
    })
    .from(reviewSignatures)
    .innerJoin(signer, eq(signer.id, reviewSignatures.signerUserId))
    .where(and(eq(reviewSignatures.revisionId, revisionId), eq(reviewSignatures.workspaceId, workspaceId)))
    .orderBy(asc(reviewSignatures.signedAt), asc(reviewSignatures.id));

  return {
    requests: requests.map((r) => ({
      ...r,
      reviewers: reviewerRows.filter((row) => row.reviewRequestId === r.id).map(({ userId, name, role }) => ({ userId, name, role })),
    })),
    comments,
    signatures,
  };
}

export type AddCommentResult =
  | { status: 'added'; id: number; anchorKind: 'stage' | 'check'; anchorId: string }
  | { status: 'not-found' }
  | { status: 'parent-not-found' };

/**
 * Adds a comment (anchored to a stage or a check) or a reply (which takes its parent's anchor) to a
 * revision, with its audit event, in one transaction.
 */
export async function addReviewComment({
  workspaceId,
  revisionId,
  authorUserId,
  anchor,
  parentCommentId,
  body,
}: {
  workspaceId: number;
  revisionId: number;
  authorUserId: number;
  anchor?: { kind: 'stage' | 'check'; id: string };
  parentCommentId?: number;
  body: string;
}): Promise<AddCommentResult> {
  return getDb().transaction(async (tx) => {
    const [revision] = await tx
      .select({ id: planRevisions.id })
      .from(planRevisions)
      .where(and(eq(planRevisions.id, revisionId), eq(planRevisions.workspaceId, workspaceId)))
      .for('update');
    if (!revision) return { status: 'not-found' } as const;
    let resolvedAnchor = anchor;
    if (parentCommentId !== undefined) {
      const [parent] = await tx
        .select({ anchorKind: reviewComments.anchorKind, anchorId: reviewComments.anchorId, parentCommentId: reviewComments.parentCommentId })
        .from(reviewComments)
        .where(and(eq(reviewComments.id, parentCommentId), eq(reviewComments.revisionId, revisionId), eq(reviewComments.workspaceId, workspaceId)));
      if (!parent) return { status: 'parent-not-found' } as const;
      resolvedAnchor = { kind: parent.anchorKind, id: parent.anchorId };
    }
    if (!resolvedAnchor) throw new Error('addReviewComment needs an anchor or a parent comment');
    const [created] = await tx
      .insert(reviewComments)
      .values({
        workspaceId,
        revisionId,
        parentCommentId: parentCommentId ?? null,
        authorUserId,
        anchorKind: resolvedAnchor.kind,
        anchorId: resolvedAnchor.id,
        body,
      })
      .$returningId();
    await insertAuditEvent(tx, {
      workspaceId,
      actorUserId: authorUserId,
      action: parentCommentId === undefined ? 'review.comment-added' : 'review.reply-added',
      entityType: revisionEntityType,
      entityId: revisionId,
      before: null,
      after: { commentId: created.id, parentCommentId: parentCommentId ?? null, anchor: resolvedAnchor, body },
    });
    return { status: 'added', id: created.id, anchorKind: resolvedAnchor.kind, anchorId: resolvedAnchor.id } as const;
  });
}

/** The comment if it belongs to the workspace (with its revision), else null. */
export async function getReviewCommentById({ workspaceId, commentId }: { workspaceId: number; commentId: number }) {
  const [row] = await getDb()
    .select({
      id: reviewComments.id,
      revisionId: reviewComments.revisionId,
      authorUserId: reviewComments.authorUserId,
      parentCommentId: reviewComments.parentCommentId,
      resolvedAt: reviewComments.resolvedAt,
    })
    .from(reviewComments)
    .where(and(eq(reviewComments.id, commentId), eq(reviewComments.workspaceId, workspaceId)))
    .limit(1);
  return row ?? null;
}

/** Resolves or reopens a comment thread, with its audit event. */
export async function setReviewCommentResolved({
  workspaceId,
  commentId,
  userId,
  resolved,
}: {
  workspaceId: number;
  commentId: number;
  userId: number;
  resolved: boolean;
}): Promise<{ status: 'changed' | 'unchanged' } | { status: 'not-found' }> {
  return getDb().transaction(async (tx) => {
    const scope = and(eq(reviewComments.id, commentId), eq(reviewComments.workspaceId, workspaceId));
    const [comment] = await tx
      .select({ revisionId: reviewComments.revisionId, resolvedAt: reviewComments.resolvedAt })
      .from(reviewComments)
      .where(scope)
      .for('update');
    if (!comment) return { status: 'not-found' } as const;
    if ((comment.resolvedAt !== null) === resolved) return { status: 'unchanged' } as const;
    await tx
      .update(reviewComments)
      .set(resolved ? { resolvedAt: new Date(), resolvedByUserId: userId } : { resolvedAt: null, resolvedByUserId: null })
      .where(scope);
    await insertAuditEvent(tx, {
      workspaceId,
      actorUserId: userId,
      action: resolved ? 'review.comment-resolved' : 'review.comment-reopened',
      entityType: revisionEntityType,
      entityId: comment.revisionId,
      before: { commentId, resolved: !resolved },
      after: { commentId, resolved },
    });
    return { status: 'changed' } as const;
  });
}

export type SignReviewResult =
  | {
      status: 'signed';
      signatureId: number;
      outcome: 'pending' | 'approved' | 'changes-requested';
      requester: { userId: number; name: string; email: string };
      supersededIds: number[];
    }
  | { status: 'not-found' }
  | { status: 'superseded'; label: string }
  | { status: 'not-in-review'; state: string; label: string }
  | { status: 'not-a-reviewer' }
  | { status: 'own-revision' }
  | { status: 'already-signed'; meaning: string; signedAt: Date }
  | { status: 'hash-mismatch' };

/**
 * Records a reviewer's signed decision and, when it decides the review, moves the revision (released,
 * with the older release superseded; or changes requested), with every audit event, in one
 * transaction. The caller has checked the signer's password.
 * @param decide the review outcome from the requested reviewers and the signatures so far
 */
export async function signReview({
  workspaceId,
  revisionId,
  signerUserId,
  signerRole,
  meaning,
  contentHash,
  note,
  decide,
}: {
  workspaceId: number;
  revisionId: number;
  signerUserId: number;
  signerRole: Role;
  meaning: 'approved' | 'changes-requested';
  contentHash: string;
  note: string;
  decide: (
    reviewerUserIds: number[],
    signatures: { signerUserId: number; meaning: 'approved' | 'changes-requested' }[],
  ) => 'pending' | 'approved' | 'changes-requested';
}): Promise<SignReviewResult> {
  return getDb().transaction(async (tx) => {
    const [revision] = await tx
      .select({
        id: planRevisions.id,
        planId: planRevisions.planId,
        label: planRevisions.label,
        state: planRevisions.state,
        contentHash: planRevisions.contentHash,
        createdByUserId: planRevisions.createdByUserId,
      })
      .from(planRevisions)
      .where(and(eq(planRevisions.id, revisionId), eq(planRevisions.workspaceId, workspaceId)))
      .for('update');
    if (!revision) return { status: 'not-found' } as const;
    if (revision.state === 'superseded') return { status: 'superseded', label: revision.label } as const;

    const requester = alias(users, 'requester');
    const [request] = await tx
      .select({ id: reviewRequests.id, requestedByUserId: reviewRequests.requestedByUserId, name: requester.name, email: requester.email })
      .from(reviewRequests)
      .innerJoin(requester, eq(requester.id, reviewRequests.requestedByUserId))
      .where(and(eq(reviewRequests.revisionId, revisionId), eq(reviewRequests.workspaceId, workspaceId)))
      .orderBy(desc(reviewRequests.id))
      .limit(1);
    if (request && (signerUserId === request.requestedByUserId || signerUserId === revision.createdByUserId)) {
      return { status: 'own-revision' } as const;
    }
    if (!request && signerUserId === revision.createdByUserId) return { status: 'own-revision' } as const;

    const existing = request
      ? await tx
          .select({ signerUserId: reviewSignatures.signerUserId, meaning: reviewSignatures.meaning, signedAt: reviewSignatures.signedAt })
          .from(reviewSignatures)
          .where(eq(reviewSignatures.reviewRequestId, request.id))
      : [];
    const mine = existing.find((s) => s.signerUserId === signerUserId);
    if (mine) return { status: 'already-signed', meaning: mine.meaning, signedAt: mine.signedAt } as const;
    if (revision.state !== 'in-review' || !request) return { status: 'not-in-review', state: revision.state, label: revision.label } as const;

    const reviewers = await tx
      .select({ userId: reviewRequestReviewers.reviewerUserId })
      .from(reviewRequestReviewers)
      .where(eq(reviewRequestReviewers.reviewRequestId, request.id));
    const reviewerIds = reviewers.map((r) => r.userId);
    if (!reviewerIds.includes(signerUserId)) return { status: 'not-a-reviewer' } as const;
    if (contentHash !== revision.contentHash) return { status: 'hash-mismatch' } as const;

    const [signature] = await tx
      .insert(reviewSignatures)
      .values({ workspaceId, revisionId, reviewRequestId: request.id, signerUserId, signerRole, meaning, contentHash: revision.contentHash, note })
      .$returningId();
    await insertAuditEvent(tx, {
      workspaceId,
      actorUserId: signerUserId,
      action: 'review.signed',
      entityType: revisionEntityType,
      entityId: revisionId,
      before: null,
      after: { signatureId: signature.id, reviewRequestId: request.id, meaning, contentHash: revision.contentHash, signerRole, note },
    });

    const outcome = decide(reviewerIds, [...existing, { signerUserId, meaning }]);
    let supersededIds: number[] = [];
    if (outcome !== 'pending') {
      await tx
        .update(reviewRequests)
        .set({ status: outcome, closedAt: new Date() })
        .where(and(eq(reviewRequests.id, request.id), eq(reviewRequests.workspaceId, workspaceId)));
      if (outcome === 'approved') {
        ({ supersededIds } = await releaseRevision(tx, { workspaceId, revisionId, planId: revision.planId, actorUserId: signerUserId }));
      } else {
        await changeRevisionState(tx, {
          workspaceId,
          revisionId,
          from: 'in-review',
          to: 'changes-requested',
          actorUserId: signerUserId,
          reason: 'a reviewer asked for changes',
        });
      }
    }
    return {
      status: 'signed',
      signatureId: signature.id,
      outcome,
      requester: { userId: request.requestedByUserId, name: request.name, email: request.email },
      supersededIds,
    } as const;
  });
}
