/**
 * The regulator matrix over every revision, review and export route: reads succeed only on released
 * (and superseded) revisions, every write is refused with 403 and changes nothing. Reviewers read
 * everything. The PDF export of a released revision is rendered and read back with poppler.
 */
import { execFileSync } from 'node:child_process';
import { mkdtempSync, writeFileSync, readdirSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest';
import { rawQuery, resetTestDatabase } from '@/unit/helpers/test-db';
import { closeDb, getDb } from '@/db/client';
import { seedDemoWorkspace } from '@/db/seed';
import { seedWorkspaceData } from '@/db/seed-workspace';
import { RATIONALE_CAUTION } from '@/features/rationale-export/cautions';
import { getRequest, jsonRequest, params, writeCounts } from '@/unit/integration/revisions-fixtures';

const session = vi.hoisted(() => ({ current: null as null | { userId: number; workspaceId: number } }));
vi.mock('@/features/auth/session-source', () => ({ getSessionIdentity: async () => session.current }));

const planRevisionsRoute = await import('@/app/api/plans/[planId]/revisions/route');
const compareRoute = await import('@/app/api/plans/[planId]/revisions/compare/route');
const planHistoryRoute = await import('@/app/api/plans/[planId]/revisions/history/route');
const revisionsRoute = await import('@/app/api/revisions/route');
const revisionRoute = await import('@/app/api/revisions/[revisionId]/route');
const revisionHistoryRoute = await import('@/app/api/revisions/[revisionId]/history/route');
const reviewRoute = await import('@/app/api/revisions/[revisionId]/review/route');
const commentsRoute = await import('@/app/api/revisions/[revisionId]/comments/route');
const commentRoute = await import('@/app/api/reviews/comments/[commentId]/route');
const signaturesRoute = await import('@/app/api/revisions/[revisionId]/signatures/route');
const exportRoute = await import('@/app/api/revisions/[revisionId]/export/route');
const importRoute = await import('@/app/api/programs/[programId]/plans/import/route');

type Role = 'admin' | 'engineer' | 'reviewer' | 'regulator';
let seeded: Awaited<ReturnType<typeof seedDemoWorkspace>>;
let planId: string;
let programId: string;
let released: { id: string; contentHash: string };
let inReview: { id: string; contentHash: string };
let draft: { id: string; contentHash: string };
let commentId: string;
const as = (role: Role) => {
  session.current = { userId: seeded.userIds[role], workspaceId: seeded.workspaceId };
};

async function freeze(summary: string) {
  as('engineer');
  const [row] = await rawQuery<{ version: number }>('SELECT version FROM channel_plans WHERE id = ?', [Number(planId)]);
  const response = await planRevisionsRoute.POST(
    jsonRequest('POST', `/api/plans/${planId}/revisions`, { changeSummary: summary, planVersion: Number(row.version) }),
    params({ planId }),
  );
  return (await response.json()).revision as { id: string; contentHash: string };
}

beforeAll(async () => {
  await resetTestDatabase();
  seeded = await seedDemoWorkspace(getDb());
  const data = await seedWorkspaceData(getDb(), { workspaceId: seeded.workspaceId, engineerUserId: seeded.userIds.engineer });
  planId = String(data.planIds['diagnostic-cart-12-lead']);
  programId = String(data.programIds['12-lead diagnostic cart front end']);
  // A released revision (A), one in review with a comment (B), one draft (C).
  released = await freeze('Released design');
  await reviewRoute.POST(jsonRequest('POST', '/x', { reviewerUserIds: [seeded.userIds.reviewer] }), params({ revisionId: released.id }));
  as('reviewer');
  await signaturesRoute.POST(
    jsonRequest('POST', '/x', { meaning: 'approved', password: 'larkspur-reviewer-1', contentHash: released.contentHash }),
    params({ revisionId: released.id }),
  );
  inReview = await freeze('Under review');
  await reviewRoute.POST(jsonRequest('POST', '/x', { reviewerUserIds: [seeded.userIds.reviewer] }), params({ revisionId: inReview.id }));
  as('reviewer');
  const c = await commentsRoute.POST(jsonRequest('POST', '/x', { anchorKind: 'stage', anchorId: 'high-pass', body: 'Check the corner.' }), params({ revisionId: inReview.id }));
  commentId = (await c.json()).comment.id;
  draft = await freeze('Draft');
  const states = await rawQuery<{ state: string }>('SELECT state FROM plan_revisions ORDER BY id');
  expect(states.map((s) => s.state)).toEqual(['released', 'in-review', 'draft']);
});
afterAll(closeDb);

const reads = (revisionId: string) => ({
  'GET /api/revisions/[id]': () => revisionRoute.GET(getRequest('/x'), params({ revisionId })),
  'GET /api/revisions/[id]/review': () => reviewRoute.GET(getRequest('/x'), params({ revisionId })),
  'GET /api/revisions/[id]/history': () => revisionHistoryRoute.GET(getRequest('/x'), params({ revisionId })),
  'GET /api/revisions/[id]/export?format=json': () => exportRoute.GET(getRequest('/x?format=json'), params({ revisionId })),
  'GET /api/plans/[id]/revisions/compare (with A)': () =>
    compareRoute.GET(getRequest(`/x?from=${released.id}&to=${revisionId}`), params({ planId })),
});

describe('regulator reads', () => {
  it('released revisions: every read route answers 200', async () => {
    as('regulator');
    for (const [name, call] of Object.entries(reads(released.id))) expect((await call()).status, name).toBe(200);
  });

  it.each([
    ['in review', () => inReview.id],
    ['draft', () => draft.id],
  ])('%s revisions: every read route answers 403 with the reason', async (_label, id) => {
    as('regulator');
    for (const [name, call] of Object.entries(reads(id()))) {
      const response = await call();
      expect(response.status, name).toBe(403);
      expect((await response.json()).error.message).toBe('Regulators see released revisions only; this revision has not been released.');
    }
  });

  it('lists only released revisions, and a plan history of released revisions only', async () => {
    as('regulator');
    const list = await (await planRevisionsRoute.GET(getRequest('/x'), params({ planId }))).json();
    expect(list.revisions.map((r: { label: string }) => r.label)).toEqual(['A']);
    const all = await (await revisionsRoute.GET()).json();
    expect(all.revisions.map((r: { id: string; state: string }) => [r.id, r.state])).toEqual([[released.id, 'released']]);
    const history = await (await planHistoryRoute.GET(getRequest('/x'), params({ planId }))).json();
    const entities = new Set(history.events.map((e: { entityType: string; entityId: string }) => `${e.entityType}:${e.entityId}`));
    expect([...entities]).toEqual([`plan-revision:${released.id}`]);
    expect(history.events.map((e: { action: string }) => e.action)).toEqual(
      expect.arrayContaining(['revision.created', 'review.requested', 'review.signed', 'revision.state-changed']),
    );
  });

  it('reviewers read every revision, whatever its state', async () => {
    as('reviewer');
    for (const id of [released.id, inReview.id, draft.id]) {
      for (const [name, call] of Object.entries(reads(id))) expect((await call()).status, `${name} ${id}`).toBe(200);
    }
  });
});

describe('regulator writes: every route refuses with 403 and nothing changes', () => {
  const writes: Record<string, () => Promise<Response>> = {
    'POST /api/plans/[id]/revisions': () =>
      planRevisionsRoute.POST(jsonRequest('POST', '/x', { changeSummary: 'regulator freeze', planVersion: 1 }), params({ planId })),
    'POST /api/revisions/[id]/review': () =>
      reviewRoute.POST(jsonRequest('POST', '/x', { reviewerUserIds: [seeded.userIds.reviewer] }), params({ revisionId: draft.id })),
    'POST /api/revisions/[id]/comments (in review)': () =>
      commentsRoute.POST(jsonRequest('POST', '/x', { anchorKind: 'stage', anchorId: 'converter', body: 'x' }), params({ revisionId: inReview.id })),
    'POST /api/revisions/[id]/comments (released)': () =>
      commentsRoute.POST(jsonRequest('POST', '/x', { anchorKind: 'stage', anchorId: 'converter', body: 'x' }), params({ revisionId: released.id })),
    'PATCH /api/reviews/comments/[id]': () => commentRoute.PATCH(jsonRequest('PATCH', '/x', { resolved: true }), params({ commentId })),
    'POST /api/revisions/[id]/signatures': () =>
      signaturesRoute.POST(
        jsonRequest('POST', '/x', { meaning: 'approved', password: 'larkspur-regulator-1', contentHash: inReview.contentHash }),
        params({ revisionId: inReview.id }),
      ),
    'PUT /api/revisions/[id]': () => revisionRoute.PUT(jsonRequest('PUT', '/x', {}), params({ revisionId: released.id })),
    'PATCH /api/revisions/[id]': () => revisionRoute.PATCH(jsonRequest('PATCH', '/x', {}), params({ revisionId: released.id })),
    'DELETE /api/revisions/[id]': () => revisionRoute.DELETE(jsonRequest('DELETE', '/x'), params({ revisionId: released.id })),
    'POST /api/programs/[id]/plans/import': async () => {
      as('engineer');
      const text = await (await exportRoute.GET(getRequest('/x?format=json'), params({ revisionId: released.id }))).text();
      as('regulator');
      return importRoute.POST(jsonRequest('POST', '/x', text), params({ programId }));
    },
  };

  it.each(Object.keys(writes))('%s', async (name) => {
    as('regulator');
    const before = await writeCounts();
    const response = await writes[name]();
    expect(response.status).toBe(403);
    expect((await response.json()).error.code).toBe('forbidden');
    const after = await writeCounts();
    // The import case exports first (as the engineer), which is itself an audit event.
    if (name.includes('import')) after.audit = Number(after.audit) - 1;
    expect(after).toEqual(before);
  });
});

describe('regulator exports the PDF of a released revision', () => {
  it('renders with pdftoppm; the text holds the revision label, every check verdict and the cautions; the export is audited', async () => {
    as('regulator');
    const response = await exportRoute.GET(getRequest('/x?format=pdf'), params({ revisionId: released.id }));
    expect(response.status).toBe(200);
    expect(response.headers.get('content-type')).toBe('application/pdf');
    const bytes = new Uint8Array(await response.arrayBuffer());
    expect(new TextDecoder().decode(bytes.slice(0, 5))).toBe('%PDF-');

    const dir = mkdtempSync(path.join(tmpdir(), 'rev-pdf-'));
    try {
      const file = path.join(dir, 'rationale.pdf');
      writeFileSync(file, bytes);
      const pages = Number(/Pages:\s+(\d+)/.exec(execFileSync('pdfinfo', [file], { encoding: 'utf8' }))![1]);
      execFileSync('pdftoppm', ['-r', '30', '-png', file, path.join(dir, 'page')]);
      expect(readdirSync(dir).filter((f) => f.endsWith('.png'))).toHaveLength(pages);
      const text = execFileSync('pdftotext', ['-layout', file, '-'], { encoding: 'utf8' }).replace(/\s+/g, ' ');
      expect(text).toContain('Revision A');
      expect(text).toContain(released.contentHash.slice(0, 16));
      const [row] = await rawQuery<{ report: string | { checks: { verdict: string; title: string }[] } }>('SELECT report FROM plan_revisions WHERE id = ?', [
        Number(released.id),
      ]);
      const report = typeof row.report === 'string' ? JSON.parse(row.report) : row.report;
      const verdictWords = new Set(report.checks.map((c: { verdict: string }) => c.verdict));
      for (const verdict of verdictWords) expect(text).toContain(String(verdict));
      expect(text).toContain(RATIONALE_CAUTION.replace(/\s+/g, ' ').slice(0, 60));
      expect(text).toContain('Rhea Rautio'); // the signature in the review record
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
    const [event] = await rawQuery<{ action: string; actor_user_id: number }>('SELECT action, actor_user_id FROM audit_events ORDER BY id DESC LIMIT 1');
    expect(event).toEqual({ action: 'revision.exported', actor_user_id: seeded.userIds.regulator });
  });
});
