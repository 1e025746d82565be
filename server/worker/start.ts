/**
 * A fit worker inside a process: one queue loop per engine thread over the fits queues, finishing
 * steps first so fits already under way end before new ones start.
 */
import type { Config } from '../config';
import type { Database } from '../db/client';
import { fitQueues } from '../fits/jobs';
import { queueSettings, startQueue, workerName, type JobQueue, type Serving } from '../queue/queue';
import { EngineThread } from './engine-thread';
import { fitJobHandler } from './fit-jobs';

export interface RunningWorker {
  queue: JobQueue;
  name: string;
  /** Ends the worker's loops (a running step fails, to be retried), and the queue when the worker started it. */
  stop(): Promise<void>;
}

/** `queue`: the process's queue when it has one already (tests' in-process worker); else the worker starts its own. */
export async function startFitWorker(config: Config, db: Database, options: { name?: string; queue?: JobQueue } = {}): Promise<RunningWorker> {
  const queue = options.queue ?? (await startQueue(queueSettings(config), fitQueues(config)));
  const name = options.name ?? workerName();
  const threads: EngineThread[] = [];
  const deps = { db, name, retryLimit: config.LARIAT_JOB_RETRIES, send: (n: string, data: object, o?: { id?: string }) => queue.send(n, data, o).then(() => undefined) };
  const loops: Serving[] = [];
  for (let s = 0; s < config.LARIAT_WORKER_THREADS; s++) {
    const thread = new EngineThread();
    threads.push(thread);
    loops.push(queue.serve(['fit-finish', 'fit-evaluate', 'fit-fold', 'fit-path'], fitJobHandler(deps, thread)));
  }
  return {
    queue,
    name,
    async stop() {
      // No new steps; the running ones fail when their thread closes, so pg-boss retries them elsewhere.
      const ending = Promise.all(loops.map((l) => l.stop()));
      await Promise.all(threads.map((t) => t.close()));
      await ending;
      if (!options.queue) await queue.stop();
    },
  };
}
