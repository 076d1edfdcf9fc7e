import type { Metadata } from 'next';
import { redirect } from 'next/navigation';
import { getCurrentMember } from '@/features/auth/guard';
import { SignInForm } from '@/features/auth/components/sign-in-form';

export const metadata: Metadata = { title: 'Sign in' };
export const dynamic = 'force-dynamic';

const first = (value: string | string[] | undefined) => (Array.isArray(value) ? value[0] : value);

export default async function SignInPage({ searchParams }: { searchParams: Promise<Record<string, string | string[] | undefined>> }) {
  const params = await searchParams;
  const callbackUrl = first(params.callbackUrl);
  if (await getCurrentMember()) redirect(callbackUrl?.startsWith('/') && !callbackUrl.startsWith('//') ? callbackUrl : '/programs');
  return (
    <>
      <h1 className="text-xl font-semibold">Sign in</h1>
      <p className="mt-1 mb-5 text-sm text-ink-soft">With the e-mail address your workspace invited.</p>
      <SignInForm callbackUrl={callbackUrl} defaultEmail={first(params.email)} />
    </>
  );
}
