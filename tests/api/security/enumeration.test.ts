/**
 * Issue 8 item 11: sign-up and password-reset requests answer the same way whether or not the
 * address has an account, and they answer before looking it up (so they also take the same time);
 * the owner of an existing account is told by e-mail instead.
 */
import pg from 'pg';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startTestApp, type TestApp } from '../../support/app';
import { lastMailId, newMail, signUp, TEST_PASSWORD, uniqueEmail } from '../../support/session';

let t: TestApp;
beforeAll(async () => {
  t = await startTestApp();
});
afterAll(async () => {
  await t?.close();
});

/** What a client can observe of an answer, minus what varies per request anyway. */
function observable(res: request.Response) {
  const varying = new Set(['date', 'etag', 'ratelimit', 'ratelimit-policy', 'content-length']);
  return { status: res.status, body: res.body as unknown, headers: Object.keys(res.headers).filter((h) => !varying.has(h)).sort() };
}

/**
 * Holds an exclusive lock on the users table: any lookup of an address waits until `release`. An
 * answer that arrives meanwhile was given without knowing whether the account exists.
 */
async function lockUsers(): Promise<{ release(): Promise<void> }> {
  const client = new pg.Client({ connectionString: t.ctx.config.DATABASE_URL });
  await client.connect();
  await client.query('BEGIN');
  await client.query('LOCK TABLE users IN ACCESS EXCLUSIVE MODE');
  return {
    async release() {
      await client.query('COMMIT');
      await client.end();
    },
  };
}

describe('sign-up', () => {
  it('answers a known and an unknown address identically, before looking either up', async () => {
    const existing = await signUp(t.app);
    const fresh = uniqueEmail('fresh');
    const before = lastMailId(t);
    const lock = await lockUsers();
    let known: request.Response;
    let unknown: request.Response;
    try {
      known = await request(t.app).post('/api/auth/sign-up').timeout(10_000).send({ email: existing.email, password: TEST_PASSWORD, name: 'Someone' });
      unknown = await request(t.app).post('/api/auth/sign-up').timeout(10_000).send({ email: fresh, password: TEST_PASSWORD, name: 'Someone' });
    } finally {
      await lock.release();
    }
    expect(known.status).toBe(202);
    expect(observable(known)).toEqual(observable(unknown));
    expect(known.headers['set-cookie']).toBeUndefined();
    // The difference goes to the mailboxes, where only each address's owner reads it.
    expect((await newMail(t, existing.email, /tried to create a Lariat account/, before)).text).toMatch(/already has one/);
    expect((await newMail(t, fresh, /Finish creating/, before)).text).toMatch(/\/sign-up\/finish\//);
  });
});

describe('password-reset request', () => {
  it('answers a known and an unknown address identically, before looking either up', async () => {
    const existing = await signUp(t.app);
    const before = lastMailId(t);
    const lock = await lockUsers();
    let known: request.Response;
    let unknown: request.Response;
    try {
      known = await request(t.app).post('/api/auth/password-reset/request').timeout(10_000).send({ email: existing.email });
      unknown = await request(t.app).post('/api/auth/password-reset/request').timeout(10_000).send({ email: uniqueEmail('nobody') });
    } finally {
      await lock.release();
    }
    expect(known.status).toBe(202);
    expect(observable(known)).toEqual(observable(unknown));
    expect((await newMail(t, existing.email, /Reset your Lariat password/, before)).text).toMatch(/\/reset-password\//);
  });
});
