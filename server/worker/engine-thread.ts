/**
 * One engine thread of a worker process: the numerical work runs here, never on the loop that talks
 * to PostgreSQL and the queue, so heartbeats and progress writes keep flowing during a long solve.
 * Cancelling terminates the thread; the next task starts a fresh one.
 */
import { createRequire } from 'node:module';
import { dirname, join } from 'node:path';
import { pathToFileURL } from 'node:url';
import { Worker } from 'node:worker_threads';
import { EngineInputError } from '../engine/index';
import type { EngineTask, FromEngine } from './engine-protocol';

/** Node 20 resolves a worker's entry before tsx's hooks apply: a small bootstrap registers them first (as parse-thread.ts). */
function startThread(): Worker {
  const tsxRoot = dirname(createRequire(import.meta.url).resolve('tsx/package.json'));
  const tsxApi = pathToFileURL(join(tsxRoot, 'dist', 'esm', 'api', 'index.mjs')).href;
  const entry = new URL('./engine-thread-entry.ts', import.meta.url).href;
  const code = `import(${JSON.stringify(tsxApi)}).then((api) => { api.register(); return import(${JSON.stringify(entry)}); })`;
  return new Worker(code, { eval: true });
}

export class TaskCancelled extends Error {
  constructor() {
    super('the task was cancelled');
    this.name = 'TaskCancelled';
  }
}

/** What the fit jobs need from an engine: run a task (off the caller's loop, or inline) and cancel it. */
export interface EngineRunner {
  run<T>(task: EngineTask, onProgress?: (done: number, total: number) => void): Promise<T>;
  cancel(reason?: Error): Promise<void>;
}

export class EngineThread implements EngineRunner {
  private worker: Worker | null = null;
  private abort: ((error: Error) => void) | null = null;

  run<T>(task: EngineTask, onProgress?: (done: number, total: number) => void): Promise<T> {
    const worker = (this.worker ??= startThread());
    return new Promise<T>((resolve, reject) => {
      const cleanup = () => {
        worker.off('message', onMessage);
        worker.off('error', onError);
        worker.off('exit', onExit);
        this.abort = null;
      };
      const onMessage = (message: FromEngine) => {
        if (message.kind === 'progress') {
          onProgress?.(message.done, message.total);
          return;
        }
        cleanup();
        if (message.kind === 'result') resolve(message.value as T);
        else if (message.name === 'EngineInputError') reject(new EngineInputError(message.message, message.field));
        else reject(Object.assign(new Error(message.message), { name: message.name }));
      };
      const onError = (error: Error) => {
        cleanup();
        this.worker = null;
        reject(error);
      };
      const onExit = (code: number) => {
        cleanup();
        this.worker = null;
        reject(new Error(`the engine thread stopped (exit code ${code})`));
      };
      this.abort = (error) => {
        cleanup();
        reject(error);
      };
      worker.on('message', onMessage);
      worker.on('error', onError);
      worker.on('exit', onExit);
      worker.postMessage(task);
    });
  }

  /** Stops the running task (the thread is ended; the next run starts a new one). */
  async cancel(reason: Error = new TaskCancelled()): Promise<void> {
    const worker = this.worker;
    this.worker = null;
    this.abort?.(reason);
    if (worker) await worker.terminate();
  }

  /** The process is stopping: a running task fails (not cancelled), so its job is retried elsewhere. */
  async close(): Promise<void> {
    await this.cancel(new Error('the worker process is stopping'));
  }
}
