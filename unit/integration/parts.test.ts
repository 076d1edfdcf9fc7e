/**
 * GET /api/parts against the real test MariaDB, with the demo library from db/seed-workspace.ts:
 * per role, by kind, scoped to the workspace; and the demo seed itself (idempotent, audited,
 * values taken from the demo plans).
 */
import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest';
import { rawQuery, resetTestDatabase } from '@/unit/helpers/test-db';
import { closeDb, getDb } from '@/db/client';
import { seedDemoWorkspace } from '@/db/seed';
import { seedWorkspaceData } from '@/db/seed-workspace';
import { memberships, users, workspaces } from '@/db/schema';
import diagnosticCart from '@/lib/engine/demo-plans/diagnostic-cart-12-lead.json';
import highGainPatch from '@/lib/engine/demo-plans/wearable-ecg-patch-high-gain.json';
import type { Role } from '@/lib/auth/roles';

const session = vi.hoisted(() => ({ current: null as null | { userId: number; workspaceId: number } }));
vi.mock('@/features/auth/session-source', () => ({ getSessionIdentity: async () => session.current }));

const partsRoute = await import('@/app/api/parts/route');

let seeded: Awaited<ReturnType<typeof seedDemoWorkspace>>;
let other: { workspaceId: number; engineerId: number };
const signInAs = (caller: Role | 'signed-out' | 'other-engineer') => {
  if (caller === 'signed-out') session.current = null;
  else if (caller === 'other-engineer') session.current = { userId: other.engineerId, workspaceId: other.workspaceId };
  else session.current = { userId: seeded.userIds[caller], workspaceId: seeded.workspaceId };
};
const get = (query = '') => partsRoute.GET(new Request(`http://test.invalid/api/parts${query}`));
const asJson = (value: unknown) => (typeof value === 'string' ? JSON.parse(value) : value);
async function counts() {
  const [row] = await rawQuery<{ programs: number; plans: number; parts: number; audit: number }>(
    'SELECT (SELECT COUNT(*) FROM programs) AS programs, (SELECT COUNT(*) FROM channel_plans) AS plans, (SELECT COUNT(*) FROM parts) AS parts, (SELECT COUNT(*) FROM audit_events) AS audit',
  );
  return { programs: Number(row.programs), plans: Number(row.plans), parts: Number(row.parts), audit: Number(row.audit) };
}

beforeAll(async () => {
  await resetTestDatabase();
  const db = getDb();
  seeded = await seedDemoWorkspace(db);
  await seedWorkspaceData(db, { workspaceId: seeded.workspaceId, engineerUserId: seeded.userIds.engineer });
  const [ws] = await db.insert(workspaces).values({ name: 'Other company', slug: 'other-company' }).$returningId();
  const [user] = await db
    .insert(users)
    .values({ email: 'olga.other@other.example', name: 'Olga Other', passwordHash: '$2b$10$' + 'x'.repeat(53) })
    .$returningId();
  await db.insert(memberships).values({ userId: user.id, workspaceId: ws.id, role: 'engineer' });
  other = { workspaceId: ws.id, engineerId: user.id };
});
afterAll(closeDb);

describe('GET /api/parts', () => {
  it.each(['admin', 'engineer', 'reviewer'] as const)('as %s: the seven demo parts', async (caller) => {
    signInAs(caller);
    const response = await get();
    expect(response.status).toBe(200);
    const { parts } = await response.json();
    expect(parts).toHaveLength(7);
    expect(parts.map((p: { kind: string }) => p.kind).sort()).toEqual([
      'converter',
      'converter',
      'electrode',
      'electrode',
      'instrumentation-amplifier',
      'instrumentation-amplifier',
      'operational-amplifier',
    ]);
  });

  it('values are keyed by plan field names, SI units, from the demo plans where they overlap', async () => {
    signInAs('engineer');
    const { parts } = await (await get('?kind=instrumentation-amplifier')).json();
    const ina = parts.find((p: { name: string }) => p.name === 'Generic low-noise INA, 8 nV/√Hz');
    // 8 nV/√Hz = 8e-9 V/√Hz, as in the diagnostic-cart demo plan's instrumentation op-amp.
    expect(ina.values.enVPerRtHz).toBe(8e-9);
    expect(ina.values.gbwHz).toBe(diagnosticCart.instrumentation.opAmp.gbwHz);
    // G1 = 1 + K/Rg with K = 2R for the three-op-amp topology.
    expect(ina.values.rgConstantOhm).toBe(2 * diagnosticCart.instrumentation.rOhm);
    expect(ina.status).toBe('approved');
    expect(typeof ina.id).toBe('string');
  });

  it('filters by kind; an unknown kind is 422 naming the choices', async () => {
    signInAs('engineer');
    const { parts } = await (await get('?kind=converter')).json();
    expect(parts.map((p: { values: { bits: number } }) => p.values.bits).sort((a: number, b: number) => a - b)).toEqual([16, 24]);
    const bad = await get('?kind=resistor');
    expect(bad.status).toBe(422);
    expect((await bad.json()).error.message).toBe(
      'kind must be one of instrumentation-amplifier, operational-amplifier, converter, electrode',
    );
  });

  it('regulator 403, signed out 401, another workspace sees none', async () => {
    signInAs('regulator');
    expect((await get()).status).toBe(403);
    signInAs('signed-out');
    expect((await get()).status).toBe(401);
    signInAs('other-engineer');
    expect((await (await get()).json()).parts).toEqual([]);
  });
});

describe('demo seed', () => {
  it('stores the failing high-gain patch with its server report: G1 = 1 + 2R/Rg = 21 and a failing check', async () => {
    const [row] = await rawQuery<{ report: unknown; worst: string }>(
      'SELECT report, worst_verdict AS worst FROM channel_plans WHERE name = ?',
      [highGainPatch.name],
    );
    const report = asJson(row.report) as { gains: { g1: number }; checks: { id: string; verdict: string }[] };
    // Three-op-amp gain (Sedra & Smith): 1 + 2 · 24.9 kΩ / 2.49 kΩ = 21.
    expect(report.gains.g1).toBeCloseTo(1 + (2 * highGainPatch.instrumentation.rOhm) / highGainPatch.instrumentation.rgOhm, 12);
    expect(report.gains.g1).toBeCloseTo(21, 12);
    expect(row.worst).toBe('fails');
    expect(report.checks.some((c) => c.verdict === 'fails')).toBe(true);
  });

  it('three programs, four plans, seven parts, each creation audited; running it again adds nothing', async () => {
    const first = await counts();
    expect(first).toMatchObject({ programs: 3, plans: 4, parts: 7 });
    const [audited] = await rawQuery<{ n: number }>(
      "SELECT COUNT(*) AS n FROM audit_events WHERE action IN ('program.created', 'plan.created', 'part.created')",
    );
    expect(Number(audited.n)).toBe(3 + 4 + 7);
    await seedWorkspaceData(getDb(), { workspaceId: seeded.workspaceId, engineerUserId: seeded.userIds.engineer });
    expect(await counts()).toEqual(first);
  });

  it('no part name carries a manufacturer-style part number (all are "Generic …")', async () => {
    const rows = await rawQuery<{ name: string }>('SELECT name FROM parts');
    for (const { name } of rows) expect(name).toMatch(/^Generic /);
  });
});
