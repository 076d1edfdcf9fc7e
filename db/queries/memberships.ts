import 'server-only';
import { and, asc, eq } from 'drizzle-orm';
import { getDb } from '@/db/client';
import { insertAuditEvent } from '@/db/queries/audit-events';
import { memberships, users, workspaces, type Role } from '@/db/schema';

/** A signed-in person as the app sees them: who, in which workspace, with which role. */
export interface MemberContext {
  userId: number;
  email: string;
  name: string;
  membershipId: number;
  workspaceId: number;
  workspaceName: string;
  role: Role;
}

const memberContextColumns = {
  userId: users.id,
  email: users.email,
  name: users.name,
  membershipId: memberships.id,
  workspaceId: workspaces.id,
  workspaceName: workspaces.name,
  role: memberships.role,
};

/** The user's first (oldest) membership: the workspace a fresh session opens in. Null if none. */
export async function getPrimaryMembership({ userId }: { userId: number }): Promise<MemberContext | null> {
  const [row] = await getDb()
    .select(memberContextColumns)
    .from(memberships)
    .innerJoin(users, eq(users.id, memberships.userId))
    .innerJoin(workspaces, eq(workspaces.id, memberships.workspaceId))
    .where(eq(memberships.userId, userId))
    .orderBy(asc(memberships.id))
    .limit(1);
  return row ?? null;
}

/** The user's current membership of the workspace (role read fresh from the database), or null. */
export async function getMemberContext({
  userId,
  workspaceId,
}: {
  userId: number;
  workspaceId: number;
}): Promise<MemberContext | null> {
  const [row] = await getDb()
    .select(memberContextColumns)
    .from(memberships)
    .innerJoin(users, eq(users.id, memberships.userId))
    .innerJoin(workspaces, eq(workspaces.id, memberships.workspaceId))
    .where(and(eq(memberships.userId, userId), eq(memberships.workspaceId, workspaceId)))
    .limit(1);
  return row ?? null;
}

export interface WorkspaceMember {
  membershipId: number;
  userId: number;
  name: string;
  email: string;
  role: Role;
  joinedAt: Date;
}

/** Every member of the workspace, by name. */
export async function listWorkspaceMembers({ workspaceId }: { workspaceId: number }): Promise<WorkspaceMember[]> {
  return getDb()
    .select({
      membershipId: memberships.id,
      userId: users.id,
      name: users.name,
      email: users.email,
      role: memberships.role,
      joinedAt: memberships.createdAt,
    })
    .from(memberships)
    .innerJoin(users, eq(users.id, memberships.userId))
    .where(eq(memberships.workspaceId, workspaceId))
    .orderBy(asc(users.name), asc(users.id));
}

/** True when the e-mail already belongs to a member of the workspace. */
export async function isWorkspaceMemberEmail({
  workspaceId,
  email,
}: {
  workspaceId: number;
  email: string;
}): Promise<boolean> {
  const [row] = await getDb()
    .select({ id: memberships.id })
    .from(memberships)
    .innerJoin(users, eq(users.id, memberships.userId))
    .where(and(eq(memberships.workspaceId, workspaceId), eq(users.email, email.trim().toLowerCase())))
    .limit(1);
  return Boolean(row);
}

export type ChangeMemberRoleResult =
  | { status: 'changed'; before: Role; after: Role }
  | { status: 'unchanged' }
  | { status: 'not-found' }
  | { status: 'last-admin' };

/**
 * Changes a member's role and records it, in one transaction. The workspace's memberships are
 * locked first, so two admins demoting each other at once cannot leave the workspace without one.
 */
export async function changeMemberRole({
  workspaceId,
  membershipId,
  role,
  actorUserId,
}: {
  workspaceId: number;
  membershipId: number;
  role: Role;
  actorUserId: number;
}): Promise<ChangeMemberRoleResult> {
  return getDb().transaction(async (tx) => {
    const members = await tx
      .select({ id: memberships.id, userId: memberships.userId, role: memberships.role })
      .from(memberships)
      .where(eq(memberships.workspaceId, workspaceId))
      .for('update');
    const target = members.find((member) => member.id === membershipId);
    if (!target) return { status: 'not-found' } as const;
    if (target.role === role) return { status: 'unchanged' } as const;
    const admins = members.filter((member) => member.role === 'admin');
    if (target.role === 'admin' && admins.length <= 1) return { status: 'last-admin' } as const;

    await tx
      .update(memberships)
      .set({ role })
      .where(and(eq(memberships.id, membershipId), eq(memberships.workspaceId, workspaceId)));
    await insertAuditEvent(tx, {
      workspaceId,
      actorUserId,
      action: 'membership.role-changed',
      entityType: 'membership',
      entityId: membershipId,
      before: { userId: target.userId, role: target.role },
      after: { userId: target.userId, role },
    });
    return { status: 'changed', before: target.role, after: role } as const;
  });
}
