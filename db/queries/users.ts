import 'server-only';
import { eq } from 'drizzle-orm';
import { getDb } from '@/db/client';
import { users, type User } from '@/db/schema';

/** The user with this e-mail (compared lower-cased), or null. */
export async function getUserByEmail({ email }: { email: string }): Promise<User | null> {
  const [user] = await getDb()
    .select()
    .from(users)
    .where(eq(users.email, email.trim().toLowerCase()))
    .limit(1);
  return user ?? null;
}

/** The user with this id, or null. */
export async function getUserById({ id }: { id: number }): Promise<User | null> {
  const [user] = await getDb().select().from(users).where(eq(users.id, id)).limit(1);
  return user ?? null;
}
