import 'server-only';
import { getPrimaryMembership } from '@/db/queries/memberships';
import { clearSignInCounter, getSignInCounters, recordSignInFailure } from '@/db/queries/sign-in-counters';
import { getUserByEmail } from '@/db/queries/users';
import { signInInputSchema } from '@/lib/auth/account-schemas';
import type { Role } from '@/lib/auth/roles';
import {
  accountCounterKey,
  failureWindowMs,
  ipCounterKey,
  isRateLimited,
  maxFailuresPerAccount,
  maxFailuresPerIp,
  tooManyAttemptsMessage,
} from '@/lib/auth/rate-limit';
import { verifyPassword } from '@/features/auth/password';

/** Same words for a wrong password and an unknown e-mail, so the form reveals no accounts. */
export const wrongCredentialsMessage = 'E-mail or password is incorrect';

/** What a successful sign-in puts into the session token. */
export interface SignedInUser {
  id: string;
  userId: number;
  email: string;
  name: string;
  workspaceId: number;
  role: Role;
}

/** Thrown with a message the sign-in form shows as is. */
export class SignInError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'SignInError';
  }
}

/** The client address from proxy headers, or "unknown". The first X-Forwarded-For entry is used. */
export function clientIpFromHeaders(headers: Record<string, string | string[] | undefined> | undefined): string {
  const forwarded = headers?.['x-forwarded-for'];
  const first = (Array.isArray(forwarded) ? forwarded[0] : forwarded)?.split(',')[0]?.trim();
  const realIp = headers?.['x-real-ip'];
  return first || (Array.isArray(realIp) ? realIp[0] : realIp) || 'unknown';
}

/**
 * Checks e-mail and password for the credentials provider. Order: parse, refuse when rate
 * limited (before any password check), verify, count a failure or clear the account's counter.
 * @throws SignInError with the message to show
 */
export async function authorizeCredentials(
  credentials: Record<string, unknown> | undefined,
  { ip, now = new Date() }: { ip: string; now?: Date },
): Promise<SignedInUser> {
  const parsed = signInInputSchema.safeParse(credentials ?? {});
  if (!parsed.success) throw new SignInError(parsed.error.issues[0]?.message ?? wrongCredentialsMessage);
  const { email, password } = parsed.data;

  const accountKey = accountCounterKey(email);
  const ipKey = ipCounterKey(ip);
  const counters = await getSignInCounters({ keys: [accountKey, ipKey] });
  for (const [key, max] of [
    [accountKey, maxFailuresPerAccount],
    [ipKey, maxFailuresPerIp],
  ] as const) {
    const decision = isRateLimited(counters.get(key) ?? null, max, now);
    if (decision.limited) throw new SignInError(tooManyAttemptsMessage(decision.retryAfterMinutes));
  }

  const user = await getUserByEmail({ email });
  const passwordMatches = await verifyPassword(password, user?.passwordHash ?? null);
  const membership = user && passwordMatches ? await getPrimaryMembership({ userId: user.id }) : null;
  if (!user || !passwordMatches || !membership) {
    await recordSignInFailure({ keys: [accountKey, ipKey], now, windowMs: failureWindowMs });
    throw new SignInError(wrongCredentialsMessage);
  }

  await clearSignInCounter({ key: accountKey });
  return {
    id: String(user.id),
    userId: user.id,
    email: user.email,
    name: user.name,
    workspaceId: membership.workspaceId,
    role: membership.role,
  };
}
