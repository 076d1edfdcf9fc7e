'use client';
import Link from 'next/link';
import { useActionState } from 'react';
import { Field, FormMessage, SubmitButton } from '@/features/ui/form-controls';
import type { FormState } from '@/lib/auth/form-state';

type FieldName = 'name' | 'password' | 'confirmPassword' | 'token';
type Action = (previous: FormState<FieldName>, formData: FormData) => Promise<FormState<FieldName>>;

/**
 * Choose a password from an e-mailed link: for an invitation (with a name field) or a reset.
 * The action is passed in by the page.
 */
export function NewPasswordForm({
  action,
  token,
  askName,
  submitLabel,
  signInEmail,
}: {
  action: Action;
  token: string;
  askName: boolean;
  submitLabel: string;
  signInEmail?: string;
}) {
  const [state, formAction, pending] = useActionState(action, { status: 'idle' } as FormState<FieldName>);
  if (state.status === 'success') {
    const href = signInEmail ? `/sign-in?email=${encodeURIComponent(signInEmail)}` : '/sign-in';
    return (
      <div className="space-y-4">
        <FormMessage tone="success">{state.message}</FormMessage>
        <Link href={href} className="inline-block font-medium text-copper-dark underline underline-offset-4">
          Go to sign-in
        </Link>
      </div>
    );
  }
  const errors = state.status === 'error' ? state.fieldErrors : {};
  return (
    <form action={formAction} className="space-y-4" noValidate>
      {state.status === 'error' && state.message ? <FormMessage tone="error">{state.message}</FormMessage> : null}
      <input type="hidden" name="token" value={token} />
      {askName ? (
        <Field
          label="Your name"
          name="name"
          autoComplete="name"
          required
          maxLength={120}
          errors={errors.name}
          defaultValue={state.status === 'error' ? state.values?.name : undefined}
        />
      ) : null}
      <Field
        label="New password"
        name="password"
        type="password"
        autoComplete="new-password"
        required
        hint="At least 10 characters."
        errors={errors.password}
      />
      <Field
        label="Repeat the password"
        name="confirmPassword"
        type="password"
        autoComplete="new-password"
        required
        errors={errors.confirmPassword}
      />
      <SubmitButton pending={pending}>{submitLabel}</SubmitButton>
    </form>
  );
}
