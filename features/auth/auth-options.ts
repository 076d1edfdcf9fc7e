import 'server-only';
import type { NextAuthOptions } from 'next-auth';
import CredentialsProvider from 'next-auth/providers/credentials';
import { getServerEnv } from '@/db/env';
import { authorizeCredentials, clientIpFromHeaders, type SignedInUser } from '@/features/auth/authorize';
import { isRole } from '@/lib/auth/roles';

/** Sessions last a working day (common practice, no source). */
const sessionMaxAgeS = 8 * 60 * 60;

let cached: NextAuthOptions | undefined;

/** next-auth's configuration: credentials only, JWT sessions carrying user, workspace and role. */
export function getAuthOptions(): NextAuthOptions {
  if (cached) return cached;
  const env = getServerEnv();
  cached = {
    secret: env.NEXTAUTH_SECRET,
    session: { strategy: 'jwt', maxAge: sessionMaxAgeS },
    pages: { signIn: '/sign-in', error: '/sign-in' },
    providers: [
      CredentialsProvider({
        name: 'E-mail and password',
        credentials: {
          email: { label: 'E-mail', type: 'email' },
          password: { label: 'Password', type: 'password' },
        },
        // Errors thrown here reach the client as `error` with their message (wrong password, rate limit).
        authorize: (credentials, request) =>
          authorizeCredentials(credentials, { ip: clientIpFromHeaders(request?.headers) }),
      }),
    ],
    callbacks: {
      jwt({ token, user }) {
        if (user) {
          const signedIn = user as unknown as SignedInUser;
          token.userId = signedIn.userId;
          token.workspaceId = signedIn.workspaceId;
          token.role = signedIn.role;
          token.name = signedIn.name;
          token.email = signedIn.email;
        }
        return token;
      },
      session({ session, token }) {
        if (typeof token.userId === 'number' && typeof token.workspaceId === 'number' && isRole(token.role)) {
          session.user = {
            userId: token.userId,
            workspaceId: token.workspaceId,
            role: token.role,
            name: token.name ?? '',
            email: token.email ?? '',
          };
        }
        return session;
      },
    },
  };
  return cached;
}
