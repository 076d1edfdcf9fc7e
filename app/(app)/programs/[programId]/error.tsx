'use client';

export default function ProgramsError({ reset }: { error: Error; reset: () => void }) {
  return (
    <div role="alert" className="rounded-lg border border-verdict-fails/30 bg-white p-6">
      <h1 className="text-lg font-semibold">This program view could not be shown</h1>
      <p className="mt-2 text-ink-soft">Something went wrong on our side; nothing was changed.</p>
      <button type="button" onClick={reset} className="mt-4 rounded-md bg-copper-dark px-4 py-2 text-white">
        Try again
      </button>
    </div>
  );
}
