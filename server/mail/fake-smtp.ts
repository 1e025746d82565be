/**
 * A local stand-in for a hosted mail relay: a real SMTP server on loopback (smtp-server) that keeps
 * every message it receives in memory, newest last. Development and tests only.
 */
import fs from 'node:fs';
import type { AddressInfo } from 'node:net';
import { simpleParser } from 'mailparser';
import { SMTPServer } from 'smtp-server';

export interface CapturedMessage {
  id: number;
  from: string;
  to: string[];
  subject: string;
  text: string;
  html: string | null;
  /** The workspace an invitation e-mail is about (the X-Lariat-Workspace header), else null. */
  workspaceId: string | null;
  receivedAt: string;
}

export interface FakeSmtp {
  port: number;
  messages: CapturedMessage[];
  /** Resolves with the first message to `to` matching `subject` (waits up to `timeoutMs`). */
  waitFor(to: string, subject?: RegExp, timeoutMs?: number): Promise<CapturedMessage>;
  close(): Promise<void>;
}

const MAX_KEPT = 500;
/** Set by invitation e-mails (server/accounts/mail.ts) so the outbox can show them to the workspace's admins. */
export const WORKSPACE_HEADER = 'x-lariat-workspace';

function headerText(value: unknown): string | null {
  return typeof value === 'string' && value !== '' ? value : null;
}

/**
 * `logFile` (browser tests only): each captured message is also appended there as one JSON line, so
 * a test can follow a link mailed to someone who cannot sign in yet (a sign-up's own link).
 */
export async function startFakeSmtp(port = 0, host = '127.0.0.1', logFile?: string, announce?: (message: CapturedMessage) => void): Promise<FakeSmtp> {
  const messages: CapturedMessage[] = [];
  let nextId = 1;
  const server = new SMTPServer({
    authOptional: true,
    disabledCommands: ['STARTTLS'],
    logger: false,
    onData(stream, session, callback) {
      simpleParser(stream)
        .then((mail) => {
          messages.push({
            id: nextId++,
            from: session.envelope.mailFrom ? session.envelope.mailFrom.address : '',
            to: session.envelope.rcptTo.map((r) => r.address.toLowerCase()),
            subject: mail.subject ?? '',
            text: mail.text ?? '',
            html: typeof mail.html === 'string' ? mail.html : null,
            workspaceId: headerText(mail.headers.get(WORKSPACE_HEADER)),
            receivedAt: new Date().toISOString(),
          });
          if (messages.length > MAX_KEPT) messages.shift();
          if (logFile) fs.appendFileSync(logFile, `${JSON.stringify(messages[messages.length - 1])}\n`);
          announce?.(messages[messages.length - 1]);
          callback();
        })
        .catch((err: Error) => callback(err));
    },
  });
  await new Promise<void>((resolve, reject) => {
    server.once('error', reject);
    server.listen(port, host, () => resolve());
  });
  const actualPort = (server.server.address() as AddressInfo).port;

  async function waitFor(to: string, subject?: RegExp, timeoutMs = 10_000): Promise<CapturedMessage> {
    const deadline = Date.now() + timeoutMs;
    const wanted = to.toLowerCase();
    for (;;) {
      const found = messages.find((m) => m.to.includes(wanted) && (!subject || subject.test(m.subject)));
      if (found) return found;
      if (Date.now() > deadline) throw new Error(`No e-mail to ${to}${subject ? ` matching ${subject}` : ''} within ${timeoutMs} ms`);
      await new Promise((r) => setTimeout(r, 50));
    }
  }

  return {
    port: actualPort,
    messages,
    waitFor,
    close: () => new Promise<void>((resolve) => server.close(() => resolve())),
  };
}
