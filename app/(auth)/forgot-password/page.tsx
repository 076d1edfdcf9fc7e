import type { Metadata } from 'next';
import Link from 'next/link';
import { requestPasswordResetAction } from '@/app/(auth)/actions';
import { ForgotPasswordForm } from '@/features/auth/components/forgot-password-form';

export const metadata: Metadata = { title: 'Forgot password' };

export default function ForgotPasswordPage() {
  return (
    <>
      <h1 className="text-xl font-semibold">Reset your password</h1>
      <p className="mt-1 mb-5 text-sm text-ink-soft">We will e-mail you a link to choose a new one.</p>
      <ForgotPasswordForm action={requestPasswordResetAction} />
      <Link href="/sign-in" className="mt-5 inline-block text-sm text-copper-dark underline underline-offset-4">
        Back to sign-in
      </Link>
    </>
  );
}
