/**
 * The job queue (pg-boss on Lariat's own PostgreSQL): one instance per process, shared by every
 * feature. Generic on purpose: start/stop, send a job, work a queue. A feature names its queue,
 * sends plain JSON data (never secrets: jobs sit in the pgboss tables), and registers one handler.
 *
 *   const queue = await startQueue(config.DATABASE_URL);
 *   await queue.work<{ id: string }>('fit-run', async (data) => { ... }, { retryLimit: 3 });
 *   await queue.send('fit-run', { id });
 *   await queue.stop();
 *
 * A handler that throws is retried (retryLimit, retryDelay seconds, doubling with retryBackoff);
 * failures are logged through reportUnexpected, without the job's data.
 */
import PgBoss from 'pg-boss';
import { reportUnexpected } from '../http/unexpected';

export interface QueueOptions {
  retryLimit?: number;
  retryDelaySeconds?: number;
  retryBackoff?: boolean;
}

export interface Queue {
  /** Adds a job; the local workers of that queue are woken at once. Returns the job id. */
  send(name: string, data: object): Promise<string | null>;
  /** Runs `handler` for each job of `name` (one at a time per process). */
  work<T extends object>(name: string, handler: (data: T, job: { id: string }) => Promise<void>, options?: QueueOptions): Promise<void>;
  stop(): Promise<void>;
}

/** Creates the pgboss schema if missing (migrations call this, so tests' template databases carry it). */
export async function installQueue(connectionString: string): Promise<void> {
  const boss = new PgBoss({ connectionString, max: 1, supervise: false, schedule: false });
  boss.on('error', (error) => reportUnexpected(error, 'queue install'));
  await boss.start();
  await boss.stop({ graceful: false, wait: true });
}

export async function startQueue(connectionString: string, options: { max?: number } = {}): Promise<Queue> {
  const boss = new PgBoss({ connectionString, max: options.max ?? 2, schedule: false });
  boss.on('error', (error) => reportUnexpected(error, 'queue'));
  await boss.start();
  const workers = new Map<string, string[]>();

  return {
    async send(name, data) {
      await boss.createQueue(name);
      const id = await boss.send(name, data);
      for (const worker of workers.get(name) ?? []) boss.notifyWorker(worker);
      return id;
    },
    async work(name, handler, opts = {}) {
      await boss.createQueue(name, {
        name,
        retryLimit: opts.retryLimit ?? 5,
        retryDelay: opts.retryDelaySeconds ?? 5,
        retryBackoff: opts.retryBackoff ?? true,
      });
      const id = await boss.work<object>(name, { pollingIntervalSeconds: 2, batchSize: 1 }, async (jobs) => {
        for (const job of jobs) {
          try {
            await handler(job.data as Parameters<typeof handler>[0], { id: job.id });
          } catch (error) {
            reportUnexpected(error, `job ${name} ${job.id}`);
            throw error; // pg-boss marks it failed and retries it
          }
        }
      });
      workers.set(name, [...(workers.get(name) ?? []), id]);
    },
    async stop() {
      await boss.stop({ graceful: true, wait: true, timeout: 5000 });
    },
  };
}
