import 'server-only';
import { and, eq } from 'drizzle-orm';
import { getDb } from '@/db/client';
import type { Executor } from '@/db/connection';
import { partImportMappings } from '@/db/schema';
import type { PartKind } from '@/lib/parts/part-kinds';

/** Column header → part field (null: ignored). */
export type StoredColumnMapping = Record<string, string | null>;

/** The mapping last used to import parts of `kind` in the workspace, or null. */
export async function getImportMapping({
  workspaceId,
  kind,
}: {
  workspaceId: number;
  kind: PartKind;
}): Promise<StoredColumnMapping | null> {
  const [row] = await getDb()
    .select({ mapping: partImportMappings.mapping })
    .from(partImportMappings)
    .where(and(eq(partImportMappings.workspaceId, workspaceId), eq(partImportMappings.kind, kind)))
    .limit(1);
  return row?.mapping ?? null;
}

/**
 * Remembers the mapping for the workspace and kind (insert or replace). Pass the import's
 * transaction so the mapping is kept only when the import commits.
 */
export async function saveImportMapping(
  executor: Executor,
  { workspaceId, kind, userId, mapping }: { workspaceId: number; kind: PartKind; userId: number; mapping: StoredColumnMapping },
): Promise<void> {
  await executor
    .insert(partImportMappings)
    .values({ workspaceId, kind, mapping, updatedByUserId: userId })
    .onDuplicateKeyUpdate({ set: { mapping, updatedByUserId: userId } });
}
