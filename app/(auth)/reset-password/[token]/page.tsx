import type { Metadata } from 'next';
import Link from 'next/link';
import { resetPasswordAction } from '@/app/(auth)/actions';
import { getPasswordResetTokenState } from '@/db/queries/password-resets';
import { linkMessages } from '@/features/auth/account-messages';
import { NewPasswordForm } from '@/features/auth/components/new-password-form';
import { hashToken } from '@/lib/auth/tokens';

export const metadata: Metadata = { title: 'Choose a new password' };
export const dynamic = 'force-dynamic';

export default async function ResetPasswordPage({ params }: { params: Promise<{ token: string }> }) {
  const { token } = await params;
  const state = token.length <= 200 ? await getPasswordResetTokenState({ tokenHash: hashToken(token), now: new Date() }) : 'not-found';
  if (state !== 'valid') {
    return (
      <>
        <h1 className="text-xl font-semibold">This link cannot be used</h1>
        <p role="alert" className="mt-3 text-ink">
          {linkMessages.passwordReset[state]}
        </p>
        <Link href="/forgot-password" className="mt-5 inline-block font-medium text-copper-dark underline underline-offset-4">
          Ask for a new link
        </Link>
      </>
    );
  }
  return (
    <>
      <h1 className="mb-5 text-xl font-semibold">Choose a new password</h1>
      <NewPasswordForm action={resetPasswordAction} token={token} askName={false} submitLabel="Set new password" />
    </>
  );
}
