import type { Metadata } from 'next';
import { redirect } from 'next/navigation';
import { changeMemberRoleAction, inviteMemberAction } from '@/app/(app)/members/actions';
import { listWorkspaceMembers } from '@/db/queries/memberships';
import { getCurrentMember } from '@/features/auth/guard';
import { InviteMemberForm } from '@/features/members/components/invite-member-form';
import { MembersTable } from '@/features/members/components/members-table';
import { canManageMembers } from '@/lib/auth/permissions';

export const metadata: Metadata = { title: 'Members' };
export const dynamic = 'force-dynamic';

export default async function MembersPage() {
  const member = await getCurrentMember();
  if (!member) redirect('/sign-in?callbackUrl=/members');
  if (!canManageMembers(member)) {
    return (
      <section aria-labelledby="members-heading">
        <h1 id="members-heading" className="text-2xl font-semibold">Members</h1>
        <p role="alert" className="mt-3 text-ink">
          Only admins can manage members. Ask an admin of {member.workspaceName} if you need a change.
        </p>
      </section>
    );
  }
  const members = await listWorkspaceMembers({ workspaceId: member.workspaceId });
  return (
    <section aria-labelledby="members-heading" className="space-y-8">
      <div>
        <h1 id="members-heading" className="text-2xl font-semibold">Members</h1>
        <p className="mt-1 text-ink-soft">
          {members.length} {members.length === 1 ? 'member' : 'members'} of {member.workspaceName}.
        </p>
      </div>
      <MembersTable
        members={members.map((row) => ({ ...row, joinedAt: row.joinedAt.toISOString() }))}
        changeRoleAction={changeMemberRoleAction}
      />
      <div className="max-w-xl rounded-lg border border-ink-soft/20 bg-white p-6">
        <InviteMemberForm action={inviteMemberAction} />
      </div>
    </section>
  );
}
