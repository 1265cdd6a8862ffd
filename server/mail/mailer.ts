import nodemailer from 'nodemailer';
import type { Logger } from 'pino';

export type OutgoingMail = { to: string; subject: string; text: string; html?: string };
export type Mailer = { send(mail: OutgoingMail): Promise<void>; close(): void };

/** Sends through any SMTP server named by a URL (the local capture by default). */
export function createMailer(smtpUrl: string, from: string, log: Logger): Mailer {
  const u = new URL(smtpUrl);
  const transport = nodemailer.createTransport({
    host: u.hostname,
    port: Number(u.port || (u.protocol === 'smtps:' ? 465 : 25)),
    secure: u.protocol === 'smtps:',
    // The local capture speaks plain SMTP; real servers upgrade with STARTTLS.
    ignoreTLS: u.hostname === '127.0.0.1' || u.hostname === 'localhost',
    auth: u.username ? { user: decodeURIComponent(u.username), pass: decodeURIComponent(u.password) } : undefined,
    pool: true,
  });
  return {
    async send(mail) {
      await transport.sendMail({ from, ...mail });
      log.info({ to: mail.to, subject: mail.subject }, 'mail sent');
    },
    close: () => transport.close(),
  };
}
