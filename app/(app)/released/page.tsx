import type { Metadata } from 'next';
import Link from 'next/link';
import { redirect } from 'next/navigation';
import { listWorkspaceRevisions } from '@/db/queries/revisions';
import { getCurrentMember } from '@/features/auth/guard';
import { StateBadge, VerdictText } from '@/features/revisions/components/state-badge';
import { releasedStates } from '@/features/revisions/revision-states';

export const metadata: Metadata = { title: 'Released revisions' };
export const dynamic = 'force-dynamic';

/** Every released (and superseded) revision of the workspace: the regulator's way in. */
export default async function ReleasedPage() {
  const member = await getCurrentMember();
  if (!member) redirect('/sign-in?callbackUrl=/released');
  const revisions = await listWorkspaceRevisions({ workspaceId: member.workspaceId, states: releasedStates });
  return (
    <section aria-labelledby="released-heading" className="space-y-6">
      <h1 id="released-heading" className="text-2xl font-semibold">
        Released revisions
      </h1>
      <p className="text-sm text-ink-soft">Each released revision with its review record, audit trail and design-rationale export.</p>
      {revisions.length === 0 ? (
        <p className="rounded-lg border border-dashed border-ink-soft/30 p-6 text-ink-soft">No revision has been released yet.</p>
      ) : (
        <table className="w-full text-sm">
          <thead>
            <tr className="border-b border-ink-soft/30 text-left">
              <th scope="col" className="py-1 pr-3">Program</th>
              <th scope="col" className="py-1 pr-3">Plan</th>
              <th scope="col" className="py-1 pr-3">Revision</th>
              <th scope="col" className="py-1 pr-3">State</th>
              <th scope="col" className="py-1 pr-3">Worst check</th>
              <th scope="col" className="py-1">Since</th>
            </tr>
          </thead>
          <tbody>
            {revisions.map((r) => (
              <tr key={r.id} className="border-b border-ink-soft/10">
                <td className="py-1 pr-3">{r.programName}</td>
                <td className="py-1 pr-3">{r.planName}</td>
                <td className="py-1 pr-3">
                  <Link href={`/programs/${r.programId}/plans/${r.planId}/revisions/${r.id}`} className="font-semibold text-copper-dark underline-offset-2 hover:underline">
                    Revision {r.label}
                  </Link>
                </td>
                <td className="py-1 pr-3">
                  <StateBadge state={r.state} />
                </td>
                <td className="py-1 pr-3">
                  <VerdictText verdict={r.worstVerdict} />
                </td>
                <td className="py-1 text-ink-soft">{r.stateChangedAt.toISOString().slice(0, 10)}</td>
              </tr>
            ))}
          </tbody>
        </table>
      )}
    </section>
  );
}
