'use client';
import { useActionState } from 'react';
import { Field, FormMessage, SelectField, SubmitButton } from '@/features/ui/form-controls';
import type { FormState } from '@/lib/auth/form-state';
import { roleLabels, roles } from '@/lib/auth/roles';

type FieldName = 'email' | 'role';
type Action = (previous: FormState<FieldName>, formData: FormData) => Promise<FormState<FieldName>>;

export function InviteMemberForm({ action }: { action: Action }) {
  const [state, formAction, pending] = useActionState(action, { status: 'idle' } as FormState<FieldName>);
  const errors = state.status === 'error' ? state.fieldErrors : {};
  const values = state.status === 'error' ? state.values : undefined;
  return (
    <form action={formAction} className="space-y-4" noValidate aria-labelledby="invite-heading">
      <h2 id="invite-heading" className="text-lg font-semibold">
        Invite a member
      </h2>
      {state.status === 'success' ? <FormMessage tone="success">{state.message}</FormMessage> : null}
      {state.status === 'error' && state.message ? <FormMessage tone="error">{state.message}</FormMessage> : null}
      <div className="grid gap-4 sm:grid-cols-[1fr_12rem]">
        <Field
          key={`email-${state.status}`}
          label="E-mail"
          name="email"
          type="email"
          required
          maxLength={254}
          errors={errors.email}
          defaultValue={values?.email}
        />
        <SelectField
          key={`role-${state.status}`}
          label="Role"
          name="role"
          errors={errors.role}
          defaultValue={values?.role ?? 'engineer'}
        >
          {roles.map((role) => (
            <option key={role} value={role}>
              {roleLabels[role]}
            </option>
          ))}
        </SelectField>
      </div>
      <SubmitButton pending={pending}>Send invitation</SubmitButton>
    </form>
  );
}
