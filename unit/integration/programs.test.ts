/**
 * Program route handlers against the real test MariaDB: list, create, rename, archive per role;
 * refusals change nothing; a program of another workspace is 404; every write is audited.
 */
import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest';
import { rawQuery, resetTestDatabase } from '@/unit/helpers/test-db';
import { closeDb, getDb } from '@/db/client';
import { seedDemoWorkspace } from '@/db/seed';
import { memberships, programs, users, workspaces } from '@/db/schema';
import type { Role } from '@/lib/auth/roles';

const session = vi.hoisted(() => ({ current: null as null | { userId: number; workspaceId: number } }));
vi.mock('@/features/auth/session-source', () => ({ getSessionIdentity: async () => session.current }));

const programsRoute = await import('@/app/api/programs/route');
const programRoute = await import('@/app/api/programs/[programId]/route');
const programPlansRoute = await import('@/app/api/programs/[programId]/plans/route');

type Caller = Role | 'signed-out' | 'other-engineer';
let seeded: Awaited<ReturnType<typeof seedDemoWorkspace>>;
let other: { workspaceId: number; engineerId: number; programId: number };

const signInAs = (caller: Caller) => {
  if (caller === 'signed-out') session.current = null;
  else if (caller === 'other-engineer') session.current = { userId: other.engineerId, workspaceId: other.workspaceId };
  else session.current = { userId: seeded.userIds[caller], workspaceId: seeded.workspaceId };
};
const asJson = (value: unknown) => (typeof value === 'string' ? JSON.parse(value) : value);
const jsonRequest = (method: string, body: unknown, url = 'http://test.invalid/api/programs') =>
  new Request(url, { method, headers: { 'content-type': 'application/json' }, body: JSON.stringify(body) });
const ctx = (id: number | string) => ({ params: Promise.resolve({ programId: String(id) }) });

const list = (url = 'http://test.invalid/api/programs') => programsRoute.GET(new Request(url));
const create = (body: unknown) => programsRoute.POST(jsonRequest('POST', body));
const patch = (id: number | string, body: unknown) => programRoute.PATCH(jsonRequest('PATCH', body), ctx(id));

async function snapshot() {
  const rows = await rawQuery<{ id: number; name: string; description: string; archived: Date | null }>(
    'SELECT id, name, description, archived_at AS archived FROM programs ORDER BY id',
  );
  const [audit] = await rawQuery<{ n: number }>('SELECT COUNT(*) AS n FROM audit_events');
  return { rows, audit: Number(audit.n) };
}
async function lastAudit() {
  const [row] = await rawQuery<{ action: string; entityId: string; actor: number; workspaceId: number; before: unknown; after: unknown }>(
    'SELECT action, entity_id AS entityId, actor_user_id AS actor, workspace_id AS workspaceId, `before`, `after` FROM audit_events ORDER BY id DESC LIMIT 1',
  );
  return { ...row, before: asJson(row.before), after: asJson(row.after) };
}

beforeAll(async () => {
  await resetTestDatabase();
  const db = getDb();
  seeded = await seedDemoWorkspace(db);
  const [ws] = await db.insert(workspaces).values({ name: 'Other company', slug: 'other-company' }).$returningId();
  const [user] = await db
    .insert(users)
    .values({ email: 'olga.other@other.example', name: 'Olga Other', passwordHash: '$2b$10$' + 'x'.repeat(53) })
    .$returningId();
  await db.insert(memberships).values({ userId: user.id, workspaceId: ws.id, role: 'engineer' });
  const [program] = await db
    .insert(programs)
    .values({ workspaceId: ws.id, name: 'Their secret program', createdByUserId: user.id, updatedByUserId: user.id })
    .$returningId();
  other = { workspaceId: ws.id, engineerId: user.id, programId: program.id };
});
afterAll(closeDb);

let programId: number;

describe('POST /api/programs', () => {
  it.each(['engineer', 'admin'] as const)('as %s: 201, stored and audited', async (caller) => {
    signInAs(caller);
    const before = await snapshot();
    const response = await create({ name: `  Holter recorder (${caller})  `, description: 'Three-channel ambulatory ECG' });
    expect(response.status).toBe(201);
    const { program } = await response.json();
    expect(program).toMatchObject({ name: `Holter recorder (${caller})`, description: 'Three-channel ambulatory ECG', archivedAt: null, planCount: 0 });
    programId = Number(program.id);
    const after = await snapshot();
    expect(after.rows).toHaveLength(before.rows.length + 1);
    expect(after.audit).toBe(before.audit + 1);
    expect(await lastAudit()).toMatchObject({
      action: 'program.created',
      entityId: program.id,
      actor: seeded.userIds[caller],
      workspaceId: seeded.workspaceId,
      before: null,
      after: { name: `Holter recorder (${caller})`, description: 'Three-channel ambulatory ECG', archivedAt: null },
    });
  });

  it.each(['reviewer', 'regulator', 'signed-out'] as const)('as %s: refused and nothing changes', async (caller) => {
    signInAs(caller);
    const before = await snapshot();
    const response = await create({ name: 'Should not exist' });
    expect(response.status).toBe(caller === 'signed-out' ? 401 : 403);
    const body = await response.json();
    expect(body.error.code).toBe(caller === 'signed-out' ? 'unauthenticated' : 'forbidden');
    expect(await snapshot()).toEqual(before);
  });

  it('bad input: 422 naming the field and the reason; nothing changes', async () => {
    signInAs('engineer');
    const before = await snapshot();
    const cases: [unknown, string][] = [
      [{ name: '' }, 'name: name is required'],
      [{ name: 'x'.repeat(201) }, 'name: name must be at most 200 characters'],
      [{ name: 'ok', description: 'y'.repeat(2001) }, 'description: description must be at most 2000 characters'],
      [{ name: 42 }, 'name: name must be text'],
      [{ name: 'ok', owner: 'me' }, 'unknown field: owner'],
      [[1, 2], 'the request body must be a JSON object'],
    ];
    for (const [body, message] of cases) {
      const response = await create(body);
      expect(response.status, JSON.stringify(body)).toBe(422);
      expect((await response.json()).error.message).toBe(message);
    }
    expect(await snapshot()).toEqual(before);
  });
});

describe('GET /api/programs', () => {
  it.each(['admin', 'engineer', 'reviewer', 'regulator'] as const)('as %s: the workspace programs only', async (caller) => {
    signInAs(caller);
    const response = await list();
    expect(response.status).toBe(200);
    const names = (await response.json()).programs.map((p: { name: string }) => p.name);
    expect(names.sort()).toEqual(['Holter recorder (admin)', 'Holter recorder (engineer)']);
  });

  it('signed out: 401', async () => {
    signInAs('signed-out');
    expect((await list()).status).toBe(401);
  });

  it('another workspace sees only its own', async () => {
    signInAs('other-engineer');
    const names = (await (await list()).json()).programs.map((p: { name: string }) => p.name);
    expect(names).toEqual(['Their secret program']);
  });
});

describe('PATCH /api/programs/[programId]', () => {
  it('rename as engineer: 200, audited before → after', async () => {
    signInAs('engineer');
    const response = await patch(programId, { name: 'Holter recorder, rev 2' });
    expect(response.status).toBe(200);
    expect((await response.json()).program.name).toBe('Holter recorder, rev 2');
    expect(await lastAudit()).toMatchObject({
      action: 'program.renamed',
      before: { name: 'Holter recorder (admin)' },
      after: { name: 'Holter recorder, rev 2' },
    });
  });

  it.each(['reviewer', 'regulator'] as const)('as %s: 403, nothing changes', async (caller) => {
    signInAs(caller);
    const before = await snapshot();
    const response = await patch(programId, { name: 'Hijacked' });
    expect(response.status).toBe(403);
    expect((await response.json()).error).toEqual({ code: 'forbidden', message: 'Only engineers and admins can change programs.' });
    expect(await snapshot()).toEqual(before);
  });

  it('a program of another workspace: 404 for GET and PATCH, nothing changes', async () => {
    signInAs('engineer');
    const before = await snapshot();
    expect((await programRoute.GET(new Request('http://test.invalid'), ctx(other.programId))).status).toBe(404);
    const response = await patch(other.programId, { name: 'Mine now' });
    expect(response.status).toBe(404);
    expect((await response.json()).error).toEqual({ code: 'not-found', message: 'No such program in this workspace.' });
    expect(await snapshot()).toEqual(before);
  });

  it('archive: hidden from the default list, listed with ?archived=include, no new plans (409); restore; both audited', async () => {
    signInAs('engineer');
    expect((await patch(programId, { archived: true })).status).toBe(200);
    expect(await lastAudit()).toMatchObject({ action: 'program.archived', before: { archivedAt: null } });
    const visible = (await (await list()).json()).programs.map((p: { id: string }) => p.id);
    expect(visible).not.toContain(String(programId));
    const all = (await (await list('http://test.invalid/api/programs?archived=include')).json()).programs.map((p: { id: string }) => p.id);
    expect(all).toContain(String(programId));

    const before = await snapshot();
    const refused = await programPlansRoute.POST(jsonRequest('POST', { source: 'blank', name: 'Late plan' }), ctx(programId));
    expect(refused.status).toBe(409);
    expect((await refused.json()).error.message).toBe('This program is archived; restore it before adding plans.');
    expect(await snapshot()).toEqual(before);

    expect((await patch(programId, { archived: false })).status).toBe(200);
    expect(await lastAudit()).toMatchObject({ action: 'program.restored', after: { archivedAt: null } });
  });

  it('an empty body: 422; an unchanged value writes nothing', async () => {
    signInAs('engineer');
    const empty = await patch(programId, {});
    expect(empty.status).toBe(422);
    expect((await empty.json()).error.message).toBe('give at least one of name, description or archived');
    const before = await snapshot();
    expect((await patch(programId, { name: 'Holter recorder, rev 2' })).status).toBe(200);
    expect(await snapshot()).toEqual(before);
  });
});
