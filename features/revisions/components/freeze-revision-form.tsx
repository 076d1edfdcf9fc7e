'use client';

import { useRouter } from 'next/navigation';
import { useState } from 'react';
import { sendJson } from '@/features/ui/send-json';

/** Freezes the stored plan as its next revision, with a change summary (engineers and admins). */
export function FreezeRevisionForm({ planId, planVersion, nextLabel }: { planId: string; planVersion: number; nextLabel: string }) {
  const router = useRouter();
  const [summary, setSummary] = useState('');
  const [pending, setPending] = useState(false);
  const [error, setError] = useState<string | null>(null);
  const [done, setDone] = useState<string | null>(null);

  async function submit(event: React.FormEvent) {
    event.preventDefault();
    setPending(true);
    setError(null);
    const result = await sendJson<{ revision: { id: string; label: string } }>(`/api/plans/${planId}/revisions`, 'POST', {
      changeSummary: summary,
      planVersion,
    });
    setPending(false);
    if (!result.ok) {
      setError(result.fieldErrors.changeSummary?.[0] ?? result.message);
      return;
    }
    setSummary('');
    setDone(`Revision ${result.data.revision.label} frozen.`);
    router.refresh();
  }

  return (
    <form onSubmit={submit} className="space-y-2 rounded-lg border border-ink-soft/20 bg-white p-4" aria-label="Freeze a revision">
      <h2 className="font-semibold">Freeze revision {nextLabel}</h2>
      <p className="text-sm text-ink-soft">
        Snapshots the saved plan (version {planVersion}) with the server&apos;s report. A revision never changes afterwards.
      </p>
      <label htmlFor="change-summary" className="block text-sm font-medium">
        Change summary
      </label>
      <textarea
        id="change-summary"
        value={summary}
        onChange={(e) => setSummary(e.target.value)}
        maxLength={4000}
        rows={3}
        className="w-full rounded-md border border-ink-soft/40 p-2 focus:outline-2 focus:outline-copper"
        aria-invalid={error ? true : undefined}
        aria-describedby={error ? 'change-summary-error' : undefined}
      />
      {error ? (
        <p id="change-summary-error" role="alert" className="text-sm text-verdict-fails">
          {error}
        </p>
      ) : null}
      {done ? (
        <p role="status" className="text-sm text-verdict-meets">
          {done}
        </p>
      ) : null}
      <button type="submit" disabled={pending} className="rounded-md bg-copper-dark px-4 py-2 text-white disabled:opacity-60">
        {pending ? 'Freezing…' : `Freeze revision ${nextLabel}`}
      </button>
    </form>
  );
}
