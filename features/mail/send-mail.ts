import 'server-only';
import nodemailer, { type Transporter } from 'nodemailer';
import { getServerEnv } from '@/db/env';

export interface OutgoingMail {
  to: string;
  subject: string;
  text: string;
  html: string;
}

const globalForMail = globalThis as unknown as { channelsmithMailer?: Transporter };

function getTransport(): Transporter {
  if (!globalForMail.channelsmithMailer) {
    const env = getServerEnv();
    // The local fake SMTP server speaks plain SMTP; a hosted service would add TLS and credentials here.
    globalForMail.channelsmithMailer = nodemailer.createTransport({
      host: env.SMTP_HOST,
      port: env.SMTP_PORT,
      secure: false,
      ignoreTLS: true,
    });
  }
  return globalForMail.channelsmithMailer;
}

/** Sends one message through the configured SMTP server; rejects when the server refuses it. */
export async function sendMail(mail: OutgoingMail): Promise<void> {
  await getTransport().sendMail({ from: getServerEnv().MAIL_FROM, ...mail });
}
