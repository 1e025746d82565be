/**
 * Worker-thread side of the runner (parallel.ts): receives a plan, then claims folds from the shared
 * counter until none is left, posting each fold's losses (or its error), then 'done'. Also sums fold
 * blocks ('blocks') and scores folds fitted on the main thread ('score').
 */
import { parentPort } from 'node:worker_threads';
import { runFoldOnDesign, scoreFold, type FoldScratch } from '../engine/cv';
import { someBlockSums } from '../engine/index';
import type { WorkerReply, WorkerRequest } from './protocol';

// Loaded: FoldWorker.ready resolves.
parentPort?.postMessage({ type: 'ready' } satisfies WorkerReply);

parentPort?.on('message', (request: WorkerRequest) => {
  if (request.type === 'blocks') {
    try {
      const { blocks, ranges } = someBlockSums(request.design, request.foldIds, request.folds, request.y, request.which, request.byFold);
      parentPort?.postMessage({ type: 'blocks', blocks, ranges } satisfies WorkerReply);
    } catch (error) {
      const e = error as Error & { field?: string };
      parentPort?.postMessage({ type: 'blocks-error', error: { name: e.name, message: e.message, field: e.field } } satisfies WorkerReply);
    }
    return;
  }
  if (request.type === 'score') {
    const fold = request.fitted.fold;
    try {
      parentPort?.postMessage({ type: 'scored', fold, result: scoreFold(request.family, request.fitted, request.held) } satisfies WorkerReply);
    } catch (error) {
      const e = error as Error & { field?: string };
      parentPort?.postMessage({ type: 'score-error', fold, error: { name: e.name, message: e.message, field: e.field } } satisfies WorkerReply);
    }
    return;
  }
  const plan = request;
  const { design, y, options, foldIds, lambda, shared, next, folds } = plan;
  const scratch: FoldScratch = {};
  for (;;) {
    const fold = Atomics.add(next, 0, 1);
    if (fold >= folds) break;
    let reply: WorkerReply;
    try {
      reply = { type: 'result', fold, result: runFoldOnDesign(design, y, options, foldIds, fold, lambda, shared, scratch) };
    } catch (error) {
      const e = error as Error & { field?: string };
      reply = { type: 'error', fold, error: { name: e.name, message: e.message, field: e.field } };
      // Nothing more to claim: the cross-validation fails.
      Atomics.store(next, 0, folds);
    }
    parentPort?.postMessage(reply);
  }
  parentPort?.postMessage({ type: 'done' } satisfies WorkerReply);
});
