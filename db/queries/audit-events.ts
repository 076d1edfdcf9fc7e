import 'server-only';
import { desc, eq } from 'drizzle-orm';
import { getDb } from '@/db/client';
import type { Executor } from '@/db/connection';
import { auditEvents, type AuditEvent } from '@/db/schema';

/** What a caller records; `at` is set by the database. */
export interface AuditEventInput {
  workspaceId: number | null;
  actorUserId: number | null;
  action: string;
  entityType: string;
  entityId: string | number;
  before?: unknown;
  after?: unknown;
}

/**
 * Appends one event. Pass the open transaction so the event commits or rolls back with the change
 * it records. There is deliberately no update or delete here (and the database refuses both).
 */
export async function insertAuditEvent(executor: Executor, event: AuditEventInput): Promise<void> {
  await executor.insert(auditEvents).values({
    workspaceId: event.workspaceId,
    actorUserId: event.actorUserId,
    action: event.action,
    entityType: event.entityType,
    entityId: String(event.entityId),
    before: event.before ?? null,
    after: event.after ?? null,
  });
}

/** The workspace's most recent events, newest first. */
export async function listAuditEvents({
  workspaceId,
  limit = 100,
}: {
  workspaceId: number;
  limit?: number;
}): Promise<AuditEvent[]> {
  return getDb()
    .select()
    .from(auditEvents)
    .where(eq(auditEvents.workspaceId, workspaceId))
    .orderBy(desc(auditEvents.at), desc(auditEvents.id))
    .limit(limit);
}
