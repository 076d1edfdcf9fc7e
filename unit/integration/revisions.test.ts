/**
 * Revisions through the route handlers against the real test MariaDB: freezing (labels, the
 * server's own report, the content hash), immutability through every route, the db layer and raw
 * SQL (triggers), compare, history, and the JSON export → import round trip.
 */
import { createHash } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest';
import { eq } from 'drizzle-orm';
import { openRawConnection, rawQuery, resetTestDatabase } from '@/unit/helpers/test-db';
import { closeDb, getDb } from '@/db/client';
import { planRevisions } from '@/db/schema';
import { savePlan } from '@/db/queries/plans';
import { seedDemoWorkspace } from '@/db/seed';
import { seedWorkspaceData } from '@/db/seed-workspace';
import { evaluate } from '@/lib/engine/evaluate';
import { parsePlan } from '@/lib/engine/validate';
import { asJson, getRequest, jsonRequest, latestAudit, params, writeCounts } from '@/unit/integration/revisions-fixtures';

const session = vi.hoisted(() => ({ current: null as null | { userId: number; workspaceId: number } }));
vi.mock('@/features/auth/session-source', () => ({ getSessionIdentity: async () => session.current }));

const planRevisionsRoute = await import('@/app/api/plans/[planId]/revisions/route');
const compareRoute = await import('@/app/api/plans/[planId]/revisions/compare/route');
const planHistoryRoute = await import('@/app/api/plans/[planId]/revisions/history/route');
const revisionRoute = await import('@/app/api/revisions/[revisionId]/route');
const revisionHistoryRoute = await import('@/app/api/revisions/[revisionId]/history/route');
const exportRoute = await import('@/app/api/revisions/[revisionId]/export/route');
const importRoute = await import('@/app/api/programs/[programId]/plans/import/route');
const planRoute = await import('@/app/api/plans/[planId]/route');
const programPlansRoute = await import('@/app/api/programs/[programId]/plans/route');

let seeded: Awaited<ReturnType<typeof seedDemoWorkspace>>;
let planId: number;
let programId: number;
const as = (role: 'admin' | 'engineer' | 'reviewer' | 'regulator') => {
  session.current = { userId: seeded.userIds[role], workspaceId: seeded.workspaceId };
};

beforeAll(async () => {
  await resetTestDatabase();
  seeded = await seedDemoWorkspace(getDb());
  const data = await seedWorkspaceData(getDb(), { workspaceId: seeded.workspaceId, engineerUserId: seeded.userIds.engineer });
  planId = data.planIds['diagnostic-cart-12-lead'];
  programId = data.programIds['12-lead diagnostic cart front end'];
});
afterAll(closeDb);

/** Canonical JSON written independently of the app: keys sorted, no whitespace (RFC 8785 for plain data). */
function canonical(value: unknown): string {
  if (value === null || typeof value !== 'object') return JSON.stringify(value);
  if (Array.isArray(value)) return `[${value.map(canonical).join(',')}]`;
  const record = value as Record<string, unknown>;
  return `{${Object.keys(record)
    .filter((k) => record[k] !== undefined)
    .sort()
    .map((k) => `${JSON.stringify(k)}:${canonical(record[k])}`)
    .join(',')}}`;
}

async function storedPlan() {
  const [row] = await rawQuery<{ plan: unknown; version: number }>('SELECT plan, version FROM channel_plans WHERE id = ?', [planId]);
  return { plan: asJson(row.plan) as Record<string, unknown>, version: Number(row.version) };
}

async function freeze(changeSummary: string) {
  const { version } = await storedPlan();
  return planRevisionsRoute.POST(jsonRequest('POST', `/api/plans/${planId}/revisions`, { changeSummary, planVersion: version }), params({ planId: String(planId) }));
}

let revisionA: { id: string; label: string; contentHash: string };
let revisionB: { id: string; label: string; contentHash: string };

describe('freezing a revision', () => {
  it('stores the plan, the server-computed report and the SHA-256 of their canonical JSON as revision A', async () => {
    as('engineer');
    const response = await freeze('First frozen design for the review');
    expect(response.status).toBe(201);
    const body = await response.json();
    revisionA = body.revision;
    expect(body.revision).toMatchObject({ label: 'A', state: 'draft', changeSummary: 'First frozen design for the review', planVersion: 1 });

    const [row] = await rawQuery<{ plan: unknown; report: unknown; content_hash: string; created_by_user_id: number }>(
      'SELECT plan, report, content_hash, created_by_user_id FROM plan_revisions WHERE id = ?',
      [Number(revisionA.id)],
    );
    const plan = asJson(row.plan);
    const report = asJson(row.report);
    // The report is the engine's, recomputed from the stored plan (not anything the client sent).
    const { plan: draft } = await storedPlan();
    expect(plan).toEqual(JSON.parse(JSON.stringify(parsePlan(draft))));
    expect(report).toEqual(JSON.parse(JSON.stringify(evaluate(parsePlan(draft)))));
    // FIPS 180-4 SHA-256 (node:crypto) of the independently written canonical text.
    const expectedHash = createHash('sha256').update(canonical({ plan, report }), 'utf8').digest('hex');
    expect(row.content_hash).toBe(expectedHash);
    expect(revisionA.contentHash).toBe(expectedHash);
    expect(row.created_by_user_id).toBe(seeded.userIds.engineer);
  });

  it('writes the audit event and the first state event in the same transaction', async () => {
    const [event] = await latestAudit(1);
    expect(event).toMatchObject({ action: 'revision.created', entity_type: 'plan-revision', entity_id: revisionA.id, actor_user_id: seeded.userIds.engineer });
    expect(event.after).toMatchObject({ label: 'A', state: 'draft', contentHash: revisionA.contentHash });
    const states = await rawQuery<{ from_state: string | null; to_state: string }>('SELECT from_state, to_state FROM revision_state_events WHERE revision_id = ?', [
      Number(revisionA.id),
    ]);
    expect(states).toEqual([{ from_state: null, to_state: 'draft' }]);
  });

  it('labels the next revision B after the plan changed', async () => {
    as('engineer');
    const { plan, version } = await storedPlan();
    const changed = structuredClone(plan) as { highPass: { fcHz: number } };
    changed.highPass.fcHz = 0.5;
    const computed = parsePlan(changed);
    await savePlan({
      planId,
      workspaceId: seeded.workspaceId,
      expectedVersion: version,
      userId: seeded.userIds.engineer,
      computed: { plan: computed as never, report: evaluate(computed), worstVerdict: 'fails', profileId: computed.profileId, application: 'ecg' },
    });
    const response = await freeze('High-pass corner raised to 0.5 Hz');
    expect(response.status).toBe(201);
    revisionB = (await response.json()).revision;
    expect(revisionB.label).toBe('B');
    expect(revisionB.contentHash).not.toBe(revisionA.contentHash);
  });

  it("the program's plan table shows the newest revision and its state; a plan never frozen shows none", async () => {
    as('reviewer');
    const response = await programPlansRoute.GET(jsonRequest('GET', `/api/programs/${programId}/plans`), params({ programId: String(programId) }));
    expect(response.status).toBe(200);
    const { plans } = (await response.json()) as { plans: { id: string; revision: string | null; state: string }[] };
    expect(plans.find((p) => p.id === String(planId))).toMatchObject({ revision: 'B', state: 'draft' });
    const [other] = await rawQuery<{ id: number }>(
      'SELECT p.id FROM channel_plans p WHERE p.program_id = ? AND p.id <> ? AND NOT EXISTS (SELECT 1 FROM plan_revisions r WHERE r.plan_id = p.id) LIMIT 1',
      [programId, planId],
    );
    if (other) expect(plans.find((p) => p.id === String(other.id))).toMatchObject({ revision: null, state: 'draft' });
  });

  it('refuses a stale plan version, a missing summary and unknown fields, changing nothing', async () => {
    as('engineer');
    const before = await writeCounts();
    const stale = await planRevisionsRoute.POST(
      jsonRequest('POST', `/api/plans/${planId}/revisions`, { changeSummary: 'late', planVersion: 1 }),
      params({ planId: String(planId) }),
    );
    expect(stale.status).toBe(409);
    expect((await stale.json()).error.message).toMatch(/was saved again \(version 2\) after you loaded version 1/);

    const missing = await planRevisionsRoute.POST(jsonRequest('POST', `/api/plans/${planId}/revisions`, { changeSummary: '  ', planVersion: 2 }), params({ planId: String(planId) }));
    expect(missing.status).toBe(422);
    expect((await missing.json()).error.fieldErrors.changeSummary).toEqual(['changeSummary is required: say what changed since the last revision']);

    const extra = await planRevisionsRoute.POST(
      jsonRequest('POST', `/api/plans/${planId}/revisions`, { changeSummary: 'x', planVersion: 2, label: 'Q' }),
      params({ planId: String(planId) }),
    );
    expect(extra.status).toBe(422);
    expect((await extra.json()).error.message).toMatch(/unknown field: label/);

    const foreign = await planRevisionsRoute.POST(jsonRequest('POST', '/api/plans/999999/revisions', { changeSummary: 'x', planVersion: 1 }), params({ planId: '999999' }));
    expect(foreign.status).toBe(404);
    expect(await writeCounts()).toEqual(before);
  });

  it('refuses reviewers (who read but do not freeze), changing nothing', async () => {
    as('reviewer');
    const before = await writeCounts();
    const response = await freeze('not mine to freeze');
    expect(response.status).toBe(403);
    expect(await writeCounts()).toEqual(before);
  });
});

describe('a revision cannot be changed or deleted', () => {
  it('through any route: PUT, PATCH and DELETE are refused and the row stays as it was', async () => {
    as('admin');
    const [before] = await rawQuery('SELECT * FROM plan_revisions WHERE id = ?', [Number(revisionA.id)]);
    const counts = await writeCounts();
    for (const handler of [revisionRoute.PUT, revisionRoute.PATCH, revisionRoute.DELETE]) {
      const response = await handler(jsonRequest('PATCH', `/api/revisions/${revisionA.id}`, { label: 'Z' }), params({ revisionId: revisionA.id }));
      expect(response.status).toBe(405);
      expect((await response.json()).error.message).toMatch(/A revision cannot be changed or deleted/);
    }
    const [after] = await rawQuery('SELECT * FROM plan_revisions WHERE id = ?', [Number(revisionA.id)]);
    expect(after).toEqual(before);
    expect(await writeCounts()).toEqual(counts);
  });

  it('through the db layer: a Drizzle update of the content is refused by the trigger', async () => {
    await expect(getDb().update(planRevisions).set({ contentHash: '0'.repeat(64) }).where(eq(planRevisions.id, Number(revisionA.id)))).rejects.toThrow();
    await expect(getDb().delete(planRevisions).where(eq(planRevisions.id, Number(revisionA.id)))).rejects.toThrow();
  });

  it('through raw SQL: UPDATE of plan, report, hash, label or summary and DELETE all fail by trigger', async () => {
    const connection = await openRawConnection();
    try {
      for (const assignment of [
        "plan = JSON_SET(plan, '$.highPass.fcHz', 0.01)",
        "report = '{}'",
        "content_hash = REPEAT('0', 64)",
        "label = 'a'", // a change of letter case only: compared as binary
        "change_summary = CONCAT(change_summary, ' ')", // a trailing space only
        'created_by_user_id = created_by_user_id + 1',
      ]) {
        await expect(connection.query(`UPDATE plan_revisions SET ${assignment} WHERE id = ?`, [Number(revisionA.id)])).rejects.toThrow(
          /plan_revisions content is immutable: UPDATE refused/,
        );
      }
      await expect(connection.query("UPDATE plan_revisions SET state = 'released' WHERE id = ?", [Number(revisionA.id)])).rejects.toThrow(
        /state transition refused/,
      );
      await expect(connection.query('DELETE FROM plan_revisions WHERE id = ?', [Number(revisionA.id)])).rejects.toThrow(/DELETE refused/);
      await expect(connection.query('DELETE FROM revision_state_events')).rejects.toThrow(/append-only: DELETE refused/);
      await expect(connection.query("UPDATE revision_state_events SET reason = 'x'")).rejects.toThrow(/append-only: UPDATE refused/);
    } finally {
      await connection.end();
    }
    const [row] = await rawQuery<{ label: string; content_hash: string; state: string }>('SELECT label, content_hash, state FROM plan_revisions WHERE id = ?', [
      Number(revisionA.id),
    ]);
    expect(row).toEqual({ label: 'A', content_hash: revisionA.contentHash, state: 'draft' });
  });
});

describe('compare', () => {
  it('lists the changed input with units and the checks whose verdict moved', async () => {
    as('reviewer');
    const response = await compareRoute.GET(getRequest(`/api/plans/${planId}/revisions/compare?from=${revisionA.id}&to=${revisionB.id}`), params({ planId: String(planId) }));
    expect(response.status).toBe(200);
    const { comparison } = await response.json();
    expect(comparison.inputs).toEqual([{ path: 'highPass.fcHz', oldValue: 0.045, newValue: 0.5, oldText: '45 mHz', newText: '500 mHz' }]);
    const impulse = comparison.checks.find((c: { id: string }) => c.id === 'impulse-displacement');
    expect(impulse).toMatchObject({ oldVerdict: 'meets', newVerdict: 'fails', verdictChanged: true });
  });

  it('refuses a missing or foreign revision with a clear message', async () => {
    as('reviewer');
    const missing = await compareRoute.GET(getRequest(`/api/plans/${planId}/revisions/compare?from=${revisionA.id}`), params({ planId: String(planId) }));
    expect(missing.status).toBe(422);
    expect((await missing.json()).error.message).toBe('Give two revisions to compare: ?from=<revision id>&to=<revision id>.');
    const foreign = await compareRoute.GET(getRequest(`/api/plans/${planId}/revisions/compare?from=${revisionA.id}&to=987654`), params({ planId: String(planId) }));
    expect(foreign.status).toBe(404);
  });
});

describe('history', () => {
  it('lists who did what to the plan and its revisions, with before → after', async () => {
    as('engineer');
    const response = await planHistoryRoute.GET(getRequest(`/api/plans/${planId}/revisions/history`), params({ planId: String(planId) }));
    const { events } = await response.json();
    const actions = events.map((e: { action: string }) => e.action);
    expect(actions).toEqual(['plan.created', 'revision.created', 'plan.saved', 'revision.created']);
    const saved = events.find((e: { action: string }) => e.action === 'plan.saved');
    expect(saved.actorName).toBe('Eli Ekwueme');
    expect(saved.changes).toEqual(
      expect.arrayContaining([
        { path: 'version', before: '1', after: '2' },
        { path: 'plan.highPass.fcHz', before: '0.045', after: '0.5' },
      ]),
    );
    const revisionHistory = await (await revisionHistoryRoute.GET(getRequest(`/api/revisions/${revisionA.id}/history`), params({ revisionId: revisionA.id }))).json();
    expect(revisionHistory.events.map((e: { action: string }) => e.action)).toEqual(['revision.created']);
    expect(revisionHistory.states.map((s: { toState: string }) => s.toState)).toEqual(['draft']);
  });
});

describe('JSON export → import', () => {
  it('round-trips to an equal plan whose server report equals the revision report; both actions are audited', async () => {
    as('engineer');
    const exported = await exportRoute.GET(getRequest(`/api/revisions/${revisionA.id}/export?format=json`), params({ revisionId: revisionA.id }));
    expect(exported.status).toBe(200);
    expect(exported.headers.get('content-disposition')).toMatch(/attachment; filename=".*-revision-A-rationale\.json"/);
    const text = await exported.text();
    const doc = JSON.parse(text);
    expect(doc).toMatchObject({ format: 'channelsmith-rationale', formatVersion: 1, contentHash: revisionA.contentHash, contentHashMatchesRevision: true });
    expect((await latestAudit(1))[0]).toMatchObject({ action: 'revision.exported', entity_id: revisionA.id, after: { format: 'json', contentHash: revisionA.contentHash } });

    const imported = await importRoute.POST(jsonRequest('POST', `/api/programs/${programId}/plans/import`, text), params({ programId: String(programId) }));
    expect(imported.status).toBe(201);
    const { plan } = await imported.json();
    const stored = await (await planRoute.GET(getRequest(`/api/plans/${plan.id}`), params({ planId: plan.id }))).json();
    const [revision] = await rawQuery<{ plan: unknown; report: unknown }>('SELECT plan, report FROM plan_revisions WHERE id = ?', [Number(revisionA.id)]);
    expect(stored.plan.plan).toEqual(asJson(revision.plan));
    expect(stored.plan.report).toEqual(asJson(revision.report));
    expect((await latestAudit(1))[0]).toMatchObject({ action: 'plan.imported', entity_type: 'channel-plan', entity_id: plan.id, after: { origin: { kind: 'import', revisionLabel: 'A' } } });
  });

  it('refuses a document that is not JSON, of another format, or with a bad plan field, naming it; nothing is created', async () => {
    as('engineer');
    const before = await writeCounts();
    const call = (body: string) => importRoute.POST(jsonRequest('POST', `/api/programs/${programId}/plans/import`, body), params({ programId: String(programId) }));

    const notJson = await call('{ not json');
    expect(notJson.status).toBe(422);
    expect((await notJson.json()).error.message).toMatch(/the text is not valid JSON/);

    const otherFormat = await call(JSON.stringify({ format: 'spreadsheet', formatVersion: 1, plan: {} }));
    expect(otherFormat.status).toBe(422);
    expect((await otherFormat.json()).error.issues).toEqual([{ path: 'format', message: 'format must be "channelsmith-rationale"' }]);

    const exported = JSON.parse(await (await exportRoute.GET(getRequest(`/api/revisions/${revisionA.id}/export?format=json`), params({ revisionId: revisionA.id }))).text());
    exported.plan.instrumentation.rOhm = -5;
    const badField = await call(JSON.stringify(exported));
    expect(badField.status).toBe(422);
    const issues = (await badField.json()).error.issues as { path: string; message: string }[];
    expect(issues).toContainEqual({ path: 'plan.instrumentation.rOhm', message: 'feedback resistance R must be greater than zero' });

    const after = await writeCounts();
    // The second export above is an audit event; nothing else changed.
    expect({ ...after, audit: Number(after.audit) - 1 }).toEqual(before);
  });

  it('refuses an unknown export format', async () => {
    as('engineer');
    const response = await exportRoute.GET(getRequest(`/api/revisions/${revisionA.id}/export?format=docx`), params({ revisionId: revisionA.id }));
    expect(response.status).toBe(422);
    expect((await response.json()).error.message).toBe('format must be pdf or json (got "docx")');
  });
});
