/**
 * The wording of the e-mails Channelsmith sends: plain text and a simple HTML twin, each with the
 * link written out in full (some readers show text only).
 */
import type { OutgoingMail } from '@/features/mail/send-mail';

const escapeHtml = (value: string) =>
  value.replace(/[&<>"']/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c] ?? c);

function layout(paragraphs: string[], link: { href: string; label: string }): string {
  const body = paragraphs.map((p) => `<p>${escapeHtml(p)}</p>`).join('\n');
  return `<!doctype html><html><body style="font-family:system-ui,sans-serif;color:#1c2430">
${body}
<p><a href="${escapeHtml(link.href)}" style="color:#8e431f">${escapeHtml(link.label)}</a></p>
<p style="color:#4a5565;font-size:13px">${escapeHtml(link.href)}</p>
</body></html>`;
}

/** The invitation to join a workspace. */
export function invitationMail({
  to,
  workspaceName,
  inviterName,
  roleLabel,
  link,
  expiresAt,
}: {
  to: string;
  workspaceName: string;
  inviterName: string;
  roleLabel: string;
  link: string;
  expiresAt: Date;
}): OutgoingMail {
  const lines = [
    `${inviterName} invited you to join ${workspaceName} on Channelsmith as ${roleLabel}.`,
    `Open the link below to choose your name and password. It works once and expires on ${expiresAt.toUTCString()}.`,
    'If you did not expect this invitation, you can ignore this message.',
  ];
  return {
    to,
    subject: `You are invited to ${workspaceName} on Channelsmith`,
    text: `${lines.join('\n\n')}\n\n${link}\n`,
    html: layout(lines, { href: link, label: 'Accept the invitation' }),
  };
}

/** The password-reset link. */
export function passwordResetMail({ to, link, expiresAt }: { to: string; link: string; expiresAt: Date }): OutgoingMail {
  const lines = [
    'Someone asked to reset the password of your Channelsmith account.',
    `Open the link below to choose a new password. It works once and expires on ${expiresAt.toUTCString()}.`,
    'If you did not ask for this, ignore this message; your password stays as it is.',
  ];
  return {
    to,
    subject: 'Reset your Channelsmith password',
    text: `${lines.join('\n\n')}\n\n${link}\n`,
    html: layout(lines, { href: link, label: 'Choose a new password' }),
  };
}
