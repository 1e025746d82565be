/** The development outbox (opt-in, never in production; see tests/api/security/outbox.test.ts) and the demo seed's account service. */
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { ensureUserWithWorkspace } from '../../../server/accounts/accounts';
import { startTestApp, type TestApp } from '../../support/app';
import { inviteAndJoin, signIn, signUp, uniqueEmail } from '../../support/session';

let t: TestApp;
beforeAll(async () => {
  t = await startTestApp({ LARIAT_DEV_OUTBOX: '1' });
});
afterAll(async () => {
  await t?.close();
});

describe('dev outbox', () => {
  it('lists the e-mails an admin may see, newest first', async () => {
    const admin = await signUp(t.app);
    const email = uniqueEmail('outbox');
    await inviteAndJoin(t, admin, email, 'viewer');
    const res = await admin.agent.get('/api/dev/outbox');
    expect(res.status).toBe(200);
    const ids = res.body.messages.map((m: { id: number }) => m.id);
    expect(ids).toEqual([...ids].sort((x, y) => y - x));
    expect(res.body.messages.find((m: { to: string[] }) => m.to.includes(email)).subject).toMatch(/invited you/);
  });

  it('does not exist in production (404)', async () => {
    const prod = await startTestApp({ NODE_ENV: 'production', LARIAT_SESSION_SECRET: 'a-production-secret-of-at-least-32-characters', LARIAT_PUBLIC_URL: 'https://lariat.example.test' });
    try {
      const res = await request(prod.app).get('/api/dev/outbox');
      expect(res.status).toBe(404);
    } finally {
      await prod.close();
    }
  });
});

describe('ensureUserWithWorkspace (demo seed)', () => {
  it('creates the account and workspace once; a second call returns the same ids', async () => {
    const input = { email: 'Seed.Person@Example.test', password: 'seeded passphrase 42', name: 'Seed Person', workspaceName: 'Seeded', role: 'admin' as const };
    const first = await ensureUserWithWorkspace(t.ctx.db, input);
    const second = await ensureUserWithWorkspace(t.ctx.db, input);
    expect(second).toEqual(first);
    const s = await signIn(t.app, 'seed.person@example.test', input.password);
    const list = (await s.agent.get('/api/workspaces')).body.workspaces;
    expect(list).toEqual([expect.objectContaining({ id: first.workspaceId, name: 'Seeded', role: 'admin' })]);
  });
});
