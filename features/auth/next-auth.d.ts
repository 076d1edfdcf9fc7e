import type { Role } from '@/lib/auth/roles';

declare module 'next-auth' {
  interface Session {
    user?: { userId: number; workspaceId: number; role: Role; name: string; email: string };
  }
}

declare module 'next-auth/jwt' {
  interface JWT {
    userId?: number;
    workspaceId?: number;
    role?: string;
  }
}
