/**
 * The job queue: pg-boss on Lariat's own PostgreSQL (DESIGN.md "Scale"). Generic: start, stop,
 * send, work. Workers fetch one job at a time per slot and keep it alive with a heartbeat, so the
 * expiry can be short: a worker process that dies stops its heartbeat, pg-boss's maintenance expires
 * the job after LARIAT_JOB_EXPIRE_SECONDS and hands it to another worker as a retry
 * (docs/decisions/0004-fits-storage-and-queue.md). pg-boss's own work() is not used because it
 * abandons a handler that runs longer than the expiry.
 */
import { hostname } from 'node:os';
import PgBoss from 'pg-boss';

export interface QueueSettings {
  url: string;
  /** A job whose worker stopped sending heartbeats is retried after this long. */
  expireSeconds: number;
  /** How often expired jobs are looked for (pg-boss maintenance). */
  maintenanceSeconds: number;
  /** Idle workers look for new jobs this often. */
  pollMs: number;
  retryLimit: number;
  /** Connections of the queue's own pool. */
  poolSize?: number;
}

export interface QueuedJob<T> {
  id: string;
  name: string;
  data: T;
  /** 0 for the first attempt. */
  retryCount: number;
}

export type JobHandler<T> = (job: QueuedJob<T>) => Promise<void>;

export interface SendOptions {
  /** A fixed job id: sending the same id twice stores one job (idempotent hand-offs). */
  id?: string;
}

const SCHEMA = 'pgboss';

export class JobQueue {
  private stopped = false;
  private readonly loops: Promise<void>[] = [];
  private readonly wakers = new Set<() => void>();

  private constructor(
    private readonly boss: PgBoss,
    readonly settings: QueueSettings,
  ) {}

  /** Starts pg-boss (creating its schema on first use) and the named queues. */
  static async start(settings: QueueSettings, queues: readonly string[], options: { supervise?: boolean } = {}): Promise<JobQueue> {
    const boss = new PgBoss({
      connectionString: settings.url,
      schema: SCHEMA,
      max: settings.poolSize ?? 4,
      supervise: options.supervise ?? true,
      schedule: false,
      maintenanceIntervalSeconds: settings.maintenanceSeconds,
    });
    boss.on('error', (error: Error) => console.error('[lariat] queue:', error.message));
    await boss.start();
    for (const name of queues) {
      const existing = await boss.getQueue(name);
      const queue = { name, retryLimit: settings.retryLimit, retryDelay: 0, expireInSeconds: settings.expireSeconds };
      if (!existing) await boss.createQueue(name, queue);
      else await boss.updateQueue(name, queue);
    }
    return new JobQueue(boss, settings);
  }

  async send(name: string, data: object, options: SendOptions = {}): Promise<void> {
    await this.boss.send(name, data, options.id ? { id: options.id } : {});
  }

  /**
   * `slots` concurrent loops, each: fetch one job (from the first of `names` that has one, so earlier
   * queues go first), run the handler with a heartbeat, complete it, or fail it so that pg-boss
   * retries it up to the retry limit.
   */
  work<T>(names: string | readonly string[], slots: number, handler: JobHandler<T>): void {
    const list = typeof names === 'string' ? [names] : [...names];
    for (let s = 0; s < slots; s++) this.loops.push(this.loop(list, handler));
  }

  private async fetchOne<T>(names: string[]): Promise<QueuedJob<T> | null> {
    for (const name of names) {
      if (this.stopped) return null;
      try {
        const [job] = await this.boss.fetch<T>(name, { batchSize: 1, includeMetadata: true });
        if (job) return { id: job.id, name, data: job.data, retryCount: job.retryCount };
      } catch (error) {
        if (!this.stopped) console.error(`[lariat] queue ${name}: fetch failed:`, (error as Error).message);
      }
    }
    return null;
  }

  private async loop<T>(names: string[], handler: JobHandler<T>): Promise<void> {
    while (!this.stopped) {
      const job = await this.fetchOne<T>(names);
      if (!job) {
        await this.idle();
        continue;
      }
      const beat = setInterval(() => void this.heartbeat(job.name, job.id), Math.max(250, (this.settings.expireSeconds * 1000) / 3));
      try {
        await handler(job);
        clearInterval(beat);
        await this.boss.complete(job.name, job.id).catch(() => undefined);
      } catch (error) {
        clearInterval(beat);
        const message = error instanceof Error ? error.message : String(error);
        console.error(`[lariat] queue ${job.name}: job ${job.id} failed (attempt ${job.retryCount + 1}):`, message);
        await this.boss.fail(job.name, job.id, { message }).catch(() => undefined);
      }
    }
  }

  /** Waits for the poll interval, or less when stop() or a local send wakes it. */
  private idle(): Promise<void> {
    return new Promise((resolve) => {
      const done = () => {
        clearTimeout(timer);
        this.wakers.delete(done);
        resolve();
      };
      const timer = setTimeout(done, this.settings.pollMs);
      this.wakers.add(done);
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

  /** Stops fetching, waits for running handlers to end, and closes pg-boss. */
  async stop(options: { wait?: boolean } = {}): Promise<void> {
    this.stopped = true;
    for (const wake of [...this.wakers]) wake();
    if (options.wait !== false) await Promise.allSettled(this.loops);
    await this.boss.stop({ graceful: false, wait: true }).catch(() => undefined);
  }
}

/** A name for this worker process in fold records: LARIAT_WORKER_NAME, else host:pid. */
export function workerName(env: NodeJS.ProcessEnv = process.env): string {
  return env.LARIAT_WORKER_NAME || `${hostname()}:${process.pid}`;
}
