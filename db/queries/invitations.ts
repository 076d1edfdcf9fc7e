import 'server-only';
import { eq } from 'drizzle-orm';
import { getDb } from '@/db/client';
import { insertAuditEvent } from '@/db/queries/audit-events';
import { invitations, memberships, users, workspaces, type Role } from '@/db/schema';

/** Saves an invitation (its token only as a hash) and records it, in one transaction. */
export async function createInvitation({
  workspaceId,
  email,
  role,
  tokenHash,
  expiresAt,
  invitedByUserId,
}: {
  workspaceId: number;
  email: string;
  role: Role;
  tokenHash: string;
  expiresAt: Date;
  invitedByUserId: number;
}): Promise<{ invitationId: number }> {
  return getDb().transaction(async (tx) => {
    const [{ id }] = await tx
      .insert(invitations)
      .values({ workspaceId, email, role, tokenHash, expiresAt, invitedByUserId })
      .$returningId();
    await insertAuditEvent(tx, {
      workspaceId,
      actorUserId: invitedByUserId,
      action: 'invitation.created',
      entityType: 'invitation',
      entityId: id,
      after: { email, role, expiresAt: expiresAt.toISOString() },
    });
    return { invitationId: id };
  });
}

export interface InvitationView {
  id: number;
  email: string;
  role: Role;
  workspaceId: number;
  workspaceName: string;
  expiresAt: Date;
  usedAt: Date | null;
  /** True when a user with this e-mail already exists (they confirm with their password instead). */
  accountExists: boolean;
}

/** The invitation a link points to (by token hash), or null. */
export async function getInvitationByTokenHash({ tokenHash }: { tokenHash: string }): Promise<InvitationView | null> {
  const [row] = await getDb()
    .select({
      id: invitations.id,
      email: invitations.email,
      role: invitations.role,
      workspaceId: invitations.workspaceId,
      workspaceName: workspaces.name,
      expiresAt: invitations.expiresAt,
      usedAt: invitations.usedAt,
      existingUserId: users.id,
    })
    .from(invitations)
    .innerJoin(workspaces, eq(workspaces.id, invitations.workspaceId))
    .leftJoin(users, eq(users.email, invitations.email))
    .where(eq(invitations.tokenHash, tokenHash))
    .limit(1);
  if (!row) return null;
  const { existingUserId, ...invitation } = row;
  return { ...invitation, accountExists: existingUserId !== null };
}

export type AcceptInvitationResult =
  | { status: 'accepted'; userId: number; email: string }
  | { status: 'not-found' }
  | { status: 'used' }
  | { status: 'expired' }
  | { status: 'account-exists' }
  | { status: 'already-member' };

/**
 * Uses an invitation: creates the account, adds the membership, marks the invitation used and
 * records both, in one transaction (the invitation row is locked, so a link works only once).
 * An address that already has an account is refused here; see the invitation page.
 */
export async function acceptInvitation({
  tokenHash,
  name,
  passwordHash,
  now,
}: {
  tokenHash: string;
  name: string;
  passwordHash: string;
  now: Date;
}): Promise<AcceptInvitationResult> {
  return getDb().transaction(async (tx) => {
    const [invitation] = await tx
      .select()
      .from(invitations)
      .where(eq(invitations.tokenHash, tokenHash))
      .limit(1)
      .for('update');
    if (!invitation) return { status: 'not-found' } as const;
    if (invitation.usedAt) return { status: 'used' } as const;
    if (invitation.expiresAt.getTime() <= now.getTime()) return { status: 'expired' } as const;

    const [existing] = await tx.select({ id: users.id }).from(users).where(eq(users.email, invitation.email)).limit(1);
    if (existing) return { status: 'account-exists' } as const;

    const [{ id: userId }] = await tx
      .insert(users)
      .values({ email: invitation.email, name, passwordHash })
      .$returningId();
    const [{ id: membershipId }] = await tx
      .insert(memberships)
      .values({ userId, workspaceId: invitation.workspaceId, role: invitation.role })
      .$returningId();
    await tx.update(invitations).set({ usedAt: now }).where(eq(invitations.id, invitation.id));
    await insertAuditEvent(tx, {
      workspaceId: invitation.workspaceId,
      actorUserId: userId,
      action: 'invitation.accepted',
      entityType: 'invitation',
      entityId: invitation.id,
      before: { usedAt: null },
      after: { usedAt: now.toISOString(), userId },
    });
    await insertAuditEvent(tx, {
      workspaceId: invitation.workspaceId,
      actorUserId: userId,
      action: 'membership.created',
      entityType: 'membership',
      entityId: membershipId,
      after: { userId, email: invitation.email, name, role: invitation.role, invitationId: invitation.id },
    });
    return { status: 'accepted', userId, email: invitation.email } as const;
  });
}
