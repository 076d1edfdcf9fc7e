/**
 * Channel-plan route handlers against the real test MariaDB: create (blank, template, duplicate),
 * read, save with optimistic concurrency, rename/archive, per role; stale and invalid saves are
 * refused with nothing changed; ids of another workspace are 404; every write is audited.
 */
import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest';
import { rawQuery, resetTestDatabase } from '@/unit/helpers/test-db';
import { closeDb, getDb } from '@/db/client';
import { seedDemoWorkspace } from '@/db/seed';
import { memberships, programs, users, workspaces } from '@/db/schema';
import wearablePatch from '@/lib/engine/demo-plans/wearable-ecg-patch.json';
import type { Role } from '@/lib/auth/roles';

const session = vi.hoisted(() => ({ current: null as null | { userId: number; workspaceId: number } }));
vi.mock('@/features/auth/session-source', () => ({ getSessionIdentity: async () => session.current }));

const programPlansRoute = await import('@/app/api/programs/[programId]/plans/route');
const planRoute = await import('@/app/api/plans/[planId]/route');

type Caller = Role | 'signed-out' | 'other-engineer';
let seeded: Awaited<ReturnType<typeof seedDemoWorkspace>>;
let other: { workspaceId: number; engineerId: number; programId: number };
let programId: number;

const signInAs = (caller: Caller) => {
  if (caller === 'signed-out') session.current = null;
  else if (caller === 'other-engineer') session.current = { userId: other.engineerId, workspaceId: other.workspaceId };
  else session.current = { userId: seeded.userIds[caller], workspaceId: seeded.workspaceId };
};

const asJson = (value: unknown) => (typeof value === 'string' ? JSON.parse(value) : value);
const jsonRequest = (method: string, body: unknown, url = 'http://test.invalid/api') =>
  new Request(url, { method, headers: { 'content-type': 'application/json' }, body: typeof body === 'string' ? body : JSON.stringify(body) });
const programCtx = (id: number | string) => ({ params: Promise.resolve({ programId: String(id) }) });
const planCtx = (id: number | string) => ({ params: Promise.resolve({ planId: String(id) }) });

const createPlan = (body: unknown, pid: number | string = programId) =>
  programPlansRoute.POST(jsonRequest('POST', body), programCtx(pid));
const savePlan = (planId: number, body: unknown) => planRoute.PUT(jsonRequest('PUT', body), planCtx(planId));
const patchPlan = (planId: number, body: unknown) => planRoute.PATCH(jsonRequest('PATCH', body), planCtx(planId));
const getPlan = (planId: number | string) => planRoute.GET(new Request('http://test.invalid/api'), planCtx(planId));

/** The stored row, read with raw SQL (bypassing the app's queries). */
async function storedPlan(planId: number) {
  const [row] = await rawQuery<{ name: string; version: number; plan: unknown; report: unknown; worst: string | null; archived: Date | null }>(
    'SELECT name, version, plan, report, worst_verdict AS worst, archived_at AS archived FROM channel_plans WHERE id = ?',
    [planId],
  );
  return row ? { ...row, plan: asJson(row.plan) as Record<string, any>, report: asJson(row.report) as Record<string, any> } : undefined;
}
async function counts() {
  const [row] = await rawQuery<{ plans: number; audit: number }>(
    'SELECT (SELECT COUNT(*) FROM channel_plans) AS plans, (SELECT COUNT(*) FROM audit_events) AS audit',
  );
  return { plans: Number(row.plans), audit: Number(row.audit) };
}
async function lastAudit() {
  const [row] = await rawQuery<{ action: string; entityType: string; entityId: string; actor: number; before: unknown; after: unknown }>(
    'SELECT action, entity_type AS entityType, entity_id AS entityId, actor_user_id AS actor, `before`, `after` FROM audit_events ORDER BY id DESC LIMIT 1',
  );
  return { ...row, before: asJson(row.before) as any, after: asJson(row.after) as any };
}

/** G1 = 1 + 2R/Rg of the three-op-amp instrumentation amplifier (Sedra & Smith, Microelectronic Circuits). */
const threeOpAmpGain = (rOhm: number, rgOhm: number) => 1 + (2 * rOhm) / rgOhm;

beforeAll(async () => {
  await resetTestDatabase();
  const db = getDb();
  seeded = await seedDemoWorkspace(db);
  const [program] = await db
    .insert(programs)
    .values({ workspaceId: seeded.workspaceId, name: 'Test program', createdByUserId: seeded.userIds.engineer, updatedByUserId: seeded.userIds.engineer })
    .$returningId();
  programId = program.id;
  // A second workspace with its own engineer and program: its ids must be invisible to Larkspur, and vice versa.
  const [ws] = await db.insert(workspaces).values({ name: 'Other company', slug: 'other-company' }).$returningId();
  const [user] = await db
    .insert(users)
    .values({ email: 'olga.other@other.example', name: 'Olga Other', passwordHash: '$2b$10$' + 'x'.repeat(53) })
    .$returningId();
  await db.insert(memberships).values({ userId: user.id, workspaceId: ws.id, role: 'engineer' });
  const [otherProgram] = await db
    .insert(programs)
    .values({ workspaceId: ws.id, name: 'Their program', createdByUserId: user.id, updatedByUserId: user.id })
    .$returningId();
  other = { workspaceId: ws.id, engineerId: user.id, programId: otherProgram.id };
});
afterAll(closeDb);

let templatePlanId: number;

describe('POST /api/programs/[programId]/plans', () => {
  it('as engineer, from the wearable-ECG template: 201, stored with the server-computed report and audited', async () => {
    signInAs('engineer');
    const before = await counts();
    const response = await createPlan({ source: 'template', templateId: 'wearable-ecg-patch' });
    expect(response.status).toBe(201);
    const { plan } = await response.json();
    expect(plan).toMatchObject({ name: wearablePatch.name, version: 1, state: 'draft', revision: null, profileId: 'monitoring-ecg', application: 'ecg' });
    templatePlanId = Number(plan.id);

    const stored = await storedPlan(templatePlanId);
    expect(stored?.version).toBe(1);
    expect(stored?.plan.instrumentation.rgOhm).toBe(wearablePatch.instrumentation.rgOhm);
    // 1 + 2·24.9 kΩ / 19.9 kΩ = 3.5025 (three-op-amp gain formula, Sedra & Smith).
    expect(stored?.report.gains.g1).toBeCloseTo(threeOpAmpGain(24_900, 19_900), 9);
    expect(stored?.report.gains.g1).toBeCloseTo(3.50251, 4);

    expect(await counts()).toEqual({ plans: before.plans + 1, audit: before.audit + 1 });
    const audit = await lastAudit();
    expect(audit).toMatchObject({ action: 'plan.created', entityType: 'channel-plan', entityId: String(templatePlanId), actor: seeded.userIds.engineer });
    expect(audit.before).toBeNull();
    expect(audit.after).toMatchObject({ programId, name: wearablePatch.name, origin: { kind: 'template', templateId: 'wearable-ecg-patch' } });
  });

  it('as admin, blank: a complete placeholder plan that validates (target gain 5 → G1 = 5)', async () => {
    signInAs('admin');
    const response = await createPlan({ source: 'blank', name: 'Scratch channel' });
    expect(response.status).toBe(201);
    const { plan } = await response.json();
    const stored = await storedPlan(Number(plan.id));
    expect(stored?.name).toBe('Scratch channel');
    expect(stored?.plan.name).toBe('Scratch channel');
    expect(stored?.report.gains.g1).toBe(5);
    expect(stored?.report.gains.totalGain).toBe(5 * 1 * 50);
    expect((await lastAudit()).after.origin).toEqual({ kind: 'blank' });
  });

  it('duplicate: a copy with the same body under a new name, audited as plan.duplicated', async () => {
    signInAs('engineer');
    const response = await createPlan({ source: 'duplicate', planId: String(templatePlanId) });
    expect(response.status).toBe(201);
    const { plan } = await response.json();
    expect(plan.name).toBe(`Copy of ${wearablePatch.name}`);
    const original = await storedPlan(templatePlanId);
    const copy = await storedPlan(Number(plan.id));
    expect({ ...copy?.plan, name: 'x' }).toEqual({ ...original?.plan, name: 'x' });
    expect(await lastAudit()).toMatchObject({ action: 'plan.duplicated', after: { origin: { kind: 'duplicate', sourcePlanId: templatePlanId } } });
  });

  it.each(['reviewer', 'regulator'] as const)('as %s: 403 forbidden and nothing changes', async (caller) => {
    signInAs(caller);
    const before = await counts();
    const response = await createPlan({ source: 'template', templateId: 'emg-sleeve' });
    expect(response.status).toBe(403);
    expect((await response.json()).error).toEqual({ code: 'forbidden', message: 'Only engineers and admins can create plans.' });
    expect(await counts()).toEqual(before);
  });

  it('signed out: 401 and nothing changes', async () => {
    signInAs('signed-out');
    const before = await counts();
    const response = await createPlan({ source: 'blank', name: 'Nope' });
    expect(response.status).toBe(401);
    expect(await counts()).toEqual(before);
  });

  it('bad bodies: 422 naming the field and the reason', async () => {
    signInAs('engineer');
    const before = await counts();
    const unknownTemplate = await createPlan({ source: 'template', templateId: 'toaster' });
    expect(unknownTemplate.status).toBe(422);
    expect((await unknownTemplate.json()).error.message).toMatch(/^templateId: templateId must be one of wearable-ecg-patch, /);
    const emptyName = await createPlan({ source: 'blank', name: '   ' });
    expect((await emptyName.json()).error).toMatchObject({ code: 'invalid-input', message: 'name: name is required' });
    const longName = await createPlan({ source: 'blank', name: 'x'.repeat(201) });
    expect((await longName.json()).error.message).toBe('name: name must be at most 200 characters');
    const badSource = await createPlan({ source: 'photocopy' });
    expect((await badSource.json()).error.message).toMatch(/source must be blank, template or duplicate/);
    const notJson = await createPlan('{"source": ');
    expect(notJson.status).toBe(422);
    expect((await notJson.json()).error.message).toBe('The request body must be valid JSON.');
    expect(await counts()).toEqual(before);
  });

  it('a program of another workspace, or a plan of another workspace to copy: 404 and nothing changes', async () => {
    signInAs('engineer');
    const before = await counts();
    const foreignProgram = await createPlan({ source: 'blank', name: 'Sneaky' }, other.programId);
    expect(foreignProgram.status).toBe(404);
    signInAs('other-engineer');
    const foreignCopy = await createPlan({ source: 'duplicate', planId: templatePlanId }, other.programId);
    expect(foreignCopy.status).toBe(404);
    expect((await foreignCopy.json()).error.message).toBe('No such plan to duplicate in this workspace.');
    expect(await counts()).toEqual(before);
  });
});

describe('GET /api/plans/[planId] and the program plan list', () => {
  it.each(['admin', 'engineer', 'reviewer'] as const)('as %s: 200 with the plan and its stored report', async (caller) => {
    signInAs(caller);
    const response = await getPlan(templatePlanId);
    expect(response.status).toBe(200);
    const { plan } = await response.json();
    expect(plan.plan.instrumentation.rOhm).toBe(24_900);
    expect(plan.report.gains.g1).toBeCloseTo(threeOpAmpGain(24_900, 19_900), 9);
    expect(plan.programName).toBe('Test program');
  });

  it('as regulator: 403 (drafts are not shared with regulators, per the roles table)', async () => {
    signInAs('regulator');
    const response = await getPlan(templatePlanId);
    expect(response.status).toBe(403);
    expect((await response.json()).error.code).toBe('forbidden');
  });

  it('an id of another workspace, an unknown id and a malformed id are all 404', async () => {
    signInAs('other-engineer');
    expect((await getPlan(templatePlanId)).status).toBe(404);
    signInAs('engineer');
    expect((await getPlan(999_999)).status).toBe(404);
    expect((await getPlan('12abc')).status).toBe(404);
  });

  it('the list shows the plans with their worst verdict, and none for another workspace', async () => {
    signInAs('reviewer');
    const response = await programPlansRoute.GET(new Request('http://test.invalid/api'), programCtx(programId));
    const { plans } = await response.json();
    expect(plans.map((p: { name: string }) => p.name).sort()).toEqual(
      [wearablePatch.name, `Copy of ${wearablePatch.name}`, 'Scratch channel'].sort(),
    );
    const patch = plans.find((p: { id: string }) => p.id === String(templatePlanId));
    const stored = await storedPlan(templatePlanId);
    const checks = stored!.report.checks as { verdict: string }[];
    const expectedWorst = checks.some((c) => c.verdict === 'fails') ? 'fails' : checks.some((c) => c.verdict === 'marginal') ? 'marginal' : 'meets';
    expect(patch.worstVerdict).toBe(expectedWorst);
    signInAs('other-engineer');
    expect((await programPlansRoute.GET(new Request('http://test.invalid/api'), programCtx(programId))).status).toBe(404);
  });
});

describe('PUT /api/plans/[planId] (save with optimistic concurrency)', () => {
  const withRg = (plan: Record<string, any>, rgOhm: number) => ({
    ...plan,
    instrumentation: { ...plan.instrumentation, rgOhm },
  });

  it('as engineer: 200 with version 2 and the server-computed report; stored and audited before → after', async () => {
    signInAs('engineer');
    const stored = await storedPlan(templatePlanId);
    const before = await counts();
    // Rg = 12.45 kΩ with R = 24.9 kΩ gives G1 = 1 + 49.8/12.45 = 5 exactly. A report sent by the client is ignored.
    const response = await savePlan(templatePlanId, { plan: withRg(stored!.plan, 12_450), version: 1, report: { gains: { g1: 999 } } });
    expect(response.status).toBe(200);
    const body = await response.json();
    expect(body.version).toBe(2);
    expect(body.report.gains.g1).toBeCloseTo(threeOpAmpGain(24_900, 12_450), 12);
    expect(body.report.gains.g1).toBeCloseTo(5, 12);

    const after = await storedPlan(templatePlanId);
    expect(after?.version).toBe(2);
    expect(after?.plan.instrumentation.rgOhm).toBe(12_450);
    expect(after?.report.gains.g1).toBeCloseTo(5, 12);
    expect(await counts()).toEqual({ plans: before.plans, audit: before.audit + 1 });
    const audit = await lastAudit();
    expect(audit).toMatchObject({ action: 'plan.saved', entityId: String(templatePlanId), actor: seeded.userIds.engineer });
    expect(audit.before.version).toBe(1);
    expect(audit.before.plan.instrumentation.rgOhm).toBe(19_900);
    expect(audit.after.version).toBe(2);
    expect(audit.after.plan.instrumentation.rgOhm).toBe(12_450);
  });

  it('a stale version: 409 with the stored plan, version, who and when; nothing changes', async () => {
    signInAs('admin');
    const stored = await storedPlan(templatePlanId);
    const before = await counts();
    const response = await savePlan(templatePlanId, { plan: withRg(stored!.plan, 2_490), version: 1 });
    expect(response.status).toBe(409);
    const body = await response.json();
    expect(body.error.code).toBe('stale');
    expect(body.error.message).toMatch(/^This plan was saved by .+ at .* \(version 2\) after you loaded it; nothing was saved\.$/);
    expect(body.current.version).toBe(2);
    const [engineer] = await rawQuery<{ name: string }>('SELECT name FROM users WHERE id = ?', [seeded.userIds.engineer]);
    expect(body.current.updatedByName).toBe(engineer.name);
    expect(Number.isNaN(Date.parse(body.current.updatedAt))).toBe(false);
    expect(body.current.plan.instrumentation.rgOhm).toBe(12_450);
    const after = await storedPlan(templatePlanId);
    expect(after?.version).toBe(2);
    expect(after?.plan).toEqual(stored?.plan);
    expect(await counts()).toEqual(before);
  });

  it('two saves from the same version at once: exactly one is saved, the other is stale', async () => {
    signInAs('engineer');
    const stored = await storedPlan(templatePlanId);
    const [a, b] = await Promise.all([
      savePlan(templatePlanId, { plan: withRg(stored!.plan, 10_000), version: 2 }),
      savePlan(templatePlanId, { plan: withRg(stored!.plan, 20_000), version: 2 }),
    ]);
    expect([a.status, b.status].sort()).toEqual([200, 409]);
    const winner = a.status === 200 ? 10_000 : 20_000;
    const after = await storedPlan(templatePlanId);
    expect(after?.version).toBe(3);
    expect(after?.plan.instrumentation.rgOhm).toBe(winner);
  });

  it('an invalid plan: 422 with every offending field path; nothing changes', async () => {
    signInAs('engineer');
    const stored = await storedPlan(templatePlanId);
    const before = await counts();
    const bad = { ...withRg(stored!.plan, -5), adc: { ...stored!.plan.adc, bits: 7 } };
    const response = await savePlan(templatePlanId, { plan: bad, version: 3 });
    expect(response.status).toBe(422);
    const body = await response.json();
    expect(body.error.code).toBe('invalid');
    const paths = body.error.issues.map((i: { path: string }) => i.path);
    expect(paths).toContain('instrumentation.rgOhm');
    expect(paths).toContain('adc.bits');
    expect(body.error.issues).toContainEqual({ path: 'adc.bits', message: 'ADC resolution must be at least 8 bits' });
    expect(body.error.issues).toContainEqual({ path: 'instrumentation.rgOhm', message: 'gain resistance Rg must be greater than zero' });
    expect(await storedPlan(templatePlanId)).toEqual(stored);
    expect(await counts()).toEqual(before);
  });

  it('a malformed body: 422 naming the field', async () => {
    signInAs('engineer');
    const response = await savePlan(templatePlanId, { plan: {}, version: 'three' });
    expect(response.status).toBe(422);
    expect((await response.json()).error.message).toBe('version: version must be a number');
  });

  it.each(['reviewer', 'regulator'] as const)('as %s: 403 and the stored plan is unchanged', async (caller) => {
    signInAs(caller);
    const stored = await storedPlan(templatePlanId);
    const before = await counts();
    const response = await savePlan(templatePlanId, { plan: withRg(stored!.plan, 1_000), version: stored!.version });
    expect(response.status).toBe(403);
    expect((await response.json()).error).toEqual({ code: 'forbidden', message: 'Only engineers and admins can edit plans.' });
    expect(await storedPlan(templatePlanId)).toEqual(stored);
    expect(await counts()).toEqual(before);
  });

  it('an engineer of another workspace: 404 and the plan is unchanged', async () => {
    signInAs('other-engineer');
    const stored = await storedPlan(templatePlanId);
    const response = await savePlan(templatePlanId, { plan: withRg(stored!.plan, 1_000), version: stored!.version });
    expect(response.status).toBe(404);
    expect(await storedPlan(templatePlanId)).toEqual(stored);
  });
});

describe('PATCH /api/plans/[planId] (rename, archive)', () => {
  it('rename: the column and the plan body are renamed, the version goes up, audited plan.renamed', async () => {
    signInAs('engineer');
    const stored = await storedPlan(templatePlanId);
    const response = await patchPlan(templatePlanId, { name: 'Patch, gain 5' });
    expect(response.status).toBe(200);
    const after = await storedPlan(templatePlanId);
    expect(after?.name).toBe('Patch, gain 5');
    expect(after?.plan.name).toBe('Patch, gain 5');
    expect(after?.report.planName).toBe('Patch, gain 5');
    expect(after?.version).toBe(stored!.version + 1);
    expect(await lastAudit()).toMatchObject({
      action: 'plan.renamed',
      before: { name: stored!.name, version: stored!.version },
      after: { name: 'Patch, gain 5', version: stored!.version + 1 },
    });
  });

  it('as reviewer: 403, nothing changes', async () => {
    signInAs('reviewer');
    const stored = await storedPlan(templatePlanId);
    const before = await counts();
    const response = await patchPlan(templatePlanId, { archived: true });
    expect(response.status).toBe(403);
    expect(await storedPlan(templatePlanId)).toEqual(stored);
    expect(await counts()).toEqual(before);
  });

  it('archive: hidden from the list, saves refused with 409; restore brings it back; both audited', async () => {
    signInAs('engineer');
    expect((await patchPlan(templatePlanId, { archived: true })).status).toBe(200);
    expect(await lastAudit()).toMatchObject({ action: 'plan.archived' });
    const stored = await storedPlan(templatePlanId);
    expect(stored?.archived).not.toBeNull();
    const list = await (await programPlansRoute.GET(new Request('http://test.invalid/api'), programCtx(programId))).json();
    expect(list.plans.map((p: { id: string }) => p.id)).not.toContain(String(templatePlanId));
    const withArchived = await (
      await programPlansRoute.GET(new Request('http://test.invalid/api?archived=include'), programCtx(programId))
    ).json();
    expect(withArchived.plans.map((p: { id: string }) => p.id)).toContain(String(templatePlanId));

    const save = await savePlan(templatePlanId, { plan: stored!.plan, version: stored!.version });
    expect(save.status).toBe(409);
    expect((await save.json()).error.code).toBe('conflict');
    expect(await storedPlan(templatePlanId)).toEqual(stored);

    expect((await patchPlan(templatePlanId, { archived: false })).status).toBe(200);
    expect(await lastAudit()).toMatchObject({ action: 'plan.restored' });
    expect((await storedPlan(templatePlanId))?.archived).toBeNull();
  });

  it('an empty or unknown-field body: 422 with the reason', async () => {
    signInAs('engineer');
    expect((await (await patchPlan(templatePlanId, {})).json()).error.message).toBe('give at least one of name or archived');
    expect((await (await patchPlan(templatePlanId, { colour: 'red' })).json()).error.message).toBe(
      'unknown field: colour; give at least one of name or archived',
    );
  });
});
