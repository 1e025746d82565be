/** An in-process Lariat for API tests: its own database copy, a fake SMTP server, the Express app. */
import type express from 'express';
import type pg from 'pg';
import { createApp } from '../../server/app';
import { loadConfig } from '../../server/config';
import type { AppContext } from '../../server/context';
import { connectDatabase } from '../../server/db/client';
import { startFakeSmtp, type FakeSmtp } from '../../server/mail/fake-smtp';
import { createMailer } from '../../server/mail/mailer';
import { fitQueues } from '../../server/fits/jobs';
import { queueSettings, startQueue, type JobQueue } from '../../server/queue/queue';
import { startWorkers } from '../../server/queue/workers';
import { createTestDatabase } from './databases';

export interface TestApp {
  app: express.Express;
  ctx: AppContext;
  /** ctx.queue, with what a test's in-process fit worker needs. */
  queue: JobQueue;
  mail: FakeSmtp;
  /** The app's own connection pool (4 connections), for tests that hold its connections. */
  pool: pg.Pool;
  close(): Promise<void>;
}

const byApp = new WeakMap<express.Express, TestApp>();

/** The TestApp of an Express app made by startTestApp (helpers that get only `app` read its mail through it). */
export function testAppOf(app: express.Express): TestApp {
  const found = byApp.get(app);
  if (!found) throw new Error('This Express app was not made by startTestApp');
  return found;
}

export async function startTestApp(env: Record<string, string> = {}): Promise<TestApp> {
  const database = await createTestDatabase();
  const mail = await startFakeSmtp(0);
  const config = loadConfig({
    NODE_ENV: 'test',
    DATABASE_URL: database.url,
    LARIAT_SERVE_CLIENT: '0',
    LARIAT_STATE_DIR: `.lariat/test-state/${database.name}`,
    // Test files sign up many accounts from 127.0.0.1; tests of the limits themselves pass '1'.
    LARIAT_RATE_LIMIT_FACTOR: '100',
    ...env,
  });
  // No wait limit (pg's default, 0) unless a test sets one: a loaded test machine must not turn slow
  // queries into failures.
  const handle = connectDatabase(database.url, 4, env.LARIAT_DB_CONNECT_TIMEOUT_MS ? config.LARIAT_DB_CONNECT_TIMEOUT_MS : 0);
  // The process's one queue, as server/main.ts starts it (fits tests add a worker on it: tests/api/fits/support.ts).
  const queue = await startQueue({ ...queueSettings(config, database.url), poolSize: 3 }, fitQueues(config));
  const ctx: AppContext = {
    config,
    db: handle.db,
    sendMail: createMailer(`smtp://127.0.0.1:${mail.port}`, config.LARIAT_MAIL_FROM),
    devMailbox: mail,
    queue,
  };
  await startWorkers(ctx);
  const app = createApp(ctx);
  const testApp: TestApp = {
    app,
    ctx,
    queue,
    mail,
    pool: handle.pool,
    async close() {
      // Work queued after a response (e-mails after a sign-up) finishes before the database goes.
      await new Promise((r) => setTimeout(r, 50));
      await queue.stop();
      await handle.close();
      await mail.close();
      await database.drop();
    },
  };
  byApp.set(app, testApp);
  return testApp;
}
