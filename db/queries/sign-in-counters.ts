import 'server-only';
import { eq, inArray, sql } from 'drizzle-orm';
import { getDb } from '@/db/client';
import { signInCounters } from '@/db/schema';
import type { FailureCounter } from '@/lib/auth/rate-limit';

/** The stored failure counters for these keys, by key (missing keys have no counter). */
export async function getSignInCounters({ keys }: { keys: string[] }): Promise<Map<string, FailureCounter>> {
  if (keys.length === 0) return new Map();
  const rows = await getDb().select().from(signInCounters).where(inArray(signInCounters.key, keys));
  return new Map(rows.map((row) => [row.key, { failures: row.failures, windowStartedAt: row.windowStartedAt }]));
}

/**
 * Counts one failed attempt against each key, atomically in the database: a counter whose window
 * (started at its first failure) has passed starts again at 1.
 */
export async function recordSignInFailure({
  keys,
  now,
  windowMs,
}: {
  keys: string[];
  now: Date;
  windowMs: number;
}): Promise<void> {
  const windowCutoff = new Date(now.getTime() - windowMs);
  for (const key of keys) {
    // MariaDB applies ON DUPLICATE KEY assignments left to right, so `failures` must be computed
    // before `window_started_at` is moved.
    await getDb()
      .insert(signInCounters)
      .values({ key, failures: 1, windowStartedAt: now, lastFailureAt: now })
      .onDuplicateKeyUpdate({
        set: {
          failures: sql`IF(${signInCounters.windowStartedAt} <= ${windowCutoff}, 1, ${signInCounters.failures} + 1)`,
          windowStartedAt: sql`IF(${signInCounters.windowStartedAt} <= ${windowCutoff}, ${now}, ${signInCounters.windowStartedAt})`,
          lastFailureAt: now,
        },
      });
  }
}

/** Forgets the failures counted against a key (after a successful sign-in or reset). */
export async function clearSignInCounter({ key }: { key: string }): Promise<void> {
  await getDb().delete(signInCounters).where(eq(signInCounters.key, key));
}
