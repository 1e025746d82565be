/**
 * Issue 8 item 7: NUL and other control characters in text fields are a 400 naming the field (they
 * were a 500 from PostgreSQL), and nothing is stored.
 */
import { count } from 'drizzle-orm';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { users, workspaces } from '../../../server/db/schema/auth';
import { singleLine, multiLine } from '../../../shared/text';
import { z } from 'zod';
import { startTestApp, type TestApp } from '../../support/app';
import { signUp, TEST_PASSWORD, uniqueEmail, withCsrf } from '../../support/session';
import { closeApp, tableCounts, upload } from '../datasets/support';

let t: TestApp;
beforeAll(async () => {
  t = await startTestApp({ LARIAT_RATE_LIMIT_FACTOR: '100' });
});
afterAll(async () => {
  await closeApp(t);
});

const rowCount = async (table: typeof users | typeof workspaces) => (await t.ctx.db.select({ n: count() }).from(table))[0].n;

function expectRefused(res: request.Response, field: string): void {
  expect(res.status, JSON.stringify(res.body)).toBe(400);
  expect(res.body.error.field).toBe(field);
  expect(res.body.error.message).toMatch(new RegExp(`^${field.replace('.', '\\.')}: .*control character`));
}

describe('control characters in text fields', () => {
  it.each([
    ['name', { name: 'Ada\u0000Lovelace' }],
    ['workspaceName', { workspaceName: 'Dairy\u0000' }],
    ['workspaceName', { workspaceName: 'Dairy\u001b[31m' }],
    ['email', { email: 'ada\u0000@example.test' }],
  ])('sign-up refuses %s with a control character', async (field, change) => {
    const before = await rowCount(users);
    const res = await request(t.app)
      .post('/api/auth/sign-up')
      .send({ email: uniqueEmail('nul'), password: TEST_PASSWORD, name: 'Ada', workspaceName: 'W', ...change });
    expectRefused(res, field);
    expect(await rowCount(users)).toBe(before);
  });

  it('refuses a workspace name with NUL', async () => {
    const s = await signUp(t.app);
    const before = await rowCount(workspaces);
    expectRefused(await withCsrf(s.agent.post('/api/workspaces'), s.csrf).send({ name: 'a\u0000b' }), 'name');
    expect(await rowCount(workspaces)).toBe(before);
  });

  it('refuses an invitation address with NUL', async () => {
    const s = await signUp(t.app);
    const res = await withCsrf(s.agent.post(`/api/workspaces/${s.workspaceId}/invitations`), s.csrf).send({ email: 'x\u0000@example.test', role: 'viewer' });
    expectRefused(res, 'email');
  });

  it.each([
    ['name', { name: 'Vats\u0000' }],
    ['description', { description: 'line one\nline two\u0000' }],
  ])('refuses a dataset %s with NUL, storing nothing', async (field, fields) => {
    const s = await signUp(t.app);
    const before = await tableCounts(t);
    expectRefused(await upload(s, 'a,b\n1,2\n', 'ok.csv', fields), field);
    expect(await tableCounts(t)).toEqual(before);
  });

  it('keeps line breaks in a description and refuses them in a one-line name', () => {
    expect(multiLine(z.string()).safeParse('one\r\ntwo\tthree').success).toBe(true);
    expect(singleLine(z.string()).safeParse('one\ntwo').success).toBe(false);
    expect(singleLine(z.string()).safeParse('Café ünïcode — 統計').success).toBe(true);
    expect(singleLine(z.string()).safeParse('c1 \u0085 control').success).toBe(false);
  });
});
