import 'server-only';
import { sql } from 'drizzle-orm';
import { getDb } from '@/db/client';

/** True when the database answers a trivial query. Never throws. */
export async function pingDatabase(): Promise<boolean> {
  try {
    await getDb().execute(sql`SELECT 1`);
    return true;
  } catch {
    return false;
  }
}
