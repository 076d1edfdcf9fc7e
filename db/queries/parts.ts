import 'server-only';
import { and, asc, eq, isNull } from 'drizzle-orm';
import { getDb } from '@/db/client';
import { parts } from '@/db/schema';
import type { PartKind, PartStatus } from '@/lib/parts/part-kinds';

/** A library part as plan forms use it: values keyed by the plan's field names, SI units. */
export interface PartListItem {
  id: number;
  kind: PartKind;
  name: string;
  description: string;
  status: PartStatus;
  sourceNote: string;
  values: Record<string, number | string>;
  updatedAt: Date;
}

/**
 * The workspace's parts that are not retired, by kind then name.
 * @param kind only this kind (default: every kind)
 */
export async function listParts({
  workspaceId,
  kind,
}: {
  workspaceId: number;
  kind?: PartKind;
}): Promise<PartListItem[]> {
  const scope = and(eq(parts.workspaceId, workspaceId), isNull(parts.retiredAt));
  return getDb()
    .select({
      id: parts.id,
      kind: parts.kind,
      name: parts.name,
      description: parts.description,
      status: parts.status,
      sourceNote: parts.sourceNote,
      values: parts.values,
      updatedAt: parts.updatedAt,
    })
    .from(parts)
    .where(kind ? and(scope, eq(parts.kind, kind)) : scope)
    .orderBy(asc(parts.kind), asc(parts.name), asc(parts.id));
}

// ───────────────────────────────────────────────────────────────────────────────────────────────
// The part-library screens: the whole library (retired parts too), one part, create, edit, retire.
// Every write records an audit event (before → after) in the same transaction.
// ───────────────────────────────────────────────────────────────────────────────────────────────
import { alias as aliasTable } from 'drizzle-orm/mysql-core';
import { insertAuditEvent } from '@/db/queries/audit-events';
import { users } from '@/db/schema';
import type { Executor } from '@/db/connection';

/** A library part as the library screen shows it. */
export interface LibraryPart extends PartListItem {
  retiredAt: Date | null;
  createdAt: Date;
  updatedByName: string;
}

/** What a part stores besides its identity: the fields of the part's zod schema, kind and name aside. */
export interface PartContent {
  kind: PartKind;
  name: string;
  description: string;
  status: PartStatus;
  sourceNote: string;
  /** Parameters keyed by field name, SI units (the electrode type is text). */
  values: Record<string, number | string>;
}

/** A name already used by a part of the same kind in the workspace (retired parts keep their name). */
export class DuplicatePartNameError extends Error {
  constructor(readonly kind: PartKind, readonly partName: string) {
    super(`A ${kind} part named "${partName}" already exists in the library (retired parts keep their names).`);
    this.name = 'DuplicatePartNameError';
  }
}

const partUpdatedBy = aliasTable(users, 'part_updated_by');

const libraryColumns = {
  id: parts.id,
  kind: parts.kind,
  name: parts.name,
  description: parts.description,
  status: parts.status,
  sourceNote: parts.sourceNote,
  values: parts.values,
  updatedAt: parts.updatedAt,
  retiredAt: parts.retiredAt,
  createdAt: parts.createdAt,
  updatedByName: partUpdatedBy.name,
};

/** Every part of the workspace, retired ones included, by kind then name. */
export async function listLibraryParts({ workspaceId }: { workspaceId: number }): Promise<LibraryPart[]> {
  return getDb()
    .select(libraryColumns)
    .from(parts)
    .innerJoin(partUpdatedBy, eq(partUpdatedBy.id, parts.updatedByUserId))
    .where(eq(parts.workspaceId, workspaceId))
    .orderBy(asc(parts.kind), asc(parts.name), asc(parts.id));
}

/** The part if it belongs to the workspace, else null. */
export async function getPartById({ workspaceId, partId }: { workspaceId: number; partId: number }): Promise<LibraryPart | null> {
  const [row] = await getDb()
    .select(libraryColumns)
    .from(parts)
    .innerJoin(partUpdatedBy, eq(partUpdatedBy.id, parts.updatedByUserId))
    .where(and(eq(parts.id, partId), eq(parts.workspaceId, workspaceId)))
    .limit(1);
  return row ?? null;
}

/** Names of the workspace's parts of one kind, retired ones included (names are unique per kind). */
export async function listPartNames({ workspaceId, kind }: { workspaceId: number; kind: PartKind }): Promise<string[]> {
  const rows = await getDb()
    .select({ name: parts.name })
    .from(parts)
    .where(and(eq(parts.workspaceId, workspaceId), eq(parts.kind, kind)));
  return rows.map((r) => r.name);
}

function isDuplicateKeyError(error: unknown): boolean {
  const cause = (error as { cause?: { code?: string }; code?: string } | null) ?? null;
  return cause?.code === 'ER_DUP_ENTRY' || cause?.cause?.code === 'ER_DUP_ENTRY';
}

async function nameTaken(
  executor: Executor,
  { workspaceId, kind, name, exceptId }: { workspaceId: number; kind: PartKind; name: string; exceptId?: number },
): Promise<boolean> {
  const rows = await executor
    .select({ id: parts.id, name: parts.name })
    .from(parts)
    .where(and(eq(parts.workspaceId, workspaceId), eq(parts.kind, kind)));
  const key = name.trim().toLowerCase();
  return rows.some((r) => r.id !== exceptId && r.name.trim().toLowerCase() === key);
}

/**
 * Adds a part to the library and records it.
 * @throws DuplicatePartNameError when the kind already has a part of that name (case-insensitive)
 */
export async function createPart({
  workspaceId,
  userId,
  part,
}: {
  workspaceId: number;
  userId: number;
  part: PartContent;
}): Promise<{ id: number }> {
  try {
    return await getDb().transaction(async (tx) => {
      if (await nameTaken(tx, { workspaceId, kind: part.kind, name: part.name })) throw new DuplicatePartNameError(part.kind, part.name);
      const [created] = await tx
        .insert(parts)
        .values({ workspaceId, ...part, createdByUserId: userId, updatedByUserId: userId })
        .$returningId();
      await insertAuditEvent(tx, {
        workspaceId,
        actorUserId: userId,
        action: 'part.created',
        entityType: 'part',
        entityId: created.id,
        before: null,
        after: part,
      });
      return { id: created.id };
    });
  } catch (error) {
    if (isDuplicateKeyError(error)) throw new DuplicatePartNameError(part.kind, part.name);
    throw error;
  }
}

export type ChangePartResult = { status: 'updated' | 'unchanged' } | { status: 'not-found' } | { status: 'retired' };

/**
 * Replaces a part's content (its kind stays) and records before → after. A retired part cannot be edited.
 * Revisions keep the values they froze: plans copy a part's values, they do not point at it.
 * @throws DuplicatePartNameError when another part of the kind has the new name
 */
export async function updatePart({
  workspaceId,
  userId,
  partId,
  part,
}: {
  workspaceId: number;
  userId: number;
  partId: number;
  part: Omit<PartContent, 'kind'>;
}): Promise<ChangePartResult> {
  let kind: PartKind | undefined;
  try {
    return await getDb().transaction(async (tx) => {
      const [current] = await tx
        .select()
        .from(parts)
        .where(and(eq(parts.id, partId), eq(parts.workspaceId, workspaceId)))
        .for('update');
      if (!current) return { status: 'not-found' } as const;
      if (current.retiredAt) return { status: 'retired' } as const;
      kind = current.kind;
      const before: PartContent = {
        kind: current.kind,
        name: current.name,
        description: current.description,
        status: current.status,
        sourceNote: current.sourceNote,
        values: current.values,
      };
      const after: PartContent = { kind: current.kind, ...part };
      if (JSON.stringify(before) === JSON.stringify(after)) return { status: 'unchanged' } as const;
      if (await nameTaken(tx, { workspaceId, kind: current.kind, name: part.name, exceptId: partId })) {
        throw new DuplicatePartNameError(current.kind, part.name);
      }
      await tx
        .update(parts)
        .set({ ...part, updatedByUserId: userId })
        .where(and(eq(parts.id, partId), eq(parts.workspaceId, workspaceId)));
      await insertAuditEvent(tx, { workspaceId, actorUserId: userId, action: 'part.updated', entityType: 'part', entityId: partId, before, after });
      return { status: 'updated' } as const;
    });
  } catch (error) {
    if (isDuplicateKeyError(error) && kind) throw new DuplicatePartNameError(kind, part.name);
    throw error;
  }
}

/** Retires a part: it leaves the plan forms' lists and can no longer be edited; the row and its name are kept. */
export async function retirePart({
  workspaceId,
  userId,
  partId,
}: {
  workspaceId: number;
  userId: number;
  partId: number;
}): Promise<{ status: 'retired' } | { status: 'not-found' } | { status: 'already-retired' }> {
  return getDb().transaction(async (tx) => {
    const [current] = await tx
      .select({ id: parts.id, retiredAt: parts.retiredAt, name: parts.name, kind: parts.kind })
      .from(parts)
      .where(and(eq(parts.id, partId), eq(parts.workspaceId, workspaceId)))
      .for('update');
    if (!current) return { status: 'not-found' } as const;
    if (current.retiredAt) return { status: 'already-retired' } as const;
    const retiredAt = new Date();
    await tx
      .update(parts)
      .set({ retiredAt, updatedByUserId: userId })
      .where(and(eq(parts.id, partId), eq(parts.workspaceId, workspaceId)));
    await insertAuditEvent(tx, {
      workspaceId,
      actorUserId: userId,
      action: 'part.retired',
      entityType: 'part',
      entityId: partId,
      before: { kind: current.kind, name: current.name, retiredAt: null },
      after: { kind: current.kind, name: current.name, retiredAt: retiredAt.toISOString() },
    });
    return { status: 'retired' } as const;
  });
}
