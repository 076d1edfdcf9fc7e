import { notFound, redirect } from 'next/navigation';
import { getRevisionById } from '@/db/queries/revisions';
import { getCurrentMember } from '@/features/auth/guard';

export const dynamic = 'force-dynamic';

/** The link in a review e-mail: signs the reader in if needed, then opens the revision's page. */
export default async function ReviewLinkPage({ params }: { params: Promise<{ revisionId: string }> }) {
  const { revisionId: raw } = await params;
  const member = await getCurrentMember();
  if (!member) redirect(`/sign-in?callbackUrl=${encodeURIComponent(`/review/${raw}`)}`);
  if (!/^[1-9][0-9]{0,15}$/.test(raw)) notFound();
  const revision = await getRevisionById({ workspaceId: member.workspaceId, revisionId: Number(raw) });
  if (!revision) notFound();
  redirect(`/programs/${revision.programId}/plans/${revision.planId}/revisions/${revision.id}`);
}
