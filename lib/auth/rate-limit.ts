/**
 * Sign-in rate limiting as pure decisions over stored counters (the counters themselves live in
 * the database so that every app instance shares them).
 *
 * Limits: common practice, no source for the exact numbers — a small allowance per account (it
 * stops password guessing against one person) and a larger one per network address (it stops
 * one client from spraying many accounts), both within a fixed window that starts at the first failure.
 */

/** Failed attempts allowed per account within the window; the next attempt is refused. */
export const maxFailuresPerAccount = 5;
/** Failed attempts allowed per client address within the window. */
export const maxFailuresPerIp = 20;
/** Length of the counting window, milliseconds (15 minutes). */
export const failureWindowMs = 15 * 60 * 1000;

/** A stored counter: failures since the window started. */
export interface FailureCounter {
  failures: number;
  windowStartedAt: Date;
}

export type RateLimitDecision = { limited: false } | { limited: true; retryAfterMinutes: number };

/**
 * Decides whether a new attempt is refused.
 * @param counter the stored counter, or null when none exists
 * @param maxFailures failures allowed within the window
 * @param now the current time
 * @param windowMs window length, ms
 * @returns limited with the whole minutes (at least 1) until the window ends, or not limited
 * @example isRateLimited({ failures: 5, windowStartedAt: t0 }, 5, t0 + 1 min, 15 min) → { limited: true, retryAfterMinutes: 14 }
 */
export function isRateLimited(
  counter: FailureCounter | null,
  maxFailures: number,
  now: Date,
  windowMs: number = failureWindowMs,
): RateLimitDecision {
  if (!counter) return { limited: false };
  const windowEndsMs = counter.windowStartedAt.getTime() + windowMs;
  const remainingMs = windowEndsMs - now.getTime();
  if (remainingMs <= 0 || counter.failures < maxFailures) return { limited: false };
  return { limited: true, retryAfterMinutes: Math.max(1, Math.ceil(remainingMs / 60_000)) };
}

/** The user-facing refusal, e.g. "Too many attempts; try again in 14 minutes". */
export function tooManyAttemptsMessage(retryAfterMinutes: number): string {
  return `Too many attempts; try again in ${retryAfterMinutes} ${retryAfterMinutes === 1 ? 'minute' : 'minutes'}`;
}

/** Counter key for an account (by normalised e-mail, known or not, so limits reveal nothing). */
export function accountCounterKey(email: string): string {
  return `account:${email.trim().toLowerCase()}`;
}

/** Counter key for a client address. */
export function ipCounterKey(ip: string): string {
  return `ip:${ip}`;
}

/**
 * Password-reset e-mails allowed per address and per client within the window: enough for a
 * person who mistyped or lost a mail, too few to flood an inbox. Common practice, no source.
 */
export const maxResetRequestsPerAccount = 3;
export const maxResetRequestsPerIp = 20;

/** Counter key of reset requests for an address (known or not, so the limit reveals nothing). */
export function resetAccountCounterKey(email: string): string {
  return `reset:${email.trim().toLowerCase()}`;
}

/** Counter key of reset requests from a client address. */
export function resetIpCounterKey(ip: string): string {
  return `reset-ip:${ip}`;
}
