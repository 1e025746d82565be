/** Inside an engine thread: runs one task at a time from the job loop (engine-thread.ts). */
import { parentPort } from 'node:worker_threads';
import { EngineInputError } from '../engine/index';
import { evaluateAt } from '../fits/compute/evaluate';
import { runFold } from '../fits/compute/fold';
import { runPath } from '../fits/compute/path';
import type { EngineTask, FromEngine } from './engine-protocol';

const port = parentPort;
if (!port) throw new Error('engine-thread-entry.ts runs as a worker thread');

function run(task: EngineTask): unknown {
  if (task.kind === 'path') {
    let last = 0;
    return runPath(task.table, task.spec, (done, total) => {
      // At most every 100 ms, and always the last lambda.
      const now = Date.now();
      if (done === total || now - last >= 100) {
        last = now;
        port!.postMessage({ kind: 'progress', done, total } satisfies FromEngine);
      }
    });
  }
  if (task.kind === 'fold') return runFold(task.table, task.spec, task.lambda, task.fold, task.fitId);
  return evaluateAt(task.input);
}

port.on('message', (task: EngineTask) => {
  try {
    port.postMessage({ kind: 'result', value: run(task) } satisfies FromEngine);
  } catch (error) {
    const e = error as Error;
    port.postMessage({ kind: 'error', name: e.name, message: e.message, field: error instanceof EngineInputError ? error.field : undefined } satisfies FromEngine);
  }
});
