import nodemailer from 'nodemailer';
import type { Config } from '../lib/config';

export type OutgoingMail = { to: string[]; subject: string; text: string };

let transport: ReturnType<typeof nodemailer.createTransport> | null = null;
let from = 'Coppice <coppice@localhost>';

export function configureMailer(config: Config): void {
  from = config.mail.from;
  transport = config.mail.smtpUrl
    ? nodemailer.createTransport(config.mail.smtpUrl)
    : nodemailer.createTransport({
        host: '127.0.0.1',
        port: config.mail.sinkPort ?? 8025,
        secure: false,
        ignoreTLS: true,
        connectionTimeout: 5000,
        greetingTimeout: 5000,
      });
}

/** Sends one e-mail now. Callers go through the mail job (jobs/mail.job.ts) so failures are retried. */
export async function deliverMail(mail: OutgoingMail): Promise<void> {
  if (!transport) throw new Error('The mailer is not configured');
  await transport.sendMail({ from, to: mail.to, subject: mail.subject, text: mail.text });
}
