import 'server-only';
import { and, asc, eq, isNull } from 'drizzle-orm';
import { getDb } from '@/db/client';
import { insertAuditEvent } from '@/db/queries/audit-events';
import { memberships, passwordResetTokens, signInCounters, users } from '@/db/schema';
import { accountCounterKey } from '@/lib/auth/rate-limit';

/** Saves a reset token (as a hash) for the user and records the request, in one transaction. */
export async function createPasswordResetToken({
  userId,
  tokenHash,
  expiresAt,
}: {
  userId: number;
  tokenHash: string;
  expiresAt: Date;
}): Promise<void> {
  await getDb().transaction(async (tx) => {
    const [membership] = await tx
      .select({ workspaceId: memberships.workspaceId })
      .from(memberships)
      .where(eq(memberships.userId, userId))
      .orderBy(asc(memberships.id))
      .limit(1);
    const [{ id }] = await tx.insert(passwordResetTokens).values({ userId, tokenHash, expiresAt }).$returningId();
    await insertAuditEvent(tx, {
      workspaceId: membership?.workspaceId ?? null,
      actorUserId: userId,
      action: 'password-reset.requested',
      entityType: 'password-reset',
      entityId: id,
      after: { expiresAt: expiresAt.toISOString() },
    });
  });
}

export type PasswordResetTokenState = 'valid' | 'not-found' | 'used' | 'expired';

/** Whether a reset link can still be used (for the page, before the form is shown). */
export async function getPasswordResetTokenState({
  tokenHash,
  now,
}: {
  tokenHash: string;
  now: Date;
}): Promise<PasswordResetTokenState> {
  const [row] = await getDb()
    .select({ usedAt: passwordResetTokens.usedAt, expiresAt: passwordResetTokens.expiresAt })
    .from(passwordResetTokens)
    .where(eq(passwordResetTokens.tokenHash, tokenHash))
    .limit(1);
  if (!row) return 'not-found';
  if (row.usedAt) return 'used';
  if (row.expiresAt.getTime() <= now.getTime()) return 'expired';
  return 'valid';
}

export type CompletePasswordResetResult = { status: 'reset'; email: string } | { status: Exclude<PasswordResetTokenState, 'valid'> };

/**
 * Sets the new password, marks this and every other open reset link of the user used, clears the
 * account's failed sign-in counter and records the change, in one transaction.
 */
export async function completePasswordReset({
  tokenHash,
  passwordHash,
  now,
}: {
  tokenHash: string;
  passwordHash: string;
  now: Date;
}): Promise<CompletePasswordResetResult> {
  return getDb().transaction(async (tx) => {
    const [token] = await tx
      .select()
      .from(passwordResetTokens)
      .where(eq(passwordResetTokens.tokenHash, tokenHash))
      .limit(1)
      .for('update');
    if (!token) return { status: 'not-found' } as const;
    if (token.usedAt) return { status: 'used' } as const;
    if (token.expiresAt.getTime() <= now.getTime()) return { status: 'expired' } as const;

    const [user] = await tx.select({ id: users.id, email: users.email }).from(users).where(eq(users.id, token.userId));
    const [membership] = await tx
      .select({ workspaceId: memberships.workspaceId })
      .from(memberships)
      .where(eq(memberships.userId, token.userId))
      .orderBy(asc(memberships.id))
      .limit(1);
    await tx.update(users).set({ passwordHash }).where(eq(users.id, token.userId));
    await tx
      .update(passwordResetTokens)
      .set({ usedAt: now })
      .where(and(eq(passwordResetTokens.userId, token.userId), isNull(passwordResetTokens.usedAt)));
    await tx.delete(signInCounters).where(eq(signInCounters.key, accountCounterKey(user.email)));
    await insertAuditEvent(tx, {
      workspaceId: membership?.workspaceId ?? null,
      actorUserId: user.id,
      action: 'password-reset.completed',
      entityType: 'user',
      entityId: user.id,
      before: { passwordResetTokenId: token.id, usedAt: null },
      after: { passwordResetTokenId: token.id, usedAt: now.toISOString() },
    });
    return { status: 'reset', email: user.email } as const;
  });
}
