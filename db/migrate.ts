/**
 * Applies the committed migrations in `drizzle/` to DATABASE_URL, then exits.
 *   node --import tsx db/migrate.ts
 */
import { fileURLToPath } from 'node:url';
import { migrate } from 'drizzle-orm/mysql2/migrator';
import { createDatabase } from '@/db/connection';
import { getDatabaseEnv } from '@/db/env';

/** The folder holding the generated SQL and its journal. */
export const migrationsFolder = fileURLToPath(new URL('../drizzle', import.meta.url));

/** Applies every pending migration to the database at `url`. */
export async function applyMigrations(url: string): Promise<void> {
  const handle = createDatabase(url, { connectionLimit: 1 });
  try {
    await migrate(handle.db, { migrationsFolder });
  } finally {
    await handle.close();
  }
}

const isMain = process.argv[1] && fileURLToPath(import.meta.url) === process.argv[1];
if (isMain) {
  const started = Date.now();
  applyMigrations(getDatabaseEnv().DATABASE_URL)
    .then(() => {
      console.log(`[migrate] migrations applied in ${Date.now() - started} ms`);
      process.exit(0);
    })
    .catch((error: unknown) => {
      console.error('[migrate] failed:', error instanceof Error ? error.message : error);
      process.exit(1);
    });
}
