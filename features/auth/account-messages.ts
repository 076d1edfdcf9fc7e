/** What the account pages say about e-mailed links (shared by the pages and their actions). */

/** Messages for links that can no longer be used. */
export const linkMessages = {
  invitation: {
    'not-found': 'This invitation link is not valid. Check that you opened the whole link from the e-mail.',
    used: 'This invitation has already been used. Sign in with the e-mail address it was sent to.',
    expired: 'This invitation has expired. Ask an admin of the workspace to invite you again.',
    'account-exists': 'An account with this e-mail address already exists. Sign in, or ask an admin to check the invitation.',
  },
  passwordReset: {
    'not-found': 'This password-reset link is not valid. Ask for a new one.',
    used: 'This password-reset link has already been used. Ask for a new one if you need it.',
    expired: 'This password-reset link has expired. Ask for a new one.',
  },
} as const;

/** The confirmation shown whether or not the e-mail has an account, so the form reveals none. */
export const passwordResetRequestedMessage =
  'If an account exists for that e-mail address, we have sent it a link to choose a new password. The link is valid for 1 hour.';
