import 'server-only';
import { getMemberContext, type MemberContext } from '@/db/queries/memberships';
import { AppError } from '@/features/auth/errors';
import { getSessionIdentity } from '@/features/auth/session-source';
import type { Actor } from '@/lib/auth/permissions';
import { roleLabels, type Role } from '@/lib/auth/roles';

/**
 * The one server-side gate. Every route handler and server action calls it after parsing its
 * input: it reads the session, then loads the membership fresh from the database (so a changed
 * role or a removed member takes effect at once, whatever the session token still says).
 * @throws AppError 'unauthenticated' when nobody is signed in or the membership is gone
 */
export async function requireSession(): Promise<MemberContext> {
  const identity = await getSessionIdentity();
  if (!identity) throw new AppError('unauthenticated');
  const member = await getMemberContext(identity);
  if (!member) throw new AppError('unauthenticated', 'Your session has ended; sign in again.');
  return member;
}

/**
 * As requireSession, and the member's role must be one of `allowed`.
 * @throws AppError 'forbidden' naming the roles that may do this
 */
export async function requireRole(...allowed: Role[]): Promise<MemberContext> {
  const member = await requireSession();
  if (!allowed.includes(member.role)) {
    throw new AppError('forbidden', `Only ${allowed.map((role) => roleLabels[role]).join(' or ')} members can do this.`);
  }
  return member;
}

/**
 * As requireSession, and the permission function (from lib/auth/permissions) must allow the member.
 * @throws AppError 'forbidden'
 */
export async function requirePermission(permission: (actor: Actor) => boolean): Promise<MemberContext> {
  const member = await requireSession();
  if (!permission(member)) throw new AppError('forbidden');
  return member;
}

/** The signed-in member for pages, or null (pages redirect; they do not throw). */
export async function getCurrentMember(): Promise<MemberContext | null> {
  try {
    return await requireSession();
  } catch (error) {
    if (error instanceof AppError) return null;
    throw error;
  }
}
