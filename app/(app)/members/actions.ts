'use server';
/**
 * Members' server actions (admin only). Each one: parse → session → load → role → act → respond,
 * and treats its caller like a public endpoint.
 */
import { revalidatePath } from 'next/cache';
import { getServerEnv } from '@/db/env';
import { createInvitation } from '@/db/queries/invitations';
import { changeMemberRole, isWorkspaceMemberEmail } from '@/db/queries/memberships';
import { errorFormState } from '@/features/auth/errors';
import { requirePermission } from '@/features/auth/guard';
import { sendMail } from '@/features/mail/send-mail';
import { invitationMail } from '@/features/mail/templates';
import { changeRoleInputSchema, createInvitationInputSchema } from '@/lib/auth/account-schemas';
import { fieldErrorsFromIssues, type FormState } from '@/lib/auth/form-state';
import { canManageMembers } from '@/lib/auth/permissions';
import { roleLabels } from '@/lib/auth/roles';
import { createOneTimeToken, invitationLifetimeMs } from '@/lib/auth/tokens';

export type InviteField = 'email' | 'role';
export type ChangeRoleField = 'membershipId' | 'role';

const text = (formData: FormData, name: string) => {
  const value = formData.get(name);
  return typeof value === 'string' ? value : undefined;
};

/** Invites an e-mail address into the admin's workspace with a role, by e-mailed one-time link. */
export async function inviteMemberAction(
  _previous: FormState<InviteField>,
  formData: FormData,
): Promise<FormState<InviteField>> {
  const raw = { email: text(formData, 'email'), role: text(formData, 'role') };
  const parsed = createInvitationInputSchema.safeParse(raw);
  if (!parsed.success) {
    return { status: 'error', fieldErrors: fieldErrorsFromIssues<InviteField>(parsed.error.issues), values: raw };
  }
  const { email, role } = parsed.data;
  try {
    const admin = await requirePermission(canManageMembers);
    if (await isWorkspaceMemberEmail({ workspaceId: admin.workspaceId, email })) {
      return { status: 'error', fieldErrors: { email: [`${email} is already a member of this workspace`] }, values: raw };
    }
    const { token, tokenHash } = createOneTimeToken();
    const expiresAt = new Date(Date.now() + invitationLifetimeMs);
    await createInvitation({
      workspaceId: admin.workspaceId,
      email,
      role,
      tokenHash,
      expiresAt,
      invitedByUserId: admin.userId,
    });
    const link = new URL(`/invite/${token}`, getServerEnv().APP_URL).toString();
    try {
      await sendMail(
        invitationMail({
          to: email,
          workspaceName: admin.workspaceName,
          inviterName: admin.name,
          roleLabel: roleLabels[role],
          link,
          expiresAt,
        }),
      );
    } catch (error) {
      console.error('[members] invitation e-mail failed', error);
      return {
        status: 'error',
        message: `The invitation was saved but the e-mail to ${email} could not be sent. Invite again to send a new link.`,
        fieldErrors: {},
        values: raw,
      };
    }
    return { status: 'success', message: `Invitation sent to ${email} as ${roleLabels[role]}.` };
  } catch (error) {
    return { ...errorFormState(error), values: raw };
  }
}

/** Changes a member's role; refuses to leave the workspace without an admin. */
export async function changeMemberRoleAction(
  _previous: FormState<ChangeRoleField>,
  formData: FormData,
): Promise<FormState<ChangeRoleField>> {
  const raw = { membershipId: text(formData, 'membershipId'), role: text(formData, 'role') };
  const parsed = changeRoleInputSchema.safeParse(raw);
  if (!parsed.success) {
    return { status: 'error', fieldErrors: fieldErrorsFromIssues<ChangeRoleField>(parsed.error.issues), values: raw };
  }
  try {
    const admin = await requirePermission(canManageMembers);
    const result = await changeMemberRole({
      workspaceId: admin.workspaceId,
      membershipId: parsed.data.membershipId,
      role: parsed.data.role,
      actorUserId: admin.userId,
    });
    switch (result.status) {
      case 'not-found':
        return { status: 'error', message: 'That member is not in this workspace.', fieldErrors: {} };
      case 'last-admin':
        return {
          status: 'error',
          fieldErrors: { role: ['The workspace needs at least one admin: make someone else admin first'] },
          values: raw,
        };
      case 'unchanged':
        return { status: 'success', message: `Role is already ${roleLabels[parsed.data.role]}.` };
      case 'changed':
        revalidatePath('/members');
        return { status: 'success', message: `Role changed from ${roleLabels[result.before]} to ${roleLabels[result.after]}.` };
    }
  } catch (error) {
    return { ...errorFormState(error), values: raw };
  }
}
