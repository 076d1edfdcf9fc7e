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
