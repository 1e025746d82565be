/**
 * Issue 8 item 6: a 500 never carries a stack trace, SQL or the values in it; the person gets an id
 * that matches the one server log line, and that line has the SQLSTATE code and constraint but not
 * the query's parameters (an e-mail, a password hash).
 */
import { sql } from 'drizzle-orm';
import express from 'express';
import request from 'supertest';
import { afterAll, afterEach, beforeAll, describe, expect, it, vi } from 'vitest';
import { users } from '../../../server/db/schema/auth';
import { badRequest, errorHandler } from '../../../server/http/errors';
import { startTestApp, type TestApp } from '../../support/app';
import { signUp, withCsrf } from '../../support/session';

let t: TestApp;
beforeAll(async () => {
  t = await startTestApp();
});
afterAll(async () => {
  await t?.close();
});
afterEach(() => {
  vi.restoreAllMocks();
});

const HASH = '$argon2id$v=19$m=65536,t=3,p=4$c2VjcmV0LXNhbHQ$secret-hash-that-must-not-be-logged';

function captureLog(): string[] {
  const lines: string[] = [];
  vi.spyOn(console, 'error').mockImplementation((...args: unknown[]) => {
    lines.push(args.map(String).join(' '));
  });
  return lines;
}

function expectNoLeak(text: string, secrets: string[]): void {
  expect(text).not.toMatch(/\bselect\b|\binsert\b|\bupdate\b|\bfrom\b|"users"/i);
  expect(text).not.toMatch(/\n\s+at |\.ts:\d+/);
  for (const s of secrets) expect(text).not.toContain(s);
}

describe('the error handler', () => {
  const email = 'taken-address@example.test';
  const app = express();
  app.get('/duplicate', async () => {
    await t.ctx.db.insert(users).values({ email, name: 'Twin', passwordHash: HASH });
  });
  app.get('/plain', () => {
    throw new Error(`could not parse "${HASH}"`);
  });
  app.get('/own', () => {
    throw badRequest('name: A name has at most 100 characters.', 'name');
  });
  app.use(errorHandler);

  beforeAll(async () => {
    await t.ctx.db.insert(users).values({ email, name: 'First', passwordHash: HASH });
  });

  it('answers a database error with a generic 500 whose id matches the log line (code and constraint, no values)', async () => {
    const log = captureLog();
    const res = await request(app).get('/duplicate');
    expect(res.status).toBe(500);
    expectNoLeak(res.text, [email, HASH, 'duplicate key']);
    const id = res.body.error.id as string;
    expect(id).toMatch(/^[0-9a-f]{12}$/);
    expect(res.body.error.message).toContain(id);
    const line = log.find((l) => l.includes(id));
    expect(line, log.join('\n')).toBeDefined();
    expect(line).toMatch(/code=23505/);
    expect(line).toMatch(/constraint=users_email_unique/);
    expect(line).not.toContain(email);
    expect(line).not.toContain(HASH);
    expect(line).not.toMatch(/\binsert into\b/i);
  });

  it('hides the message of an error that is not one of Lariat\'s own', async () => {
    captureLog();
    const res = await request(app).get('/plain');
    expect(res.status).toBe(500);
    expectNoLeak(res.text, [HASH, 'could not parse']);
  });

  it("passes Lariat's own errors through unchanged", async () => {
    const res = await request(app).get('/own');
    expect(res.status).toBe(400);
    expect(res.body).toEqual({ error: { message: 'name: A name has at most 100 characters.', field: 'name' } });
  });
});

describe('a real route whose query fails', () => {
  it('gives a 500 without SQL or stack, and the log line has the id', async () => {
    const own = await startTestApp();
    try {
      const admin = await signUp(own.app);
      await own.ctx.db.execute(sql`DROP TABLE invitations CASCADE`);
      const log = captureLog();
      const res = await withCsrf(admin.agent.post(`/api/workspaces/${admin.workspaceId}/invitations`), admin.csrf).send({ email: 'someone@example.test', role: 'viewer' });
      expect(res.status).toBe(500);
      expectNoLeak(res.text, ['someone@example.test', 'invitations']);
      expect(log.some((l) => l.includes(res.body.error.id) && /code=42P01/.test(l))).toBe(true);
    } finally {
      await own.close();
    }
  });
});
