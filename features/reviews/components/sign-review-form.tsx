'use client';

import { useRouter } from 'next/navigation';
import { useState } from 'react';
import { sendJson } from '@/features/ui/send-json';

/**
 * A requested reviewer's decision, signed by re-entering the password. The content hash shown is
 * the one recorded with the signature.
 */
export function SignReviewForm({ revisionId, label, contentHash }: { revisionId: string; label: string; contentHash: string }) {
  const router = useRouter();
  const [meaning, setMeaning] = useState<'approved' | 'changes-requested'>('approved');
  const [password, setPassword] = useState('');
  const [note, setNote] = useState('');
  const [pending, setPending] = useState(false);
  const [error, setError] = useState<string | null>(null);
  const [done, setDone] = useState<string | null>(null);

  async function submit(event: React.FormEvent) {
    event.preventDefault();
    setPending(true);
    setError(null);
    const result = await sendJson<{ outcome: string; state: string }>(`/api/revisions/${revisionId}/signatures`, 'POST', {
      meaning,
      password,
      contentHash,
      note,
    });
    setPending(false);
    setPassword('');
    if (!result.ok) {
      setError(result.fieldErrors.password?.[0] ?? result.message);
      return;
    }
    setDone(
      result.data.outcome === 'approved'
        ? `Signed. Every reviewer has approved: revision ${label} is released.`
        : result.data.outcome === 'changes-requested'
          ? `Signed. Revision ${label} is marked changes requested.`
          : 'Signed. The review waits for the other reviewers.',
    );
    router.refresh();
  }

  return (
    <form onSubmit={submit} aria-label="Sign the review" className="space-y-3 rounded-lg border border-copper/40 bg-white p-4">
      <h3 className="font-semibold">Your decision on revision {label}</h3>
      <fieldset className="flex flex-wrap gap-4 text-sm">
        <legend className="sr-only">Decision</legend>
        <label className="flex items-center gap-2">
          <input type="radio" name="meaning" checked={meaning === 'approved'} onChange={() => setMeaning('approved')} /> Approve
        </label>
        <label className="flex items-center gap-2">
          <input type="radio" name="meaning" checked={meaning === 'changes-requested'} onChange={() => setMeaning('changes-requested')} /> Request changes
        </label>
      </fieldset>
      <label htmlFor="signature-note" className="block text-sm font-medium">
        Note (optional)
      </label>
      <textarea id="signature-note" value={note} onChange={(e) => setNote(e.target.value)} maxLength={2000} rows={2} className="w-full rounded-md border border-ink-soft/40 p-2" />
      <label htmlFor="signature-password" className="block text-sm font-medium">
        Password (your signature)
      </label>
      <input
        id="signature-password"
        type="password"
        autoComplete="current-password"
        value={password}
        onChange={(e) => setPassword(e.target.value)}
        className="w-full max-w-sm rounded-md border border-ink-soft/40 p-2"
        aria-invalid={error ? true : undefined}
      />
      <p className="text-xs text-ink-soft">
        Signing records your name, the time, the decision and the content hash <code className="break-all">{contentHash}</code>.
      </p>
      {error ? (
        <p role="alert" className="text-sm text-verdict-fails">
          {error}
        </p>
      ) : null}
      {done ? (
        <p role="status" className="text-sm text-verdict-meets">
          {done}
        </p>
      ) : null}
      <button type="submit" disabled={pending || password.length === 0} className="rounded-md bg-copper-dark px-4 py-2 text-white disabled:opacity-60">
        {pending ? 'Signing…' : 'Sign'}
      </button>
    </form>
  );
}
