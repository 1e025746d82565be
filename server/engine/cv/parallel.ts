/**
 * Cross-validation with folds spread over a small pool of worker threads (min(2, K) by default: the
 * target machine has 2 cores). Workers run TypeScript through tsx's loader.
 */

/**
 * Node 20 resolves a worker's entry file before `--import tsx` hooks apply, so a `.ts` entry fails;
 * a small evaluated bootstrap registers tsx's ESM hooks first, then imports the TypeScript worker.
 */
function startWorker(): Worker {
  const tsxRoot = dirname(createRequire(import.meta.url).resolve('tsx/package.json'));
  const tsxApi = pathToFileURL(join(tsxRoot, 'dist', 'esm', 'api', 'index.mjs')).href;
  const entry = new URL('./worker.ts', import.meta.url).href;
  const code = `import(${JSON.stringify(tsxApi)}).then((api) => { api.register(); return import(${JSON.stringify(entry)}); })`;
  return new Worker(code, { eval: true });
}
import { createRequire } from 'node:module';
import { dirname, join } from 'node:path';
import { pathToFileURL } from 'node:url';
import { Worker } from 'node:worker_threads';
import type { BuiltDesign } from '../design/build';
import { EngineInputError, type CvResult, type EngineTable, type FitSpec, type PathResult } from '../types';
import { combineFolds } from './combine';
import { planCrossValidation } from './crossValidate';
import type { FoldLosses } from './fold';
import type { WorkerReply, WorkerRequest } from './protocol';

export async function crossValidateInWorkers(
  table: EngineTable,
  spec: FitSpec,
  path: PathResult,
  poolSize = 2,
  built?: BuiltDesign,
): Promise<CvResult> {
  const plan = planCrossValidation(table, spec, path, built);
  const size = Math.max(1, Math.min(poolSize, plan.folds));
  const init: WorkerRequest = {
    type: 'init',
    design: plan.built.design,
    y: plan.built.y,
    options: plan.options,
    foldIds: plan.foldIds,
    lambda: plan.lambda,
  };
  const results: FoldLosses[] = [];
  let next = 0;
  const workers = Array.from({ length: size }, startWorker);
  try {
    await Promise.all(
      workers.map(
        (worker) =>
          new Promise<void>((resolve, reject) => {
            const sendNext = () => {
              if (next >= plan.folds) return resolve();
              worker.postMessage({ type: 'fold', fold: next++ } satisfies WorkerRequest);
            };
            worker.on('message', (reply: WorkerReply) => {
              if ('error' in reply) {
                const { name, message, field } = reply.error;
                return reject(name === 'EngineInputError' ? new EngineInputError(message, field) : new Error(message));
              }
              results.push(reply.result);
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
  results.sort((a, b) => a.fold - b.fold);
  return combineFolds(spec.family, plan.lambda, results, plan.foldIds);
}
