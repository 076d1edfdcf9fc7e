import 'server-only';
import { and, asc, desc, eq, inArray, or, sql } from 'drizzle-orm';
import { alias } from 'drizzle-orm/mysql-core';
import { getDb } from '@/db/client';
import type { Executor } from '@/db/connection';
import { insertAuditEvent } from '@/db/queries/audit-events';
import {
  auditEvents,
  channelPlans,
  planRevisions,
  programs,
  revisionStateEvents,
  users,
  type AuditEvent,
  type revisionStateValues,
} from '@/db/schema';

export type RevisionStateValue = (typeof revisionStateValues)[number];
type WorstVerdict = 'meets' | 'marginal' | 'fails';

/** Audit entity type of everything recorded about a revision (its creation, states, review, exports). */
export const revisionEntityType = 'plan-revision';

/** A revision as lists show it (no plan or report bodies). */
export interface RevisionSummary {
  id: number;
  workspaceId: number;
  planId: number;
  programId: number;
  sequence: number;
  label: string;
  changeSummary: string;
  planVersion: number;
  contentHash: string;
  worstVerdict: WorstVerdict | null;
  state: RevisionStateValue;
  stateChangedAt: Date;
  createdAt: Date;
  createdByUserId: number;
  createdByName: string;
  planName: string;
  programName: string;
}

/** One revision with its frozen bodies. */
export interface RevisionDetail extends RevisionSummary {
  plan: Record<string, unknown>;
  report: unknown;
}

const author = alias(users, 'revision_author');

const summaryColumns = {
  id: planRevisions.id,
  workspaceId: planRevisions.workspaceId,
  planId: planRevisions.planId,
  programId: channelPlans.programId,
  sequence: planRevisions.sequence,
  label: planRevisions.label,
  changeSummary: planRevisions.changeSummary,
  planVersion: planRevisions.planVersion,
  contentHash: planRevisions.contentHash,
  worstVerdict: planRevisions.worstVerdict,
  state: planRevisions.state,
  stateChangedAt: planRevisions.stateChangedAt,
  createdAt: planRevisions.createdAt,
  createdByUserId: planRevisions.createdByUserId,
  createdByName: author.name,
  planName: channelPlans.name,
  programName: programs.name,
};

function summaryQuery(executor: Executor) {
  return executor
    .select(summaryColumns)
    .from(planRevisions)
    .innerJoin(author, eq(author.id, planRevisions.createdByUserId))
    .innerJoin(channelPlans, eq(channelPlans.id, planRevisions.planId))
    .innerJoin(programs, eq(programs.id, channelPlans.programId));
}

/**
 * The plan's revisions, newest first. Only those in `states` when given (a regulator's list).
 * Plans of other workspaces have none.
 */
export async function listRevisions({
  workspaceId,
  planId,
  states,
}: {
  workspaceId: number;
  planId: number;
  states?: readonly RevisionStateValue[];
}): Promise<RevisionSummary[]> {
  const scope = and(eq(planRevisions.workspaceId, workspaceId), eq(planRevisions.planId, planId));
  return summaryQuery(getDb())
    .where(states ? and(scope, inArray(planRevisions.state, [...states])) : scope)
    .orderBy(desc(planRevisions.sequence));
}

/** The workspace's revisions in the given states (the regulator's entry list), newest state change first. */
export async function listWorkspaceRevisions({
  workspaceId,
  states,
}: {
  workspaceId: number;
  states: readonly RevisionStateValue[];
}): Promise<RevisionSummary[]> {
  return summaryQuery(getDb())
    .where(and(eq(planRevisions.workspaceId, workspaceId), inArray(planRevisions.state, [...states])))
    .orderBy(desc(planRevisions.stateChangedAt), desc(planRevisions.id));
}

/** The revision with its bodies if it belongs to the workspace, else null. */
export async function getRevisionById({
  workspaceId,
  revisionId,
}: {
  workspaceId: number;
  revisionId: number;
}): Promise<RevisionDetail | null> {
  const [row] = await getDb()
    .select({ ...summaryColumns, plan: planRevisions.plan, report: planRevisions.report })
    .from(planRevisions)
    .innerJoin(author, eq(author.id, planRevisions.createdByUserId))
    .innerJoin(channelPlans, eq(channelPlans.id, planRevisions.planId))
    .innerJoin(programs, eq(programs.id, channelPlans.programId))
    .where(and(eq(planRevisions.id, revisionId), eq(planRevisions.workspaceId, workspaceId)))
    .limit(1);
  return row ?? null;
}

export type CreateRevisionResult =
  | { status: 'created'; id: number; label: string; sequence: number }
  | { status: 'not-found' }
  | { status: 'stale'; currentVersion: number }
  | { status: 'too-many' };

/**
 * Freezes the plan as its next revision (state draft) and records it, in one transaction. The plan
 * row is locked so two freezes cannot take the same label, and the caller's `planVersion` must
 * still be the stored one (so the frozen content is the plan the caller computed it from).
 * @param labelFor the label of a sequence number (1 → "A")
 * @param content the validated plan, the server's report for it and their content hash
 */
export async function createRevision({
  workspaceId,
  planId,
  userId,
  changeSummary,
  planVersion,
  content,
  labelFor,
  maxSequence,
}: {
  workspaceId: number;
  planId: number;
  userId: number;
  changeSummary: string;
  planVersion: number;
  content: { plan: Record<string, unknown>; report: unknown; contentHash: string; worstVerdict: WorstVerdict | null };
  labelFor: (sequence: number) => string;
  maxSequence: number;
}): Promise<CreateRevisionResult> {
  return getDb().transaction(async (tx) => {
    const [plan] = await tx
      .select({ id: channelPlans.id, version: channelPlans.version })
      .from(channelPlans)
      .where(and(eq(channelPlans.id, planId), eq(channelPlans.workspaceId, workspaceId)))
      .for('update');
    if (!plan) return { status: 'not-found' } as const;
    if (plan.version !== planVersion) return { status: 'stale', currentVersion: plan.version } as const;

    const [last] = await tx
      .select({ sequence: sql<number>`COALESCE(MAX(${planRevisions.sequence}), 0)` })
      .from(planRevisions)
      .where(eq(planRevisions.planId, planId));
    const sequence = Number(last?.sequence ?? 0) + 1;
    if (sequence > maxSequence) return { status: 'too-many' } as const;
    const label = labelFor(sequence);

    const [created] = await tx
      .insert(planRevisions)
      .values({
        workspaceId,
        planId,
        sequence,
        label,
        changeSummary,
        planVersion,
        plan: content.plan,
        report: content.report,
        contentHash: content.contentHash,
        worstVerdict: content.worstVerdict,
        createdByUserId: userId,
        state: 'draft',
      })
      .$returningId();
    await tx.insert(revisionStateEvents).values({
      workspaceId,
      revisionId: created.id,
      fromState: null,
      toState: 'draft',
      actorUserId: userId,
      reason: 'frozen from the plan',
    });
    await insertAuditEvent(tx, {
      workspaceId,
      actorUserId: userId,
      action: 'revision.created',
      entityType: revisionEntityType,
      entityId: created.id,
      before: null,
      after: { planId, label, sequence, planVersion, changeSummary, contentHash: content.contentHash, state: 'draft' },
    });
    return { status: 'created', id: created.id, label, sequence } as const;
  });
}

/**
 * Moves a revision to a new state inside the caller's transaction: the state column, a state
 * event and an audit event. (The database trigger refuses a move the life cycle does not allow.)
 */
export async function changeRevisionState(
  tx: Executor,
  {
    workspaceId,
    revisionId,
    from,
    to,
    actorUserId,
    reason,
  }: {
    workspaceId: number;
    revisionId: number;
    from: RevisionStateValue;
    to: RevisionStateValue;
    actorUserId: number | null;
    reason: string;
  },
): Promise<void> {
  await tx
    .update(planRevisions)
    .set({ state: to, stateChangedAt: new Date() })
    .where(and(eq(planRevisions.id, revisionId), eq(planRevisions.workspaceId, workspaceId)));
  await tx.insert(revisionStateEvents).values({ workspaceId, revisionId, fromState: from, toState: to, actorUserId, reason });
  await insertAuditEvent(tx, {
    workspaceId,
    actorUserId,
    action: 'revision.state-changed',
    entityType: revisionEntityType,
    entityId: revisionId,
    before: { state: from },
    after: { state: to, reason },
  });
}

/**
 * Releases a revision inside the caller's transaction; the plan's previously released revision
 * (if any) becomes superseded.
 */
export async function releaseRevision(
  tx: Executor,
  { workspaceId, revisionId, planId, actorUserId }: { workspaceId: number; revisionId: number; planId: number; actorUserId: number },
): Promise<{ supersededIds: number[] }> {
  const older = await tx
    .select({ id: planRevisions.id, label: planRevisions.label })
    .from(planRevisions)
    .where(and(eq(planRevisions.planId, planId), eq(planRevisions.workspaceId, workspaceId), eq(planRevisions.state, 'released')))
    .for('update');
  await changeRevisionState(tx, {
    workspaceId,
    revisionId,
    from: 'in-review',
    to: 'released',
    actorUserId,
    reason: 'every requested reviewer approved',
  });
  for (const row of older) {
    if (row.id === revisionId) continue;
    await changeRevisionState(tx, {
      workspaceId,
      revisionId: row.id,
      from: 'released',
      to: 'superseded',
      actorUserId,
      reason: `superseded by a newer release of the plan (revision id ${revisionId})`,
    });
  }
  return { supersededIds: older.map((row) => row.id).filter((id) => id !== revisionId) };
}

/** The revision's state history, oldest first. */
export async function listRevisionStateEvents({ workspaceId, revisionId }: { workspaceId: number; revisionId: number }) {
  const actor = alias(users, 'state_actor');
  return getDb()
    .select({
      id: revisionStateEvents.id,
      fromState: revisionStateEvents.fromState,
      toState: revisionStateEvents.toState,
      at: revisionStateEvents.at,
      reason: revisionStateEvents.reason,
      actorName: actor.name,
    })
    .from(revisionStateEvents)
    .leftJoin(actor, eq(actor.id, revisionStateEvents.actorUserId))
    .where(and(eq(revisionStateEvents.revisionId, revisionId), eq(revisionStateEvents.workspaceId, workspaceId)))
    .orderBy(asc(revisionStateEvents.at), asc(revisionStateEvents.id));
}

/** An audit event with the actor's name, for history views. */
export interface HistoryEvent extends AuditEvent {
  actorName: string | null;
}

/**
 * The audit trail of one revision (everything recorded against it), oldest first.
 */
export async function listRevisionAuditEvents({
  workspaceId,
  revisionId,
}: {
  workspaceId: number;
  revisionId: number;
}): Promise<HistoryEvent[]> {
  const actor = alias(users, 'audit_actor');
  const rows = await getDb()
    .select({ event: auditEvents, actorName: actor.name })
    .from(auditEvents)
    .leftJoin(actor, eq(actor.id, auditEvents.actorUserId))
    .where(
      and(
        eq(auditEvents.workspaceId, workspaceId),
        eq(auditEvents.entityType, revisionEntityType),
        eq(auditEvents.entityId, String(revisionId)),
      ),
    )
    .orderBy(asc(auditEvents.at), asc(auditEvents.id));
  return rows.map((row) => ({ ...row.event, actorName: row.actorName }));
}

/**
 * The audit trail of a plan: its own events and those of its revisions, oldest first.
 * @param revisionStates only revisions in these states count (the regulator's view); all when omitted,
 *   and then the plan's own (draft) events are included too
 */
export async function listPlanAuditEvents({
  workspaceId,
  planId,
  revisionStates,
}: {
  workspaceId: number;
  planId: number;
  revisionStates?: readonly RevisionStateValue[];
}): Promise<HistoryEvent[]> {
  const revisions = await getDb()
    .select({ id: planRevisions.id })
    .from(planRevisions)
    .where(
      and(
        eq(planRevisions.planId, planId),
        eq(planRevisions.workspaceId, workspaceId),
        ...(revisionStates ? [inArray(planRevisions.state, [...revisionStates])] : []),
      ),
    );
  const revisionIds = revisions.map((r) => String(r.id));
  const ofRevisions =
    revisionIds.length > 0
      ? and(eq(auditEvents.entityType, revisionEntityType), inArray(auditEvents.entityId, revisionIds))
      : undefined;
  const ofPlan = revisionStates ? undefined : and(eq(auditEvents.entityType, 'channel-plan'), eq(auditEvents.entityId, String(planId)));
  const filters = [ofPlan, ofRevisions].filter((f) => f !== undefined);
  if (filters.length === 0) return [];
  const actor = alias(users, 'audit_actor');
  const rows = await getDb()
    .select({ event: auditEvents, actorName: actor.name })
    .from(auditEvents)
    .leftJoin(actor, eq(actor.id, auditEvents.actorUserId))
    .where(and(eq(auditEvents.workspaceId, workspaceId), or(...filters)))
    .orderBy(asc(auditEvents.at), asc(auditEvents.id))
    .limit(2000);
  return rows.map((row) => ({ ...row.event, actorName: row.actorName }));
}

/** Records an export of a revision (format and the hash of what was exported). */
export async function recordRevisionExport({
  workspaceId,
  revisionId,
  userId,
  format,
  contentHash,
}: {
  workspaceId: number;
  revisionId: number;
  userId: number;
  format: 'pdf' | 'json';
  contentHash: string;
}): Promise<void> {
  await getDb().transaction((tx) =>
    insertAuditEvent(tx, {
      workspaceId,
      actorUserId: userId,
      action: 'revision.exported',
      entityType: revisionEntityType,
      entityId: revisionId,
      before: null,
      after: { format, contentHash },
    }),
  );
}

/**
 * Creates a plan from an imported design-rationale JSON and records it, in one transaction.
 * (The plan queries know blank, template and duplicate origins; an import is recorded as its own action.)
 */
export async function createImportedPlan({
  workspaceId,
  programId,
  userId,
  name,
  computed,
  source,
}: {
  workspaceId: number;
  programId: number;
  userId: number;
  name: string;
  computed: { plan: Record<string, unknown>; report: unknown; worstVerdict: WorstVerdict | null; profileId: string; application: string };
  source: { format: string; revisionLabel: string | null; contentHash: string | null; planName: string | null };
}): Promise<{ status: 'created'; id: number } | { status: 'not-found' } | { status: 'program-archived' }> {
  return getDb().transaction(async (tx) => {
    const [program] = await tx
      .select({ id: programs.id, archivedAt: programs.archivedAt })
      .from(programs)
      .where(and(eq(programs.id, programId), eq(programs.workspaceId, workspaceId)))
      .for('update');
    if (!program) return { status: 'not-found' } as const;
    if (program.archivedAt) return { status: 'program-archived' } as const;
    const [created] = await tx
      .insert(channelPlans)
      .values({
        programId,
        workspaceId,
        name,
        profileId: computed.profileId,
        application: computed.application,
        plan: computed.plan,
        report: computed.report,
        worstVerdict: computed.worstVerdict,
        version: 1,
        createdByUserId: userId,
        updatedByUserId: userId,
      })
      .$returningId();
    await insertAuditEvent(tx, {
      workspaceId,
      actorUserId: userId,
      action: 'plan.imported',
      entityType: 'channel-plan',
      entityId: created.id,
      before: null,
      after: { programId, name, origin: { kind: 'import', ...source }, version: 1, plan: computed.plan },
    });
    return { status: 'created', id: created.id } as const;
  });
}
