/**
 * Shared set-up of the revision, review and regulator integration tests: the demo workspace with its
 * plans, a session that tests switch between members, and small callers for the route handlers.
 * Tests must mock '@/features/auth/session-source' with `sessionMock` (vi.mock is hoisted per file).
 */
import { rawQuery } from '@/unit/helpers/test-db';

export type Identity = { userId: number; workspaceId: number };
export const sessionState: { current: Identity | null } = { current: null };

/** Route context for a dynamic segment. */
export const params = <T extends Record<string, string>>(values: T) => ({ params: Promise.resolve(values) });

export function jsonRequest(method: string, url: string, body?: unknown): Request {
  return new Request(`http://localhost${url}`, {
    method,
    headers: { 'content-type': 'application/json' },
    body: body === undefined ? undefined : typeof body === 'string' ? body : JSON.stringify(body),
  });
}

export const getRequest = (url: string) => new Request(`http://localhost${url}`);

/** Row counts of every table a revision or review writes (to show that a refusal changed nothing). */
export async function writeCounts() {
  const [row] = await rawQuery<Record<string, number>>(
    `SELECT (SELECT COUNT(*) FROM plan_revisions) AS revisions,
            (SELECT COUNT(*) FROM revision_state_events) AS stateEvents,
            (SELECT COUNT(*) FROM review_requests) AS requests,
            (SELECT COUNT(*) FROM review_request_reviewers) AS reviewers,
            (SELECT COUNT(*) FROM review_comments) AS comments,
            (SELECT COUNT(*) FROM review_comments WHERE resolved_at IS NOT NULL) AS resolved,
            (SELECT COUNT(*) FROM review_signatures) AS signatures,
            (SELECT COUNT(*) FROM channel_plans) AS plans,
            (SELECT COUNT(*) FROM audit_events) AS audit,
            (SELECT GROUP_CONCAT(CONCAT(id, ':', state) ORDER BY id) FROM plan_revisions) AS states`,
  );
  return Object.fromEntries(Object.entries(row).map(([k, v]) => [k, k === 'states' ? String(v) : Number(v)]));
}

/** The driver may hand JSON columns back parsed or as text. */
export const asJson = (value: unknown) => (typeof value === 'string' ? JSON.parse(value) : value);

/** The newest audit events, newest first. */
export async function latestAudit(limit = 5) {
  const rows = await rawQuery<{ action: string; entity_type: string; entity_id: string; actor_user_id: number; before: unknown; after: unknown }>(
    'SELECT action, entity_type, entity_id, actor_user_id, `before`, `after` FROM audit_events ORDER BY id DESC LIMIT ?',
    [limit],
  );
  return rows.map((r) => ({ ...r, before: asJson(r.before), after: asJson(r.after) }));
}

/** Messages in the test fake SMTP inbox (maildev REST API) sent to `to`, newest last. */
export async function mailsTo(to: string): Promise<{ subject: string; text: string; to: { address: string }[] }[]> {
  const response = await fetch(`${process.env.MAIL_WEB_URL}/email`);
  if (!response.ok) throw new Error(`maildev answered ${response.status}`);
  const all = (await response.json()) as { subject: string; text: string; to: { address: string }[] }[];
  return all.filter((m) => m.to.some((t) => t.address.toLowerCase() === to.toLowerCase()));
}
