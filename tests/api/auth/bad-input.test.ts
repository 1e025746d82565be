/** Malformed, oversized, unknown and wrongly typed input: a clear 4xx naming the field, nothing written. */
import { count } from 'drizzle-orm';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { users, workspaces } from '../../../server/db/schema/auth';
import { startTestApp, type TestApp } from '../../support/app';
import { signUp, TEST_PASSWORD, uniqueEmail, withCsrf } from '../../support/session';

let t: TestApp;
beforeAll(async () => {
  t = await startTestApp();
});
afterAll(async () => {
  await t?.close();
});

const rowCounts = async () => ({
  users: (await t.ctx.db.select({ n: count() }).from(users))[0].n,
  workspaces: (await t.ctx.db.select({ n: count() }).from(workspaces))[0].n,
});

async function signUpWith(body: unknown) {
  return request(t.app).post('/api/auth/sign-up').set('Content-Type', 'application/json').send(body as object);
}

describe('request bodies', () => {
  it('malformed JSON is a 400 naming the body', async () => {
    const res = await request(t.app).post('/api/auth/sign-up').set('Content-Type', 'application/json').send('{"email": "a@b.test", ');
    expect(res.status).toBe(400);
    expect(res.body.error).toEqual({ message: expect.stringMatching(/not valid JSON/), field: 'body' });
  });

  it('an oversized body (over 1 MB) is a 413', async () => {
    const res = await signUpWith({ email: uniqueEmail(), password: TEST_PASSWORD, name: 'x'.repeat(1_100_000) });
    expect(res.status).toBe(413);
    expect(res.body.error.field).toBe('body');
  });

  it('unknown fields are refused by name', async () => {
    const res = await signUpWith({ email: uniqueEmail(), password: TEST_PASSWORD, name: 'A', isAdmin: true });
    expect(res.status).toBe(400);
    expect(res.body.error.message).toMatch(/Unknown field.*isAdmin/);
  });

  it('wrong types name the field', async () => {
    const res = await signUpWith({ email: uniqueEmail(), password: 1234567890123, name: 'A' });
    expect(res.status).toBe(400);
    expect(res.body.error.field).toBe('password');
  });

  it('a JSON array instead of an object is a 400', async () => {
    const res = await signUpWith([1, 2]);
    expect(res.status).toBe(400);
  });

  it('a malformed e-mail names the email field', async () => {
    const res = await signUpWith({ email: 'not-an-address', password: TEST_PASSWORD, name: 'A' });
    expect(res.status).toBe(400);
    expect(res.body.error.field).toBe('email');
  });

  it('an over-long workspace name names workspaceName', async () => {
    const res = await signUpWith({ email: uniqueEmail(), password: TEST_PASSWORD, name: 'A', workspaceName: 'w'.repeat(81) });
    expect(res.status).toBe(400);
    expect(res.body.error.field).toBe('workspaceName');
  });
});

describe('weak passwords (length >= 12, not trivially weak)', () => {
  const email = 'weak.tester@example.test';
  const cases: Array<[string, string, RegExp]> = [
    ['too short', 'short-pw-11', /at least 12/],
    ['one character repeated', 'aaaaaaaaaaaaaaaa', /different/],
    ['two characters alternating', 'abababababababab', /different/],
    ['a straight run of digits', '1234567890123', /run/],
    ['a straight run of letters', 'abcdefghijklmnop', /run/],
    ['the e-mail address itself', email, /e-mail/],
    ['over the maximum length', 'Long passphrase '.repeat(13), /at most/],
  ];
  for (const [label, password, message] of cases) {
    it(`refuses ${label}, naming the password field, and writes nothing`, async () => {
      const before = await rowCounts();
      const res = await signUpWith({ email, password, name: 'Weak' });
      expect(res.status, `password ${JSON.stringify(password)}`).toBe(400);
      expect(res.body.error.field).toBe('password');
      expect(res.body.error.message).toMatch(message);
      expect(await rowCounts()).toEqual(before);
    });
  }
});

describe('workspace and member routes', () => {
  it('unknown fields and wrong roles are refused by name', async () => {
    const s = await signUp(t.app);
    const unknown = await withCsrf(s.agent.post('/api/workspaces'), s.csrf).send({ name: 'Ok', owner: 'me' });
    expect(unknown.status).toBe(400);
    expect(unknown.body.error.message).toMatch(/owner/);
    const badRole = await withCsrf(s.agent.post(`/api/workspaces/${s.workspaceId}/invitations`), s.csrf).send({ email: uniqueEmail(), role: 'owner' });
    expect(badRole.status).toBe(400);
    expect(badRole.body.error.field).toBe('role');
    expect(badRole.body.error.message).toMatch(/admin, analyst, reviewer, viewer/);
    const emptyName = await withCsrf(s.agent.post('/api/workspaces'), s.csrf).send({ name: '   ' });
    expect(emptyName.status).toBe(400);
    expect(emptyName.body.error.field).toBe('name');
  });

  it('a malformed workspace id is a 404, not a server error', async () => {
    const s = await signUp(t.app);
    expect((await s.agent.get('/api/workspaces/not-a-uuid/members')).status).toBe(404);
    const member = await withCsrf(s.agent.patch(`/api/workspaces/${s.workspaceId}/members/nope`), s.csrf).send({ role: 'viewer' });
    expect(member.status).toBe(404);
  });
});
