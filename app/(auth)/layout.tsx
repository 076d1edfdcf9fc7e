import type { ReactNode } from 'react';
import { planningAidCaution } from '@/lib/cautions';

export default function AuthLayout({ children }: { children: ReactNode }) {
  return (
    <div className="flex min-h-screen flex-col">
      <main className="mx-auto w-full max-w-md flex-1 px-6 py-16">
        <p className="text-sm font-semibold uppercase tracking-widest text-copper-dark">Channelsmith</p>
        <div className="mt-4 rounded-lg border border-ink-soft/20 bg-white p-6 shadow-sm">{children}</div>
      </main>
      <footer className="border-t border-ink-soft/20 px-6 py-4 text-xs text-ink-soft">
        <p className="mx-auto max-w-3xl">{planningAidCaution}</p>
      </footer>
    </div>
  );
}
