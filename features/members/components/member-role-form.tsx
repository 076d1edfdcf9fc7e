'use client';
import { useActionState } from 'react';
import type { FormState } from '@/lib/auth/form-state';
import { roleLabels, roles, type Role } from '@/lib/auth/roles';

type FieldName = 'membershipId' | 'role';
type Action = (previous: FormState<FieldName>, formData: FormData) => Promise<FormState<FieldName>>;

/** One member's role with a control to change it. */
export function MemberRoleForm({
  action,
  membershipId,
  role,
  memberName,
}: {
  action: Action;
  membershipId: number;
  role: Role;
  memberName: string;
}) {
  const [state, formAction, pending] = useActionState(action, { status: 'idle' } as FormState<FieldName>);
  const id = `role-${membershipId}`;
  const message =
    state.status === 'error' ? (state.fieldErrors.role?.[0] ?? state.message) : state.status === 'success' ? state.message : null;
  return (
    <form action={formAction} className="flex flex-wrap items-center gap-2">
      <input type="hidden" name="membershipId" value={membershipId} />
      <label htmlFor={id} className="sr-only">
        Role of {memberName}
      </label>
      <select
        id={id}
        name="role"
        defaultValue={role}
        key={role}
        className="rounded-md border border-ink-soft/40 bg-white px-2 py-1 text-sm"
      >
        {roles.map((option) => (
          <option key={option} value={option}>
            {roleLabels[option]}
          </option>
        ))}
      </select>
      <button
        type="submit"
        disabled={pending}
        className="rounded-md border border-copper-dark px-2 py-1 text-sm text-copper-dark hover:bg-copper-light disabled:opacity-60"
        aria-label={`Change role of ${memberName}`}
      >
        Change
      </button>
      {message ? (
        <span role={state.status === 'error' ? 'alert' : 'status'} className={`text-sm ${state.status === 'error' ? 'text-verdict-fails' : 'text-verdict-meets'}`}>
          {message}
        </span>
      ) : null}
    </form>
  );
}
