/**
 * The job queue: pg-boss on Lariat's own PostgreSQL, ONE instance per process, shared by every
 * feature (docs/decisions/0020-one-job-queue.md, 0018-fits-storage-and-queue.md). A feature names its
 * queue, sends plain JSON data (never secrets: jobs sit in the pgboss tables), and works it:
 *
 *   await ctx.queue.work<{ id: string }>('thing-mail', (data) => mailThing(ctx, data.id), { retryLimit: 8, retryDelaySeconds: 2 });
 *   await ctx.queue.send('thing-mail', { id });
 *
 * Retry policies belong to the queue (pg-boss v10 copies them into each job when it is sent): work()
 * sets them before any job of that process is sent; queues whose senders and workers live in other
 * processes (the fits) are defined with their policy when the queue starts (startQueue's `queues`).
 * A handler that throws is retried up to retryLimit times, after retryDelaySeconds (doubling with
 * retryBackoff; work() defaults to 5 tries after 5, 10, 20... s).
 *
 * pg-boss's own work() is not used: it abandons a handler that runs longer than the expiry. Our loops
 * fetch one job at a time and keep it alive with a heartbeat, so an expiry can be short: a process
 * that dies stops its heartbeat, pg-boss's maintenance expires the job and it is retried elsewhere.
 */
import { hostname } from 'node:os';
import PgBoss from 'pg-boss';
import type { Config } from '../config';
import { reportUnexpected } from '../http/unexpected';

export interface QueueSettings {
  url: string;
  /** How often expired jobs are looked for (pg-boss maintenance). */
  maintenanceSeconds: number;
  /** Idle loops look for new jobs this often (a send in the same process wakes them at once). */
  pollMs: number;
  /** Connections of the queue's own pool. */
  poolSize?: number;
}

/** A queue's retry policy, stored with the queue. */
export interface QueueOptions {
  retryLimit?: number;
  retryDelaySeconds?: number;
  /** Double the delay at each retry (2, 4, 8... s); work() defaults it to true. */
  retryBackoff?: boolean;
  /** A job whose worker stopped its heartbeat is retried after this long (default pg-boss's 15 min). */
  expireSeconds?: number;
}

export interface SendOptions {
  /** A fixed job id: sending the same id twice stores one job (idempotent hand-offs). */
  id?: string;
}

export interface QueuedJob<T> {
  id: string;
  name: string;
  data: T;
  /** 0 for the first attempt. */
  retryCount: number;
}

export type JobHandler<T> = (job: QueuedJob<T>) => Promise<void>;

/** What features get in ctx.queue. */
export interface Queue {
  /** Adds a job; the local workers of that queue are woken at once. Returns the job id (null when a job with that id exists). */
  send(name: string, data: object, options?: SendOptions): Promise<string | null>;
  /** Sets the queue's retry policy and runs `handler` for each of its jobs (one at a time per process). */
  work<T extends object>(name: string, handler: (data: T, job: { id: string; retryCount: number }) => Promise<void>, options?: QueueOptions): Promise<void>;
  stop(): Promise<void>;
}

/** Loops started by JobQueue.serve, stoppable on their own (a fit worker inside a process that keeps its queue). */
export interface Serving {
  stop(): Promise<void>;
}

const SCHEMA = 'pgboss';
/** pg-boss's default expiry, for heartbeats of queues that set none. */
const DEFAULT_EXPIRE_SECONDS = 15 * 60;
/** How long stop() waits for running handlers before closing pg-boss anyway. */
const STOP_GRACE_MS = 10_000;

/** Creates the pgboss schema if missing (migrations call this, so tests' template databases carry it). */
export async function installQueue(connectionString: string): Promise<void> {
  const boss = new PgBoss({ connectionString, schema: SCHEMA, max: 1, supervise: false, schedule: false });
  boss.on('error', (error) => reportUnexpected(error, 'queue install'));
  await boss.start();
  await boss.stop({ graceful: false, wait: true });
}

/** Queue settings from the configuration (API and worker processes alike). */
export function queueSettings(config: Config, url = config.DATABASE_URL): QueueSettings {
  return { url, maintenanceSeconds: config.LARIAT_QUEUE_MAINTENANCE_SECONDS, pollMs: config.LARIAT_QUEUE_POLL_MS };
}

/** Starts this process's queue, defining `queues` (name -> policy) first. */
export async function startQueue(settings: QueueSettings, queues: Record<string, QueueOptions> = {}): Promise<JobQueue> {
  const boss = new PgBoss({
    connectionString: settings.url,
    schema: SCHEMA,
    max: settings.poolSize ?? 4,
    schedule: false,
    maintenanceIntervalSeconds: settings.maintenanceSeconds,
  });
  boss.on('error', (error: Error) => reportUnexpected(error, 'queue'));
  await boss.start();
  const queue = new JobQueue(boss, settings);
  for (const [name, options] of Object.entries(queues)) await queue.define(name, options);
  return queue;
}

export class JobQueue implements Queue {
  private stopped = false;
  private stopping: Promise<void> | null = null;
  private readonly loops: Promise<void>[] = [];
  /** Idle loops, by the queue names they serve. */
  private readonly wakers = new Map<() => void, readonly string[]>();
  /** Queues known to exist, with their expiry (for heartbeats). */
  private readonly known = new Map<string, Promise<void>>();
  private readonly expiry = new Map<string, number>();

  constructor(
    private readonly boss: PgBoss,
    readonly settings: QueueSettings,
  ) {}

  /** Creates the queue with this policy, or applies the policy to the queue that exists. */
  async define(name: string, options: QueueOptions = {}): Promise<void> {
    // pg-boss checks which keys are present ('expireInSeconds' in options): leave unset ones out.
    const given = { retryLimit: options.retryLimit, retryDelay: options.retryDelaySeconds, retryBackoff: options.retryBackoff, expireInSeconds: options.expireSeconds };
    const policy: PgBoss.Queue = { name, ...Object.fromEntries(Object.entries(given).filter(([, v]) => v !== undefined)) };
    // create_queue inserts ON CONFLICT DO NOTHING, so processes starting together are safe; the
    // update applies this process's policy to a queue that already existed.
    const ready = (async () => {
      await this.boss.createQueue(name, policy);
      await this.boss.updateQueue(name, policy);
    })();
    this.remember(name, ready);
    if (options.expireSeconds !== undefined) this.expiry.set(name, options.expireSeconds);
    await ready;
  }

  /** A queue being created; forgotten if that fails, so the next send or work tries again. */
  private remember(name: string, ready: Promise<void>): void {
    this.known.set(name, ready);
    ready.catch(() => {
      if (this.known.get(name) === ready) this.known.delete(name);
    });
  }

  async send(name: string, data: object, options: SendOptions = {}): Promise<string | null> {
    let ready = this.known.get(name);
    if (!ready) {
      // A queue nobody defined yet in this process: created with pg-boss's defaults (work() elsewhere sets its policy).
      ready = this.boss.createQueue(name);
      this.remember(name, ready);
    }
    await ready;
    const id = await this.boss.send(name, data, options.id ? { id: options.id } : {});
    for (const [wake, names] of [...this.wakers]) if (names.includes(name)) wake();
    return id;
  }

  async work<T extends object>(name: string, handler: (data: T, job: { id: string; retryCount: number }) => Promise<void>, options: QueueOptions = {}): Promise<void> {
    // The defaults every feature has had since the queue began: 5 tries, after 5, 10, 20... s.
    await this.define(name, { retryLimit: 5, retryDelaySeconds: 5, retryBackoff: true, ...options });
    // Log through reportUnexpected: a handler's error may quote what it worked on (an address, a row).
    this.serve<T>([name], (job) => handler(job.data, { id: job.id, retryCount: job.retryCount }), (error, job) => reportUnexpected(error, `job ${job.name} ${job.id}`));
  }

  /**
   * One loop: fetch one job (from the first of `names` that has one, so earlier queues go first), run
   * the handler with a heartbeat, complete it, or fail it so that pg-boss retries it by its queue's
   * policy. Call it once per concurrent slot.
   */
  serve<T>(names: readonly string[], handler: JobHandler<T>, report: (error: unknown, job: QueuedJob<T>) => void = logFailure): Serving {
    const state = { stopped: false };
    const list = [...names];
    const loop = this.loop(list, handler, report, state);
    this.loops.push(loop);
    return {
      stop: async () => {
        state.stopped = true;
        for (const [wake, served] of [...this.wakers]) if (served === list) wake();
        await loop;
      },
    };
  }

  private async fetchOne<T>(names: string[], state: { stopped: boolean }): Promise<QueuedJob<T> | null> {
    for (const name of names) {
      if (this.stopped || state.stopped) return null;
      try {
        const [job] = await this.boss.fetch<T>(name, { batchSize: 1, includeMetadata: true });
        if (job) return { id: job.id, name, data: job.data, retryCount: job.retryCount };
      } catch (error) {
        if (!this.stopped) console.error(`[lariat] queue ${name}: fetch failed:`, (error as Error).message);
      }
    }
    return null;
  }

  private async loop<T>(names: string[], handler: JobHandler<T>, report: (error: unknown, job: QueuedJob<T>) => void, state: { stopped: boolean }): Promise<void> {
    while (!this.stopped && !state.stopped) {
      const job = await this.fetchOne<T>(names, state);
      if (!job) {
        if (!this.stopped && !state.stopped) await this.idle(names);
        continue;
      }
      const expire = this.expiry.get(job.name) ?? DEFAULT_EXPIRE_SECONDS;
      const beat = setInterval(() => void this.heartbeat(job.name, job.id), Math.max(250, (expire * 1000) / 3));
      try {
        await handler(job);
        clearInterval(beat);
        await this.boss.complete(job.name, job.id).catch(() => undefined);
      } catch (error) {
        clearInterval(beat);
        report(error, job);
        await this.boss.fail(job.name, job.id, { message: error instanceof Error ? error.message : String(error) }).catch(() => undefined);
      }
    }
  }

  /** Waits for the poll interval, or less when stop() or a local send to one of `names` wakes it. */
  private idle(names: readonly string[]): Promise<void> {
    return new Promise((resolve) => {
      const done = () => {
        clearTimeout(timer);
        this.wakers.delete(done);
        resolve();
      };
      const timer = setTimeout(done, this.settings.pollMs);
      this.wakers.set(done, names);
    });
  }

  /** Keeps an active job from expiring while its worker is alive (pg-boss expires on started_on + expire_in). */
  private async heartbeat(name: string, id: string): Promise<void> {
    if (this.stopped) return;
    try {
      await this.boss
        .getDb()
        .executeSql(`UPDATE ${SCHEMA}.job SET started_on = now() WHERE name = $1 AND id = $2 AND state = 'active'`, [name, id]);
    } catch (error) {
      console.error(`[lariat] queue ${name}: heartbeat failed:`, (error as Error).message);
    }
  }

  /** Stops fetching, waits (a few seconds at most) for running handlers to end, and closes pg-boss. Idempotent. */
  stop(): Promise<void> {
    this.stopping ??= (async () => {
      this.stopped = true;
      for (const wake of [...this.wakers.keys()]) wake();
      let timer: NodeJS.Timeout | undefined;
      await Promise.race([Promise.allSettled(this.loops), new Promise((r) => (timer = setTimeout(r, STOP_GRACE_MS)))]);
      clearTimeout(timer);
      await this.boss.stop({ graceful: false, wait: true }).catch(() => undefined);
    })();
    return this.stopping;
  }
}

function logFailure(error: unknown, job: QueuedJob<unknown>): void {
  const message = error instanceof Error ? error.message : String(error);
  console.error(`[lariat] queue ${job.name}: job ${job.id} failed (attempt ${job.retryCount + 1}):`, message);
}

/** A name for this worker process in fold records: LARIAT_WORKER_NAME, else host:pid. */
export function workerName(env: NodeJS.ProcessEnv = process.env): string {
  return env.LARIAT_WORKER_NAME || `${hostname()}:${process.pid}`;
}
