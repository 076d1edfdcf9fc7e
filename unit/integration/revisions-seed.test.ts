/** The demo revisions and reviews: one released, one under review; the seed is idempotent and its hash is the app's. */
import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest';
import { rawQuery, resetTestDatabase } from '@/unit/helpers/test-db';
import { closeDb, getDb } from '@/db/client';
import { seedDemoWorkspace } from '@/db/seed';
import { seedReviewData } from '@/db/seed-reviews';
import { seedWorkspaceData } from '@/db/seed-workspace';
import { listPlans } from '@/db/queries/plans';
import { toPlanSummaryDto } from '@/features/plans/types';
import { contentHash } from '@/features/rationale-export/content-hash';
import { asJson, writeCounts } from '@/unit/integration/revisions-fixtures';

const session = vi.hoisted(() => ({ current: null as null | { userId: number; workspaceId: number } }));
vi.mock('@/features/auth/session-source', () => ({ getSessionIdentity: async () => session.current }));
const partRoute = await import('@/app/api/parts/[partId]/route');
const retireRoute = await import('@/app/api/parts/[partId]/retire/route');

let seeded: Awaited<ReturnType<typeof seedDemoWorkspace>>;
beforeAll(async () => {
  await resetTestDatabase();
  seeded = await seedDemoWorkspace(getDb());
  await seedWorkspaceData(getDb(), { workspaceId: seeded.workspaceId, engineerUserId: seeded.userIds.engineer });
  await seedReviewData(getDb(), { workspaceId: seeded.workspaceId, userIds: seeded.userIds });
});
afterAll(closeDb);

describe('demo revisions', () => {
  it('hold one released revision (signed by the reviewer) and one under review', async () => {
    const rows = await rawQuery<{ name: string; label: string; state: string }>(
      'SELECT p.name, r.label, r.state FROM plan_revisions r JOIN channel_plans p ON p.id = r.plan_id ORDER BY r.id',
    );
    expect(rows).toEqual([
      { name: 'Larkspur 12-lead diagnostic cart front end', label: 'A', state: 'released' },
      { name: 'Larkspur two-lead wearable ECG patch', label: 'A', state: 'in-review' },
    ]);
    const signatures = await rawQuery<{ signer_user_id: number; meaning: string }>('SELECT signer_user_id, meaning FROM review_signatures');
    expect(signatures).toEqual([{ signer_user_id: seeded.userIds.reviewer, meaning: 'approved' }]);
  });

  it("show in their program's plan table as the plan's newest revision and its state", async () => {
    const plans = await rawQuery<{ id: number; program_id: number; name: string }>('SELECT id, program_id, name FROM channel_plans');
    const byName = new Map(plans.map((p) => [p.name, p]));
    const row = async (name: string) => {
      const plan = byName.get(name)!;
      const list = await listPlans({ workspaceId: seeded.workspaceId, programId: plan.program_id });
      return toPlanSummaryDto(list.find((p) => p.id === plan.id)!);
    };
    expect(await row('Larkspur 12-lead diagnostic cart front end')).toMatchObject({ revision: 'A', state: 'released' });
    expect(await row('Larkspur two-lead wearable ECG patch')).toMatchObject({ revision: 'A', state: 'in-review' });
  });

  it('carry the content hash the app computes for their plan and report', async () => {
    const rows = await rawQuery<{ plan: unknown; report: unknown; content_hash: string }>('SELECT plan, report, content_hash FROM plan_revisions');
    for (const row of rows) expect(row.content_hash).toBe(contentHash({ plan: asJson(row.plan), report: asJson(row.report) }));
  });

  it('are not added twice when the seed runs again', async () => {
    const before = await writeCounts();
    expect(await seedReviewData(getDb(), { workspaceId: seeded.workspaceId, userIds: seeded.userIds })).toEqual({ releasedRevisionId: null, inReviewRevisionId: null });
    expect(await writeCounts()).toEqual(before);
  });

  it('keep the part values they were frozen with when the library part is edited and retired later', async () => {
    const [revision] = await rawQuery<{ plan_id: number; plan: unknown; report: unknown; content_hash: string }>(
      "SELECT plan_id, plan, report, content_hash FROM plan_revisions WHERE state = 'released'",
    );
    const frozenPlan = asJson(revision.plan) as { instrumentation: { opAmp: { enVPerRtHz: number; source: string } } };
    const [draftBefore] = await rawQuery<{ plan: unknown; version: number }>('SELECT plan, version FROM channel_plans WHERE id = ?', [revision.plan_id]);
    const [part] = await rawQuery<{ id: number; kind: string; name: string; description: string; source_note: string; status: string; values: unknown }>(
      "SELECT id, kind, name, description, source_note, status, `values` FROM parts WHERE name = 'Generic low-noise INA, 8 nV/√Hz'",
    );
    // The cart's input stage uses this part's 8 nV/√Hz (its source note names it).
    expect(frozenPlan.instrumentation.opAmp.enVPerRtHz).toBe(8e-9);
    expect(frozenPlan.instrumentation.opAmp.source).toMatch(/low-noise INA/);

    session.current = { userId: seeded.userIds.engineer, workspaceId: seeded.workspaceId };
    const body = { kind: part.kind, name: part.name, description: part.description, sourceNote: 'remeasured on the bench', status: 'not-for-new-designs', ...(asJson(part.values) as object), enVPerRtHz: 20e-9 };
    const ctx = { params: Promise.resolve({ partId: String(part.id) }) };
    const edited = await partRoute.PUT(new Request('http://test.invalid/api', { method: 'PUT', headers: { 'content-type': 'application/json' }, body: JSON.stringify(body) }), ctx);
    expect(edited.status).toBe(200);
    expect((await retireRoute.POST(new Request('http://test.invalid/api', { method: 'POST', headers: { 'content-type': 'application/json' }, body: '{}' }), ctx)).status).toBe(200);

    const [after] = await rawQuery<{ plan: unknown; report: unknown; content_hash: string }>('SELECT plan, report, content_hash FROM plan_revisions WHERE plan_id = ? AND state = ?', [revision.plan_id, 'released']);
    expect(asJson(after.plan)).toEqual(asJson(revision.plan));
    expect(asJson(after.report)).toEqual(asJson(revision.report));
    expect(after.content_hash).toBe(revision.content_hash);
    expect(contentHash({ plan: asJson(after.plan), report: asJson(after.report) })).toBe(revision.content_hash);
    // The draft plan, which copied the values when the part was chosen, is not changed either.
    const [draftAfter] = await rawQuery<{ plan: unknown; version: number }>('SELECT plan, version FROM channel_plans WHERE id = ?', [revision.plan_id]);
    expect(asJson(draftAfter.plan)).toEqual(asJson(draftBefore.plan));
    expect(draftAfter.version).toBe(draftBefore.version);
  });
});
