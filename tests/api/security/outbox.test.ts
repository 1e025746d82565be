/**
 * Issue 8 item 1: the development outbox must not hand one person's reset or invitation link to
 * another. Off unless LARIAT_DEV_OUTBOX=1; on, each person sees mail to themselves and invitations
 * from workspaces they administer, and nothing else through any route.
 */
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startTestApp, type TestApp } from '../../support/app';
import { apiRoutes } from '../../support/routes';
import { inviteAndJoin, lastMailId, newMail, signIn, signUp, tokenFromMail, uniqueEmail } from '../../support/session';

let on: TestApp;
beforeAll(async () => {
  on = await startTestApp({ LARIAT_DEV_OUTBOX: '1' });
});
afterAll(async () => {
  await on?.close();
});

/** A request for every GET route, with the caller's own workspace id and made-up ids elsewhere. */
function concretePath(path: string, workspaceId: string): string {
  return path
    .replace(':workspaceId', workspaceId)
    .replace(/:number/g, '1')
    .replace(/:token/g, 'x'.repeat(43))
    .replace(/:[A-Za-z]+/g, '00000000-0000-4000-8000-000000000000');
}

describe('development outbox', () => {
  it('does not exist unless asked for (404 even for a signed-in admin)', async () => {
    const off = await startTestApp();
    try {
      const admin = await signUp(off.app);
      const res = await admin.agent.get('/api/dev/outbox');
      expect(res.status).toBe(404);
      // The client learns this from /auth/me and does not ask (no console 404 on every page).
      expect((await admin.agent.get('/api/auth/me')).body.devOutbox).toBe(false);
      const onUser = await signUp(on.app);
      expect((await onUser.agent.get('/api/auth/me')).body.devOutbox).toBe(true);
    } finally {
      await off.close();
    }
  });

  it("never shows a freshly signed-up user another person's reset link, by any GET route", async () => {
    const victim = await signUp(on.app);
    const before = lastMailId(on);
    expect((await request(on.app).post('/api/auth/password-reset/request').send({ email: victim.email })).status).toBe(202);
    const mail = await newMail(on, victim.email, /reset/i, before);
    const token = tokenFromMail(mail.text, 'reset-password');

    const attacker = await signUp(on.app);
    const outbox = await attacker.agent.get('/api/dev/outbox');
    expect(outbox.status).toBe(200);
    expect(JSON.stringify(outbox.body)).not.toContain(token);
    expect(JSON.stringify(outbox.body)).not.toContain(victim.email);

    const routes = apiRoutes(on.app).filter((r) => r.method === 'GET');
    expect(routes.length).toBeGreaterThan(5);
    for (const route of routes) {
      const res = await attacker.agent.get(concretePath(route.path, attacker.workspaceId));
      expect(res.text, `GET ${route.path}`).not.toContain(token);
    }

    // The owner does see it.
    const own = await victim.agent.get('/api/dev/outbox');
    expect(JSON.stringify(own.body)).toContain(token);
  });

  it("shows an admin the invitations sent from their workspace, but not a member's later reset link", async () => {
    const admin = await signUp(on.app);
    const email = uniqueEmail('member');
    await inviteAndJoin(on, admin, email, 'viewer');
    const list = (await admin.agent.get('/api/dev/outbox')).body.messages as { to: string[]; subject: string; text: string }[];
    expect(list.some((m) => m.to.includes(email) && /invited you/.test(m.subject))).toBe(true);

    const before = lastMailId(on);
    await request(on.app).post('/api/auth/password-reset/request').send({ email });
    const token = tokenFromMail((await newMail(on, email, /reset/i, before)).text, 'reset-password');
    expect(JSON.stringify((await admin.agent.get('/api/dev/outbox')).body)).not.toContain(token);
    const member = await signIn(on.app, email);
    expect(JSON.stringify((await member.agent.get('/api/dev/outbox')).body)).toContain(token);
  });

  it('is 401 without a session', async () => {
    expect((await request(on.app).get('/api/dev/outbox')).status).toBe(401);
  });
});
