/** Steps the browser tests share: signing up and in through the real pages, and reading captured e-mail. */
import { randomBytes } from 'node:crypto';
import fs from 'node:fs';
import { inject } from 'vitest';
import type { BrowserContext, Page } from 'playwright-core';

/** Invented for the tests; long and varied enough for Lariat's password rules. */
export const PASSWORD = 'copper-kettle-river-57';

export function uniqueEmail(who: string): string {
  return `${who}-${randomBytes(4).toString('hex')}@lariat.test`;
}

export interface Account {
  name: string;
  email: string;
  password: string;
  workspaceName: string;
}

export function newAccount(who: string): Account {
  return { name: `${who[0].toUpperCase()}${who.slice(1)} Tester`, email: uniqueEmail(who), password: PASSWORD, workspaceName: `${who} workspace` };
}

/**
 * Signs up through /sign-up, follows the e-mailed link (read from the server's mail log: the new
 * person cannot read the outbox before having an account), and returns the id of the new workspace
 * from the URL it lands on.
 */
export async function signUp(page: Page, account: Account): Promise<string> {
  await page.goto('/sign-up');
  await page.getByLabel('Your name').fill(account.name);
  await page.getByLabel('E-mail').fill(account.email);
  await page.getByLabel('Password').fill(account.password);
  await page.getByLabel('Workspace name').fill(account.workspaceName);
  await page.getByRole('button', { name: 'Create workspace' }).click();
  await page.getByRole('heading', { name: 'Check your inbox' }).waitFor();
  const link = await mailedLink(account.email, '/sign-up/finish/');
  await page.goto(new URL(link).pathname);
  await page.getByRole('button', { name: 'Create my account' }).click();
  await page.waitForURL(/\/w\/[^/]+\/datasets$/);
  return workspaceIdOf(page.url());
}

/** The newest link under `linkPath` in an e-mail to `to`, from the server's mail log (waits up to 15 s). */
export async function mailedLink(to: string, linkPath: string): Promise<string> {
  const deadline = Date.now() + 15_000;
  const wanted = to.toLowerCase();
  while (Date.now() < deadline) {
    const lines = fs.existsSync(inject('mailLog')) ? fs.readFileSync(inject('mailLog'), 'utf8').split('\n').filter(Boolean) : [];
    for (const line of lines.reverse()) {
      const message = JSON.parse(line) as OutboxMessage;
      if (!message.to.includes(wanted)) continue;
      const link = message.text.match(/https?:\/\/\S+/g)?.find((u) => new URL(u).pathname.startsWith(linkPath));
      if (link) return link;
    }
    await new Promise((r) => setTimeout(r, 100));
  }
  throw new Error(`No e-mail to ${to} with a ${linkPath} link within 15 s`);
}

export async function signIn(page: Page, email: string, password: string): Promise<void> {
  await page.goto('/sign-in');
  await page.getByLabel('E-mail').fill(email);
  await page.getByLabel('Password').fill(password);
  await page.getByRole('button', { name: 'Sign in' }).click();
}

export async function signOut(page: Page): Promise<void> {
  await page.getByRole('button', { name: 'Sign out' }).click();
  await page.waitForURL(/\/sign-in/);
  // The sign-in page loads lazily: wait for its heading so later checks see the page, not the shell.
  await page.getByRole('heading', { name: 'Sign in', level: 1 }).waitFor();
}

export function workspaceIdOf(url: string): string {
  const match = /\/w\/([^/]+)/.exec(new URL(url).pathname);
  if (!match) throw new Error(`Not a workspace URL: ${url}`);
  return match[1];
}

interface OutboxMessage {
  to: string[];
  subject: string;
  text: string;
}

/**
 * Waits for an e-mail to `to` in the dev outbox, read with the cookies of `reader` (the addressee
 * signed in, or an admin of the workspace an invitation is from: nobody else sees it), and returns
 * the newest one with a link whose path starts with `linkPath`, and that link.
 */
export async function waitForEmail(reader: BrowserContext, to: string, linkPath: string): Promise<{ message: OutboxMessage; link: string }> {
  const deadline = Date.now() + 15_000;
  let last = '';
  while (Date.now() < deadline) {
    const response = await reader.request.get('/api/dev/outbox');
    last = `${response.status()} ${await response.text()}`;
    if (response.ok()) {
      const { messages } = (await response.json()) as { messages: OutboxMessage[] };
      // Newest first: the latest e-mail to `to` that has such a link (a sign-up's own mail has another).
      for (const message of messages.filter((m) => m.to.includes(to.toLowerCase()))) {
        const link = message.text.match(/https?:\/\/\S+/g)?.find((u) => new URL(u).pathname.startsWith(linkPath));
        if (link) return { message, link };
      }
    }
    await new Promise((r) => setTimeout(r, 200));
  }
  throw new Error(`No e-mail to ${to} reached the outbox within 15 s; last answer: ${last.slice(0, 500)}`);
}

/** The CSRF token from a context's cookies, for requests made outside the pages. */
export async function csrfHeader(context: BrowserContext): Promise<Record<string, string>> {
  const cookie = (await context.cookies()).find((c) => c.name === 'lariat_csrf');
  return cookie ? { 'X-Lariat-CSRF': cookie.value } : {};
}
