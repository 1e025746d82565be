/**
 * Issue 8 item 4: sign-in limited per IP and per IP and e-mail, with a per-account delay that never
 * locks the owner out; limits on reset completion, sign-up, invitations and new workspaces; the
 * client address taken from X-Forwarded-For only when LARIAT_TRUST_PROXY says so.
 */
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startTestApp, type TestApp } from '../../support/app';
import { signUp, TEST_PASSWORD, uniqueEmail, withCsrf } from '../../support/session';

let t: TestApp;
beforeAll(async () => {
  // Real limits; behind one trusted proxy, so X-Forwarded-For stands for different clients.
  t = await startTestApp({ LARIAT_RATE_LIMIT_FACTOR: '1', LARIAT_TRUST_PROXY: '1' });
});
afterAll(async () => {
  await t?.close();
});

const signInFrom = (app: TestApp['app'], ip: string, email: string, password: string) =>
  request(app).post('/api/auth/sign-in').set('X-Forwarded-For', ip).send({ email, password });

describe('sign-in limits', () => {
  it('limits failed attempts per address across many accounts (50 per 15 minutes)', async () => {
    const statuses: number[] = [];
    for (let i = 0; i < 51; i++) statuses.push((await signInFrom(t.app, '10.0.0.1', uniqueEmail('spray'), 'wrong password 1')).status);
    expect(statuses.slice(0, 50).every((s) => s === 401)).toBe(true);
    expect(statuses[50]).toBe(429);
    const other = await signInFrom(t.app, '10.0.0.2', uniqueEmail('spray'), 'wrong password 1');
    expect(other.status).toBe(401);
  });

  it('cannot be used to lock a chosen person out: the owner still signs in from elsewhere', async () => {
    const victim = await signUp(t.app);
    const attacker: number[] = [];
    for (let i = 0; i < 12; i++) attacker.push((await signInFrom(t.app, '10.0.1.1', victim.email, `guess number ${i}`)).status);
    expect(attacker).toEqual([...Array(10).fill(401), 429, 429]);
    // A second attacking address adds failures: the account is now slowed down, not closed.
    for (let i = 0; i < 3; i++) expect((await signInFrom(t.app, '10.0.1.2', victim.email, `other guess ${i}`)).status).toBe(401);
    const started = Date.now();
    const owner = await signInFrom(t.app, '10.0.1.3', victim.email, TEST_PASSWORD);
    expect(owner.status).toBe(200);
    // 13 failures, 10 free: this attempt waited 100 ms * 2^3 = 800 ms.
    expect(Date.now() - started).toBeGreaterThanOrEqual(750);
    // The success cleared the delay.
    const t2 = Date.now();
    expect((await signInFrom(t.app, '10.0.1.4', victim.email, TEST_PASSWORD)).status).toBe(200);
    expect(Date.now() - t2).toBeLessThan(750);
  });

  it('says when to come back (Retry-After) on a 429', async () => {
    const email = uniqueEmail('retry');
    for (let i = 0; i < 10; i++) await signInFrom(t.app, '10.0.2.1', email, 'wrong password 2');
    const limited = await signInFrom(t.app, '10.0.2.1', email, 'wrong password 2');
    expect(limited.status).toBe(429);
    expect(Number(limited.headers['retry-after'])).toBeGreaterThan(0);
    expect(limited.body.error).toEqual({ message: expect.stringMatching(/too many sign-in attempts/i), field: 'email' });
  });

  it('ignores X-Forwarded-For when no proxy is trusted (a client cannot pick its own address)', async () => {
    const direct = await startTestApp({ LARIAT_RATE_LIMIT_FACTOR: '1' });
    try {
      const email = uniqueEmail('spoof');
      const statuses: number[] = [];
      for (let i = 0; i < 11; i++) statuses.push((await signInFrom(direct.app, `10.9.0.${i}`, email, 'wrong password 3')).status);
      expect(statuses[10]).toBe(429);
    } finally {
      await direct.close();
    }
  });
});

describe('other limits', () => {
  it('limits reset-link attempts per address (20 per 15 minutes)', async () => {
    const statuses: number[] = [];
    for (let i = 0; i < 21; i++) {
      statuses.push((await request(t.app).post('/api/auth/password-reset/complete').set('X-Forwarded-For', '10.0.3.1').send({ token: `made-up-token-${i}`, password: 'a fine new password 9' })).status);
    }
    expect(statuses.slice(0, 20).every((s) => s === 404)).toBe(true);
    expect(statuses[20]).toBe(429);
  });

  it('limits sign-ups per address (20 per hour)', async () => {
    const statuses: number[] = [];
    for (let i = 0; i < 21; i++) {
      statuses.push((await request(t.app).post('/api/auth/sign-up').set('X-Forwarded-For', '10.0.4.1').send({ email: uniqueEmail('many'), password: TEST_PASSWORD, name: 'Many' })).status);
    }
    expect(statuses.slice(0, 20).every((s) => s !== 429)).toBe(true);
    expect(statuses[20]).toBe(429);
  });

  it('limits invitations and new workspaces per account, not per address', async () => {
    // A tenth of the real limits: 5 invitations and 2 workspaces an hour.
    const small = await startTestApp({ LARIAT_RATE_LIMIT_FACTOR: '0.1' });
    try {
      const admin = await signUp(small.app);
      const invites: number[] = [];
      for (let i = 0; i < 6; i++) {
        invites.push((await withCsrf(admin.agent.post(`/api/workspaces/${admin.workspaceId}/invitations`), admin.csrf).send({ email: uniqueEmail('inv'), role: 'viewer' })).status);
      }
      expect(invites).toEqual([201, 201, 201, 201, 201, 429]);
      const created: number[] = [];
      for (let i = 0; i < 3; i++) created.push((await withCsrf(admin.agent.post('/api/workspaces'), admin.csrf).send({ name: `Extra ${i}` })).status);
      expect(created).toEqual([201, 201, 429]);
      // Another account from the same address is not affected.
      const other = await signUp(small.app);
      expect((await withCsrf(other.agent.post('/api/workspaces'), other.csrf).send({ name: 'Mine' })).status).toBe(201);
    } finally {
      await small.close();
    }
  });
});
