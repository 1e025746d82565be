import type { Config } from './config';
import type { Database } from './db/client';
import type { FitJobSender } from './fits/jobs';
import type { FakeSmtp } from './mail/fake-smtp';

/** What every route and service gets: configuration and the database. Areas add their pieces. */
export interface AppContext {
  config: Config;
  db: Database;
  /** Sends an e-mail through SMTP (nodemailer); set up by server/mail. */
  sendMail: (message: { to: string; subject: string; text: string; html?: string }) => Promise<void>;
  /** The local fake SMTP server's captured messages (development and test only). */
  devMailbox?: FakeSmtp;
  /** Sends fit jobs to the queue (server/queue/boss.ts); absent when no queue was started. */
  fitJobs?: FitJobSender;
}
