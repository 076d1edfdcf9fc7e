import type { Metadata } from 'next';

export const metadata: Metadata = { title: 'Parts' };

export default function PartsPage() {
  return (
    <section aria-labelledby="parts-heading">
      <h1 id="parts-heading" className="text-2xl font-semibold">Parts</h1>
      <p className="mt-3 text-ink-soft">No parts yet. The workspace&apos;s part library will be listed here.</p>
    </section>
  );
}
