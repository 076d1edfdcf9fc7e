import 'server-only';
import { and, asc, count, desc, eq, isNull } from 'drizzle-orm';
import { alias } from 'drizzle-orm/mysql-core';
import { getDb } from '@/db/client';
import { insertAuditEvent } from '@/db/queries/audit-events';
import { channelPlans, programs, users, type Program } from '@/db/schema';

/** A program as lists and pages show it. */
export interface ProgramSummary {
  id: number;
  workspaceId: number;
  name: string;
  description: string;
  archivedAt: Date | null;
  createdAt: Date;
  updatedAt: Date;
  updatedByName: string;
  /** Plans that are not archived. */
  planCount: number;
}

const updatedBy = alias(users, 'updated_by');

/** The audited fields of a program (what before/after records). */
function auditView(program: Pick<Program, 'name' | 'description' | 'archivedAt'>) {
  return {
    name: program.name,
    description: program.description,
    archivedAt: program.archivedAt ? program.archivedAt.toISOString() : null,
  };
}

/**
 * The workspace's programs, newest change first.
 * @param includeArchived also list archived programs (default false)
 */
export async function listPrograms({
  workspaceId,
  includeArchived = false,
}: {
  workspaceId: number;
  includeArchived?: boolean;
}): Promise<ProgramSummary[]> {
  const db = getDb();
  const rows = await db
    .select({
      id: programs.id,
      workspaceId: programs.workspaceId,
      name: programs.name,
      description: programs.description,
      archivedAt: programs.archivedAt,
      createdAt: programs.createdAt,
      updatedAt: programs.updatedAt,
      updatedByName: updatedBy.name,
    })
    .from(programs)
    .innerJoin(updatedBy, eq(updatedBy.id, programs.updatedByUserId))
    .where(
      includeArchived
        ? eq(programs.workspaceId, workspaceId)
        : and(eq(programs.workspaceId, workspaceId), isNull(programs.archivedAt)),
    )
    .orderBy(desc(programs.updatedAt), asc(programs.id));
  const counts = await db
    .select({ programId: channelPlans.programId, planCount: count() })
    .from(channelPlans)
    .where(and(eq(channelPlans.workspaceId, workspaceId), isNull(channelPlans.archivedAt)))
    .groupBy(channelPlans.programId);
  const countById = new Map(counts.map((row) => [row.programId, row.planCount]));
  return rows.map((row) => ({ ...row, planCount: countById.get(row.id) ?? 0 }));
}

/** The program if it belongs to the workspace, else null (a foreign id is indistinguishable from a missing one). */
export async function getProgramById({
  workspaceId,
  programId,
}: {
  workspaceId: number;
  programId: number;
}): Promise<ProgramSummary | null> {
  const [row] = await getDb()
    .select({
      id: programs.id,
      workspaceId: programs.workspaceId,
      name: programs.name,
      description: programs.description,
      archivedAt: programs.archivedAt,
      createdAt: programs.createdAt,
      updatedAt: programs.updatedAt,
      updatedByName: updatedBy.name,
    })
    .from(programs)
    .innerJoin(updatedBy, eq(updatedBy.id, programs.updatedByUserId))
    .where(and(eq(programs.id, programId), eq(programs.workspaceId, workspaceId)))
    .limit(1);
  if (!row) return null;
  const [planCount] = await getDb()
    .select({ value: count() })
    .from(channelPlans)
    .where(and(eq(channelPlans.programId, programId), eq(channelPlans.workspaceId, workspaceId), isNull(channelPlans.archivedAt)));
  return { ...row, planCount: planCount?.value ?? 0 };
}

/** Creates a program and records it, in one transaction. @returns the new program's id */
export async function createProgram({
  workspaceId,
  userId,
  name,
  description,
}: {
  workspaceId: number;
  userId: number;
  name: string;
  description: string;
}): Promise<{ id: number }> {
  return getDb().transaction(async (tx) => {
    const [created] = await tx
      .insert(programs)
      .values({ workspaceId, name, description, createdByUserId: userId, updatedByUserId: userId })
      .$returningId();
    await insertAuditEvent(tx, {
      workspaceId,
      actorUserId: userId,
      action: 'program.created',
      entityType: 'program',
      entityId: created.id,
      before: null,
      after: auditView({ name, description, archivedAt: null }),
    });
    return { id: created.id };
  });
}

export type UpdateProgramResult = { status: 'updated' | 'unchanged'; id: number } | { status: 'not-found' };

/**
 * Renames, re-describes, archives or restores a program, and records the change (before → after)
 * in the same transaction. Fields left undefined stay as they are.
 * @param archived true archives (keeps the first archive time), false restores
 */
export async function updateProgram({
  workspaceId,
  programId,
  userId,
  name,
  description,
  archived,
}: {
  workspaceId: number;
  programId: number;
  userId: number;
  name?: string;
  description?: string;
  archived?: boolean;
}): Promise<UpdateProgramResult> {
  return getDb().transaction(async (tx) => {
    const [current] = await tx
      .select()
      .from(programs)
      .where(and(eq(programs.id, programId), eq(programs.workspaceId, workspaceId)))
      .for('update');
    if (!current) return { status: 'not-found' } as const;

    const next = {
      name: name ?? current.name,
      description: description ?? current.description,
      archivedAt: archived === undefined ? current.archivedAt : archived ? (current.archivedAt ?? new Date()) : null,
    };
    const before = auditView(current);
    const after = auditView(next);
    if (JSON.stringify(before) === JSON.stringify(after)) return { status: 'unchanged', id: programId } as const;

    await tx
      .update(programs)
      .set({ ...next, updatedByUserId: userId })
      .where(and(eq(programs.id, programId), eq(programs.workspaceId, workspaceId)));
    const action =
      before.archivedAt === null && after.archivedAt !== null
        ? 'program.archived'
        : before.archivedAt !== null && after.archivedAt === null
          ? 'program.restored'
          : before.name !== after.name
            ? 'program.renamed'
            : 'program.updated';
    await insertAuditEvent(tx, {
      workspaceId,
      actorUserId: userId,
      action,
      entityType: 'program',
      entityId: programId,
      before,
      after,
    });
    return { status: 'updated', id: programId } as const;
  });
}
