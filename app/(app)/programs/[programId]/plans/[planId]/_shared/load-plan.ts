import 'server-only';
import { notFound, redirect } from 'next/navigation';
import { getPlanById } from '@/db/queries/plans';
import { getCurrentMember } from '@/features/auth/guard';

const parseId = (value: string) => (/^[1-9][0-9]{0,15}$/.test(value) ? Number(value) : null);

/** The signed-in member and the plan of the URL (scoped by workspace), or a redirect / not-found. */
export async function loadPlanPage(raw: { programId: string; planId: string }, returnPath: string) {
  const member = await getCurrentMember();
  if (!member) redirect(`/sign-in?callbackUrl=${encodeURIComponent(returnPath)}`);
  const programId = parseId(raw.programId);
  const planId = parseId(raw.planId);
  if (programId === null || planId === null) notFound();
  const plan = await getPlanById({ workspaceId: member.workspaceId, planId });
  if (!plan || plan.programId !== programId) notFound();
  return { member, plan, programId, planId };
}

export { parseId };
