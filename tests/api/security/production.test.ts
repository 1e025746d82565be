/** Issue 8 item 5: production refuses development settings and the demo account; the seed stays out of production. */
import { execFileSync } from 'node:child_process';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { ensureUserWithWorkspace } from '../../../server/accounts/accounts';
import { findUserByEmail } from '../../../server/accounts/users';
import { DEVELOPMENT_SESSION_SECRET, loadConfig } from '../../../server/config';
import { DEMO_ACCOUNT } from '../../../server/seed/demo-account';
import { productionDatabaseProblems } from '../../../server/security/production-checks';
import { startTestApp, type TestApp } from '../../support/app';

const GOOD = {
  NODE_ENV: 'production',
  LARIAT_SESSION_SECRET: 'a-production-secret-of-at-least-32-characters',
  LARIAT_PUBLIC_URL: 'https://lariat.example.test',
};

describe('production configuration', () => {
  it('accepts a proper production configuration', () => {
    expect(loadConfig(GOOD).publicUrl).toBe('https://lariat.example.test');
  });

  it.each([
    ['the development session secret', { LARIAT_SESSION_SECRET: DEVELOPMENT_SESSION_SECRET }, /development secret/],
    ['no session secret', { LARIAT_SESSION_SECRET: undefined }, /LARIAT_SESSION_SECRET is required/],
    ['an http public URL', { LARIAT_PUBLIC_URL: 'http://lariat.example.test' }, /LARIAT_PUBLIC_URL must be an https/],
    ['no public URL', { LARIAT_PUBLIC_URL: undefined }, /LARIAT_PUBLIC_URL must be an https/],
    ['the development outbox', { LARIAT_DEV_OUTBOX: '1' }, /LARIAT_DEV_OUTBOX/],
  ])('refuses %s', (_what, change, message) => {
    const env: Record<string, string | undefined> = { ...GOOD, ...change };
    expect(() => loadConfig(env)).toThrow(message);
  });

  it('lets development run with the development defaults', () => {
    expect(loadConfig({ NODE_ENV: 'development' }).sessionSecret).toBe(DEVELOPMENT_SESSION_SECRET);
  });
});

describe('the demo account', () => {
  let t: TestApp;
  beforeAll(async () => {
    t = await startTestApp();
  });
  afterAll(async () => {
    await t?.close();
  });

  it('is not seeded when NODE_ENV is production', () => {
    const out = execFileSync('npx', ['tsx', 'server/seed/demo.ts'], {
      env: { ...process.env, NODE_ENV: 'production', DATABASE_URL: 'postgres://nobody@127.0.0.1:1/none' },
      encoding: 'utf8',
      stdio: ['ignore', 'pipe', 'pipe'],
    });
    expect(out).toBe('');
  });

  it('stops a production start while it exists, and not otherwise', async () => {
    const production = { ...t.ctx.config, ...loadConfig({ ...GOOD, DATABASE_URL: 'unused' }) };
    expect(await productionDatabaseProblems(production, t.ctx.db)).toEqual([]);
    await ensureUserWithWorkspace(t.ctx.db, { email: DEMO_ACCOUNT.email, password: DEMO_ACCOUNT.password, name: DEMO_ACCOUNT.name, workspaceName: DEMO_ACCOUNT.workspace, role: 'admin' });
    expect(await findUserByEmail(t.ctx.db, DEMO_ACCOUNT.email)).not.toBeNull();
    const problems = await productionDatabaseProblems(production, t.ctx.db);
    expect(problems).toHaveLength(1);
    expect(problems[0]).toMatch(/demo account .* exists/);
    expect(await productionDatabaseProblems(t.ctx.config, t.ctx.db)).toEqual([]);
  });
});
