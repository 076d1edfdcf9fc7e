/**
 * The demo workspace: "Larkspur Biosignals" (invented) with one member per role.
 *   node --import tsx db/seed.ts
 * Idempotent: running it again resets the demo members' names, roles and passwords and adds nothing.
 * Later seeds (programs, plans) call `seedDemoWorkspace(db)` and build on the ids it returns.
 */
import { fileURLToPath } from 'node:url';
import bcrypt from 'bcryptjs';
import { and, eq, sql } from 'drizzle-orm';
import { createDatabase, type Database } from '@/db/connection';
import { getDatabaseEnv } from '@/db/env';
import { memberships, users, workspaces } from '@/db/schema';
import { seedWorkspaceData } from '@/db/seed-workspace';
import { seedReviewData } from '@/db/seed-reviews';
import { demoAccounts } from '@/db/demo-accounts';
import type { Role } from '@/lib/auth/roles';

export const demoWorkspace = { slug: 'larkspur', name: 'Larkspur Biosignals' } as const;

export { demoAccounts } from '@/db/demo-accounts';

export interface SeededWorkspace {
  workspaceId: number;
  /** User id by role. */
  userIds: Record<Role, number>;
}

/** Upserts the demo workspace and its four members; returns their ids. */
export async function seedDemoWorkspace(db: Database): Promise<SeededWorkspace> {
  await db
    .insert(workspaces)
    .values(demoWorkspace)
    .onDuplicateKeyUpdate({ set: { name: sql`VALUES(${workspaces.name})` } });
  const [workspace] = await db.select().from(workspaces).where(eq(workspaces.slug, demoWorkspace.slug));

  const userIds = {} as Record<Role, number>;
  for (const account of demoAccounts) {
    // Cost 10 keeps the seed quick; the app hashes new passwords at its own cost.
    const passwordHash = await bcrypt.hash(account.password, 10);
    await db
      .insert(users)
      .values({ email: account.email, name: account.name, passwordHash })
      .onDuplicateKeyUpdate({ set: { name: account.name, passwordHash } });
    const [user] = await db.select({ id: users.id }).from(users).where(eq(users.email, account.email));
    userIds[account.role] = user.id;

    const [existing] = await db
      .select({ id: memberships.id })
      .from(memberships)
      .where(and(eq(memberships.userId, user.id), eq(memberships.workspaceId, workspace.id)));
    if (existing) {
      await db.update(memberships).set({ role: account.role }).where(eq(memberships.id, existing.id));
    } else {
      await db.insert(memberships).values({ userId: user.id, workspaceId: workspace.id, role: account.role });
    }
  }
  return { workspaceId: workspace.id, userIds };
}

const isMain = process.argv[1] && fileURLToPath(import.meta.url) === process.argv[1];
if (isMain) {
  const handle = createDatabase(getDatabaseEnv().DATABASE_URL, { connectionLimit: 2 });
  seedDemoWorkspace(handle.db)
    .then(async (seeded) => {
      await seedWorkspaceData(handle.db, { workspaceId: seeded.workspaceId, engineerUserId: seeded.userIds.engineer });
      await seedReviewData(handle.db, { workspaceId: seeded.workspaceId, userIds: seeded.userIds });
      await handle.close();
      console.log(`[seed] workspace "${demoWorkspace.name}" with demo accounts (e-mail / password / role):`);
      for (const account of demoAccounts) console.log(`  ${account.email}  ${account.password}  ${account.role}`);
      process.exit(0);
    })
    .catch(async (error: unknown) => {
      console.error('[seed] failed:', error instanceof Error ? error.message : error);
      await handle.close().catch(() => undefined);
      process.exit(1);
    });
}
