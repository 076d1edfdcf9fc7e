import Link from 'next/link';

export default function NotFound() {
  return (
    <main className="mx-auto max-w-xl px-6 py-24">
      <h1 className="text-2xl font-semibold">Page not found</h1>
      <p className="mt-3 text-ink-soft">The address may be mistyped, or the page may have moved.</p>
      <Link href="/" className="mt-6 inline-block font-medium text-copper-dark underline underline-offset-4">
        Go to Channelsmith
      </Link>
    </main>
  );
}
