'use server';
/**
 * Public account actions: accepting an invitation and resetting a password by e-mailed link.
 * Nobody is signed in here; the one-time token is the authority, checked in the same transaction
 * that uses it.
 */
import { headers } from 'next/headers';
import { getServerEnv } from '@/db/env';
import { acceptInvitation } from '@/db/queries/invitations';
import { completePasswordReset, createPasswordResetToken } from '@/db/queries/password-resets';
import { getSignInCounters, recordSignInFailure } from '@/db/queries/sign-in-counters';
import { getUserByEmail } from '@/db/queries/users';
import { linkMessages, passwordResetRequestedMessage } from '@/features/auth/account-messages';
import { clientIpFromHeaders } from '@/features/auth/authorize';
import { errorFormState } from '@/features/auth/errors';
import { hashPassword } from '@/features/auth/password';
import { sendMail } from '@/features/mail/send-mail';
import { passwordResetMail } from '@/features/mail/templates';
import {
  acceptInvitationInputSchema,
  requestPasswordResetInputSchema,
  resetPasswordInputSchema,
} from '@/lib/auth/account-schemas';
import { fieldErrorsFromIssues, type FormState } from '@/lib/auth/form-state';
import {
  failureWindowMs,
  isRateLimited,
  maxResetRequestsPerAccount,
  maxResetRequestsPerIp,
  resetAccountCounterKey,
  resetIpCounterKey,
  tooManyAttemptsMessage,
} from '@/lib/auth/rate-limit';
import { createOneTimeToken, hashToken, passwordResetLifetimeMs } from '@/lib/auth/tokens';

export type AcceptInvitationField = 'name' | 'password' | 'confirmPassword' | 'token';
export type ForgotPasswordField = 'email';
export type ResetPasswordField = 'password' | 'confirmPassword' | 'token';

const text = (formData: FormData, name: string) => {
  const value = formData.get(name);
  return typeof value === 'string' ? value : undefined;
};

/** Creates the invited account from the e-mailed link: name and password. */
export async function acceptInvitationAction(
  _previous: FormState<AcceptInvitationField>,
  formData: FormData,
): Promise<FormState<AcceptInvitationField>> {
  const raw = {
    token: text(formData, 'token'),
    name: text(formData, 'name'),
    password: text(formData, 'password'),
    confirmPassword: text(formData, 'confirmPassword'),
  };
  const parsed = acceptInvitationInputSchema.safeParse(raw);
  if (!parsed.success) {
    return {
      status: 'error',
      fieldErrors: fieldErrorsFromIssues<AcceptInvitationField>(parsed.error.issues),
      values: { name: raw.name },
    };
  }
  try {
    const result = await acceptInvitation({
      tokenHash: hashToken(parsed.data.token),
      name: parsed.data.name,
      passwordHash: await hashPassword(parsed.data.password),
      now: new Date(),
    });
    if (result.status !== 'accepted') {
      return { status: 'error', message: linkMessages.invitation[result.status === 'already-member' ? 'used' : result.status], fieldErrors: {} };
    }
    return { status: 'success', message: `Your account for ${result.email} is ready. Sign in with your new password.` };
  } catch (error) {
    return { ...errorFormState(error), values: { name: raw.name } };
  }
}

/** Sends a reset link when the e-mail has an account; answers the same either way. */
export async function requestPasswordResetAction(
  _previous: FormState<ForgotPasswordField>,
  formData: FormData,
): Promise<FormState<ForgotPasswordField>> {
  const raw = { email: text(formData, 'email') };
  const parsed = requestPasswordResetInputSchema.safeParse(raw);
  if (!parsed.success) {
    return { status: 'error', fieldErrors: fieldErrorsFromIssues<ForgotPasswordField>(parsed.error.issues), values: raw };
  }
  try {
    // Reset e-mails are counted per address and per client in MariaDB (shared by every app
    // instance); past the limit nothing is sent, whether or not the address has an account.
    const ip = clientIpFromHeaders(Object.fromEntries((await headers()).entries()));
    const keys = [resetAccountCounterKey(parsed.data.email), resetIpCounterKey(ip)];
    const counters = await getSignInCounters({ keys });
    const now = new Date();
    const limits = [maxResetRequestsPerAccount, maxResetRequestsPerIp];
    for (const [k, key] of keys.entries()) {
      const decision = isRateLimited(counters.get(key) ?? null, limits[k], now, failureWindowMs);
      if (decision.limited) {
        return { status: 'error', message: `${tooManyAttemptsMessage(decision.retryAfterMinutes)}: no reset e-mail was sent.`, fieldErrors: {}, values: raw };
      }
    }
    await recordSignInFailure({ keys, now, windowMs: failureWindowMs });
    const user = await getUserByEmail({ email: parsed.data.email });
    if (user) {
      const { token, tokenHash } = createOneTimeToken();
      const expiresAt = new Date(Date.now() + passwordResetLifetimeMs);
      await createPasswordResetToken({ userId: user.id, tokenHash, expiresAt });
      const link = new URL(`/reset-password/${token}`, getServerEnv().APP_URL).toString();
      try {
        await sendMail(passwordResetMail({ to: user.email, link, expiresAt }));
      } catch (error) {
        // Logged, not shown: telling the visitor would reveal that the account exists.
        console.error('[auth] password-reset e-mail failed', error);
      }
    }
    return { status: 'success', message: passwordResetRequestedMessage };
  } catch (error) {
    return { ...errorFormState(error), values: raw };
  }
}

/** Sets a new password from the e-mailed link. */
export async function resetPasswordAction(
  _previous: FormState<ResetPasswordField>,
  formData: FormData,
): Promise<FormState<ResetPasswordField>> {
  const raw = {
    token: text(formData, 'token'),
    password: text(formData, 'password'),
    confirmPassword: text(formData, 'confirmPassword'),
  };
  const parsed = resetPasswordInputSchema.safeParse(raw);
  if (!parsed.success) {
    return { status: 'error', fieldErrors: fieldErrorsFromIssues<ResetPasswordField>(parsed.error.issues) };
  }
  try {
    const result = await completePasswordReset({
      tokenHash: hashToken(parsed.data.token),
      passwordHash: await hashPassword(parsed.data.password),
      now: new Date(),
    });
    if (result.status !== 'reset') {
      return { status: 'error', message: linkMessages.passwordReset[result.status], fieldErrors: {} };
    }
    return { status: 'success', message: `The password for ${result.email} is changed. Sign in with the new one.` };
  } catch (error) {
    return errorFormState(error);
  }
}
