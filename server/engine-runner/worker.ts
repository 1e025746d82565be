/**
 * Worker-thread side of crossValidateInWorkers: receives the shared plan once, then fold indices,
 * and answers each with the fold's losses (or its error).
 */
import { parentPort } from 'node:worker_threads';
import { runFoldOnDesign } from '../engine/cv';
import type { WorkerPlan, WorkerReply, WorkerRequest } from './protocol';

let shared: WorkerPlan | undefined;

parentPort?.on('message', (message: WorkerRequest) => {
  if (message.type === 'init') {
    shared = message;
    return;
  }
  const reply: WorkerReply = (() => {
    try {
      if (!shared) throw new Error('worker received a fold before its data');
      const { design, y, options, foldIds, lambda } = shared;
      return { fold: message.fold, result: runFoldOnDesign(design, y, options, foldIds, message.fold, lambda, shared.shared) };
    } catch (error) {
      const e = error as Error & { field?: string };
      return { fold: message.fold, error: { name: e.name, message: e.message, field: e.field } };
    }
  })();
  parentPort?.postMessage(reply);
});
