import type { Config } from './config';
import type { Database } from './db/client';
import type { FakeSmtp } from './mail/fake-smtp';
import type { Queue } from './queue/queue';

export interface MailMessage {
  to: string;
  subject: string;
  text: string;
  html?: string;
  /** Extra headers, e.g. X-Lariat-Workspace on invitations (read by the development outbox). */
  headers?: Record<string, string>;
}

/** What every route and service gets: configuration and the database. Areas add their pieces. */
export interface AppContext {
  config: Config;
  db: Database;
  /** Sends an e-mail through SMTP (nodemailer); set up by server/mail. */
  sendMail: (message: MailMessage) => Promise<void>;
  /** The process's one job queue (server/queue/queue.ts), shared by every feature (fits, e-mails...). */
  queue: Queue;
  /** The local fake SMTP server's captured messages (development and test only). */
  devMailbox?: FakeSmtp;
}
