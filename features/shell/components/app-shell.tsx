import type { ReactNode } from 'react';
import { NavLinks, type NavItem } from '@/features/shell/components/nav-links';
import { SignOutButton } from '@/features/shell/components/sign-out-button';
import { planningAidCaution } from '@/lib/cautions';
import { canManageMembers } from '@/lib/auth/permissions';
import { roleLabels, type Role } from '@/lib/auth/roles';

export interface ShellMember {
  name: string;
  role: Role;
  workspaceName: string;
}

/** The signed-in frame: navigation by role, who is signed in, sign-out, and the standing caution. */
export function AppShell({ member, children }: { member: ShellMember; children: ReactNode }) {
  const items: NavItem[] = [
    { href: '/programs', label: 'Programs' },
    { href: '/released', label: 'Released' },
    { href: '/parts', label: 'Parts' },
    ...(canManageMembers(member) ? [{ href: '/members', label: 'Members' }] : []),
  ];
  return (
    <div className="flex min-h-screen flex-col">
      <a href="#main" className="sr-only focus:not-sr-only focus:absolute focus:left-2 focus:top-2 focus:bg-white focus:p-2">
        Skip to content
      </a>
      <header className="bg-ink text-white">
        <div className="mx-auto flex max-w-6xl flex-wrap items-center gap-x-6 gap-y-3 px-6 py-3">
          <span className="font-semibold tracking-wide">
            Channelsmith <span className="font-normal text-white/70">· {member.workspaceName}</span>
          </span>
          <nav aria-label="Main" className="flex-1">
            <NavLinks items={items} />
          </nav>
          <div className="flex items-center gap-3 text-sm">
            <span aria-label="Signed in as">
              {member.name} <span className="rounded bg-copper px-1.5 py-0.5 text-xs font-semibold">{roleLabels[member.role]}</span>
            </span>
            <SignOutButton />
          </div>
        </div>
      </header>
      <main id="main" className="mx-auto w-full max-w-6xl flex-1 px-6 py-8">
        {children}
      </main>
      <footer className="border-t border-ink-soft/20 bg-white px-6 py-4">
        <p role="note" aria-label="Caution" className="mx-auto max-w-6xl text-xs text-ink-soft">
          {planningAidCaution}
        </p>
      </footer>
    </div>
  );
}
