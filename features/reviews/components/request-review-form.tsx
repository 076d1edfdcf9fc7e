'use client';

import { useRouter } from 'next/navigation';
import { useState } from 'react';
import { sendJson } from '@/features/ui/send-json';

export interface ReviewerOption {
  userId: string;
  name: string;
  role: string;
}

/** Chooses reviewers (reviewers and admins other than the requester) and sends the request by e-mail. */
export function RequestReviewForm({ revisionId, label, options }: { revisionId: string; label: string; options: ReviewerOption[] }) {
  const router = useRouter();
  const [chosen, setChosen] = useState<string[]>([]);
  const [message, setMessage] = useState('');
  const [pending, setPending] = useState(false);
  const [error, setError] = useState<string | null>(null);

  async function submit(event: React.FormEvent) {
    event.preventDefault();
    setPending(true);
    setError(null);
    const result = await sendJson<{ mailFailedFor: string[] }>(`/api/revisions/${revisionId}/review`, 'POST', {
      reviewerUserIds: chosen,
      message,
    });
    setPending(false);
    if (!result.ok) {
      setError(result.message);
      return;
    }
    if (result.data.mailFailedFor.length > 0) setError(`Review requested, but the e-mail to ${result.data.mailFailedFor.join(', ')} could not be sent.`);
    router.refresh();
  }

  return (
    <form onSubmit={submit} aria-label="Request a review" className="space-y-3 rounded-lg border border-ink-soft/20 bg-white p-4">
      <h3 className="font-semibold">Request a review of revision {label}</h3>
      {options.length === 0 ? <p className="text-sm text-ink-soft">No reviewer or admin other than you is a member of this workspace.</p> : null}
      <fieldset className="space-y-1">
        <legend className="text-sm font-medium">Reviewers (every one must approve)</legend>
        {options.map((option) => (
          <label key={option.userId} className="flex items-center gap-2 text-sm">
            <input
              type="checkbox"
              checked={chosen.includes(option.userId)}
              onChange={(e) => setChosen((c) => (e.target.checked ? [...c, option.userId] : c.filter((id) => id !== option.userId)))}
            />
            {option.name} ({option.role})
          </label>
        ))}
      </fieldset>
      <label htmlFor="review-message" className="block text-sm font-medium">
        Message to the reviewers (optional)
      </label>
      <textarea id="review-message" value={message} onChange={(e) => setMessage(e.target.value)} maxLength={2000} rows={2} className="w-full rounded-md border border-ink-soft/40 p-2" />
      {error ? (
        <p role="alert" className="text-sm text-verdict-fails">
          {error}
        </p>
      ) : null}
      <button type="submit" disabled={pending || chosen.length === 0} className="rounded-md bg-copper-dark px-4 py-2 text-white disabled:opacity-60">
        {pending ? 'Sending…' : 'Send review request'}
      </button>
    </form>
  );
}
