import type { Metadata } from 'next';
import Link from 'next/link';
import { acceptInvitationAction } from '@/app/(auth)/actions';
import { getInvitationByTokenHash } from '@/db/queries/invitations';
import { linkMessages } from '@/features/auth/account-messages';
import { NewPasswordForm } from '@/features/auth/components/new-password-form';
import { roleLabels } from '@/lib/auth/roles';
import { hashToken } from '@/lib/auth/tokens';

export const metadata: Metadata = { title: 'Accept invitation' };
export const dynamic = 'force-dynamic';

export default async function InvitationPage({ params }: { params: Promise<{ token: string }> }) {
  const { token } = await params;
  const invitation = token.length <= 200 ? await getInvitationByTokenHash({ tokenHash: hashToken(token) }) : null;
  const problem = !invitation
    ? linkMessages.invitation['not-found']
    : invitation.usedAt
      ? linkMessages.invitation.used
      : invitation.expiresAt.getTime() <= Date.now()
        ? linkMessages.invitation.expired
        : invitation.accountExists
          ? linkMessages.invitation['account-exists']
          : null;
  if (!invitation || problem) {
    return (
      <>
        <h1 className="text-xl font-semibold">This invitation cannot be used</h1>
        <p role="alert" className="mt-3 text-ink">
          {problem}
        </p>
        <Link href="/sign-in" className="mt-5 inline-block font-medium text-copper-dark underline underline-offset-4">
          Go to sign-in
        </Link>
      </>
    );
  }
  return (
    <>
      <h1 className="text-xl font-semibold">Join {invitation.workspaceName}</h1>
      <p className="mt-1 mb-5 text-sm text-ink-soft">
        You are invited as {roleLabels[invitation.role]} with the address <strong>{invitation.email}</strong>. Choose your
        name and a password.
      </p>
      <NewPasswordForm
        action={acceptInvitationAction}
        token={token}
        askName
        submitLabel="Create my account"
        signInEmail={invitation.email}
      />
    </>
  );
}
