/**
 * Cross-validation with folds spread over a small pool of worker threads (min(2, K) by default: the
 * target machine has 2 cores).
 */

import { existsSync } from 'node:fs';
import { createRequire } from 'node:module';
import { dirname, join } from 'node:path';
import { pathToFileURL } from 'node:url';
import { Worker } from 'node:worker_threads';
import { EngineInputError, type CvResult, type EngineTable, type FitSpec, type PathResult, type PreparedFit } from '../engine/index';
import { combineFolds, planCrossValidation, runPlannedFold, type CvPlan, type FoldLosses } from '../engine/cv';
import type { WorkerReply, WorkerRequest } from './protocol';

/**
 * A worker thread running worker.ts. From the CLI's bundle (scripts/cli.sh) the bundled worker
 * (cv-worker.mjs beside it) starts directly. From TypeScript sources: Node 20 resolves a worker's
 * entry file before `--import tsx` hooks apply, so a `.ts` entry fails; a small evaluated bootstrap
 * registers tsx's ESM hooks first, then imports the TypeScript worker (~0.7 s per worker).
 */
function bundledWorker(): URL | null {
  const bundled = new URL('./cv-worker.mjs', import.meta.url);
  return import.meta.url.endsWith('.mjs') && existsSync(bundled) ? bundled : null;
}

function startWorker(): Worker {
  const bundled = bundledWorker();
  if (bundled) return new Worker(bundled);
  const tsxRoot = dirname(createRequire(import.meta.url).resolve('tsx/package.json'));
  const tsxApi = pathToFileURL(join(tsxRoot, 'dist', 'esm', 'api', 'index.mjs')).href;
  const entry = new URL('./worker.ts', import.meta.url).href;
  const code = `import(${JSON.stringify(tsxApi)}).then((api) => { api.register(); return import(${JSON.stringify(entry)}); })`;
  return new Worker(code, { eval: true });
}

function initMessage(plan: CvPlan): WorkerRequest {
  return {
    type: 'init',
    design: plan.built.design,
    y: plan.built.y,
    options: plan.options,
    foldIds: plan.foldIds,
    lambda: plan.lambda,
    shared: plan.shared,
  };
}

function replyError(reply: WorkerReply): Error | null {
  if (!('error' in reply)) return null;
  const { name, message, field } = reply.error;
  return name === 'EngineInputError' ? new EngineInputError(message, field) : new Error(message);
}

/** Runs the given folds of a plan on a pool of worker threads; results in fold order. */
export async function runFoldsInWorkers(plan: CvPlan, folds: number[], poolSize = 2): Promise<FoldLosses[]> {
  const size = Math.max(1, Math.min(poolSize, folds.length));
  const init = initMessage(plan);
  const results: FoldLosses[] = [];
  const queue = [...folds];
  const workers = Array.from({ length: size }, startWorker);
  try {
    await Promise.all(
      workers.map(
        (worker) =>
          new Promise<void>((resolve, reject) => {
            const sendNext = () => {
              const fold = queue.shift();
              if (fold === undefined) return resolve();
              worker.postMessage({ type: 'fold', fold } satisfies WorkerRequest);
            };
            worker.on('message', (reply: WorkerReply) => {
              const error = replyError(reply);
              if (error) return reject(error);
              if ('result' in reply) results.push(reply.result);
              sendNext();
            });
            worker.on('error', reject);
            worker.postMessage(init);
            sendNext();
          }),
      ),
    );
  } finally {
    await Promise.all(workers.map((w) => w.terminate()));
  }
  return results.sort((a, b) => a.fold - b.fold);
}

/**
 * Runs the given folds on this thread and one worker thread together, both taking folds from one
 * queue: this thread is already warm (compiled code, caches), so it keeps working rather than wait.
 * The worker gets two folds ahead, so it does not idle while this thread, busy with a fold, cannot
 * answer its messages. Results in fold order.
 */
export async function runFoldsAlongside(plan: CvPlan, folds: number[]): Promise<FoldLosses[]> {
  const queue = [...folds];
  const results: FoldLosses[] = [];
  const worker = startWorker();
  let inFlight = 0;
  let failure: Error | null = null;
  let settle: () => void = () => {};
  const drained = new Promise<void>((resolve) => (settle = resolve));
  const feed = (): void => {
    while (inFlight < 2 && queue.length > 0 && !failure) {
      worker.postMessage({ type: 'fold', fold: queue.shift() as number } satisfies WorkerRequest);
      inFlight++;
    }
    if (inFlight === 0) settle();
  };
  worker.on('message', (reply: WorkerReply) => {
    inFlight--;
    failure ??= replyError(reply);
    if ('result' in reply) results.push(reply.result);
    feed();
  });
  worker.on('error', (error) => {
    failure ??= error;
    inFlight = 0;
    settle();
  });
  try {
    worker.postMessage(initMessage(plan));
    feed();
    while (queue.length > 0 && !failure) {
      results.push(runPlannedFold(plan, queue.shift() as number));
      // Let the worker's replies in, so it is fed while this thread works.
      await new Promise<void>((resolve) => setImmediate(resolve));
    }
    await drained;
  } finally {
    await worker.terminate();
  }
  if (failure) throw failure;
  return results.sort((a, b) => a.fold - b.fold);
}

/** Every fold on worker threads. */
export async function crossValidateInWorkers(
  table: EngineTable,
  spec: FitSpec,
  path: PathResult,
  poolSize = 2,
  prepared?: PreparedFit,
): Promise<CvResult> {
  const plan = planCrossValidation(table, spec, path, prepared);
  const results = await runFoldsInWorkers(plan, Array.from({ length: plan.folds }, (_, k) => k), poolSize);
  return combineFolds(spec.family, plan.lambda, results, plan.foldIds);
}

/**
 * Runs fold 1 in this thread and times it; when the remaining folds would take longer than
 * `breakEvenSeconds` in this thread, runs them on this thread and a worker thread together
 * (runFoldsAlongside; `workers` then counts the 2 threads), else here. Worker start-up makes it a
 * loss for quick folds: ~0.7 s through the TypeScript loader (default break-even 2 s), ~0.1 s from
 * the CLI's bundle (0.3 s). Timing a real fold adapts to the data, the family and the machine.
 */
export async function crossValidateAdaptive(
  table: EngineTable,
  spec: FitSpec,
  path: PathResult,
  prepared?: PreparedFit,
  breakEvenSeconds = bundledWorker() ? 0.3 : 2,
): Promise<{ result: CvResult; workers: number }> {
  const plan = planCrossValidation(table, spec, path, prepared);
  const started = performance.now();
  const first = runPlannedFold(plan, 0);
  const seconds = (performance.now() - started) / 1000;
  const rest = Array.from({ length: plan.folds - 1 }, (_, k) => k + 1);
  const useWorkers = seconds * rest.length > breakEvenSeconds && rest.length > 1;
  const others = useWorkers ? await runFoldsAlongside(plan, rest) : rest.map((k) => runPlannedFold(plan, k));
  return { result: combineFolds(spec.family, plan.lambda, [first, ...others], plan.foldIds), workers: useWorkers ? 2 : 0 };
}
