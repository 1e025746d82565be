/**
 * The fits queue's jobs. A fit runs as: fit-path (the full-data path), then one fit-fold job per
 * cross-validation fold (any worker may take any fold), then fit-finish (combines the folds, chooses
 * lambda, evaluates it). fit-evaluate computes the refit and diagnostics for a newly chosen lambda.
 */
import { createHash } from 'node:crypto';
import type { Config } from '../config';
import type { QueueOptions } from '../queue/queue';

export const FIT_QUEUES = ['fit-path', 'fit-fold', 'fit-finish', 'fit-evaluate'] as const;
export type FitQueue = (typeof FIT_QUEUES)[number];

export interface PathJob {
  fitId: string;
}
export interface FoldJob {
  fitId: string;
  fold: number;
}
export interface FinishJob {
  fitId: string;
}
export interface EvaluateJob {
  fitId: string;
  index: number;
}

/**
 * A job id fixed by what the job does, so a retried step that sends its hand-off again stores no
 * second job (pg-boss inserts with ON CONFLICT DO NOTHING).
 */
export function jobId(...parts: (string | number)[]): string {
  const h = createHash('sha256').update(parts.join(':')).digest('hex');
  return `${h.slice(0, 8)}-${h.slice(8, 12)}-4${h.slice(13, 16)}-8${h.slice(17, 20)}-${h.slice(20, 32)}`;
}

/**
 * The fits queues' policy, defined by every process that starts a queue (API, workers, tests): a
 * failed step is retried at once, and a step whose worker stopped its heartbeat after
 * LARIAT_JOB_EXPIRE_SECONDS (docs/decisions/0018-fits-storage-and-queue.md).
 */
export function fitQueues(config: Config): Record<FitQueue, QueueOptions> {
  const policy: QueueOptions = { retryLimit: config.LARIAT_JOB_RETRIES, retryDelaySeconds: 0, retryBackoff: false, expireSeconds: config.LARIAT_JOB_EXPIRE_SECONDS };
  return Object.fromEntries(FIT_QUEUES.map((name) => [name, policy])) as Record<FitQueue, QueueOptions>;
}
