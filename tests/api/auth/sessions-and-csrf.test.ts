/** Forged, expired and revoked session tokens; CSRF double-submit and Origin checks. */
import { randomUUID } from 'node:crypto';
import { SignJWT } from 'jose';
import { eq } from 'drizzle-orm';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { sessions } from '../../../server/db/schema/auth';
import { startTestApp, type TestApp } from '../../support/app';
import { signUp, withCsrf } from '../../support/session';

let t: TestApp;
beforeAll(async () => {
  t = await startTestApp();
});
afterAll(async () => {
  await t?.close();
});

/** A session token shaped like the server's (RFC 7519 claims), signed with `secret`. */
function token(secret: string, claims: { sub: string; jti: string; exp: number }): Promise<string> {
  return new SignJWT({})
    .setProtectedHeader({ alg: 'HS256' })
    .setIssuer('lariat')
    .setAudience('lariat-session')
    .setSubject(claims.sub)
    .setJti(claims.jti)
    .setIssuedAt(claims.exp - 3600)
    .setExpirationTime(claims.exp)
    .sign(new TextEncoder().encode(secret));
}

const inAnHour = () => Math.floor(Date.now() / 1000) + 3600;

describe('session tokens', () => {
  it('rejects a token with a bad signature (401)', async () => {
    const s = await signUp(t.app);
    const forged = await token('an-attacker-guess-at-the-secret-of-32-chars', { sub: s.userId, jti: randomUUID(), exp: inAnHour() });
    const res = await request(t.app).get('/api/auth/me').set('Cookie', `lariat_session=${forged}`);
    expect(res.status).toBe(401);
    expect(res.body.error.message).toMatch(/not valid/i);
  });

  it('rejects a correctly signed token whose session row does not exist (401)', async () => {
    const s = await signUp(t.app);
    const made = await token(t.ctx.config.sessionSecret, { sub: s.userId, jti: randomUUID(), exp: inAnHour() });
    const res = await request(t.app).get('/api/auth/me').set('Cookie', `lariat_session=${made}`);
    expect(res.status).toBe(401);
  });

  it('rejects an expired token (401 saying it expired)', async () => {
    const s = await signUp(t.app);
    const expired = await token(t.ctx.config.sessionSecret, { sub: s.userId, jti: randomUUID(), exp: Math.floor(Date.now() / 1000) - 60 });
    const res = await request(t.app).get('/api/auth/me').set('Cookie', `lariat_session=${expired}`);
    expect(res.status).toBe(401);
    expect(res.body.error.message).toMatch(/expired/i);
  });

  it('rejects garbage in the cookie (401)', async () => {
    const res = await request(t.app).get('/api/workspaces').set('Cookie', 'lariat_session=not.a.jwt');
    expect(res.status).toBe(401);
  });

  it('a revoked session cookie replayed by another client is refused', async () => {
    const s = await signUp(t.app);
    const me = await s.agent.get('/api/auth/me');
    const sessionCookie = String(me.request.cookies).match(/lariat_session=[^;]+/)?.[0];
    expect(sessionCookie, 'the agent sent a session cookie').toBeDefined();
    expect((await request(t.app).get('/api/auth/me').set('Cookie', sessionCookie as string)).status).toBe(200);
    expect((await withCsrf(s.agent.post('/api/auth/sign-out'), s.csrf)).status).toBe(204);
    const replay = await request(t.app).get('/api/auth/me').set('Cookie', sessionCookie as string);
    expect(replay.status).toBe(401);
    expect(replay.body.error.message).toMatch(/signed out or expired/i);
  });
});

describe('sliding renewal', () => {
  it('replaces a token past half its life with a later one for the same session row', async () => {
    const s = await signUp(t.app);
    const jti = randomUUID();
    const soon = Math.floor(Date.now() / 1000) + 60; // 1 of the 60 configured minutes left
    await t.ctx.db.insert(sessions).values({ id: jti, userId: s.userId, expiresAt: new Date(soon * 1000) });
    const old = await token(t.ctx.config.sessionSecret, { sub: s.userId, jti, exp: soon });
    const res = await request(t.app).get('/api/auth/me').set('Cookie', `lariat_session=${old}`);
    expect(res.status).toBe(200);
    const renewed = (res.headers['set-cookie'] as unknown as string[] | undefined)?.find((c) => c.startsWith('lariat_session='));
    expect(renewed, 'a renewed session cookie').toBeDefined();
    const [row] = await t.ctx.db.select().from(sessions).where(eq(sessions.id, jti));
    const minutesLeft = (row.expiresAt.getTime() - Date.now()) / 60_000;
    expect(minutesLeft).toBeGreaterThan(t.ctx.config.LARIAT_SESSION_MINUTES - 1);
  });

  it('leaves a fresh token alone', async () => {
    const s = await signUp(t.app);
    const res = await s.agent.get('/api/auth/me');
    expect((res.headers['set-cookie'] as unknown as string[] | undefined) ?? []).not.toContainEqual(expect.stringMatching(/^lariat_session=/));
  });
});

describe('CSRF', () => {
  it('refuses a state-changing request without the header, or with a wrong one (403)', async () => {
    const s = await signUp(t.app);
    const none = await s.agent.post('/api/workspaces').send({ name: 'Sneaky' });
    expect(none.status).toBe(403);
    expect(none.body.error.message).toMatch(/X-Lariat-CSRF/);
    const wrong = await withCsrf(s.agent.post('/api/workspaces'), 'x'.repeat(43)).send({ name: 'Sneaky' });
    expect(wrong.status).toBe(403);
    const list = await s.agent.get('/api/workspaces');
    expect(list.body.workspaces).toHaveLength(1);
    const right = await withCsrf(s.agent.post('/api/workspaces'), s.csrf).send({ name: 'Fine' });
    expect(right.status).toBe(201);
  });

  it('refuses a request from a foreign Origin even with the right token', async () => {
    const s = await signUp(t.app);
    const res = await withCsrf(s.agent.post('/api/workspaces'), s.csrf).set('Origin', 'https://evil.example').send({ name: 'X' });
    expect(res.status).toBe(403);
    expect(res.body.error.message).toMatch(/evil\.example/);
    const signIn = await request(t.app).post('/api/auth/sign-in').set('Origin', 'https://evil.example').send({ email: s.email, password: s.password });
    expect(signIn.status).toBe(403);
  });

  it('accepts the public origin', async () => {
    const s = await signUp(t.app);
    const res = await withCsrf(s.agent.post('/api/workspaces'), s.csrf).set('Origin', new URL(t.ctx.config.publicUrl).origin).send({ name: 'Y' });
    expect(res.status).toBe(201);
  });

  it('GET /me hands out the CSRF token the client must echo', async () => {
    const s = await signUp(t.app);
    const me = await s.agent.get('/api/auth/me');
    expect(me.body.csrfToken).toBe(s.csrf);
  });
});

describe('cookie flags', () => {
  it('marks cookies Secure when the public URL is https', async () => {
    const secure = await startTestApp({ LARIAT_PUBLIC_URL: 'https://lariat.example.test' });
    try {
      await signUp(secure.app, { email: 'secure@example.test', password: 'a fine long passphrase', name: 'S' });
      const res = await request(secure.app).post('/api/auth/sign-in').send({ email: 'secure@example.test', password: 'a fine long passphrase' });
      expect(res.status).toBe(200);
      const cookies = (res.headers['set-cookie'] as unknown as string[]).join('\n');
      expect(cookies).toMatch(/lariat_session=[^\n]*Secure/);
      expect(cookies).toMatch(/lariat_csrf=[^\n]*Secure/);
      expect(cookies).not.toMatch(/lariat_csrf=[^\n]*HttpOnly/);
    } finally {
      await secure.close();
    }
  });
});
