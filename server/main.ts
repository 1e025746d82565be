/** `npm start`'s server process: the API, the built client, and (in development) a fake SMTP server. */
import { createApp } from './app';
import { loadConfig } from './config';
import type { AppContext } from './context';
import { connectDatabase } from './db/client';
import { startFakeSmtp, type CapturedMessage, type FakeSmtp } from './mail/fake-smtp';
import { createMailer } from './mail/mailer';
import { queueSettings, startQueue } from './queue/queue';
import { startWorkers } from './queue/workers';
import { productionDatabaseProblems } from './security/production-checks';
import { DEMO_ACCOUNT } from './seed/demo-account';
import { outboxEnabled } from './dev/outbox';
import { fitQueues } from './fits/jobs';

const config = loadConfig();
const database = connectDatabase(config.DATABASE_URL, 10, config.LARIAT_DB_CONNECT_TIMEOUT_MS);
const problems = await productionDatabaseProblems(config, database.db);
if (problems.length > 0) {
  await database.close();
  throw new Error(`Refusing to start in production: ${problems.join('; ')}`);
}

let devMailbox: FakeSmtp | undefined;
let smtpUrl = config.LARIAT_SMTP_URL;
if (!smtpUrl) {
  if (config.NODE_ENV === 'production') throw new Error('LARIAT_SMTP_URL is required in production');
  // In development the person running the server sees each captured e-mail's links in this terminal
  // (they own the database anyway); nobody else does unless LARIAT_DEV_OUTBOX=1 (decision 6).
  const announce =
    config.NODE_ENV === 'development'
      ? (m: CapturedMessage) => console.log(`[lariat] e-mail to ${m.to.join(', ')}: ${m.subject}\n${(m.text.match(/https?:\/\/\S+/g) ?? []).map((l) => `  ${l}`).join('\n')}`)
      : undefined;
  devMailbox = await startFakeSmtp(config.LARIAT_FAKE_SMTP_PORT, '127.0.0.1', config.NODE_ENV === 'test' ? config.LARIAT_FAKE_SMTP_LOG : undefined, announce);
  smtpUrl = `smtp://127.0.0.1:${devMailbox.port}`;
}

// One queue for every feature. The API only sends fit jobs (`npm run worker` processes run them) and
// works the queues of startWorkers (e-mails).
const queue = await startQueue(queueSettings(config), fitQueues(config));
const ctx: AppContext = { config, db: database.db, sendMail: createMailer(smtpUrl, config.LARIAT_MAIL_FROM), devMailbox, queue };
await startWorkers(ctx);
const app = createApp(ctx);
const server = app.listen(config.LARIAT_PORT, config.LARIAT_HOST, () => {
  const lines = [
    '',
    `  Lariat is running at ${config.publicUrl}`,
    config.NODE_ENV !== 'production' ? `  Demo sign-in: ${DEMO_ACCOUNT.email} / ${DEMO_ACCOUNT.password}` : '',
    devMailbox
      ? `  Outgoing e-mail is captured by a local fake SMTP server on port ${devMailbox.port}` +
        (config.NODE_ENV === 'development' ? '; its links are printed here' : '') +
        (outboxEnabled(config) ? ' (each person sees their own under Outbox)' : ' (LARIAT_DEV_OUTBOX=1 shows it under Outbox)')
      : '',
    '  Press Ctrl-C to stop.',
    '',
  ];
  console.log(lines.filter((l) => l !== '').join('\n'));
});

async function shutdown(): Promise<void> {
  server.close();
  await queue.stop();
  await devMailbox?.close();
  await database.close();
  process.exit(0);
}
process.on('SIGINT', () => void shutdown());
process.on('SIGTERM', () => void shutdown());
