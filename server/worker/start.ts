/**
 * A fit worker inside a process: the queue loops (one per engine thread) over the fits queues,
 * finishing steps first so fits already under way end before new ones start.
 */
import type { Config } from '../config';
import type { Database } from '../db/client';
import { FIT_QUEUES } from '../fits/jobs';
import { JobQueue, workerName } from '../queue/boss';
import { EngineThread } from './engine-thread';
import { fitJobHandler } from './fit-jobs';

export interface RunningWorker {
  queue: JobQueue;
  name: string;
  stop(): Promise<void>;
}

/** Queue settings from the configuration (shared by the API, which only sends, and the workers). */
export function queueSettings(config: Config, url: string) {
  return {
    url,
    expireSeconds: config.LARIAT_JOB_EXPIRE_SECONDS,
    maintenanceSeconds: config.LARIAT_QUEUE_MAINTENANCE_SECONDS,
    pollMs: config.LARIAT_QUEUE_POLL_MS,
    retryLimit: config.LARIAT_JOB_RETRIES,
  };
}

export async function startFitWorker(config: Config, db: Database, options: { name?: string; queue?: JobQueue } = {}): Promise<RunningWorker> {
  const queue = options.queue ?? (await JobQueue.start(queueSettings(config, config.DATABASE_URL), FIT_QUEUES));
  const name = options.name ?? workerName();
  const threads: EngineThread[] = [];
  const deps = { db, name, retryLimit: config.LARIAT_JOB_RETRIES, send: (n: string, data: object, o?: { id?: string }) => queue.send(n, data, o) };
  for (let s = 0; s < config.LARIAT_WORKER_THREADS; s++) {
    const thread = new EngineThread();
    threads.push(thread);
    queue.work(['fit-finish', 'fit-evaluate', 'fit-fold', 'fit-path'], 1, fitJobHandler(deps, thread));
  }
  return {
    queue,
    name,
    async stop() {
      await Promise.all(threads.map((t) => t.close()));
      await queue.stop();
    },
  };
}
