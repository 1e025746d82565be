/**
 * Issue 8 item 10: an absolute session lifetime on top of the sliding one; the list of one's
 * sessions and signing out the others; changing the password (current one required), which signs
 * out the other sessions, spends open reset links and sends a notice; `__Host-` cookies over
 * https; a CSRF token tied to the session.
 */
import { eq, sql } from 'drizzle-orm';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { signSessionToken } from '../../../server/auth/session-token';
import { sessions } from '../../../server/db/schema/auth';
import { startTestApp, type TestApp } from '../../support/app';
import { lastMailId, newMail, signIn, signUp, TEST_PASSWORD, tokenFromMail, withCsrf, type Session } from '../../support/session';

let t: TestApp;
beforeAll(async () => {
  t = await startTestApp({ LARIAT_SESSION_MAX_HOURS: '12' });
});
afterAll(async () => {
  await t?.close();
});

function cookieOf(s: Session, name = 'lariat_session'): string {
  const jar = (s.agent as unknown as { jar: { getCookie(name: string, access: unknown): { value: string } | undefined } }).jar;
  const found = jar.getCookie(name, { domain: '127.0.0.1', path: '/', secure: false, script: false });
  if (!found) throw new Error(`no ${name} cookie in the agent`);
  return found.value;
}

async function sessionRowIds(userId: string): Promise<string[]> {
  return (await t.ctx.db.select({ id: sessions.id }).from(sessions).where(eq(sessions.userId, userId))).map((r) => r.id);
}

describe('absolute lifetime', () => {
  it('ends a session 12 hours after sign-in however active it is', async () => {
    const s = await signUp(t.app);
    expect((await s.agent.get('/api/auth/me')).status).toBe(200);
    // Signed in 12 h 1 min ago, still within its sliding expiry (as if renewed a minute ago).
    await t.ctx.db.execute(sql`UPDATE sessions SET created_at = now() - interval '12 hours 1 minute', expires_at = now() + interval '59 minutes' WHERE user_id = ${s.userId}`);
    const res = await s.agent.get('/api/auth/me');
    expect(res.status).toBe(401);
  });

  it('never renews a token past the absolute end', async () => {
    const s = await signUp(t.app);
    // 11 h 50 min after sign-in, 10 minutes left of the sliding hour: renewal is due, but only up to 12 h.
    await t.ctx.db.execute(sql`UPDATE sessions SET created_at = now() - interval '11 hours 50 minutes', expires_at = now() + interval '10 minutes' WHERE user_id = ${s.userId}`);
    // A token for that session with 10 minutes left, as the browser would hold it by then.
    const [{ id }] = await t.ctx.db.select({ id: sessions.id }).from(sessions).where(eq(sessions.userId, s.userId));
    const expiresAt = new Date(Date.now() + 10 * 60_000);
    const token = await signSessionToken(t.ctx.config.sessionSecret, { userId: s.userId, sessionId: id, expiresAt });
    const res = await request(t.app).get('/api/auth/me').set('Cookie', `lariat_session=${token}`);
    expect(res.status).toBe(200);
    const renewed = (res.headers['set-cookie'] as unknown as string[] | undefined)?.find((c) => c.startsWith('lariat_session='));
    expect(renewed, 'renewal is due: a new session cookie').toBeDefined();
    const [row] = await t.ctx.db.select({ createdAt: sessions.createdAt, expiresAt: sessions.expiresAt }).from(sessions).where(eq(sessions.userId, s.userId));
    expect(row.expiresAt.getTime()).toBeLessThanOrEqual(row.createdAt.getTime() + 12 * 3_600_000 + 1000);
  });
});

describe('sessions page API', () => {
  it('lists my live sessions with the current one marked, and signs out the others', async () => {
    const first = await signUp(t.app);
    const second = await signIn(t.app, first.email);
    const third = await signIn(t.app, first.email);
    const list = await second.agent.get('/api/auth/sessions');
    expect(list.status).toBe(200);
    expect(list.body.sessions).toHaveLength(3);
    expect(list.body.sessions.filter((x: { current: boolean }) => x.current)).toHaveLength(1);
    // The public id is not the session's secret id.
    const rowIds = await sessionRowIds(first.userId);
    for (const x of list.body.sessions as { id: string }[]) expect(rowIds).not.toContain(x.id);

    const out = await withCsrf(second.agent.post('/api/auth/sessions/sign-out-others'), second.csrf);
    expect(out.status).toBe(200);
    expect(out.body.signedOut).toBe(2);
    expect((await first.agent.get('/api/auth/me')).status).toBe(401);
    expect((await third.agent.get('/api/auth/me')).status).toBe(401);
    expect((await second.agent.get('/api/auth/me')).status).toBe(200);
    expect((await second.agent.get('/api/auth/sessions')).body.sessions).toHaveLength(1);
  });

  it('does not show anyone else\'s sessions', async () => {
    const a = await signUp(t.app);
    const b = await signUp(t.app);
    await signIn(t.app, b.email);
    expect((await a.agent.get('/api/auth/sessions')).body.sessions).toHaveLength(1);
  });
});

describe('change password', () => {
  const NEW = 'a brand new passphrase 77';

  it('refuses a wrong current password, naming the field', async () => {
    const s = await signUp(t.app);
    const res = await withCsrf(s.agent.post('/api/auth/password'), s.csrf).send({ currentPassword: 'not my password at all', newPassword: NEW });
    expect(res.status).toBe(400);
    expect(res.body.error.field).toBe('currentPassword');
  });

  it('changes it, signs out the other sessions, spends open reset links and e-mails a notice', async () => {
    const s = await signUp(t.app);
    const elsewhere = await signIn(t.app, s.email);
    let before = lastMailId(t);
    await request(t.app).post('/api/auth/password-reset/request').send({ email: s.email });
    const resetToken = tokenFromMail((await newMail(t, s.email, /reset/i, before)).text, 'reset-password');

    before = lastMailId(t);
    const res = await withCsrf(s.agent.post('/api/auth/password'), s.csrf).send({ currentPassword: TEST_PASSWORD, newPassword: NEW });
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    expect(res.body.signedOut).toBe(1);
    expect((await elsewhere.agent.get('/api/auth/me')).status).toBe(401);
    expect((await s.agent.get('/api/auth/me')).status).toBe(200);
    const notice = await newMail(t, s.email, /password was changed/, before);
    expect(notice.text).toMatch(/other sessions \(1\) were signed out/);

    expect((await request(t.app).post('/api/auth/sign-in').send({ email: s.email, password: TEST_PASSWORD })).status).toBe(401);
    expect((await request(t.app).post('/api/auth/sign-in').send({ email: s.email, password: NEW })).status).toBe(200);
    const reset = await request(t.app).post('/api/auth/password-reset/complete').send({ token: resetToken, password: 'a third fine passphrase 5' });
    expect(reset.status).toBe(410);
  });

  it('needs the CSRF token and a session', async () => {
    const s = await signUp(t.app);
    expect((await s.agent.post('/api/auth/password').send({ currentPassword: TEST_PASSWORD, newPassword: NEW })).status).toBe(403);
    expect((await request(t.app).post('/api/auth/password').set('X-Lariat-CSRF', 'x').set('Cookie', 'lariat_csrf=x').send({ currentPassword: TEST_PASSWORD, newPassword: NEW })).status).toBe(401);
  });
});

describe('CSRF token tied to the session', () => {
  it("refuses another session's token, and a cookie-and-header pair planted by someone else", async () => {
    const a = await signUp(t.app);
    const b = await signUp(t.app);
    const url = (s: Session) => `/api/workspaces/${s.workspaceId}/invitations`;
    const body = { email: 'invitee@example.test', role: 'viewer' };
    // A's token with B's session.
    expect((await withCsrf(b.agent.post(url(b)), a.csrf).send(body)).status).toBe(403);
    // A matching pair that does not belong to the session (a plain double-submit check would pass it).
    const planted = await request(t.app)
      .post(url(b))
      .set('Cookie', `lariat_session=${cookieOf(b)}; lariat_csrf=planted-value`)
      .set('X-Lariat-CSRF', 'planted-value')
      .send(body);
    expect(planted.status).toBe(403);
    expect(planted.body.error.field).toBe('X-Lariat-CSRF');
    // B's own token works.
    expect((await withCsrf(b.agent.post(url(b)), b.csrf).send(body)).status).toBe(201);
  });

  it('gives a new token with each new session', async () => {
    const s = await signUp(t.app);
    const again = await signIn(t.app, s.email);
    expect(again.csrf).not.toBe(s.csrf);
    expect((await again.agent.get('/api/auth/me')).body.csrfToken).toBe(again.csrf);
  });
});

describe('__Host- cookies over https', () => {
  it('prefixes both cookies with __Host- (Secure, Path=/, no Domain) when the public URL is https, and not over http', async () => {
    const https = await startTestApp({ LARIAT_PUBLIC_URL: 'https://lariat.example.test' });
    try {
      await signUp(https.app, { email: 'host-prefix@example.test' });
      const res = await request(https.app).post('/api/auth/sign-in').send({ email: 'host-prefix@example.test', password: TEST_PASSWORD });
      expect(res.status).toBe(200);
      const cookies = res.headers['set-cookie'] as unknown as string[];
      const session = cookies.find((c) => c.startsWith('__Host-lariat_session='));
      const csrf = cookies.find((c) => c.startsWith('__Host-lariat_csrf='));
      for (const c of [session, csrf]) {
        expect(c).toBeDefined();
        expect(c).toMatch(/; Secure/i);
        expect(c).toMatch(/; Path=\//i);
        expect(c).not.toMatch(/Domain=/i);
      }
      // The prefixed cookie is the one the server reads.
      const token = /^__Host-lariat_session=([^;]+)/.exec(session as string)?.[1];
      expect((await request(https.app).get('/api/auth/me').set('Cookie', `__Host-lariat_session=${token}`)).status).toBe(200);
      expect((await request(https.app).get('/api/auth/me').set('Cookie', `lariat_session=${token}`)).status).toBe(401);
    } finally {
      await https.close();
    }
    const mine = await signUp(t.app);
    const plain = await request(t.app).post('/api/auth/sign-in').send({ email: mine.email, password: TEST_PASSWORD });
    expect((plain.headers['set-cookie'] as unknown as string[]).some((c) => c.startsWith('lariat_session='))).toBe(true);
  });
});
