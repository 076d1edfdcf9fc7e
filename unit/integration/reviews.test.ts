/**
 * Design review through the route handlers against the real test MariaDB and the test fake SMTP:
 * request (e-mail with the link), comments anchored to stages and checks with replies and resolve,
 * signatures with the password, release when every requested reviewer approved (older release
 * superseded), changes requested, and each refusal: nothing changes.
 */
import bcrypt from 'bcryptjs';
import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest';
import { rawQuery, resetTestDatabase } from '@/unit/helpers/test-db';
import { closeDb, getDb } from '@/db/client';
import { memberships, users, workspaces } from '@/db/schema';
import { createRevision } from '@/db/queries/revisions';
import { seedDemoWorkspace } from '@/db/seed';
import { seedWorkspaceData } from '@/db/seed-workspace';
import { getRequest, jsonRequest, latestAudit, mailsTo, params, writeCounts } from '@/unit/integration/revisions-fixtures';

const session = vi.hoisted(() => ({ current: null as null | { userId: number; workspaceId: number } }));
vi.mock('@/features/auth/session-source', () => ({ getSessionIdentity: async () => session.current }));

const planRevisionsRoute = await import('@/app/api/plans/[planId]/revisions/route');
const reviewRoute = await import('@/app/api/revisions/[revisionId]/review/route');
const commentsRoute = await import('@/app/api/revisions/[revisionId]/comments/route');
const commentRoute = await import('@/app/api/reviews/comments/[commentId]/route');
const signaturesRoute = await import('@/app/api/revisions/[revisionId]/signatures/route');
const revisionRoute = await import('@/app/api/revisions/[revisionId]/route');
const exportRoute = await import('@/app/api/revisions/[revisionId]/export/route');

type Role = 'admin' | 'engineer' | 'reviewer' | 'regulator';
const passwords: Record<Role, string> = {
  admin: 'larkspur-admin-1',
  engineer: 'larkspur-engineer-1',
  reviewer: 'larkspur-reviewer-1',
  regulator: 'larkspur-regulator-1',
};
const emails: Record<Role, string> = {
  admin: 'ada.admin@larkspur.example',
  engineer: 'eli.engineer@larkspur.example',
  reviewer: 'rhea.reviewer@larkspur.example',
  regulator: 'rafe.regulator@larkspur.example',
};

let seeded: Awaited<ReturnType<typeof seedDemoWorkspace>>;
let planId: number;
const as = (role: Role) => {
  session.current = { userId: seeded.userIds[role], workspaceId: seeded.workspaceId };
};

beforeAll(async () => {
  await resetTestDatabase();
  seeded = await seedDemoWorkspace(getDb());
  const data = await seedWorkspaceData(getDb(), { workspaceId: seeded.workspaceId, engineerUserId: seeded.userIds.engineer });
  planId = data.planIds['wearable-ecg-patch'];
});
afterAll(closeDb);

async function freeze(summary: string) {
  as('engineer');
  const [row] = await rawQuery<{ version: number }>('SELECT version FROM channel_plans WHERE id = ?', [planId]);
  const response = await planRevisionsRoute.POST(
    jsonRequest('POST', `/api/plans/${planId}/revisions`, { changeSummary: summary, planVersion: Number(row.version) }),
    params({ planId: String(planId) }),
  );
  expect(response.status).toBe(201);
  return (await response.json()).revision as { id: string; label: string; contentHash: string };
}
const requestReview = (revisionId: string, body: unknown) => reviewRoute.POST(jsonRequest('POST', `/api/revisions/${revisionId}/review`, body), params({ revisionId }));
const comment = (revisionId: string, body: unknown) => commentsRoute.POST(jsonRequest('POST', `/api/revisions/${revisionId}/comments`, body), params({ revisionId }));
const sign = (revisionId: string, body: unknown) => signaturesRoute.POST(jsonRequest('POST', `/api/revisions/${revisionId}/signatures`, body), params({ revisionId }));
const stateOf = async (revisionId: string) =>
  (await rawQuery<{ state: string }>('SELECT state FROM plan_revisions WHERE id = ?', [Number(revisionId)]))[0].state;

let a: { id: string; label: string; contentHash: string };
const startedAt = Date.now();

describe('requesting a review', () => {
  it('refuses reviewers who are not reviewers or admins, the requester, duplicates and foreign ids, changing nothing', async () => {
    a = await freeze('Patch front end for its first review');
    as('engineer');
    const before = await writeCounts();
    const cases: [unknown, RegExp][] = [
      [{ reviewerUserIds: [seeded.userIds.regulator] }, /Rafe Ruiz-Lindqvist is regulator; only reviewers and admins can review/],
      [{ reviewerUserIds: [seeded.userIds.engineer] }, /Eli Ekwueme is engineer; only reviewers and admins can review/],
      [{ reviewerUserIds: [seeded.userIds.reviewer, seeded.userIds.reviewer] }, /must not name a reviewer twice/],
      [{ reviewerUserIds: [987654] }, /member 987654 is not in this workspace/],
      [{ reviewerUserIds: [] }, /reviewerUserIds must name at least one reviewer/],
      [{ reviewers: [1] }, /unknown field: reviewers/],
    ];
    for (const [body, message] of cases) {
      const response = await requestReview(a.id, body);
      expect(response.status, JSON.stringify(body)).toBe(422);
      expect((await response.json()).error.message).toMatch(message);
    }
    expect(await writeCounts()).toEqual(before);
  });

  it('refuses the reviewer role, which reviews but does not request', async () => {
    as('reviewer');
    const before = await writeCounts();
    const response = await requestReview(a.id, { reviewerUserIds: [seeded.userIds.admin] });
    expect(response.status).toBe(403);
    expect(await writeCounts()).toEqual(before);
  });

  it('moves the draft to in review and e-mails each reviewer a link to the revision', async () => {
    as('engineer');
    const response = await requestReview(a.id, { reviewerUserIds: [seeded.userIds.reviewer, seeded.userIds.admin], message: 'Please look at the high-pass.' });
    expect(response.status).toBe(201);
    expect((await response.json()).mailFailedFor).toEqual([]);
    expect(await stateOf(a.id)).toBe('in-review');

    const link = `${process.env.APP_URL}/review/${a.id}`;
    for (const role of ['reviewer', 'admin'] as const) {
      const mails = await mailsTo(emails[role]);
      const mail = mails.filter((m) => m.subject === 'Review requested: Larkspur two-lead wearable ECG patch, revision A').at(-1);
      expect(mail, `mail to ${role}`).toBeDefined();
      expect(mail!.text).toContain(link);
      expect(mail!.text).toContain('Please look at the high-pass.');
    }
    const audit = await latestAudit(2);
    expect(audit.map((e) => e.action)).toEqual(['review.requested', 'revision.state-changed']);
    expect(audit[1]).toMatchObject({ before: { state: 'draft' }, after: { state: 'in-review' } });
  });

  it('refuses a second request while the revision is in review', async () => {
    as('engineer');
    const before = await writeCounts();
    const response = await requestReview(a.id, { reviewerUserIds: [seeded.userIds.reviewer] });
    expect(response.status).toBe(409);
    expect((await response.json()).error.message).toBe('Revision A is in review; only a draft revision can be sent for review. Nothing was changed.');
    expect(await writeCounts()).toEqual(before);
  });
});

describe('comments', () => {
  let threadId: string;

  it('anchors a comment to a stage, a reply to its thread, and a comment to a check', async () => {
    as('reviewer');
    const stage = await comment(a.id, { anchorKind: 'stage', anchorId: 'high-pass', body: 'Why 0.5 Hz for a monitoring patch?' });
    expect(stage.status).toBe(201);
    threadId = (await stage.json()).comment.id;
    as('engineer');
    const reply = await comment(a.id, { parentCommentId: threadId, body: 'Motion artefacts on dry electrodes; see the recovery time.' });
    expect(reply.status).toBe(201);
    expect((await reply.json()).comment).toMatchObject({ anchorKind: 'stage', anchorId: 'high-pass' });
    as('admin');
    const check = await comment(a.id, { anchorKind: 'check', anchorId: 'noise', body: 'Noise margin is comfortable.' });
    expect(check.status).toBe(201);
    const [event] = await latestAudit(1);
    expect(event).toMatchObject({ action: 'review.comment-added', entity_id: a.id, after: { anchor: { kind: 'check', id: 'noise' } } });
  });

  it('refuses unknown stages and checks, empty text and foreign parents, naming the field', async () => {
    as('reviewer');
    const before = await writeCounts();
    const badStage = await comment(a.id, { anchorKind: 'stage', anchorId: 'amplifier', body: 'x' });
    expect(badStage.status).toBe(422);
    expect((await badStage.json()).error.fieldErrors.anchorId[0]).toBe(
      'anchorId must be one of electrodes, protection, instrumentation, high-pass, gain-stage, converter, right-leg-drive, lead-off',
    );
    const badCheck = await comment(a.id, { anchorKind: 'check', anchorId: 'no-such-check', body: 'x' });
    expect(badCheck.status).toBe(422);
    expect((await badCheck.json()).error.message).toBe('anchorId: revision A has no check "no-such-check"');
    const empty = await comment(a.id, { anchorKind: 'stage', anchorId: 'converter', body: '   ' });
    expect(empty.status).toBe(422);
    expect((await empty.json()).error.message).toMatch(/body must not be empty/);
    const orphan = await comment(a.id, { parentCommentId: 999999, body: 'x' });
    expect(orphan.status).toBe(422);
    expect((await orphan.json()).error.message).toBe('parentCommentId: no such comment on this revision');
    expect(await writeCounts()).toEqual(before);
  });

  it('resolves and reopens a thread, each change audited', async () => {
    as('engineer');
    const resolve = await commentRoute.PATCH(jsonRequest('PATCH', `/api/reviews/comments/${threadId}`, { resolved: true }), params({ commentId: threadId }));
    expect(resolve.status).toBe(200);
    expect((await latestAudit(1))[0]).toMatchObject({ action: 'review.comment-resolved', after: { resolved: true } });
    const record = await (await reviewRoute.GET(getRequest(`/api/revisions/${a.id}/review`), params({ revisionId: a.id }))).json();
    const thread = record.review.comments.find((c: { id: string }) => c.id === threadId);
    expect(thread).toMatchObject({ resolved: true, resolvedByName: 'Eli Ekwueme', anchorKind: 'stage', anchorId: 'high-pass' });
    expect(record.review.comments).toHaveLength(3);
  });
});

describe('signatures', () => {
  it('refuse a wrong password, changing nothing', async () => {
    as('reviewer');
    const before = await writeCounts();
    const response = await sign(a.id, { meaning: 'approved', password: 'not-my-password', contentHash: a.contentHash });
    expect(response.status).toBe(422);
    expect((await response.json()).error.fieldErrors).toEqual({ password: ['The password is not correct; nothing was signed.'] });
    expect(await writeCounts()).toEqual(before);
  });

  it('refuse the author and requester of the revision, even with the right password', async () => {
    as('engineer');
    const before = await writeCounts();
    const response = await sign(a.id, { meaning: 'approved', password: passwords.engineer, contentHash: a.contentHash });
    expect(response.status).toBe(403);
    expect((await response.json()).error.message).toBe(
      'The author of a revision and the person who asked for its review cannot sign it. Nothing was signed.',
    );
    expect(await writeCounts()).toEqual(before);
  });

  it('refuse a content hash other than the revision’s', async () => {
    as('reviewer');
    const before = await writeCounts();
    const response = await sign(a.id, { meaning: 'approved', password: passwords.reviewer, contentHash: 'f'.repeat(64) });
    expect(response.status).toBe(409);
    expect((await response.json()).error.message).toMatch(/does not match revision A/);
    expect(await writeCounts()).toEqual(before);
  });

  it('record who, when, what and the hash; the review waits for every requested reviewer', async () => {
    as('reviewer');
    const response = await sign(a.id, { meaning: 'approved', password: passwords.reviewer, contentHash: a.contentHash, note: 'Looks right.' });
    expect(response.status).toBe(201);
    expect(await response.json()).toMatchObject({ outcome: 'pending', state: 'in-review' });
    const [row] = await rawQuery<{ signer_user_id: number; meaning: string; content_hash: string; signer_role: string; signed_at: Date }>(
      'SELECT signer_user_id, meaning, content_hash, signer_role, signed_at FROM review_signatures',
    );
    expect(row).toMatchObject({ signer_user_id: seeded.userIds.reviewer, meaning: 'approved', content_hash: a.contentHash, signer_role: 'reviewer' });
    expect(row.signed_at.getTime()).toBeGreaterThanOrEqual(startedAt - 2000);
    expect(await stateOf(a.id)).toBe('in-review');
    expect((await latestAudit(1))[0]).toMatchObject({ action: 'review.signed', actor_user_id: seeded.userIds.reviewer, after: { meaning: 'approved', contentHash: a.contentHash } });
  });

  it('refuse a second approval by the same reviewer', async () => {
    as('reviewer');
    const before = await writeCounts();
    const response = await sign(a.id, { meaning: 'approved', password: passwords.reviewer, contentHash: a.contentHash });
    expect(response.status).toBe(409);
    expect((await response.json()).error.message).toMatch(/^You already signed this review \(approved at .*\); a signature cannot be given twice/);
    expect(await writeCounts()).toEqual(before);
  });

  it('release the revision when the last requested reviewer approves, and e-mail the requester each decision', async () => {
    as('admin');
    const response = await sign(a.id, { meaning: 'approved', password: passwords.admin, contentHash: a.contentHash });
    expect(response.status).toBe(201);
    expect(await response.json()).toMatchObject({ outcome: 'approved', state: 'released' });
    expect(await stateOf(a.id)).toBe('released');
    const mails = await mailsTo(emails.engineer);
    const approvals = mails.filter((m) => m.subject === 'Approved: Larkspur two-lead wearable ECG patch, revision A');
    expect(approvals.length).toBeGreaterThanOrEqual(2);
    expect(approvals.at(-1)!.text).toContain('Every requested reviewer has approved: revision A is now released.');
    const states = await rawQuery<{ to_state: string }>('SELECT to_state FROM revision_state_events WHERE revision_id = ? ORDER BY id', [Number(a.id)]);
    expect(states.map((s) => s.to_state)).toEqual(['draft', 'in-review', 'released']);
  });

  it('close the review record of a released revision to comments and any further signature', async () => {
    as('reviewer');
    const before = await writeCounts();
    const late = await comment(a.id, { anchorKind: 'stage', anchorId: 'converter', body: 'late' });
    expect(late.status).toBe(409);
    expect((await late.json()).error.message).toBe('Revision A is released; its review record is closed to new comments. Nothing was changed.');
    const patch = await revisionRoute.PATCH(jsonRequest('PATCH', `/api/revisions/${a.id}`, { state: 'draft' }), params({ revisionId: a.id }));
    expect(patch.status).toBe(405);
    expect(await writeCounts()).toEqual(before);
  });
});

describe('a newer release', () => {
  let b: { id: string; label: string; contentHash: string };

  it('supersedes the older release, and the superseded revision can no longer be reviewed', async () => {
    b = await freeze('Second revision after the review');
    as('engineer');
    expect((await requestReview(b.id, { reviewerUserIds: [seeded.userIds.reviewer] })).status).toBe(201);
    as('reviewer');
    const approve = await sign(b.id, { meaning: 'approved', password: passwords.reviewer, contentHash: b.contentHash });
    expect(await approve.json()).toMatchObject({ outcome: 'approved', state: 'released' });
    expect(await stateOf(b.id)).toBe('released');
    expect(await stateOf(a.id)).toBe('superseded');

    const before = await writeCounts();
    as('admin');
    const late = await sign(a.id, { meaning: 'approved', password: passwords.admin, contentHash: a.contentHash });
    expect(late.status).toBe(409);
    expect((await late.json()).error.message).toBe('Revision A is superseded by a newer release; it can no longer be reviewed. Nothing was signed.');
    expect(await writeCounts()).toEqual(before);
  });

  it('a request for changes marks the revision and ends the review', async () => {
    const c = await freeze('Third revision, gain split changed');
    as('engineer');
    expect((await requestReview(c.id, { reviewerUserIds: [seeded.userIds.reviewer, seeded.userIds.admin] })).status).toBe(201);
    as('reviewer');
    const changes = await sign(c.id, { meaning: 'changes-requested', password: passwords.reviewer, contentHash: c.contentHash, note: 'Show the recovery.' });
    expect(await changes.json()).toMatchObject({ outcome: 'changes-requested', state: 'changes-requested' });
    expect(await stateOf(c.id)).toBe('changes-requested');
    expect(await stateOf(b.id)).toBe('released');
    const mail = (await mailsTo(emails.engineer)).filter((m) => m.subject === 'Changes requested: Larkspur two-lead wearable ECG patch, revision C').at(-1);
    expect(mail?.text).toContain('Note: Show the recovery.');
    as('admin');
    const after = await sign(c.id, { meaning: 'approved', password: passwords.admin, contentHash: c.contentHash });
    expect(after.status).toBe(409);
    expect((await after.json()).error.message).toBe('Revision C is changes requested, not in review; nothing was signed.');
  });
});

describe('a revision id from another workspace', () => {
  it('is not found through every route, and nothing changes', async () => {
    // A second workspace with its own engineer, plan and revision.
    const [{ id: otherWorkspaceId }] = await getDb().insert(workspaces).values({ name: 'Other Lab', slug: 'other-lab' }).$returningId();
    const [{ id: otherUserId }] = await getDb()
      .insert(users)
      .values({ email: 'oli@other.example', name: 'Oli Other', passwordHash: await bcrypt.hash('other-pass-1', 4) })
      .$returningId();
    await getDb().insert(memberships).values({ userId: otherUserId, workspaceId: otherWorkspaceId, role: 'engineer' });
    const otherData = await seedWorkspaceData(getDb(), { workspaceId: otherWorkspaceId, engineerUserId: otherUserId });
    const [planRow] = await rawQuery<{ plan: unknown; report: unknown; version: number }>('SELECT plan, report, version FROM channel_plans WHERE id = ?', [
      otherData.planIds['emg-sleeve'],
    ]);
    const created = await createRevision({
      workspaceId: otherWorkspaceId,
      planId: otherData.planIds['emg-sleeve'],
      userId: otherUserId,
      changeSummary: 'theirs',
      planVersion: Number(planRow.version),
      content: { plan: {}, report: {}, contentHash: 'a'.repeat(64), worstVerdict: null },
      labelFor: () => 'A',
      maxSequence: 10,
    });
    if (created.status !== 'created') throw new Error('set-up failed');
    const foreign = String(created.id);

    const before = await writeCounts();
    for (const role of ['engineer', 'reviewer', 'admin', 'regulator'] as const) {
      as(role);
      const responses = [
        await revisionRoute.GET(getRequest(`/api/revisions/${foreign}`), params({ revisionId: foreign })),
        await reviewRoute.GET(getRequest(`/api/revisions/${foreign}/review`), params({ revisionId: foreign })),
        await exportRoute.GET(getRequest(`/api/revisions/${foreign}/export?format=json`), params({ revisionId: foreign })),
        await requestReview(foreign, { reviewerUserIds: [seeded.userIds.reviewer] }),
        await comment(foreign, { anchorKind: 'stage', anchorId: 'electrodes', body: 'x' }),
        await sign(foreign, { meaning: 'approved', password: passwords[role], contentHash: 'a'.repeat(64) }),
      ];
      for (const response of responses) {
        expect(response.status, role).toBe(404);
        expect((await response.json()).error.message).toBe('No such revision in this workspace.');
      }
    }
    expect(await writeCounts()).toEqual(before);
  });
});
