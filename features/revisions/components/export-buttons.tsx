'use client';

import { useState } from 'react';

type Status = { kind: 'idle' } | { kind: 'working'; format: string; startedAt: number } | { kind: 'done'; text: string } | { kind: 'error'; text: string };

/**
 * Downloads the design rationale as PDF or JSON. A PDF takes several seconds to lay out on the
 * server, so while the single request runs the button shows a spinner and a status line.
 */
export function ExportButtons({ revisionId, label }: { revisionId: string; label: string }) {
  const [status, setStatus] = useState<Status>({ kind: 'idle' });

  async function download(format: 'pdf' | 'json') {
    setStatus({ kind: 'working', format, startedAt: Date.now() });
    try {
      const response = await fetch(`/api/revisions/${revisionId}/export?format=${format}`);
      if (!response.ok) {
        const body = (await response.json().catch(() => null)) as { error?: { message?: string } } | null;
        setStatus({ kind: 'error', text: body?.error?.message ?? `The export failed (${response.status}).` });
        return;
      }
      const blob = await response.blob();
      const disposition = response.headers.get('content-disposition') ?? '';
      const name = /filename="([^"]+)"/.exec(disposition)?.[1] ?? `revision-${label}.${format}`;
      const url = URL.createObjectURL(blob);
      const link = document.createElement('a');
      link.href = url;
      link.download = name;
      document.body.appendChild(link);
      link.click();
      link.remove();
      URL.revokeObjectURL(url);
      setStatus({ kind: 'done', text: `${name} downloaded.` });
    } catch {
      setStatus({ kind: 'error', text: 'The server could not be reached.' });
    }
  }

  const working = status.kind === 'working';
  return (
    <div className="space-y-2" aria-label="Export">
      <div className="flex flex-wrap gap-2">
        <button type="button" onClick={() => download('pdf')} disabled={working} className="rounded-md border border-copper-dark px-3 py-1.5 text-copper-dark disabled:opacity-60">
          Download PDF rationale
        </button>
        <button type="button" onClick={() => download('json')} disabled={working} className="rounded-md border border-copper-dark px-3 py-1.5 text-copper-dark disabled:opacity-60">
          Download JSON
        </button>
      </div>
      <p role="status" aria-live="polite" className="flex items-center gap-2 text-sm text-ink-soft">
        {working ? (
          <>
            <span aria-hidden className="inline-block h-4 w-4 animate-spin rounded-full border-2 border-copper border-t-transparent" />
            Preparing the {status.format.toUpperCase()} on the server (laying out every result and plot; a PDF takes several seconds)…
          </>
        ) : status.kind === 'done' || status.kind === 'error' ? (
          <span className={status.kind === 'error' ? 'text-verdict-fails' : ''}>{status.text}</span>
        ) : null}
      </p>
    </div>
  );
}
