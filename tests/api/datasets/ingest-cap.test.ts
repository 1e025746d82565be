/**
 * The per-process ingest cap: with one slot and one place in the queue, a second upload waits
 * ("queued") and a third is refused at once with 429 and Retry-After, storing nothing; when the first
 * ends the waiting one runs. And a query that cannot get a database connection gives up after the
 * connection timeout instead of waiting forever.
 */
import { createHash, randomUUID } from 'node:crypto';
import { sql } from 'drizzle-orm';
import pg from 'pg';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { connectDatabase } from '../../../server/db/client';
import { startTestApp, type TestApp } from '../../support/app';
import { signUp, withCsrf, type Session } from '../../support/session';
import { apiBase, closeApp, tableCounts, upload, uploadUrl } from './support';

let t: TestApp;
let alice: Session;

beforeAll(async () => {
  t = await startTestApp({ LARIAT_INGEST_SLOTS: '1', LARIAT_INGEST_QUEUE: '1' });
  alice = await signUp(t.app);
});
afterAll(async () => closeApp(t));

const file = (k: number) => `a,b\n${k},1\n2,3\n`;

async function waitFor(what: string, test: () => Promise<boolean>): Promise<void> {
  for (let i = 0; i < 500; i++) {
    if (await test()) return;
    await new Promise((r) => setTimeout(r, 20));
  }
  throw new Error(`timed out waiting for ${what}`);
}

describe('ingest cap', () => {
  it('one running, one queued, the next refused with 429 and Retry-After; then the queued one runs', async () => {
    // The first ingest is held inside its transaction by a lock this test takes on its checksum.
    const holder = new pg.Client({ connectionString: t.ctx.config.DATABASE_URL });
    await holder.connect();
    const key = `lariat-checksum:${alice.workspaceId}:${createHash('sha256').update(file(1)).digest('hex')}`;
    try {
      await holder.query('SELECT pg_advisory_lock(hashtextextended($1, 0))', [key]);
      const first = upload(alice, file(1), 'first.csv').then((r) => r);
      await waitFor('the first ingest to hold its slot', async () => {
        const r = await holder.query<{ n: number }>("SELECT count(*)::int AS n FROM pg_locks WHERE locktype = 'advisory' AND NOT granted AND database = (SELECT oid FROM pg_database WHERE datname = current_database())");
        return r.rows[0].n === 1;
      });
      const queuedId = randomUUID();
      const second = withCsrf(alice.agent.post(uploadUrl(alice, queuedId)), alice.csrf)
        .attach('file', Buffer.from(file(2)), 'second.csv')
        .then((r) => r);
      await waitFor('the second upload to wait in the queue', async () => (await alice.agent.get(`${apiBase(alice)}/ingests/${queuedId}`)).body.phase === 'queued');

      const before = await tableCounts(t);
      const third = await upload(alice, file(3), 'third.csv');
      expect(third.status).toBe(429);
      expect(third.headers['retry-after']).toBe('30');
      expect(third.body.error).toEqual({ message: 'The server is already storing as many uploads as it can; nothing was stored. Try again in 30 seconds.', field: 'file' });
      expect(await tableCounts(t)).toEqual(before);

      await holder.query('SELECT pg_advisory_unlock(hashtextextended($1, 0))', [key]);
      expect((await first).status).toBe(201);
      expect((await second).status).toBe(201);
      // Both slots are free again: a new upload goes straight through.
      expect((await upload(alice, file(4), 'fourth.csv')).status).toBe(201);
    } finally {
      await holder.end();
    }
  });
});

describe('database connection timeout', () => {
  it('a query that cannot get a connection fails after the timeout instead of hanging', async () => {
    const handle = connectDatabase(t.ctx.config.DATABASE_URL, 1, 300);
    const busy = await handle.pool.connect(); // the pool's only connection, held
    try {
      const outcome = await Promise.race([
        handle.db.execute(sql`SELECT 1`).then(
          () => 'answered',
          (error: Error) => `failed: ${(error.cause as Error | undefined)?.message ?? error.message}`, // drizzle wraps the driver's error
        ),
        new Promise((r) => setTimeout(() => r('still waiting after 5 s'), 5000)),
      ]);
      expect(outcome).toBe('failed: timeout exceeded when trying to connect');
    } finally {
      busy.release();
      await handle.close();
    }
  });
});
