'use client';

import { useRouter } from 'next/navigation';
import { useState } from 'react';
import { anchorLabel, reviewStageIds, reviewStageLabels } from '@/features/reviews/anchors';
import { sendJson } from '@/features/ui/send-json';

export interface CommentView {
  id: string;
  parentCommentId: string | null;
  anchorKind: 'stage' | 'check';
  anchorId: string;
  body: string;
  createdAt: string;
  authorName: string;
  resolved: boolean;
  resolvedByName: string | null;
}

const when = (iso: string) => new Date(iso).toISOString().replace('T', ' ').slice(0, 16) + ' UTC';

/** Comment threads anchored to stages and checks, with replies and resolve; a form for new comments. */
export function CommentsPanel({
  revisionId,
  comments,
  checks,
  canWrite,
}: {
  revisionId: string;
  comments: CommentView[];
  checks: { id: string; title: string }[];
  canWrite: boolean;
}) {
  const router = useRouter();
  const [anchor, setAnchor] = useState<string>('stage:high-pass');
  const [body, setBody] = useState('');
  const [error, setError] = useState<string | null>(null);
  const [pending, setPending] = useState(false);
  const checkTitles = Object.fromEntries(checks.map((c) => [c.id, c.title]));
  const threads = comments.filter((c) => c.parentCommentId === null);

  async function post(payload: Record<string, unknown>) {
    setPending(true);
    setError(null);
    const result = await sendJson(`/api/revisions/${revisionId}/comments`, 'POST', payload);
    setPending(false);
    if (!result.ok) {
      setError(result.message);
      return false;
    }
    router.refresh();
    return true;
  }

  async function addComment(event: React.FormEvent) {
    event.preventDefault();
    const [kind, ...rest] = anchor.split(':');
    if (await post({ anchorKind: kind, anchorId: rest.join(':'), body })) setBody('');
  }

  async function toggleResolved(id: string, resolved: boolean) {
    const result = await sendJson(`/api/reviews/comments/${id}`, 'PATCH', { resolved });
    if (!result.ok) setError(result.message);
    router.refresh();
  }

  return (
    <section aria-labelledby="comments-heading" className="space-y-3">
      <h3 id="comments-heading" className="font-semibold">
        Comments ({comments.length})
      </h3>
      {threads.length === 0 ? <p className="text-sm text-ink-soft">No comments yet.</p> : null}
      <ul className="space-y-3">
        {threads.map((thread) => (
          <li key={thread.id} className={`rounded-lg border p-3 ${thread.resolved ? 'border-ink-soft/20 bg-ink-soft/5' : 'border-copper/30 bg-white'}`}>
            <p className="text-xs font-semibold uppercase tracking-wide text-copper-dark">{anchorLabel({ kind: thread.anchorKind, id: thread.anchorId }, checkTitles)}</p>
            {[thread, ...comments.filter((c) => c.parentCommentId === thread.id)].map((c) => (
              <div key={c.id} className={c.parentCommentId ? 'ml-4 mt-2 border-l-2 border-ink-soft/20 pl-3' : 'mt-1'}>
                <p className="text-sm">
                  <span className="font-medium">{c.authorName}</span> <span className="text-ink-soft">· {when(c.createdAt)}</span>
                </p>
                <p className="whitespace-pre-wrap text-sm">{c.body}</p>
              </div>
            ))}
            <p className="mt-2 text-xs text-ink-soft">{thread.resolved ? `Resolved by ${thread.resolvedByName ?? 'someone'}` : 'Open'}</p>
            {canWrite ? <ThreadActions thread={thread} onReply={(text) => post({ parentCommentId: thread.id, body: text })} onToggle={toggleResolved} /> : null}
          </li>
        ))}
      </ul>
      {canWrite ? (
        <form onSubmit={addComment} aria-label="Add a comment" className="space-y-2 rounded-lg border border-ink-soft/20 bg-white p-3">
          <label htmlFor="comment-anchor" className="block text-sm font-medium">
            Comment on
          </label>
          <select id="comment-anchor" value={anchor} onChange={(e) => setAnchor(e.target.value)} className="rounded-md border border-ink-soft/40 p-1.5">
            <optgroup label="Stages">
              {reviewStageIds.map((id) => (
                <option key={id} value={`stage:${id}`}>
                  {reviewStageLabels[id]}
                </option>
              ))}
            </optgroup>
            <optgroup label="Checks">
              {checks.map((c) => (
                <option key={c.id} value={`check:${c.id}`}>
                  {c.title}
                </option>
              ))}
            </optgroup>
          </select>
          <label htmlFor="comment-body" className="block text-sm font-medium">
            Comment
          </label>
          <textarea id="comment-body" value={body} onChange={(e) => setBody(e.target.value)} maxLength={10000} rows={3} className="w-full rounded-md border border-ink-soft/40 p-2" />
          {error ? (
            <p role="alert" className="text-sm text-verdict-fails">
              {error}
            </p>
          ) : null}
          <button type="submit" disabled={pending || body.trim().length === 0} className="rounded-md bg-copper-dark px-4 py-2 text-white disabled:opacity-60">
            Add comment
          </button>
        </form>
      ) : null}
    </section>
  );
}

function ThreadActions({
  thread,
  onReply,
  onToggle,
}: {
  thread: CommentView;
  onReply: (text: string) => Promise<boolean>;
  onToggle: (id: string, resolved: boolean) => Promise<void>;
}) {
  const [reply, setReply] = useState('');
  return (
    <div className="mt-2 flex flex-wrap items-end gap-2">
      <label className="sr-only" htmlFor={`reply-${thread.id}`}>
        Reply to this comment
      </label>
      <input
        id={`reply-${thread.id}`}
        value={reply}
        onChange={(e) => setReply(e.target.value)}
        placeholder="Reply…"
        maxLength={10000}
        className="min-w-0 flex-1 rounded-md border border-ink-soft/40 p-1.5 text-sm"
      />
      <button
        type="button"
        disabled={reply.trim().length === 0}
        onClick={async () => {
          if (await onReply(reply)) setReply('');
        }}
        className="rounded-md border border-ink-soft/40 px-3 py-1 text-sm disabled:opacity-60"
      >
        Reply
      </button>
      <button type="button" onClick={() => onToggle(thread.id, !thread.resolved)} className="rounded-md border border-ink-soft/40 px-3 py-1 text-sm">
        {thread.resolved ? 'Reopen' : 'Resolve'}
      </button>
    </div>
  );
}
