import 'server-only';
import { getServerSession } from 'next-auth';
import { getAuthOptions } from '@/features/auth/auth-options';

/** Who the session cookie says is signed in, or null. (Tests replace this module.) */
export async function getSessionIdentity(): Promise<{ userId: number; workspaceId: number } | null> {
  const session = await getServerSession(getAuthOptions());
  if (!session?.user) return null;
  return { userId: session.user.userId, workspaceId: session.user.workspaceId };
}
