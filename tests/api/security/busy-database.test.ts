/**
 * When every database connection stays busy for the whole connection timeout, a request gets 503
 * with Retry-After (a capacity problem, not a server fault: no generic 500 with an error id), and the
 * same request succeeds once a connection is free again.
 */
import type pg from 'pg';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startTestApp, type TestApp } from '../../support/app';
import { signUp, type Session } from '../../support/session';

let t: TestApp;
let alice: Session;

beforeAll(async () => {
  t = await startTestApp({ LARIAT_DB_CONNECT_TIMEOUT_MS: '300' });
  alice = await signUp(t.app);
});
afterAll(async () => t.close());

describe('a saturated connection pool', () => {
  it('answers 503 with Retry-After, then serves the request once a connection is free', async () => {
    const held: pg.PoolClient[] = [];
    try {
      // The test app's pool has 4 connections: hold them all.
      for (let i = 0; i < 4; i++) held.push(await t.pool.connect());
      const busy = await alice.agent.get('/api/workspaces');
      expect(busy.status, JSON.stringify(busy.body)).toBe(503);
      expect(busy.headers['retry-after']).toBe('5');
      expect(busy.body.error.message).toMatch(/busy/);
      expect(busy.body.error.id).toBeUndefined();
    } finally {
      for (const c of held) c.release();
    }
    const free = await alice.agent.get('/api/workspaces');
    expect(free.status).toBe(200);
  });
});
