import nodemailer from 'nodemailer';
import type { AppContext } from '../context';

/** nodemailer over SMTP: to the configured relay, or to the local fake SMTP server in development. */
export function createMailer(smtpUrl: string, from: string): AppContext['sendMail'] {
  const transport = nodemailer.createTransport(smtpUrl);
  return async ({ to, subject, text, html, headers }) => {
    await transport.sendMail({ from, to, subject, text, html, headers });
  };
}
