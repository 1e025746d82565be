/**
 * The engine on the calling thread, for one-off scripts (the demo seed) that run a fit's jobs in
 * order without a queue. Workers use EngineThread instead, so their loop never blocks.
 */
import { evaluateAt } from '../fits/compute/evaluate';
import { runFold } from '../fits/compute/fold';
import { runPath } from '../fits/compute/path';
import type { EngineTask } from './engine-protocol';
import type { EngineRunner } from './engine-thread';

export class InlineEngine implements EngineRunner {
  run<T>(task: EngineTask, onProgress?: (done: number, total: number) => void): Promise<T> {
    try {
      if (task.kind === 'path') return Promise.resolve(runPath(task.table, task.spec, onProgress) as T);
      if (task.kind === 'fold') return Promise.resolve(runFold(task.table, task.spec, task.lambda, task.fold, task.fitId) as T);
      return Promise.resolve(evaluateAt(task.input) as T);
    } catch (error) {
      return Promise.reject(error as Error);
    }
  }

  cancel(): Promise<void> {
    return Promise.resolve();
  }
}
