import { MemberRoleForm } from '@/features/members/components/member-role-form';
import type { FormState } from '@/lib/auth/form-state';
import { roleLabels, type Role } from '@/lib/auth/roles';

export interface MemberRow {
  membershipId: number;
  name: string;
  email: string;
  role: Role;
  joinedAt: string;
}

type Action = (previous: FormState<'membershipId' | 'role'>, formData: FormData) => Promise<FormState<'membershipId' | 'role'>>;

export function MembersTable({ members, changeRoleAction }: { members: MemberRow[]; changeRoleAction: Action }) {
  return (
    <table className="w-full border-collapse text-left text-sm">
      <caption className="sr-only">Members of the workspace and their roles</caption>
      <thead>
        <tr className="border-b border-ink-soft/30 text-ink-soft">
          <th scope="col" className="py-2 pr-4 font-medium">Name</th>
          <th scope="col" className="py-2 pr-4 font-medium">E-mail</th>
          <th scope="col" className="py-2 pr-4 font-medium">Role</th>
          <th scope="col" className="py-2 font-medium">Change role</th>
        </tr>
      </thead>
      <tbody>
        {members.map((member) => (
          <tr key={member.membershipId} className="border-b border-ink-soft/10 align-top">
            <td className="py-2 pr-4 font-medium">{member.name}</td>
            <td className="py-2 pr-4">{member.email}</td>
            <td className="py-2 pr-4">{roleLabels[member.role]}</td>
            <td className="py-2">
              <MemberRoleForm
                action={changeRoleAction}
                membershipId={member.membershipId}
                role={member.role}
                memberName={member.name}
              />
            </td>
          </tr>
        ))}
      </tbody>
    </table>
  );
}
