/**
 * Signed-in sessions for API tests.
 *
 *   const t = await startTestApp();
 *   const alice = await signUp(t.app);                       // admin of a new workspace (follows the e-mailed link)
 *   await withCsrf(alice.agent.post(`/api/workspaces/${alice.workspaceId}/...`), alice.csrf).send({...});
 *   const bob = await inviteAndJoin(t, alice, 'bob@example.test', 'viewer');
 *
 * `agent` keeps the session cookie; state-changing requests also need the CSRF header (`withCsrf`).
 */
import { randomBytes } from 'node:crypto';
import { eq } from 'drizzle-orm';
import type express from 'express';
import request from 'supertest';
import type { Test } from 'supertest';
import type TestAgent from 'supertest/lib/agent';
import type { MeDto } from '../../shared/auth';
import type { WorkspaceRole } from '../../shared/members';
import { invitations } from '../../server/db/schema/auth';
import { testAppOf, type TestApp } from './app';

export const TEST_PASSWORD = 'correct horse battery staple';

export interface Session {
  agent: TestAgent;
  userId: string;
  email: string;
  password: string;
  /** The workspace this helper signed up into or joined. */
  workspaceId: string;
  /** The X-Lariat-CSRF value for this agent. */
  csrf: string;
}

let counter = 0;
/** A fresh address per call, so tests in one file never collide. */
export function uniqueEmail(prefix = 'person'): string {
  counter += 1;
  return `${prefix}-${counter}-${randomBytes(3).toString('hex')}@example.test`;
}

/** Sets the CSRF header on a mutating request. */
export function withCsrf(test: Test, csrf: string): Test {
  return test.set('X-Lariat-CSRF', csrf);
}

function fail(what: string, res: request.Response): never {
  throw new Error(`${what} failed: HTTP ${res.status} ${JSON.stringify(res.body)}`);
}

export async function signUp(
  app: express.Express,
  opts: { email?: string; password?: string; name?: string; workspaceName?: string } = {},
): Promise<Session> {
  const agent = request.agent(app);
  const email = opts.email ?? uniqueEmail();
  const password = opts.password ?? TEST_PASSWORD;
  const body = { email, password, name: opts.name ?? 'Test Person', ...(opts.workspaceName ? { workspaceName: opts.workspaceName } : {}) };
  const testApp = testAppOf(app);
  const before = lastMailId(testApp);
  const res = await agent.post('/api/auth/sign-up').send(body);
  if (res.status !== 202) fail(`Sign-up of ${email}`, res);
  // The account exists once the e-mailed link is used (server/accounts/sign-up.ts).
  const mail = await newMail(testApp, email, /Finish creating/, before);
  const done = await agent.post('/api/auth/sign-up/complete').send({ token: tokenFromMail(mail.text, 'sign-up/finish') });
  if (done.status !== 201) fail(`Finishing the sign-up of ${email}`, done);
  const me = done.body as MeDto;
  return { agent, userId: me.user.id, email: me.user.email, password, workspaceId: me.memberships[0].workspaceId, csrf: me.csrfToken };
}

/** Signs an existing account in on a fresh agent. */
export async function signIn(app: express.Express, email: string, password = TEST_PASSWORD, workspaceId?: string): Promise<Session> {
  const agent = request.agent(app);
  const res = await agent.post('/api/auth/sign-in').send({ email, password });
  if (res.status !== 200) fail(`Sign-in of ${email}`, res);
  const me = res.body as MeDto;
  return { agent, userId: me.user.id, email: me.user.email, password, workspaceId: workspaceId ?? me.memberships[0]?.workspaceId ?? '', csrf: me.csrfToken };
}

/** Pulls the token out of a link like `${publicUrl}/invitations/<token>` in a captured e-mail. */
export function tokenFromMail(text: string, kind: 'invitations' | 'reset-password' | 'sign-up/finish'): string {
  const match = new RegExp(`/${kind}/([A-Za-z0-9_-]+)`).exec(text);
  if (!match) throw new Error(`No /${kind}/<token> link in the e-mail:\n${text}`);
  return match[1];
}

/**
 * The admin invites `email` with `role` into their workspace; the invited person follows the link in
 * the captured e-mail, sets a name and password, and is signed in. Returns the new member's session.
 */
export async function inviteAndJoin(testApp: TestApp, admin: Session, email: string, role: WorkspaceRole, name = 'Invited Person'): Promise<Session> {
  const before = lastMailId(testApp);
  const invited = await withCsrf(admin.agent.post(`/api/workspaces/${admin.workspaceId}/invitations`), admin.csrf).send({ email, role });
  if (invited.status !== 201) fail(`Inviting ${email}`, invited);
  const mail = await newMail(testApp, email, /invited you/, before);
  await invitationMailed(testApp, (invited.body as { id: string }).id);
  const token = tokenFromMail(mail.text, 'invitations');
  const agent = request.agent(testApp.app);
  const accepted = await agent.post(`/api/invitations/${token}/accept`).send({ name, password: TEST_PASSWORD });
  if (accepted.status !== 201) fail(`Accepting the invitation for ${email}`, accepted);
  const body = accepted.body as { user: { id: string; email: string }; csrfToken: string };
  return { agent, userId: body.user.id, email: body.user.email, password: TEST_PASSWORD, workspaceId: admin.workspaceId, csrf: body.csrfToken };
}

/** The first e-mail to `to` matching `subject` captured after message id `afterId` (waits up to 10 s). */
export async function newMail(testApp: TestApp, to: string, subject: RegExp, afterId: number): Promise<{ text: string; subject: string }> {
  const deadline = Date.now() + 10_000;
  const wanted = to.toLowerCase();
  for (;;) {
    const found = testApp.mail.messages.find((m) => m.id > afterId && m.to.includes(wanted) && subject.test(m.subject));
    if (found) return found;
    if (Date.now() > deadline) throw new Error(`No new e-mail to ${to} matching ${subject} within 10 s`);
    await new Promise((r) => setTimeout(r, 25));
  }
}

/**
 * Waits until the queued job has finished with an invitation (its e-mail is sent and older pending
 * invitations to the address are ended): the e-mail lands a moment before that.
 */
export async function invitationMailed(testApp: TestApp, invitationId: string): Promise<void> {
  const deadline = Date.now() + 10_000;
  for (;;) {
    const [row] = await testApp.ctx.db.select({ mailedAt: invitations.mailedAt }).from(invitations).where(eq(invitations.id, invitationId));
    if (row?.mailedAt) return;
    if (Date.now() > deadline) throw new Error(`Invitation ${invitationId} was not mailed within 10 s`);
    await new Promise((r) => setTimeout(r, 25));
  }
}

/** The highest captured message id so far (pass it to newMail). */
export function lastMailId(testApp: TestApp): number {
  return testApp.mail.messages.reduce((max, m) => Math.max(max, m.id), 0);
}
