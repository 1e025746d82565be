import { count, eq } from 'drizzle-orm';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { users, workspaces } from '../../../server/db/schema/auth';
import { startTestApp, type TestApp } from '../../support/app';
import { lastMailId, newMail, signIn, signUp, TEST_PASSWORD, tokenFromMail, uniqueEmail, withCsrf } from '../../support/session';

let t: TestApp;
beforeAll(async () => {
  t = await startTestApp({ LARIAT_RATE_LIMIT_FACTOR: '1' });
});
afterAll(async () => {
  await t?.close();
});

describe('sign-up', () => {
  it('e-mails a link that creates the account and a new workspace where the person is admin, and signs them in', async () => {
    const email = uniqueEmail('first');
    const before = lastMailId(t);
    const asked = await request(t.app).post('/api/auth/sign-up').send({ email: email.toUpperCase(), password: TEST_PASSWORD, name: 'Ada', workspaceName: 'Dairy yields' });
    expect(asked.status, JSON.stringify(asked.body)).toBe(202);
    const token = tokenFromMail((await newMail(t, email, /Finish creating/, before)).text, 'sign-up/finish');
    // No account before the link is used.
    expect((await request(t.app).post('/api/auth/sign-in').send({ email, password: TEST_PASSWORD })).status).toBe(401);
    const res = await request(t.app).post('/api/auth/sign-up/complete').send({ token });
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    expect(res.body.user).toEqual({ id: expect.any(String), email, name: 'Ada' });
    expect(res.body.memberships).toEqual([{ workspaceId: expect.any(String), workspaceName: 'Dairy yields', role: 'admin' }]);
    expect(res.body.user.passwordHash).toBeUndefined();
    const cookies = (res.headers['set-cookie'] as unknown as string[]).join('\n');
    expect(cookies).toMatch(/lariat_session=[^;]+;.*HttpOnly/i);
    expect(cookies).toMatch(/lariat_session=[^;]+;.*SameSite=Lax/i);
    expect(cookies).toMatch(new RegExp(`lariat_csrf=${res.body.csrfToken}`));
    // The link works once.
    expect((await request(t.app).post('/api/auth/sign-up/complete').send({ token })).status).toBe(410);
  });

  it('gives every later sign-up its own workspace too (no one joins a stranger by signing up)', async () => {
    const a = await signUp(t.app);
    const b = await signUp(t.app);
    expect(b.workspaceId).not.toBe(a.workspaceId);
    const list = await b.agent.get('/api/workspaces');
    expect(list.body.workspaces).toEqual([expect.objectContaining({ id: b.workspaceId, role: 'admin' })]);
  });

  it('stores the password hashed with argon2id', async () => {
    const s = await signUp(t.app);
    const [row] = await t.ctx.db.select({ hash: users.passwordHash }).from(users).where(eq(users.id, s.userId));
    expect(row.hash).toMatch(/^\$argon2id\$/);
    expect(row.hash).not.toContain(TEST_PASSWORD);
  });

  it('makes no second account for the same e-mail: the owner is told by e-mail instead', async () => {
    const s = await signUp(t.app);
    const workspacesBefore = (await t.ctx.db.select({ n: count() }).from(workspaces))[0].n;
    const before = lastMailId(t);
    const res = await request(t.app).post('/api/auth/sign-up').send({ email: s.email.toUpperCase(), password: TEST_PASSWORD, name: 'Again', workspaceName: 'Orphan' });
    expect(res.status).toBe(202);
    const mail = await newMail(t, s.email, /tried to create a Lariat account/, before);
    expect(mail.text).toMatch(/already has one/);
    expect(mail.text).not.toMatch(/sign-up\/finish/);
    // Nothing is written for it: no orphan workspace.
    expect((await t.ctx.db.select({ n: count() }).from(workspaces))[0].n).toBe(workspacesBefore);
  });
});

describe('sign-in, me, sign-out', () => {
  it('signs in with the right password and returns memberships and a CSRF token', async () => {
    const s = await signUp(t.app, { workspaceName: 'Harbour' });
    const again = await signIn(t.app, s.email);
    const me = await again.agent.get('/api/auth/me');
    expect(me.status).toBe(200);
    expect(me.body.user.id).toBe(s.userId);
    expect(me.body.memberships).toEqual([{ workspaceId: s.workspaceId, workspaceName: 'Harbour', role: 'admin' }]);
    expect(me.body.csrfToken).toBe(again.csrf);
  });

  it('gives the same message for a wrong password and an unknown e-mail', async () => {
    const s = await signUp(t.app);
    const wrong = await request(t.app).post('/api/auth/sign-in').send({ email: s.email, password: 'not the password at all' });
    const unknown = await request(t.app).post('/api/auth/sign-in').send({ email: uniqueEmail('nobody'), password: 'not the password at all' });
    expect(wrong.status).toBe(401);
    expect(unknown.status).toBe(401);
    expect(unknown.body.error.message).toBe(wrong.body.error.message);
  });

  it('me is 401 without a session', async () => {
    const res = await request(t.app).get('/api/auth/me');
    expect(res.status).toBe(401);
    expect(res.body.error.message).toMatch(/sign in/i);
  });

  it('sign-out revokes the session on the server: the old cookie no longer works', async () => {
    const s = await signUp(t.app);
    expect((await s.agent.get('/api/auth/me')).status).toBe(200);
    const out = await withCsrf(s.agent.post('/api/auth/sign-out'), s.csrf);
    expect(out.status).toBe(204);
    expect((await s.agent.get('/api/auth/me')).status).toBe(401);
  });

  it('rate-limits sign-in attempts per IP and e-mail with a clear 429', async () => {
    const s = await signUp(t.app);
    // Successful sign-ins don't count towards the limit.
    for (let i = 0; i < 12; i++) expect((await request(t.app).post('/api/auth/sign-in').send({ email: s.email, password: s.password })).status).toBe(200);
    const statuses: number[] = [];
    for (let i = 0; i < 11; i++) {
      statuses.push((await request(t.app).post('/api/auth/sign-in').send({ email: s.email, password: `wrong guess ${i}!` })).status);
    }
    expect(statuses.slice(0, 10).every((x) => x === 401)).toBe(true);
    const limited = await request(t.app).post('/api/auth/sign-in').send({ email: s.email, password: s.password });
    expect(statuses[10]).toBe(429);
    expect(limited.status).toBe(429);
    expect(limited.body.error.message).toMatch(/too many sign-in attempts/i);
    // Another e-mail from the same address is not locked out.
    const other = await signUp(t.app);
    expect((await request(t.app).post('/api/auth/sign-in').send({ email: other.email, password: other.password })).status).toBe(200);
  });
});
