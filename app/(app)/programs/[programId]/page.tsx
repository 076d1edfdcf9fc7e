import type { Metadata } from 'next';
import Link from 'next/link';
import { notFound, redirect } from 'next/navigation';
import { listPlans } from '@/db/queries/plans';
import { getProgramById } from '@/db/queries/programs';
import { getCurrentMember } from '@/features/auth/guard';
import { PlansTable } from '@/features/plans/components/plans-table';
import { toPlanSummaryDto } from '@/features/plans/types';
import { canEditPlans, canReadWorkInProgress } from '@/lib/auth/permissions';

export const metadata: Metadata = { title: 'Program' };
export const dynamic = 'force-dynamic';

/** A URL id that cannot name a row is simply not found. */
const parseId = (value: string) => (/^[1-9][0-9]{0,15}$/.test(value) ? Number(value) : null);

export default async function ProgramPage({ params }: { params: Promise<{ programId: string }> }) {
  const { programId: rawId } = await params;
  const member = await getCurrentMember();
  if (!member) redirect(`/sign-in?callbackUrl=/programs/${encodeURIComponent(rawId)}`);
  const programId = parseId(rawId);
  if (programId === null) notFound();
  const program = await getProgramById({ workspaceId: member.workspaceId, programId });
  if (!program) notFound();

  const archived = program.archivedAt !== null;
  return (
    <section aria-labelledby="program-heading" className="space-y-6">
      <nav aria-label="Breadcrumb" className="text-sm text-ink-soft">
        <Link href="/programs" className="underline-offset-2 hover:underline">
          Programs
        </Link>{' '}
        / <span aria-current="page">{program.name}</span>
      </nav>
      <div>
        <h1 id="program-heading" className="text-2xl font-semibold">
          {program.name}
        </h1>
        {program.description ? <p className="mt-1 text-ink-soft">{program.description}</p> : null}
        {archived ? (
          <p role="status" className="mt-2 text-sm text-verdict-marginal">
            This program is archived: its plans are read-only. Restore it from the programs list to change them.
          </p>
        ) : null}
      </div>
      {canReadWorkInProgress(member) ? (
        <PlansTable
          programId={String(program.id)}
          initialPlans={(await listPlans({ workspaceId: member.workspaceId, programId })).map(toPlanSummaryDto)}
          canEdit={canEditPlans(member) && !archived}
        />
      ) : (
        <p className="rounded-lg border border-dashed border-ink-soft/30 p-6 text-ink-soft">
          Draft channel plans are not shared with regulators. Released revisions of this program will be listed here.
        </p>
      )}
    </section>
  );
}
