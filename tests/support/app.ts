/** An in-process Lariat for API tests: its own database copy, a fake SMTP server, the Express app. */
import type express from 'express';
import { createApp } from '../../server/app';
import { loadConfig } from '../../server/config';
import type { AppContext } from '../../server/context';
import { connectDatabase } from '../../server/db/client';
import { startFakeSmtp, type FakeSmtp } from '../../server/mail/fake-smtp';
import { createMailer } from '../../server/mail/mailer';
import { createTestDatabase } from './databases';

export interface TestApp {
  app: express.Express;
  ctx: AppContext;
  mail: FakeSmtp;
  close(): Promise<void>;
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
  const handle = connectDatabase(database.url, 4);
  const ctx: AppContext = {
    config,
    db: handle.db,
    sendMail: createMailer(`smtp://127.0.0.1:${mail.port}`, config.LARIAT_MAIL_FROM),
    devMailbox: mail,
  };
  const app = createApp(ctx);
  return {
    app,
    ctx,
    mail,
    async close() {
      await handle.close();
      await mail.close();
      await database.drop();
    },
  };
}
