import { redirect } from 'next/navigation';
import type { ReactNode } from 'react';
import { getCurrentMember } from '@/features/auth/guard';
import { AppShell } from '@/features/shell/components/app-shell';

export const dynamic = 'force-dynamic';

export default async function SignedInLayout({ children }: { children: ReactNode }) {
  const member = await getCurrentMember();
  if (!member) redirect('/sign-in');
  return <AppShell member={{ name: member.name, role: member.role, workspaceName: member.workspaceName }}>{children}</AppShell>;
}
