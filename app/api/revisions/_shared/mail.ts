import 'server-only';
import { getServerEnv } from '@/db/env';
import { sendMail } from '@/features/mail/send-mail';
import type { ReviewMail } from '@/features/reviews/review-mail';

/** The application's public address (for links in e-mails). */
export function appUrl(): string {
  return getServerEnv().APP_URL;
}

/**
 * Sends the review e-mails after the change has been committed. A refused message does not undo
 * the change (it is recorded); the addresses that could not be reached are returned for the response.
 */
export async function sendReviewMails(mails: ReviewMail[]): Promise<string[]> {
  const failed: string[] = [];
  for (const mail of mails) {
    try {
      await sendMail(mail);
    } catch (error) {
      console.error('[channelsmith] review e-mail not sent', mail.to, error);
      failed.push(mail.to);
    }
  }
  return failed;
}
