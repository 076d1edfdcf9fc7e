import type { Metadata } from 'next';

export const metadata: Metadata = { title: 'Programs' };

export default function ProgramsPage() {
  return (
    <section aria-labelledby="programs-heading">
      <h1 id="programs-heading" className="text-2xl font-semibold">Programs</h1>
      <p className="mt-3 text-ink-soft">No programs yet. Programs and their channel plans will be listed here.</p>
    </section>
  );
}
