/**
 * Cross-validation folds on worker threads (docs/decisions/0024-cv-folds-and-threads.md). Every
 * thread runs the same pure fold function on the same numbers, so results do not depend on which
 * thread ran which fold; combineFolds sums them in fold order.
 *
 * - The design and the cross products are copied once into SharedArrayBuffers and shared with the
 *   workers (posting them shares the memory, nothing is copied per worker).
 * - Threads claim folds from one shared counter (Atomics.add): no thread waits for a message to get
 *   work, and the main thread can run folds synchronously alongside the workers.
 * - A worker can be started before the data are read (startFoldWorker), so its start-up (loading
 *   and compiling the bundle, ~0.1 s) overlaps the reading; it then computes half of the folds'
 *   cross-product blocks (attachFoldsBeside), and when the grid is known before the full path is
 *   solved (plannedGrid), it runs folds while the main thread fits that path (fitPathAndFolds).
 * - The CLI's `auto` uses it only when the work is large (threadsPay) and a core is free (coreToSpare).
 */

import { existsSync } from 'node:fs';
import { cpus } from 'node:os';
import { createRequire } from 'node:module';
import { dirname, join } from 'node:path';
import { pathToFileURL } from 'node:url';
import { Worker } from 'node:worker_threads';
import { attachFolds, EngineInputError, fitPathPrepared, joinBlocks, plannedGrid, rowsByBlock, someBlockSums, type ColumnRange, type CrossProducts, type CvResult, type EngineTable, type Family, type FitSpec, type PathResult, type PreparedFit } from '../engine/index';
import { combineFolds, fitPlannedFold, foldsUseGram, imputedPredictors, planCrossValidation, planFromPrepared, plannedHeldOut, runPlannedFold, type CvPlan, type FoldFit, type FoldLosses, type FoldShared, type HeldOutRows } from '../engine/cv';
import type { BlockRequest, WorkerReply, WorkerRequest } from './protocol';

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

/** A copy of `values` in shared memory (unchanged if it is there already). */
function shared(values: Float64Array): Float64Array {
  if (values.buffer instanceof SharedArrayBuffer) return values;
  const out = new Float64Array(new SharedArrayBuffer(values.byteLength));
  out.set(values);
  return out;
}

function sharedSums(cp: CrossProducts): CrossProducts {
  return { ...cp, sums: shared(cp.sums) };
}

/**
 * Moves the plan's large arrays into shared memory, in place: the design's values (the plan's
 * design is the caller's prepared design, so the private copy is dropped and memory does not double)
 * and the cross products' sums. Same numbers, so no result changes.
 */
function sharePlan(plan: CvPlan): void {
  plan.built.design.x = shared(plan.built.design.x);
  const s: FoldShared = plan.shared;
  if (s.crossProducts) s.crossProducts = sharedSums(s.crossProducts);
  if (s.blocks) s.blocks = s.blocks.map(sharedSums);
  if (s.byFold) s.byFold = { x: shared(s.byFold.x), y: s.byFold.y && shared(s.byFold.y), start: s.byFold.start };
}

type Outcome = { fold: number; result: FoldLosses } | { fold: number; error: Error };

function replyError(reply: { error: { name: string; message: string; field?: string } }): Error {
  const { name, message, field } = reply.error;
  return name === 'EngineInputError' ? new EngineInputError(message, field) : new Error(message);
}

/** A worker thread that runs folds of the plans it is given; start it early, use it once. */
export class FoldWorker {
  private readonly worker = startWorker();
  private failure: Error | null = null;
  /** Resolves once the worker has loaded its code (tests wait for it; runs need not). */
  readonly ready: Promise<void>;

  constructor() {
    // An error before any plan (e.g. the bundle failed to load) is reported by the next run.
    this.worker.on('error', (error) => (this.failure ??= error));
    this.ready = new Promise((resolve, reject) => {
      this.worker.once('error', reject);
      this.worker.once('message', () => resolve());
    });
    // Nobody may wait for `ready`: its failure is reported by run().
    this.ready.catch(() => {});
  }

  /**
   * Gives the worker `plan` and the shared counter; resolves with the folds it ran once it finds none
   * left (rejects if the thread dies).
   */
  run(plan: CvPlan, next: Int32Array): Promise<Outcome[]> {
    const worker = this.worker;
    return new Promise<Outcome[]>((resolve, reject) => {
      if (this.failure) return reject(this.failure);
      const outcomes: Outcome[] = [];
      const onMessage = (reply: WorkerReply) => {
        if (reply.type === 'ready' || reply.type === 'blocks' || reply.type === 'blocks-error' || reply.type === 'scored' || reply.type === 'score-error') return;
        if (reply.type === 'result') outcomes.push({ fold: reply.fold, result: reply.result });
        else if (reply.type === 'error') outcomes.push({ fold: reply.fold, error: replyError(reply) });
        else {
          cleanup();
          resolve(outcomes);
        }
      };
      const onError = (error: Error) => {
        cleanup();
        reject(error);
      };
      const onExit = (code: number) => {
        cleanup();
        reject(new Error(`a cross-validation worker thread stopped (exit code ${code})`));
      };
      const cleanup = () => {
        worker.off('message', onMessage);
        worker.off('error', onError);
        worker.off('exit', onExit);
      };
      worker.on('message', onMessage);
      worker.on('error', onError);
      worker.on('exit', onExit);
      const { design, y } = plan.built;
      worker.postMessage({
        type: 'plan',
        design,
        y,
        options: plan.options,
        foldIds: plan.foldIds,
        lambda: plan.lambda,
        shared: plan.shared,
        next,
        folds: plan.folds,
      } satisfies WorkerRequest);
    });
  }

  /** The cross products of the listed fold blocks, computed on the worker (design.x in shared memory). */
  blockSums(request: Omit<BlockRequest, 'type'>): Promise<{ blocks: CrossProducts[]; ranges: ColumnRange[] }> {
    const worker = this.worker;
    return new Promise((resolve, reject) => {
      if (this.failure) return reject(this.failure);
      const onMessage = (reply: WorkerReply) => {
        if (reply.type === 'blocks') {
          cleanup();
          resolve({ blocks: reply.blocks, ranges: reply.ranges });
        } else if (reply.type === 'blocks-error') {
          cleanup();
          reject(replyError(reply));
        }
      };
      const onError = (error: Error) => {
        cleanup();
        reject(error);
      };
      const cleanup = () => {
        worker.off('message', onMessage);
        worker.off('error', onError);
      };
      worker.on('message', onMessage);
      worker.on('error', onError);
      worker.postMessage({ type: 'blocks', ...request } satisfies WorkerRequest);
    });
  }

  /** Scoring requests waiting for their reply, by fold (score). */
  private readonly scoring = new Map<number, { resolve: (losses: FoldLosses) => void; reject: (error: Error) => void }>();
  private scoringListens = false;

  /**
   * The held-out losses of a fold fitted on this thread, scored on the worker (held.x in shared
   * memory). Many may be in flight: one set of listeners serves them all, and a worker that dies
   * fails every one still waiting.
   */
  score(family: Family, fitted: FoldFit, held: HeldOutRows): Promise<FoldLosses> {
    if (this.failure) return Promise.reject(this.failure);
    if (!this.scoringListens) {
      this.scoringListens = true;
      const failAll = (error: Error) => {
        for (const waiting of this.scoring.values()) waiting.reject(error);
        this.scoring.clear();
      };
      this.worker.on('message', (reply: WorkerReply) => {
        if (reply.type !== 'scored' && reply.type !== 'score-error') return;
        const waiting = this.scoring.get(reply.fold);
        if (!waiting) return;
        this.scoring.delete(reply.fold);
        if (reply.type === 'scored') waiting.resolve(reply.result);
        else waiting.reject(replyError(reply));
      });
      this.worker.on('error', failAll);
      this.worker.on('exit', (code) => failAll(new Error(`a cross-validation worker thread stopped (exit code ${code})`)));
    }
    return new Promise((resolve, reject) => {
      this.scoring.set(fitted.fold, { resolve, reject });
      this.worker.postMessage({ type: 'score', family, fitted, held } satisfies WorkerRequest);
    });
  }

  async stop(): Promise<void> {
    await this.worker.terminate();
  }
}

/**
 * attachFolds (prepareFit's fold planning) with the fold blocks' cross products shared between this
 * thread and `worker` (even folds here, odd ones there; the worker is otherwise idle until the
 * folds). The same numbers as prepareFit: each block's sums do not depend on the thread or on the
 * blocks computed with it (someBlockSums), and joinBlocks sums them in fold order. `prepared` comes
 * from prepareFit(table, spec, false); `assignment` is foldAssignment's for the spec.
 */
export async function attachFoldsBeside(
  table: EngineTable,
  spec: FitSpec,
  prepared: PreparedFit,
  worker: FoldWorker,
  assignment: { foldIds: Int32Array; folds: number },
): Promise<void> {
  const { built, options } = prepared;
  const { foldIds, folds } = assignment;
  if (!spec.cv || !foldsUseGram(imputedPredictors(table, built), built, options, foldIds, folds)) {
    attachFolds(table, spec, prepared, { foldIds, folds });
    return;
  }
  built.design.x = shared(built.design.x);
  const mineWhich = Array.from({ length: folds }, (_, k) => k).filter((k) => k % 2 === 0);
  const theirWhich = Array.from({ length: folds }, (_, k) => k).filter((k) => k % 2 === 1);
  // The rows regrouped by fold (RowsByBlock) in shared memory: each thread writes its blocks' rows.
  const byFold = rowsByBlock(built.design, foldIds, folds, true, true);
  const theirs = pending(worker.blockSums({ design: built.design, y: built.y, foldIds, folds, which: theirWhich, byFold }));
  const mine = someBlockSums(built.design, foldIds, folds, built.y, mineWhich, byFold);
  const other = await theirs;
  const blocks: CrossProducts[] = new Array<CrossProducts>(folds);
  const ranges: ColumnRange[] = new Array<ColumnRange>(folds);
  mineWhich.forEach((k, t) => ((blocks[k] = mine.blocks[t]), (ranges[k] = mine.ranges[t])));
  theirWhich.forEach((k, t) => ((blocks[k] = other.blocks[t]), (ranges[k] = other.ranges[t])));
  attachFolds(table, spec, prepared, { foldIds, folds, blocks: { ...joinBlocks(built.design, built.y, blocks, ranges), byFold } });
}

/** Starts a fold worker now (e.g. before reading the data, so its start-up overlaps the reading). */
export function startFoldWorker(): FoldWorker {
  return new FoldWorker();
}

function newCounter(): Int32Array {
  return new Int32Array(new SharedArrayBuffer(4));
}

/**
 * A worker's pending run, marked as handled: if this thread fails first (e.g. the full path rejects
 * its input) the caller stops the worker, whose run then rejects with nobody awaiting it; that must
 * not become an unhandled rejection ending the process with a second, misleading error.
 */
function pending<T>(promise: Promise<T>): Promise<T> {
  promise.catch(() => {});
  return promise;
}

/** Claims and runs folds on this thread until none is left. */
function runClaimed(plan: CvPlan, next: Int32Array): Outcome[] {
  const outcomes: Outcome[] = [];
  for (;;) {
    const fold = Atomics.add(next, 0, 1);
    if (fold >= plan.folds) return outcomes;
    try {
      outcomes.push({ fold, result: runPlannedFold(plan, fold) });
    } catch (error) {
      outcomes.push({ fold, error: error as Error });
      Atomics.store(next, 0, plan.folds);
    }
  }
}

/**
 * Every fold's losses in fold order, or the error of the first failing fold (the one a single
 * thread running the folds in order would have met: every fold before it was claimed and run).
 */
function collect(plan: CvPlan, outcomes: Outcome[]): FoldLosses[] {
  const sorted = [...outcomes].sort((a, b) => a.fold - b.fold);
  const failed = sorted.find((o) => 'error' in o);
  if (failed && 'error' in failed) throw failed.error;
  if (sorted.length !== plan.folds) throw new Error(`cross-validation ran ${sorted.length} of ${plan.folds} folds`);
  return sorted.map((o) => (o as { result: FoldLosses }).result);
}

/**
 * Runs a plan's folds on `workers` and, with `here`, on this thread too, all claiming from one
 * counter. This thread works synchronously: the workers' replies wait in their queues meanwhile.
 */
export async function runFoldsShared(plan: CvPlan, workers: FoldWorker[], here: boolean): Promise<FoldLosses[]> {
  sharePlan(plan);
  const next = newCounter();
  const running = workers.map((w) => pending(w.run(plan, next)));
  const mine = here ? runClaimed(plan, next) : [];
  const theirs = await Promise.all(running);
  return collect(plan, [...mine, ...theirs.flat()]);
}

/** Every fold on a pool of worker threads (this thread only waits). */
export async function crossValidateInWorkers(
  table: EngineTable,
  spec: FitSpec,
  path: PathResult,
  poolSize = 2,
  prepared?: PreparedFit,
): Promise<CvResult> {
  const plan = planCrossValidation(table, spec, path, prepared);
  const workers = Array.from({ length: Math.max(1, Math.min(poolSize, plan.folds)) }, startFoldWorker);
  try {
    return combineFolds(spec.family, plan.lambda, await runFoldsShared(plan, workers, false), plan.foldIds);
  } finally {
    await Promise.all(workers.map((w) => w.stop()));
  }
}

/**
 * Runs fold 1 in this thread and times it; when the remaining folds would take longer than
 * `breakEvenSeconds` in this thread, runs them on this thread and a worker thread together, else
 * here (`workers` counts the threads that ran folds: 2 or 0). For callers that have not started a
 * worker early; the CLI uses runCrossValidation.
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
  const rest = plan.folds - 1;
  if (!(seconds * rest > breakEvenSeconds && rest > 1)) {
    const others = Array.from({ length: rest }, (_, k) => runPlannedFold(plan, k + 1));
    return { result: combineFolds(spec.family, plan.lambda, [first, ...others], plan.foldIds), workers: 0 };
  }
  const worker = startFoldWorker();
  try {
    sharePlan(plan);
    const next = newCounter();
    Atomics.store(next, 0, 1);
    const running = pending(worker.run(plan, next));
    const mine = runClaimed(plan, next);
    const outcomes = [{ fold: 0, result: first }, ...mine, ...(await running)];
    return { result: combineFolds(spec.family, plan.lambda, collect(plan, outcomes), plan.foldIds), workers: 2 };
  } finally {
    await worker.stop();
  }
}

/**
 * Below this estimate of a cross-validation's work the CLI's `--workers auto` runs the folds in its
 * own thread: folds x lambdas x p x min(n, p) (one lambda of a fold costs about p min(n, p) in either
 * form: Gram columns in the tall case, products with the working columns in the wide case).
 * A worker costs far more than its start-up: it compiles the engine afresh (its code is cold, and
 * V8's optimizing compiler shares the two cores), about 0.5-0.75 s of CPU on the bench cases. On a
 * quiet 2-core machine (`npm run bench -- engine`, 2026-12-02 06:57) a worker was slower than one
 * thread at 4e7 (tall 20000 x 200: 1.27 s against 1.21 s wall) and 4.5e8 (300 x 1500: 1.39 s against
 * 1.24 s), and faster at 3e9 (600 x 5000: 3.05 s against 3.82 s); the breast cancer case (9e5) gains
 * nothing either. So the line sits between the last two.
 */
export const THREAD_WORK_THRESHOLD = 1e9;

/** The work estimate compared with THREAD_WORK_THRESHOLD: folds x lambdas x p x min(n, p). */
export function foldWork(n: number, p: number, folds: number, lambdaCount: number): number {
  return folds * lambdaCount * p * Math.min(n, p);
}

/** Whether a second thread pays for this cross-validation (see THREAD_WORK_THRESHOLD). */
export function threadsPay(prepared: PreparedFit, folds: number, lambdaCount: number): boolean {
  const { n, p } = prepared.built.design;
  return foldWork(n, p, folds, lambdaCount) >= THREAD_WORK_THRESHOLD;
}

/**
 * The full path and its cross-validation with `worker` beside this thread. When the grid is known
 * before the path is solved (plannedGrid), the worker starts on the folds at once and this thread
 * joins them when the full path is done; otherwise both start on the folds after the path. Results
 * are those of fitPathPrepared and crossValidate in one thread. `pathDone` is when the full path ended.
 * `prepared` comes from prepareFit with the spec's CV (its fold plan; the table is not needed).
 */
export async function fitPathAndFolds(
  spec: FitSpec,
  prepared: PreparedFit,
  worker: FoldWorker,
  /** false: this thread fits the path only and the worker runs every fold (tests: a known split). */
  here = true,
): Promise<{ path: PathResult; cv: CvResult; pathDone: number; foldsOnWorker: number }> {
  const grid = plannedGrid(prepared);
  if (!grid) {
    const path = fitPathPrepared(prepared);
    const pathDone = performance.now();
    const plan = planFromPrepared(spec, path, prepared);
    sharePlan(plan);
    const next = newCounter();
    const running = pending(worker.run(plan, next));
    const mine = here ? runClaimed(plan, next) : [];
    const theirs = await running;
    return { path, cv: combineFolds(spec.family, plan.lambda, collect(plan, [...mine, ...theirs]), plan.foldIds), pathDone, foldsOnWorker: theirs.length };
  }
  const plan = planFromPrepared(spec, { lambda: grid } as PathResult, prepared);
  sharePlan(plan);
  const next = newCounter();
  const running = pending(worker.run(plan, next));
  const path = fitPathPrepared(prepared);
  const pathDone = performance.now();
  if (path.lambda.length !== grid.length || path.lambda.some((l, k) => l !== grid[k])) {
    // Not expected (plannedGrid makes the path's own grid); if it happens, redo the folds on the path's.
    Atomics.store(next, 0, plan.folds);
    await running;
    const again = planFromPrepared(spec, path, prepared);
    return { path, cv: combineFolds(spec.family, again.lambda, await runFoldsShared(again, [worker], here), again.foldIds), pathDone, foldsOnWorker: -1 };
  }
  const mine = here ? runClaimed(plan, next) : [];
  const theirs = await running;
  return { path, cv: combineFolds(spec.family, plan.lambda, collect(plan, [...mine, ...theirs]), plan.foldIds), pathDone, foldsOnWorker: theirs.length };
}

/** Every fold of a prepared fit's plan on 2 worker threads (CLI `--workers on`). */
export async function crossValidateInWorkersPrepared(spec: FitSpec, path: PathResult, prepared: PreparedFit, poolSize = 2): Promise<CvResult> {
  const plan = planFromPrepared(spec, path, prepared);
  const workers = Array.from({ length: Math.max(1, Math.min(poolSize, plan.folds)) }, startFoldWorker);
  try {
    return combineFolds(spec.family, plan.lambda, await runFoldsShared(plan, workers, false), plan.foldIds);
  } finally {
    await Promise.all(workers.map((w) => w.stop()));
  }
}

/**
 * Every fold fitted on this thread, one after another, and each fold's held-out rows scored on
 * `worker` meanwhile (scoreFold on the rows regrouped by fold, in shared memory): the worker scores
 * fold k while this thread fits fold k + 1. The results are crossValidatePrepared's (the same
 * functions on the same numbers). Needs the plan's rows regrouped by fold in shared memory
 * (attachFoldsBeside makes them so; scoringBesidePays says when it pays).
 */
export async function crossValidateScoringBeside(spec: FitSpec, path: PathResult, prepared: PreparedFit, worker: FoldWorker): Promise<CvResult> {
  const plan = planFromPrepared(spec, path, prepared);
  const byFold = plan.shared.byFold;
  if (!byFold || !(byFold.x.buffer instanceof SharedArrayBuffer)) {
    throw new Error('scoring beside needs the rows regrouped by fold in shared memory (attachFoldsBeside)');
  }
  const scored: Promise<FoldLosses>[] = [];
  for (let k = 0; k < plan.folds; k++) scored.push(pending(worker.score(spec.family, fitPlannedFold(plan, k), plannedHeldOut(plan, k))));
  return combineFolds(spec.family, plan.lambda, await Promise.all(scored), plan.foldIds);
}

/**
 * From this much scoring work (held-out rows x columns x lambdas summed over the folds: n p L) the
 * CLI's `--workers auto` scores the folds on a worker (crossValidateScoringBeside) while this thread
 * fits them. Scoring is one small kernel, which a fresh worker compiles at once (unlike the solver:
 * see THREAD_WORK_THRESHOLD). Tall 20000 x 200 with 100 lambdas: 4e8 (about 0.06-0.09 s of scoring
 * on one thread, 2026-12-02).
 */
export const SCORING_WORK_THRESHOLD = 1e8;

/** Whether scoring the folds on a worker pays (see SCORING_WORK_THRESHOLD): the Gram form's regrouped rows, and enough work. */
export function scoringBesidePays(prepared: PreparedFit, lambdaCount: number): boolean {
  const { n, p } = prepared.built.design;
  return prepared.folds?.shared.byFold !== undefined && n * p * lambdaCount >= SCORING_WORK_THRESHOLD;
}

/**
 * Cumulative CPU milliseconds: all cores' busy and idle time (node:os cpus(); the kernel counts in
 * ~10 ms ticks), and this process's own (every thread of it: process.cpuUsage()).
 */
export interface CpuSnapshot {
  idle: number;
  total: number;
  process: number;
  cores: number;
  at: number;
}

export function cpuSnapshot(): CpuSnapshot {
  let idle = 0;
  let total = 0;
  const all = cpus();
  for (const { times } of all) {
    idle += times.idle;
    total += times.user + times.nice + times.sys + times.idle + times.irq;
  }
  const own = process.cpuUsage();
  return { idle, total, process: (own.user + own.system) / 1000, cores: all.length, at: performance.now() };
}

/**
 * A second thread pays only if a core is free for it: its start-up, compiling and collecting cost
 * about 0.4 s CPU on the tall case, a loss on a core that has none to spare. Since `since` (the CLI
 * takes it before reading the data), other processes must have left this process at least one core
 * plus this share of another: on a quiet 2-core machine they leave nearly 2; with other processes
 * on every core (load 5-7 while this was written) well under 1.5, and `auto` with a worker was
 * measured slower than one thread there. This process's own use (the reading, the early worker's
 * start-up) is not counted against the spare core.
 */
export const MIN_SPARE_CORE_SHARE = 0.5;

/** Whether, since `since`, other processes left at least 1 + MIN_SPARE_CORE_SHARE cores to this one. */
export function coreToSpare(since: CpuSnapshot, now: CpuSnapshot = cpuSnapshot()): boolean {
  const elapsedMs = now.at - since.at;
  const busyMs = now.total - now.idle - (since.total - since.idle);
  // Too short a window to measure (ticks of ~10 ms): assume a core is free if there are two.
  if (now.total - since.total < 100) return now.cores >= 2;
  const othersMs = Math.max(0, busyMs - (now.process - since.process));
  return now.cores * elapsedMs - othersMs >= (1 + MIN_SPARE_CORE_SHARE) * elapsedMs;
}
