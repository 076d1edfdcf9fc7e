import NextAuth from 'next-auth';
import { getAuthOptions } from '@/features/auth/auth-options';

type RouteContext = { params: Promise<{ nextauth: string[] }> };

// Options are built on the first request, so a build without the server's settings still succeeds.
function handler(request: Request, context: RouteContext) {
  return NextAuth(request as never, context as never, getAuthOptions());
}

export { handler as GET, handler as POST };
