'use client';
import { useActionState } from 'react';
import { Field, FormMessage, SubmitButton } from '@/features/ui/form-controls';
import type { FormState } from '@/lib/auth/form-state';

type Action = (previous: FormState<'email'>, formData: FormData) => Promise<FormState<'email'>>;

export function ForgotPasswordForm({ action }: { action: Action }) {
  const [state, formAction, pending] = useActionState(action, { status: 'idle' } as FormState<'email'>);
  if (state.status === 'success') return <FormMessage tone="success">{state.message}</FormMessage>;
  const errors = state.status === 'error' ? state.fieldErrors : {};
  return (
    <form action={formAction} className="space-y-4" noValidate>
      {state.status === 'error' && state.message ? <FormMessage tone="error">{state.message}</FormMessage> : null}
      <Field
        label="E-mail"
        name="email"
        type="email"
        autoComplete="email"
        required
        errors={errors.email}
        defaultValue={state.status === 'error' ? state.values?.email : undefined}
      />
      <SubmitButton pending={pending}>Send reset link</SubmitButton>
    </form>
  );
}
