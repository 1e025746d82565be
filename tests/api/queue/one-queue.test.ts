/**
 * The process's one job queue (server/queue/queue.ts, docs/decisions/0020-one-job-queue.md): each
 * queue keeps its own retry policy on the same pg-boss instance. E-mail-style queues retry after a
 * delay that doubles (pg-boss v10: attempt n waits between d * 2^(n-1) and twice that); fit queues
 * retry at once; a job that outlives its expiry is kept alive by the heartbeat, not retried.
 */
import { sql } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startTestApp, type TestApp } from '../../support/app';

let t: TestApp;
beforeAll(async () => {
  // Short expiry and maintenance for the fits queues, as the fits tests run them.
  t = await startTestApp({ LARIAT_JOB_EXPIRE_SECONDS: '2', LARIAT_QUEUE_MAINTENANCE_SECONDS: '1', LARIAT_QUEUE_POLL_MS: '200', LARIAT_JOB_RETRIES: '3' });
});
afterAll(async () => {
  await t?.close();
});

async function until(what: string, check: () => boolean, timeoutMs = 60_000): Promise<void> {
  const deadline = Date.now() + timeoutMs;
  while (!check()) {
    if (Date.now() > deadline) throw new Error(`Timed out waiting for: ${what}`);
    await new Promise((r) => setTimeout(r, 50));
  }
}

async function policy(name: string) {
  const rows = await t.ctx.db.execute(sql`SELECT retry_limit, retry_delay, retry_backoff, expire_seconds FROM pgboss.queue WHERE name = ${name}`);
  return rows.rows[0] as { retry_limit: number; retry_delay: number; retry_backoff: boolean; expire_seconds: number | null } | undefined;
}

describe('one queue, per-queue retry policies', () => {
  it('stores each queue its own policy: invitation e-mails back off, fit steps retry at once with a short expiry', async () => {
    expect(await policy('invitation-mail')).toEqual({ retry_limit: 8, retry_delay: 2, retry_backoff: true, expire_seconds: null });
    for (const name of ['fit-path', 'fit-fold', 'fit-finish', 'fit-evaluate']) {
      expect(await policy(name)).toEqual({ retry_limit: 3, retry_delay: 0, retry_backoff: false, expire_seconds: 2 });
    }
  });

  it('a work() handler that throws is retried after a doubling delay, then its job completes', async () => {
    const attempts: number[] = [];
    await t.ctx.queue.work<{ n: number }>(
      'queue-test-backoff',
      async () => {
        attempts.push(Date.now());
        if (attempts.length < 3) throw new Error('relay down');
      },
      { retryLimit: 4, retryDelaySeconds: 1 },
    );
    const id = await t.ctx.queue.send('queue-test-backoff', { n: 1 });
    await until('three attempts', () => attempts.length >= 3);
    // First retry after at least 1 s, the second after at least 2 s (50 ms for clock granularity).
    expect(attempts[1] - attempts[0]).toBeGreaterThanOrEqual(950);
    expect(attempts[2] - attempts[1]).toBeGreaterThanOrEqual(1950);
    const deadline = Date.now() + 10_000;
    let state = '';
    while (Date.now() < deadline) {
      const rows = await t.ctx.db.execute(sql`SELECT state FROM pgboss.job WHERE name = 'queue-test-backoff' AND id = ${id}`);
      state = (rows.rows[0] as { state: string } | undefined)?.state ?? '';
      if (state === 'completed') break;
      await new Promise((r) => setTimeout(r, 100));
    }
    expect(state).toBe('completed');
    expect(attempts).toHaveLength(3);
  }, 90_000);

  it('a job running past its expiry is kept alive by the heartbeat: one attempt, no retry', async () => {
    const runs: string[] = [];
    const serving = t.queue.serve<{ fitId: string }>(['fit-finish', 'fit-path'], async (job) => {
      runs.push(job.name);
      // Longer than the 2 s expiry, with maintenance every second.
      await new Promise((r) => setTimeout(r, 4_000));
    });
    try {
      await t.ctx.queue.send('fit-path', { fitId: 'heartbeat-test' });
      await until('the job to start', () => runs.length >= 1);
      await new Promise((r) => setTimeout(r, 6_000));
      expect(runs).toEqual(['fit-path']);
      const rows = await t.ctx.db.execute(sql`SELECT state, retry_count FROM pgboss.job WHERE name = 'fit-path'`);
      expect(rows.rows).toEqual([{ state: 'completed', retry_count: 0 }]);
    } finally {
      await serving.stop();
    }
  }, 60_000);
});
