/** The demo revisions and reviews: one released, one under review; the seed is idempotent and its hash is the app's. */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { rawQuery, resetTestDatabase } from '@/unit/helpers/test-db';
import { closeDb, getDb } from '@/db/client';
import { seedDemoWorkspace } from '@/db/seed';
import { seedReviewData } from '@/db/seed-reviews';
import { seedWorkspaceData } from '@/db/seed-workspace';
import { listPlans } from '@/db/queries/plans';
import { toPlanSummaryDto } from '@/features/plans/types';
import { contentHash } from '@/features/rationale-export/content-hash';
import { asJson, writeCounts } from '@/unit/integration/revisions-fixtures';

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
});
