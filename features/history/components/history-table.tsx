import type { HistoryEntry } from '@/features/history/history-entry';

const when = (iso: string) => iso.replace('T', ' ').slice(0, 19) + ' UTC';

/** The audit trail as a table: when, who, what, before → after. */
export function HistoryTable({ entries, caption }: { entries: HistoryEntry[]; caption: string }) {
  if (entries.length === 0) return <p className="text-sm text-ink-soft">No recorded events.</p>;
  return (
    <table className="w-full border-collapse text-sm">
      <caption className="mb-2 text-left font-semibold">{caption}</caption>
      <thead>
        <tr className="border-b border-ink-soft/30 text-left">
          <th scope="col" className="py-1 pr-3">When</th>
          <th scope="col" className="py-1 pr-3">Who</th>
          <th scope="col" className="py-1 pr-3">What</th>
          <th scope="col" className="py-1">Before → after</th>
        </tr>
      </thead>
      <tbody>
        {entries.map((entry) => (
          <tr key={entry.id} className="border-b border-ink-soft/10 align-top">
            <td className="whitespace-nowrap py-1 pr-3 text-ink-soft">{when(entry.at)}</td>
            <td className="py-1 pr-3">{entry.actorName}</td>
            <td className="py-1 pr-3">
              {entry.actionLabel}
              <span className="block text-xs text-ink-soft">
                {entry.entityType} {entry.entityId}
              </span>
            </td>
            <td className="py-1">
              <ul className="space-y-0.5">
                {[...entry.changes, ...entry.details].map((change) => (
                  <li key={change.path} className="break-all">
                    <code className="text-xs">{change.path}</code>: {change.before} → {change.after}
                  </li>
                ))}
                {entry.moreChanges > 0 ? <li className="text-xs text-ink-soft">… and {entry.moreChanges} more changes</li> : null}
              </ul>
            </td>
          </tr>
        ))}
      </tbody>
    </table>
  );
}
