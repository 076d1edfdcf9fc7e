import type { Metadata } from 'next';
import { redirect } from 'next/navigation';
import { listLibraryParts } from '@/db/queries/parts';
import { getCurrentMember } from '@/features/auth/guard';
import { PartsLibrary } from '@/features/parts/components/parts-library';
import { toLibraryPartDto } from '@/features/parts/types';
import { canEditParts, canReadWorkInProgress } from '@/lib/auth/permissions';

export const metadata: Metadata = { title: 'Parts' };
export const dynamic = 'force-dynamic';

export default async function PartsPage() {
  const member = await getCurrentMember();
  if (!member) redirect('/sign-in?callbackUrl=/parts');
  const heading = (
    <div>
      <h1 id="parts-heading" className="text-2xl font-semibold">
        Parts
      </h1>
      <p className="mt-1 text-ink-soft">
        The part library of {member.workspaceName}: amplifiers, converters and electrode types with their parameters, usable in any plan.
      </p>
    </div>
  );
  if (!canReadWorkInProgress(member)) {
    return (
      <section aria-labelledby="parts-heading" className="space-y-6">
        {heading}
        <p className="rounded-lg border border-dashed border-ink-soft/30 p-6 text-ink-soft">
          The part library is work in progress and is not shared with regulators. The values each released revision used are in that revision and its
          design rationale.
        </p>
      </section>
    );
  }
  const parts = await listLibraryParts({ workspaceId: member.workspaceId });
  return (
    <section aria-labelledby="parts-heading" className="space-y-6">
      {heading}
      <PartsLibrary initialParts={parts.map(toLibraryPartDto)} canEdit={canEditParts(member)} />
    </section>
  );
}
