/**
 * Runs an ingest's parsing, encoding and summaries on a worker thread (parse-worker.ts). The
 * machine has two cores: while the worker parses, the main thread streams the original file into
 * PostgreSQL, which then works on the other core; while PostgreSQL inserts column j, the worker
 * encodes and summarises column j + 1. Small files stay on the calling thread (LocalParse).
 */
import fs from 'node:fs';
import { createRequire } from 'node:module';
import { dirname, join } from 'node:path';
import { pathToFileURL } from 'node:url';
import { Worker } from 'node:worker_threads';
import { FileProblem } from '../parse/errors';
import type { StoredColumn } from '../storage/convert';
import type { ColumnMessage, FromWorker, ParseJob, ParseOutcome, ToWorker, WorkerError } from './parse-protocol';
import { ParseSession, type ParsedColumn } from './parse-session';

/**
 * Node 20 resolves a worker's entry file before `--import tsx` hooks apply, so a `.ts` entry fails;
 * a small evaluated bootstrap registers tsx's ESM hooks first (as server/engine-runner/parallel.ts does).
 */
function startWorker(): Worker {
  const tsxRoot = dirname(createRequire(import.meta.url).resolve('tsx/package.json'));
  const tsxApi = pathToFileURL(join(tsxRoot, 'dist', 'esm', 'api', 'index.mjs')).href;
  const entry = new URL('./parse-worker.ts', import.meta.url).href;
  const code = `import(${JSON.stringify(tsxApi)}).then((api) => { api.register(); return import(${JSON.stringify(entry)}); })`;
  return new Worker(code, { eval: true });
}

function revive(e: WorkerError): Error {
  if (e.name === 'FileProblem') return new FileProblem(e.message, e.status, e.field);
  const error = new Error(e.message);
  error.name = e.name;
  return error;
}

/** A promise whose rejection counts as handled until someone awaits it. */
function quiet<T>(p: Promise<T>): Promise<T> {
  p.catch(() => undefined);
  return p;
}

/** A file being parsed, and then its columns one by one, wherever the work runs. */
export interface ColumnSource {
  readonly parsed: Promise<ParseOutcome>;
  column(j: number): Promise<ParsedColumn>;
  close(): Promise<void>;
}

/** Below this size a worker's start (about half a second to load its modules) costs more than it saves. */
export const WORKER_MIN_BYTES = 8 << 20;

export function startParse(job: ParseJob, sizeBytes: number, onProgress?: (bytes: number, rows: number) => void): ColumnSource {
  return sizeBytes >= WORKER_MIN_BYTES ? new ParseThread(job, onProgress) : new LocalParse(job, onProgress);
}

/** The same work on the calling thread. */
export class LocalParse implements ColumnSource {
  readonly parsed: Promise<ParseOutcome>;
  private readonly session: Promise<ParseSession>;

  constructor(job: ParseJob, onProgress?: (bytes: number, rows: number) => void) {
    this.session = quiet(ParseSession.open(job, onProgress));
    this.parsed = quiet(this.session.then((s) => s.outcome));
  }

  column(j: number): Promise<ParsedColumn> {
    return quiet(this.session.then((s) => s.column(j)));
  }

  async close(): Promise<void> {
    const session = await this.session.catch(() => null);
    session?.close();
  }
}

export class ParseThread implements ColumnSource {
  /** Settles when the file is parsed (or refused). */
  readonly parsed: Promise<ParseOutcome>;
  private readonly worker: Worker;
  private readonly waiting = new Map<number, { resolve: (c: ParsedColumn) => void; reject: (e: Error) => void }>();
  private failure: Error | null = null;
  private exited: Promise<void>;

  constructor(
    private readonly job: ParseJob,
    onProgress?: (bytes: number, rows: number) => void,
  ) {
    this.worker = startWorker();
    this.exited = new Promise((resolve) => this.worker.once('exit', () => resolve()));
    let settle: { resolve: (o: ParseOutcome) => void; reject: (e: Error) => void };
    this.parsed = quiet(new Promise<ParseOutcome>((resolve, reject) => (settle = { resolve, reject })));
    const fail = (error: Error) => {
      this.failure ??= error;
      settle.reject(error);
      for (const w of this.waiting.values()) w.reject(error);
      this.waiting.clear();
    };
    this.worker.on('error', fail);
    this.worker.on('exit', () => fail(this.failure ?? new Error('The parse worker stopped before it finished.')));
    this.worker.on('message', (m: FromWorker) => {
      if (m.type === 'progress') onProgress?.(m.bytes, m.rows);
      else if (m.type === 'parsed') settle.resolve(m.outcome);
      else if (m.type === 'error') fail(revive(m.error));
      else {
        this.waiting.get(m.j)?.resolve(toParsedColumn(m.column));
        this.waiting.delete(m.j);
      }
    });
    this.send({ type: 'parse', job });
  }

  /** Column j encoded for storage with its schema; ask ahead so the worker works while the database does. */
  column(j: number): Promise<ParsedColumn> {
    if (this.failure) return quiet(Promise.reject(this.failure));
    const p = new Promise<ParsedColumn>((resolve, reject) => this.waiting.set(j, { resolve, reject }));
    this.send({ type: 'column', j });
    return quiet(p);
  }

  /** Stops the worker and removes its spill file. */
  async close(): Promise<void> {
    this.failure ??= new Error('The parse worker was closed.');
    this.send({ type: 'close' });
    const timeout = setTimeout(() => void this.worker.terminate(), 5000);
    await this.exited;
    clearTimeout(timeout);
    fs.rmSync(this.job.spillPath, { force: true });
  }

  private send(message: ToWorker): void {
    this.worker.postMessage(message);
  }
}

function toParsedColumn(c: ColumnMessage): ParsedColumn {
  const data = Buffer.from(c.data);
  const stored = { name: c.name, storage: c.storage, data, levels: c.levels } as StoredColumn;
  return { stored, schema: c.schema };
}
