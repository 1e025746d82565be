/** Forgotten passwords: no account enumeration, a 1-hour single-use link, every session signed out. */
import { eq } from 'drizzle-orm';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { passwordResets } from '../../../server/db/schema/auth';
import { hashToken } from '../../../server/auth/tokens';
import { startTestApp, type TestApp } from '../../support/app';
import { lastMailId, newMail, signIn, signUp, tokenFromMail, uniqueEmail, type Session } from '../../support/session';

let t: TestApp;
beforeAll(async () => {
  t = await startTestApp({ LARIAT_RATE_LIMIT_FACTOR: '1' });
});
afterAll(async () => {
  await t?.close();
});

const NEW_PASSWORD = 'a brand new passphrase 7';

async function requestReset(s: Session): Promise<{ token: string; text: string }> {
  const before = lastMailId(t);
  const res = await request(t.app).post('/api/auth/password-reset/request').send({ email: s.email.toUpperCase() });
  expect(res.status).toBe(202);
  const mail = await newMail(t, s.email, /reset/i, before);
  return { token: tokenFromMail(mail.text, 'reset-password'), text: mail.text };
}

const complete = (token: string, password = NEW_PASSWORD) => request(t.app).post('/api/auth/password-reset/complete').send({ token, password });

describe('password reset', () => {
  it('answers 202 with the same body whether or not the account exists, and mails only real accounts', async () => {
    const s = await signUp(t.app);
    const before = lastMailId(t);
    const nobody = uniqueEmail('nobody');
    // The unknown address first: its (empty) background work is done before the real one's mail lands.
    const b = await request(t.app).post('/api/auth/password-reset/request').send({ email: nobody });
    const a = await request(t.app).post('/api/auth/password-reset/request').send({ email: s.email });
    expect([a.status, b.status]).toEqual([202, 202]);
    expect(b.body).toEqual(a.body);
    await newMail(t, s.email, /reset/i, before);
    expect(t.mail.messages.some((m) => m.to.includes(nobody))).toBe(false);
  });

  it('sets a new password through the e-mailed link, signs out every session, and the old password stops working', async () => {
    const s = await signUp(t.app);
    const other = await signIn(t.app, s.email);
    const { token, text } = await requestReset(s);
    expect(text).toContain(`${t.ctx.config.publicUrl}/reset-password/${token}`);
    const [row] = await t.ctx.db.select().from(passwordResets).where(eq(passwordResets.tokenHash, hashToken(token)));
    const minutes = (row.expiresAt.getTime() - row.createdAt.getTime()) / 60_000;
    expect(Math.abs(minutes - 60)).toBeLessThan(0.1);
    const res = await complete(token);
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    expect((await s.agent.get('/api/auth/me')).status).toBe(401);
    expect((await other.agent.get('/api/auth/me')).status).toBe(401);
    expect((await request(t.app).post('/api/auth/sign-in').send({ email: s.email, password: s.password })).status).toBe(401);
    expect((await request(t.app).post('/api/auth/sign-in').send({ email: s.email, password: NEW_PASSWORD })).status).toBe(200);
  });

  it('a used link is a clear 410; so is an older link of the same account', async () => {
    const s = await signUp(t.app);
    const first = await requestReset(s);
    const second = await requestReset(s);
    expect((await complete(second.token)).status).toBe(200);
    const reused = await complete(second.token, 'yet another passphrase 8');
    expect(reused.status).toBe(410);
    expect(reused.body.error).toEqual({ message: expect.stringMatching(/already been used/), field: 'token' });
    expect((await complete(first.token, 'yet another passphrase 8')).status).toBe(410);
  });

  it('an expired link is a clear 410 and leaves the password alone', async () => {
    const s = await signUp(t.app);
    const { token } = await requestReset(s);
    await t.ctx.db.update(passwordResets).set({ expiresAt: new Date(Date.now() - 1000) }).where(eq(passwordResets.tokenHash, hashToken(token)));
    const res = await complete(token);
    expect(res.status).toBe(410);
    expect(res.body.error.message).toMatch(/expired/);
    expect((await request(t.app).post('/api/auth/sign-in').send({ email: s.email, password: s.password })).status).toBe(200);
  });

  it('a forged token is a 404 naming the token', async () => {
    const res = await complete('forged-token-that-was-never-sent');
    expect(res.status).toBe(404);
    expect(res.body.error.field).toBe('token');
  });

  it('a weak new password (here: the e-mail address) names the password field and keeps the link usable', async () => {
    const s = await signUp(t.app);
    const { token } = await requestReset(s);
    const weak = await complete(token, s.email);
    expect(weak.status).toBe(400);
    expect(weak.body.error.field).toBe('password');
    const short = await complete(token, 'short');
    expect(short.body.error.field).toBe('password');
    expect((await complete(token)).status).toBe(200);
  });

  it('rate-limits reset requests per e-mail (429)', async () => {
    const s = await signUp(t.app);
    const statuses: number[] = [];
    for (let i = 0; i < 6; i++) statuses.push((await request(t.app).post('/api/auth/password-reset/request').send({ email: s.email })).status);
    expect(statuses).toEqual([202, 202, 202, 202, 202, 429]);
    // Let the five background e-mails land before the test app shuts its SMTP server down.
    const resets = () => t.mail.messages.filter((m) => m.to.includes(s.email) && /Reset your/.test(m.subject));
    for (let i = 0; i < 400 && resets().length < 5; i++) await new Promise((r) => setTimeout(r, 25));
    expect(resets()).toHaveLength(5);
  });
});
