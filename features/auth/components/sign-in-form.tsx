'use client';
import { signIn } from 'next-auth/react';
import Link from 'next/link';
import { useState, type FormEvent } from 'react';
import { Field, FormMessage, SubmitButton } from '@/features/ui/form-controls';

/** Only same-site paths are followed after sign-in (no open redirect). */
function safeCallback(callbackUrl: string | undefined): string {
  return callbackUrl && callbackUrl.startsWith('/') && !callbackUrl.startsWith('//') ? callbackUrl : '/programs';
}

export function SignInForm({
  callbackUrl,
  defaultEmail,
  notice,
}: {
  callbackUrl?: string;
  defaultEmail?: string;
  notice?: string;
}) {
  const [error, setError] = useState<string | null>(null);
  const [pending, setPending] = useState(false);

  // The form has method="post": a submit before the scripts load must never put the password in the URL.
  async function onSubmit(event: FormEvent<HTMLFormElement>) {
    event.preventDefault();
    const data = new FormData(event.currentTarget);
    setPending(true);
    setError(null);
    const result = await signIn('credentials', {
      email: String(data.get('email') ?? ''),
      password: String(data.get('password') ?? ''),
      redirect: false,
    });
    setPending(false);
    if (!result || result.error) {
      // The server's own words: wrong credentials (one message for both cases) or the rate limit.
      setError(result?.error && result.error !== 'CredentialsSignin' ? result.error : 'E-mail or password is incorrect');
      return;
    }
    // A full navigation, so the next page is rendered with the new session cookie from the start.
    window.location.assign(safeCallback(callbackUrl));
  }

  return (
    <form onSubmit={onSubmit} method="post" className="space-y-4" noValidate>
      {notice ? <FormMessage tone="success">{notice}</FormMessage> : null}
      {error ? <FormMessage tone="error">{error}</FormMessage> : null}
      <Field label="E-mail" name="email" type="email" autoComplete="email" required defaultValue={defaultEmail} maxLength={254} />
      <Field label="Password" name="password" type="password" autoComplete="current-password" required />
      <div className="flex items-center justify-between">
        <SubmitButton pending={pending}>Sign in</SubmitButton>
        <Link href="/forgot-password" className="text-sm text-copper-dark underline underline-offset-4">
          Forgot your password?
        </Link>
      </div>
    </form>
  );
}
