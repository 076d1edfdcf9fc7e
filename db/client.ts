import 'server-only';
import { createDatabase, type Database, type DatabaseHandle } from '@/db/connection';
import { getDatabaseEnv } from '@/db/env';

// One pool per process. In development Next re-evaluates modules on every change, so the pool is
// kept on globalThis instead of opening a new one each time.
const globalForDb = globalThis as unknown as { channelsmithDb?: DatabaseHandle };

/** The app's database (created on first use from DATABASE_URL). */
export function getDb(): Database {
  if (!globalForDb.channelsmithDb) {
    globalForDb.channelsmithDb = createDatabase(getDatabaseEnv().DATABASE_URL);
  }
  return globalForDb.channelsmithDb.db;
}

/** Closes the pool (tests and scripts); the next `getDb()` opens a new one. */
export async function closeDb(): Promise<void> {
  const handle = globalForDb.channelsmithDb;
  globalForDb.channelsmithDb = undefined;
  await handle?.close();
}
