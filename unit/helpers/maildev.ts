/**
 * Reads the fake SMTP server's inbox through maildev's REST API (GET /email, DELETE /email/all).
 */
export interface ReceivedMail {
  id: string;
  subject: string;
  text: string;
  html: string;
  to: Array<{ address: string; name?: string }>;
}

const inboxUrl = () => process.env.MAIL_WEB_URL ?? 'http://127.0.0.1:1081';

export async function clearInbox(): Promise<void> {
  const response = await fetch(`${inboxUrl()}/email/all`, { method: 'DELETE' });
  if (!response.ok) throw new Error(`maildev refused to clear the inbox: HTTP ${response.status}`);
}

export async function listInbox(): Promise<ReceivedMail[]> {
  const response = await fetch(`${inboxUrl()}/email`);
  if (!response.ok) throw new Error(`maildev inbox unreadable: HTTP ${response.status}`);
  return (await response.json()) as ReceivedMail[];
}

/** Waits (up to `timeoutMs`) for a message to `address`, newest first. */
export async function waitForMail(address: string, timeoutMs = 5000): Promise<ReceivedMail> {
  const deadline = Date.now() + timeoutMs;
  for (;;) {
    const mail = (await listInbox()).reverse().find((m) => m.to.some((to) => to.address.toLowerCase() === address.toLowerCase()));
    if (mail) return mail;
    if (Date.now() > deadline) throw new Error(`no e-mail to ${address} arrived within ${timeoutMs} ms`);
    await new Promise((resolve) => setTimeout(resolve, 100));
  }
}

/** The first link in the message's text that starts with `prefix`. */
export function linkFrom(mail: ReceivedMail, prefix: string): string {
  const match = mail.text.match(new RegExp(`${prefix.replace(/[.*+?^${}()|[\]\\]/g, '\\$&')}\\S+`));
  if (!match) throw new Error(`no link starting with ${prefix} in e-mail "${mail.subject}"`);
  return match[0];
}
