import { getToken } from 'next-auth/jwt';
import { NextResponse, type NextRequest } from 'next/server';

/**
 * Sends signed-out visitors of the signed-in pages to the sign-in page, remembering where they
 * were going. It only redirects: every page, route handler and server action still checks the
 * session and role itself (features/auth/guard.ts).
 */
export async function proxy(request: NextRequest) {
  const token = await getToken({ req: request, secret: process.env.NEXTAUTH_SECRET });
  if (token) return NextResponse.next();
  const signIn = new URL('/sign-in', request.url);
  signIn.searchParams.set('callbackUrl', `${request.nextUrl.pathname}${request.nextUrl.search}`);
  return NextResponse.redirect(signIn);
}

export const config = {
  matcher: ['/programs/:path*', '/parts/:path*', '/members/:path*', '/plans/:path*'],
};
