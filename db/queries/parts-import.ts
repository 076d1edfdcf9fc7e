import 'server-only';
import { and, eq, inArray } from 'drizzle-orm';
import { getDb } from '@/db/client';
import { insertAuditEvent } from '@/db/queries/audit-events';
import { saveImportMapping, type StoredColumnMapping } from '@/db/queries/import-mappings';
import { DuplicatePartNameError, type PartContent } from '@/db/queries/parts';
import { parts } from '@/db/schema';
import type { PartKind } from '@/lib/parts/part-kinds';

/** Rows per INSERT statement (keeps each statement far below the server's packet limit). */
const INSERT_BATCH = 250;

/**
 * Imports validated parts of one kind, all or nothing, in ONE transaction: every part, the
 * remembered column mapping and one audit event listing what was created. If any insert fails
 * (e.g. a name taken meanwhile), nothing is written.
 *
 * @param fileName and fileSha256 identify the imported file in the audit trail
 * @throws DuplicatePartNameError when a name is already used by a part of the kind
 */
export async function importParts({
  workspaceId,
  userId,
  kind,
  rows,
  mapping,
  fileName,
  fileSha256,
}: {
  workspaceId: number;
  userId: number;
  kind: PartKind;
  rows: PartContent[];
  mapping: StoredColumnMapping;
  fileName: string;
  fileSha256: string;
}): Promise<{ ids: number[] }> {
  return getDb().transaction(async (tx) => {
    // Lock the kind's existing names, then check: a concurrent import of the same names waits here.
    const existing = await tx
      .select({ name: parts.name })
      .from(parts)
      .where(and(eq(parts.workspaceId, workspaceId), eq(parts.kind, kind)))
      .for('update');
    const taken = new Set(existing.map((r) => r.name.trim().toLowerCase()));
    const clash = rows.find((r) => taken.has(r.name.trim().toLowerCase()));
    if (clash) throw new DuplicatePartNameError(kind, clash.name);

    for (let i = 0; i < rows.length; i += INSERT_BATCH) {
      await tx.insert(parts).values(
        rows.slice(i, i + INSERT_BATCH).map((row) => ({
          workspaceId,
          kind,
          name: row.name,
          description: row.description,
          status: row.status,
          sourceNote: row.sourceNote,
          values: row.values,
          createdByUserId: userId,
          updatedByUserId: userId,
        })),
      );
    }
    const names = rows.map((r) => r.name);
    const created: { id: number; name: string }[] = [];
    for (let i = 0; i < names.length; i += INSERT_BATCH) {
      created.push(
        ...(await tx
          .select({ id: parts.id, name: parts.name })
          .from(parts)
          .where(and(eq(parts.workspaceId, workspaceId), eq(parts.kind, kind), inArray(parts.name, names.slice(i, i + INSERT_BATCH))))),
      );
    }
    const idByName = new Map(created.map((c) => [c.name.toLowerCase(), c.id]));
    const ids = names.map((n) => idByName.get(n.toLowerCase())!);

    await saveImportMapping(tx, { workspaceId, kind, userId, mapping });
    await insertAuditEvent(tx, {
      workspaceId,
      actorUserId: userId,
      action: 'parts.imported',
      entityType: 'part-import',
      entityId: fileSha256.slice(0, 64),
      before: null,
      after: { kind, fileName, fileSha256, count: rows.length, mapping, parts: rows.map((row, i) => ({ id: ids[i], ...row })) },
    });
    return { ids };
  });
}
