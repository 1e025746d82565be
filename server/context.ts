import type { Config } from './config';
import type { Database } from './db/client';
import type { FitJobSender } from './fits/jobs';
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
  /** The job queue (server/queue), shared by every feature. */
  queue: Queue;
  /** The local fake SMTP server's captured messages (development and test only). */
  devMailbox?: FakeSmtp;
  /** Sends fit jobs to the queue (server/queue/boss.ts); absent when no queue was started. */
  fitJobs?: FitJobSender;
}
