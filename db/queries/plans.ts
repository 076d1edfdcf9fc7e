import 'server-only';
import { and, desc, eq, inArray, isNull, sql } from 'drizzle-orm';
import { alias } from 'drizzle-orm/mysql-core';
import { getDb } from '@/db/client';
import type { Executor } from '@/db/connection';
import { insertAuditEvent } from '@/db/queries/audit-events';
import { channelPlans, planRevisions, programs, revisionStateValues, users } from '@/db/schema';

export type WorstVerdict = 'meets' | 'marginal' | 'fails';

/** What the server derived from a validated plan, stored beside it. */
export interface ComputedPlan {
  /** The validated plan (defaults applied), as JSON. */
  plan: Record<string, unknown>;
  /** The engine's report for it. */
  report: unknown;
  worstVerdict: WorstVerdict | null;
  profileId: string;
  application: string;
}

/** A plan as the program's plan table shows it (no plan or report bodies). */
export interface PlanSummary {
  id: number;
  programId: number;
  name: string;
  profileId: string;
  application: string;
  worstVerdict: WorstVerdict | null;
  version: number;
  archivedAt: Date | null;
  createdAt: Date;
  updatedAt: Date;
  updatedByName: string;
  /** The plan's newest revision (label and state), null before the first freeze. Set by `listPlans`. */
  latestRevision?: { label: string; state: (typeof revisionStateValues)[number] } | null;
}

/** One plan with its bodies. */
export interface PlanDetail extends PlanSummary {
  workspaceId: number;
  programName: string;
  programArchivedAt: Date | null;
  plan: Record<string, unknown>;
  report: unknown;
}

/** The stored state a stale save is shown. */
export interface CurrentPlanState {
  plan: Record<string, unknown>;
  version: number;
  updatedByName: string;
  updatedAt: Date;
}

/**
 * A save based on an older version than the stored one: nothing was written. Carries what is
 * stored now so the editor can offer to reload it.
 */
export class StalePlanError extends Error {
  readonly current: CurrentPlanState;
  constructor(current: CurrentPlanState) {
    super(
      `This plan was saved by ${current.updatedByName} at ${current.updatedAt.toISOString()} (version ${current.version}) after you loaded it; nothing was saved.`,
    );
    this.name = 'StalePlanError';
    this.current = current;
  }
}

const updatedBy = alias(users, 'updated_by');

const summaryColumns = {
  id: channelPlans.id,
  programId: channelPlans.programId,
  name: channelPlans.name,
  profileId: channelPlans.profileId,
  application: channelPlans.application,
  worstVerdict: channelPlans.worstVerdict,
  version: channelPlans.version,
  archivedAt: channelPlans.archivedAt,
  createdAt: channelPlans.createdAt,
  updatedAt: channelPlans.updatedAt,
  updatedByName: updatedBy.name,
};

/** The program's plans, newest change first. Programs of other workspaces have none. */
export async function listPlans({
  workspaceId,
  programId,
  includeArchived = false,
}: {
  workspaceId: number;
  programId: number;
  includeArchived?: boolean;
}): Promise<PlanSummary[]> {
  const scope = and(eq(channelPlans.workspaceId, workspaceId), eq(channelPlans.programId, programId));
  const rows = await getDb()
    .select(summaryColumns)
    .from(channelPlans)
    .innerJoin(updatedBy, eq(updatedBy.id, channelPlans.updatedByUserId))
    .where(includeArchived ? scope : and(scope, isNull(channelPlans.archivedAt)))
    .orderBy(desc(channelPlans.updatedAt), desc(channelPlans.id));
  if (rows.length === 0) return rows;
  const revisions = await getDb()
    .select({ planId: planRevisions.planId, sequence: planRevisions.sequence, label: planRevisions.label, state: planRevisions.state })
    .from(planRevisions)
    .where(and(eq(planRevisions.workspaceId, workspaceId), inArray(planRevisions.planId, rows.map((row) => row.id))));
  const latest = new Map<number, (typeof revisions)[number]>();
  for (const revision of revisions) {
    const seen = latest.get(revision.planId);
    if (!seen || revision.sequence > seen.sequence) latest.set(revision.planId, revision);
  }
  return rows.map((row) => {
    const revision = latest.get(row.id);
    return { ...row, latestRevision: revision ? { label: revision.label, state: revision.state } : null };
  });
}

/** The plan if it belongs to the workspace, else null. */
export async function getPlanById({
  workspaceId,
  planId,
}: {
  workspaceId: number;
  planId: number;
}): Promise<PlanDetail | null> {
  const [row] = await getDb()
    .select({
      ...summaryColumns,
      workspaceId: channelPlans.workspaceId,
      programName: programs.name,
      programArchivedAt: programs.archivedAt,
      plan: channelPlans.plan,
      report: channelPlans.report,
    })
    .from(channelPlans)
    .innerJoin(updatedBy, eq(updatedBy.id, channelPlans.updatedByUserId))
    .innerJoin(programs, eq(programs.id, channelPlans.programId))
    .where(and(eq(channelPlans.id, planId), eq(channelPlans.workspaceId, workspaceId)))
    .limit(1);
  return row ?? null;
}

export type CreatePlanOrigin =
  | { kind: 'blank' }
  | { kind: 'template'; templateId: string }
  | { kind: 'duplicate'; sourcePlanId: number };

/**
 * Creates a plan in a program of the workspace and records it, in one transaction.
 * @returns the new id, or not-found when the program is not in the workspace, archived when it is archived
 */
export async function createPlan({
  workspaceId,
  programId,
  userId,
  name,
  computed,
  origin,
}: {
  workspaceId: number;
  programId: number;
  userId: number;
  name: string;
  computed: ComputedPlan;
  origin: CreatePlanOrigin;
}): Promise<{ status: 'created'; id: number } | { status: 'not-found' } | { status: 'program-archived' }> {
  return getDb().transaction(async (tx) => {
    const [program] = await tx
      .select({ id: programs.id, archivedAt: programs.archivedAt })
      .from(programs)
      .where(and(eq(programs.id, programId), eq(programs.workspaceId, workspaceId)))
      .for('update'); // MariaDB has no FOR SHARE; the row lock keeps the program from being archived meanwhile
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
      action: origin.kind === 'duplicate' ? 'plan.duplicated' : 'plan.created',
      entityType: 'channel-plan',
      entityId: created.id,
      before: null,
      after: { programId, name, origin, version: 1, plan: computed.plan },
    });
    return { status: 'created', id: created.id } as const;
  });
}

/**
 * Saves a new body for a plan with optimistic concurrency: the row is written only where its
 * version is still `expectedVersion`, and the version goes up by one. The audit event (plan
 * before → after) commits in the same transaction.
 * @returns the new version, or not-found when the plan is not in the workspace
 * @throws StalePlanError when the stored version differs (nothing is written)
 */
export async function savePlan({
  planId,
  workspaceId,
  expectedVersion,
  computed,
  userId,
}: {
  planId: number;
  workspaceId: number;
  expectedVersion: number;
  computed: ComputedPlan;
  userId: number;
}): Promise<{ status: 'saved'; version: number } | { status: 'not-found' }> {
  return getDb().transaction(async (tx) => {
    const scope = and(eq(channelPlans.id, planId), eq(channelPlans.workspaceId, workspaceId));
    // Lock the row: the before-image of the audit event is then the row this update replaces.
    const [before] = await tx
      .select({ plan: channelPlans.plan, version: channelPlans.version, name: channelPlans.name })
      .from(channelPlans)
      .where(scope)
      .for('update');
    if (!before) return { status: 'not-found' } as const;

    const nextName = typeof computed.plan.name === 'string' ? computed.plan.name : before.name;
    const [result] = await tx
      .update(channelPlans)
      .set({
        name: nextName,
        plan: computed.plan,
        report: computed.report,
        worstVerdict: computed.worstVerdict,
        profileId: computed.profileId,
        application: computed.application,
        version: sql`${channelPlans.version} + 1`,
        updatedByUserId: userId,
      })
      .where(and(scope, eq(channelPlans.version, expectedVersion)));
    if (result.affectedRows === 0) {
      const current = await readCurrentState(tx, planId, workspaceId);
      throw new StalePlanError(current);
    }
    const version = expectedVersion + 1;
    await insertAuditEvent(tx, {
      workspaceId,
      actorUserId: userId,
      action: 'plan.saved',
      entityType: 'channel-plan',
      entityId: planId,
      before: { version: before.version, name: before.name, plan: before.plan },
      after: { version, name: nextName, plan: computed.plan },
    });
    return { status: 'saved', version } as const;
  });
}

async function readCurrentState(tx: Executor, planId: number, workspaceId: number): Promise<CurrentPlanState> {
  const [row] = await tx
    .select({
      plan: channelPlans.plan,
      version: channelPlans.version,
      updatedAt: channelPlans.updatedAt,
      updatedByName: updatedBy.name,
    })
    .from(channelPlans)
    .innerJoin(updatedBy, eq(updatedBy.id, channelPlans.updatedByUserId))
    .where(and(eq(channelPlans.id, planId), eq(channelPlans.workspaceId, workspaceId)))
    .limit(1);
  if (!row) throw new Error(`channel plan ${planId} vanished during a save`);
  return row;
}

export type UpdatePlanMetaResult =
  | { status: 'updated'; version: number }
  | { status: 'unchanged'; version: number }
  | { status: 'not-found' };

/**
 * Renames, archives or restores a plan and records it. A rename changes the plan body's `name`
 * too (so it bumps the version and stores the recomputed body the caller passes in `computed`).
 */
export async function updatePlanMeta({
  workspaceId,
  planId,
  userId,
  archived,
  renamed,
}: {
  workspaceId: number;
  planId: number;
  userId: number;
  archived?: boolean;
  /** The new name with the plan body recomputed for it. */
  renamed?: { name: string; computed: ComputedPlan };
}): Promise<UpdatePlanMetaResult> {
  return getDb().transaction(async (tx) => {
    const scope = and(eq(channelPlans.id, planId), eq(channelPlans.workspaceId, workspaceId));
    const [current] = await tx
      .select({ name: channelPlans.name, version: channelPlans.version, archivedAt: channelPlans.archivedAt })
      .from(channelPlans)
      .where(scope)
      .for('update');
    if (!current) return { status: 'not-found' } as const;

    const nextArchivedAt =
      archived === undefined ? current.archivedAt : archived ? (current.archivedAt ?? new Date()) : null;
    const nameChanges = renamed !== undefined && renamed.name !== current.name;
    const archiveChanges = (current.archivedAt === null) !== (nextArchivedAt === null);
    if (!nameChanges && !archiveChanges) return { status: 'unchanged', version: current.version } as const;

    const version = nameChanges ? current.version + 1 : current.version;
    await tx
      .update(channelPlans)
      .set({
        archivedAt: nextArchivedAt,
        updatedByUserId: userId,
        ...(nameChanges && renamed
          ? {
              name: renamed.name,
              plan: renamed.computed.plan,
              report: renamed.computed.report,
              worstVerdict: renamed.computed.worstVerdict,
              version,
            }
          : {}),
      })
      .where(scope);
    const view = (name: string, archivedAt: Date | null, v: number) => ({
      name,
      archivedAt: archivedAt ? archivedAt.toISOString() : null,
      version: v,
    });
    await insertAuditEvent(tx, {
      workspaceId,
      actorUserId: userId,
      action: archiveChanges ? (nextArchivedAt ? 'plan.archived' : 'plan.restored') : 'plan.renamed',
      entityType: 'channel-plan',
      entityId: planId,
      before: view(current.name, current.archivedAt, current.version),
      after: view(nameChanges && renamed ? renamed.name : current.name, nextArchivedAt, version),
    });
    return { status: 'updated', version } as const;
  });
}
