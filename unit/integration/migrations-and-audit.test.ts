import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { openRawConnection, rawQuery, resetTestDatabase } from '@/unit/helpers/test-db';
import { closeDb, getDb } from '@/db/client';
import { insertAuditEvent, listAuditEvents } from '@/db/queries/audit-events';
import { workspaces } from '@/db/schema';

beforeAll(resetTestDatabase);
afterAll(closeDb);

describe('migrations', () => {
  it('create every foundation table on an empty database', async () => {
    const rows = await rawQuery<{ name: string }>(
      'SELECT table_name AS name FROM information_schema.tables WHERE table_schema = DATABASE()',
    );
    const names = rows.map((row) => row.name);
    for (const table of [
      'users',
      'workspaces',
      'memberships',
      'invitations',
      'password_reset_tokens',
      'sign_in_counters',
      'audit_events',
      '__drizzle_migrations',
    ]) {
      expect(names, `table ${table}`).toContain(table);
    }
  });

  it('install the two triggers that keep audit events append-only', async () => {
    const rows = await rawQuery<{ name: string; event: string }>(
      `SELECT trigger_name AS name, event_manipulation AS event FROM information_schema.triggers
       WHERE trigger_schema = DATABASE() AND event_object_table = 'audit_events' ORDER BY name`,
    );
    expect(rows.map((row) => row.event).sort()).toEqual(['DELETE', 'UPDATE']);
  });
});

describe('audit events', () => {
  it('can be appended and read back through the db layer', async () => {
    const [{ id: workspaceId }] = await getDb().insert(workspaces).values({ name: 'Audit Lab', slug: 'audit-lab' }).$returningId();
    await getDb().transaction((tx) =>
      insertAuditEvent(tx, {
        workspaceId,
        actorUserId: null,
        action: 'workspace.created',
        entityType: 'workspace',
        entityId: workspaceId,
        after: { name: 'Audit Lab' },
      }),
    );
    const events = await listAuditEvents({ workspaceId });
    expect(events).toHaveLength(1);
    expect(events[0]).toMatchObject({ action: 'workspace.created', entityId: String(workspaceId), after: { name: 'Audit Lab' } });
  });

  it('refuse a raw SQL UPDATE and DELETE, leaving the row unchanged', async () => {
    const connection = await openRawConnection();
    try {
      await expect(connection.query("UPDATE audit_events SET action = 'tampered'")).rejects.toThrow(
        /append-only: UPDATE refused/,
      );
      await expect(connection.query('DELETE FROM audit_events')).rejects.toThrow(/append-only: DELETE refused/);
      const [rows] = await connection.query('SELECT action FROM audit_events');
      expect(rows).toEqual([{ action: 'workspace.created' }]);
    } finally {
      await connection.end();
    }
  });

  it('offer no update or delete function in the db layer', async () => {
    const auditModule = await import('@/db/queries/audit-events');
    expect(Object.keys(auditModule).sort()).toEqual(['insertAuditEvent', 'listAuditEvents']);
  });
});
