import type { Metadata } from 'next';
import { redirect } from 'next/navigation';
import { listPrograms } from '@/db/queries/programs';
import { getCurrentMember } from '@/features/auth/guard';
import { ProgramsList } from '@/features/programs/components/programs-list';
import { toProgramDto } from '@/features/programs/types';
import { canEditPlans } from '@/lib/auth/permissions';

export const metadata: Metadata = { title: 'Programs' };
export const dynamic = 'force-dynamic';

export default async function ProgramsPage() {
  const member = await getCurrentMember();
  if (!member) redirect('/sign-in?callbackUrl=/programs');
  const programs = await listPrograms({ workspaceId: member.workspaceId });
  return (
    <section aria-labelledby="programs-heading" className="space-y-6">
      <div>
        <h1 id="programs-heading" className="text-2xl font-semibold">
          Programs
        </h1>
        <p className="mt-1 text-ink-soft">Devices under development in {member.workspaceName}, each with its channel plans.</p>
      </div>
      <ProgramsList initialPrograms={programs.map(toProgramDto)} canEdit={canEditPlans(member)} />
    </section>
  );
}
