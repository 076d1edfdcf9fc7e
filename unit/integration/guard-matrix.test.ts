/**
 * Every guarded route handler and server action, called as each role and signed out: the allowed
 * roles act, the others are refused with the right status and nothing changes in the database.
 */
import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest';
import { rawQuery, resetTestDatabase } from '@/unit/helpers/test-db';
import { closeDb, getDb } from '@/db/client';
import { seedDemoWorkspace } from '@/db/seed';
import type { Role } from '@/lib/auth/roles';

const session = vi.hoisted(() => ({ current: null as null | { userId: number; workspaceId: number } }));
vi.mock('@/features/auth/session-source', () => ({ getSessionIdentity: async () => session.current }));
vi.mock('next/cache', () => ({ revalidatePath: () => undefined }));

const { GET: getMembers } = await import('@/app/api/members/route');
const { inviteMemberAction, changeMemberRoleAction } = await import('@/app/(app)/members/actions');

let seeded: Awaited<ReturnType<typeof seedDemoWorkspace>>;
beforeAll(async () => {
  await resetTestDatabase();
  seeded = await seedDemoWorkspace(getDb());
});
afterAll(closeDb);

type Caller = Role | 'signed-out';
const callers: Caller[] = ['admin', 'engineer', 'reviewer', 'regulator', 'signed-out'];
const signInAs = (caller: Caller) => {
  session.current = caller === 'signed-out' ? null : { userId: seeded.userIds[caller], workspaceId: seeded.workspaceId };
};

const form = (fields: Record<string, string>) => {
  const data = new FormData();
  for (const [name, value] of Object.entries(fields)) data.set(name, value);
  return data;
};
// The driver may hand JSON columns back parsed or as text.
const asJson = (value: unknown) => (typeof value === 'string' ? JSON.parse(value) : value);
const counts = async () => {
  const [row] = await rawQuery<{ invitations: number; audit: number }>(
    'SELECT (SELECT COUNT(*) FROM invitations) AS invitations, (SELECT COUNT(*) FROM audit_events) AS audit',
  );
  return { invitations: Number(row.invitations), audit: Number(row.audit) };
};

// Expected from the product's roles table: only admins manage members.
const expectedStatus: Record<Caller, number> = { admin: 200, engineer: 403, reviewer: 403, regulator: 403, 'signed-out': 401 };

describe('GET /api/members', () => {
  it.each(callers)('as %s', async (caller) => {
    signInAs(caller);
    const response = await getMembers();
    expect(response.status).toBe(expectedStatus[caller]);
    const body = await response.json();
    if (caller === 'admin') {
      expect(body.members.map((m: { role: string }) => m.role).sort()).toEqual(['admin', 'engineer', 'regulator', 'reviewer']);
    } else {
      expect(body.members).toBeUndefined();
      expect(body.error.code).toBe(caller === 'signed-out' ? 'unauthenticated' : 'forbidden');
    }
  });
});

describe('inviteMemberAction refuses every role but admin, changing nothing', () => {
  it.each(callers.filter((c) => c !== 'admin'))('as %s', async (caller) => {
    signInAs(caller);
    const before = await counts();
    const state = await inviteMemberAction({ status: 'idle' }, form({ email: `from-${caller}@larkspur.example`, role: 'engineer' }));
    expect(state).toMatchObject({
      status: 'error',
      message: caller === 'signed-out' ? 'Sign in to continue.' : 'Your role does not allow this.',
    });
    expect(await counts()).toEqual(before);
  });
});

describe('changeMemberRoleAction refuses every role but admin, changing nothing', () => {
  it.each(callers.filter((c) => c !== 'admin'))('as %s', async (caller) => {
    signInAs(caller);
    const [target] = await rawQuery<{ id: number }>("SELECT id FROM memberships WHERE role = 'reviewer'");
    const before = await counts();
    const state = await changeMemberRoleAction({ status: 'idle' }, form({ membershipId: String(target.id), role: 'admin' }));
    expect(state.status).toBe('error');
    const [after] = await rawQuery<{ role: string }>('SELECT role FROM memberships WHERE id = ?', [target.id]);
    expect(after.role).toBe('reviewer');
    expect(await counts()).toEqual(before);
  });

  it('as admin: changes the role and writes one audit event with before and after', async () => {
    signInAs('admin');
    const [target] = await rawQuery<{ id: number }>("SELECT id FROM memberships WHERE role = 'reviewer'");
    const before = await counts();
    const state = await changeMemberRoleAction({ status: 'idle' }, form({ membershipId: String(target.id), role: 'engineer' }));
    expect(state).toEqual({ status: 'success', message: 'Role changed from Reviewer to Engineer.' });
    const events = await rawQuery<{ action: string; before: unknown; after: unknown; actor: number }>(
      'SELECT action, `before`, `after`, actor_user_id AS actor FROM audit_events ORDER BY id DESC LIMIT 1',
    );
    expect(events[0].action).toBe('membership.role-changed');
    expect(events[0].actor).toBe(seeded.userIds.admin);
    expect(asJson(events[0].before)).toEqual({ userId: seeded.userIds.reviewer, role: 'reviewer' });
    expect(asJson(events[0].after)).toEqual({ userId: seeded.userIds.reviewer, role: 'engineer' });
    expect((await counts()).audit).toBe(before.audit + 1);
  });

  it('as admin: refuses to demote the last admin, changing nothing', async () => {
    signInAs('admin');
    const [self] = await rawQuery<{ id: number }>("SELECT id FROM memberships WHERE role = 'admin'");
    const before = await counts();
    const state = await changeMemberRoleAction({ status: 'idle' }, form({ membershipId: String(self.id), role: 'engineer' }));
    expect(state).toMatchObject({
      status: 'error',
      fieldErrors: { role: ['The workspace needs at least one admin: make someone else admin first'] },
    });
    const [after] = await rawQuery<{ role: string }>('SELECT role FROM memberships WHERE id = ?', [self.id]);
    expect(after.role).toBe('admin');
    expect(await counts()).toEqual(before);
  });

  it('as admin: refuses a malformed role with the field and the reason', async () => {
    signInAs('admin');
    const state = await changeMemberRoleAction({ status: 'idle' }, form({ membershipId: '1', role: 'owner' }));
    expect(state).toMatchObject({ status: 'error', fieldErrors: { role: ['Role must be admin, engineer, reviewer or regulator'] } });
  });

  it('reads the role fresh from the database, not from the session token', async () => {
    // Promote the engineer, then demote them again: the guard follows each change at once.
    signInAs('admin');
    const [eng] = await rawQuery<{ id: number }>('SELECT id FROM memberships WHERE user_id = ?', [seeded.userIds.engineer]);
    await changeMemberRoleAction({ status: 'idle' }, form({ membershipId: String(eng.id), role: 'admin' }));
    signInAs('engineer');
    expect((await getMembers()).status).toBe(200);
    await changeMemberRoleAction({ status: 'idle' }, form({ membershipId: String(eng.id), role: 'engineer' }));
    expect((await getMembers()).status).toBe(403);
  });
});
