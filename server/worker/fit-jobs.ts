/**
 * The fit jobs a worker process runs (server/fits/jobs.ts). Every step is safe to run twice: a step
 * first looks at what is stored (a fit that has ended is left alone; a fold already stored is not
 * recomputed), results are written with guarded statements (`WHERE status = 'running'`, fold rows
 * with ON CONFLICT DO NOTHING), and hand-offs use fixed job ids. So a worker killed mid-job, whose
 * job pg-boss retries elsewhere, cannot make a fit finish twice or differently.
 */
import { and, eq, inArray, sql } from 'drizzle-orm';
import type { CvMetric, FitSpec } from '../../shared/fits';
import type { Database } from '../db/client';
import { fitEvaluations, fitFolds, fits } from '../db/schema/index';
import { chooseLambdas, combineFolds, EngineInputError, METRICS, type FoldLosses } from '../engine/index';
import { bytesToFloat64, bytesToUint8, float64ToBytes, uint8ToBytes } from '../fits/codec';
import type { EvaluateInput } from '../fits/compute/evaluate';
import type { FoldOutput } from '../fits/compute/fold';
import type { PathOutput } from '../fits/compute/path';
import { columnsOfSpec, splitHoldout, type SplitTable } from '../fits/compute/table';
import { jobId, type EvaluateJob, type FinishJob, type FitQueue, type FoldJob, type PathJob } from '../fits/jobs';
import { keyMetrics } from '../fits/service/key-metrics';
import type { FitStoredCv, FitStoredResults, FoldStoredLosses, StoredEvaluation } from '../fits/stored-types';
import type { QueuedJob } from '../queue/queue';
import { TaskCancelled, type EngineRunner } from './engine-thread';
import type { EngineTask } from './engine-protocol';
import { cachedTable } from './table-cache';

export interface FitWorkerDeps {
  db: Database;
  send(name: FitQueue, data: object, options?: { id?: string }): Promise<void>;
  /** This worker process's name (recorded with each fold). */
  name: string;
  retryLimit: number;
  /** How often a running task checks whether its fit was cancelled. */
  cancelCheckMs?: number;
}

const ENDED = ['finished', 'failed', 'cancelled'];

async function loadFit(db: Database, fitId: string) {
  const [row] = await db
    .select({ id: fits.id, status: fits.status, spec: fits.spec, datasetVersionId: fits.datasetVersionId, results: fits.results, timings: fits.timings, progress: fits.progress })
    .from(fits)
    .where(eq(fits.id, fitId));
  return row ?? null;
}

async function tablesOf(db: Database, spec: FitSpec): Promise<SplitTable> {
  const table = await cachedTable(db, spec.datasetVersionId, columnsOfSpec(spec));
  return splitHoldout(table, spec.holdout);
}

/** Records a failure in plain words; only a fit still waiting or running changes. */
async function failFit(db: Database, fitId: string, message: string): Promise<void> {
  await db
    .update(fits)
    .set({ status: 'failed', message, finishedAt: sql`now()` })
    .where(and(eq(fits.id, fitId), inArray(fits.status, ['waiting', 'running'])));
}

/** Runs an engine task, ending it early when the fit is cancelled meanwhile. */
async function runWatched<T>(
  deps: FitWorkerDeps,
  thread: EngineRunner,
  fitId: string,
  task: EngineTask,
  onProgress?: (done: number, total: number) => void,
): Promise<T | 'cancelled'> {
  // An evaluation runs for a finished fit; everything else stops when its fit has ended.
  const stopOn = task.kind === 'evaluate' ? ['failed', 'cancelled'] : ENDED;
  const watch = setInterval(() => {
    void loadFit(deps.db, fitId)
      .then((fit) => {
        if (!fit || stopOn.includes(fit.status)) void thread.cancel();
      })
      .catch(() => undefined);
  }, deps.cancelCheckMs ?? 500);
  try {
    return await thread.run<T>(task, onProgress);
  } catch (error) {
    if (error instanceof TaskCancelled) return 'cancelled';
    throw error;
  } finally {
    clearInterval(watch);
  }
}

export function fitJobHandler(deps: FitWorkerDeps, thread: EngineRunner) {
  return async (job: QueuedJob<unknown>): Promise<void> => {
    const fitId = (job.data as { fitId: string }).fitId;
    try {
      if (job.name === 'fit-path') await runPathStep(deps, thread, job.data as PathJob);
      else if (job.name === 'fit-fold') await runFoldStep(deps, thread, job.data as FoldJob, job.retryCount);
      else if (job.name === 'fit-finish') await runFinishStep(deps, thread, job.data as FinishJob);
      else if (job.name === 'fit-evaluate') await runEvaluateStep(deps, thread, job.data as EvaluateJob);
      else throw new Error(`unknown fit job ${job.name}`);
    } catch (error) {
      if (error instanceof EngineInputError) {
        // Bad data or spec found by the engine: retrying would fail again.
        const where = job.name === 'fit-fold' ? `fold ${(job.data as FoldJob).fold + 1}: ` : '';
        if (job.name === 'fit-evaluate') await markEvaluation(deps.db, job.data as EvaluateJob, 'failed', error.message);
        else await failFit(deps.db, fitId, `${where}${error.message}`);
        return;
      }
      if (job.retryCount >= deps.retryLimit && job.name !== 'fit-evaluate') {
        await failFit(deps.db, fitId, `The ${job.name.replace('fit-', '')} step failed ${job.retryCount + 1} times; last error: ${(error as Error).message}`);
      }
      throw error;
    }
  };
}

async function runPathStep(deps: FitWorkerDeps, thread: EngineRunner, job: PathJob): Promise<void> {
  const { db } = deps;
  const fit = await loadFit(db, job.fitId);
  if (!fit || ENDED.includes(fit.status)) return;
  if (!fit.results) {
    await db
      .update(fits)
      .set({ status: 'running', startedAt: sql`coalesce(${fits.startedAt}, now())`, progress: { ...fit.progress, stage: 'path' } })
      .where(and(eq(fits.id, fit.id), inArray(fits.status, ['waiting', 'running'])));
    const tables = await tablesOf(db, fit.spec);
    const started = Date.now();
    let lastWrite = 0;
    const out = await runWatched<PathOutput>(deps, thread, fit.id, { kind: 'path', table: tables.train, spec: fit.spec }, (done, total) => {
      const now = Date.now();
      if (now - lastWrite < 250 && done !== total) return;
      lastWrite = now;
      void db
        .update(fits)
        .set({ progress: sql`${fits.progress} || ${JSON.stringify({ lambdaIndex: done, lambdaCount: total })}::jsonb` })
        .where(and(eq(fits.id, fit.id), eq(fits.status, 'running')))
        .catch(() => undefined);
    });
    if (out === 'cancelled') return;
    const results: FitStoredResults = {
      terms: out.terms,
      termColumns: out.termColumns,
      termGroups: out.termGroups,
      lambda: out.lambda,
      lambdaMax: out.lambdaMax,
      intercept: out.intercept,
      standardizedIntercept: out.standardizedIntercept,
      nonzero: out.nonzero,
      devianceExplained: out.devianceExplained,
      certificates: out.certificates,
      cv: null,
      encoding: out.encoding,
      rowsFitted: out.rowsFitted,
      rowsDropped: out.rowsDropped,
      holdoutRows: tables.holdout?.nRows ?? 0,
      notes: out.notes,
      standardization: out.standardization,
    };
    const stored = await db
      .update(fits)
      .set({
        results,
        coefficients: float64ToBytes(out.coefficients),
        standardizedCoefficients: float64ToBytes(out.standardizedCoefficients),
        progress: { stage: out.folds > 0 ? 'folds' : 'combining', lambdaIndex: out.lambda.length, lambdaCount: out.lambda.length, foldsDone: 0, foldsTotal: out.folds },
        timings: { pathMs: Date.now() - started, foldsQueuedAt: Date.now() },
      })
      .where(and(eq(fits.id, fit.id), eq(fits.status, 'running')))
      .returning({ id: fits.id });
    if (stored.length === 0) return;
  }
  const [now] = await db.select({ progress: fits.progress }).from(fits).where(eq(fits.id, job.fitId));
  const folds = now?.progress.foldsTotal ?? 0;
  if (folds === 0) {
    await deps.send('fit-finish', { fitId: job.fitId }, { id: jobId('finish', job.fitId) });
    return;
  }
  for (let k = 0; k < folds; k++) await deps.send('fit-fold', { fitId: job.fitId, fold: k }, { id: jobId('fold', job.fitId, k) });
}

async function runFoldStep(deps: FitWorkerDeps, thread: EngineRunner, job: FoldJob, retryCount: number): Promise<void> {
  const { db } = deps;
  const fit = await loadFit(db, job.fitId);
  if (!fit || ENDED.includes(fit.status) || !fit.results) return;
  const [done] = await db.select({ fold: fitFolds.fold }).from(fitFolds).where(and(eq(fitFolds.fitId, fit.id), eq(fitFolds.fold, job.fold)));
  if (!done) {
    const tables = await tablesOf(db, fit.spec);
    const out = await runWatched<FoldOutput>(deps, thread, fit.id, { kind: 'fold', table: tables.train, spec: fit.spec, lambda: fit.results.lambda, fold: job.fold, fitId: fit.id });
    if (out === 'cancelled') return;
    await db
      .insert(fitFolds)
      .values({
        fitId: fit.id,
        fold: job.fold,
        worker: deps.name,
        attempt: retryCount + 1,
        nTest: out.nTest,
        losses: { ...(out.losses as Partial<Record<CvMetric, number[]>>), statuses: out.statuses },
        support: uint8ToBytes(out.support),
        timeMs: out.timeMs,
      })
      .onConflictDoNothing();
  }
  const [{ count }] = await db.select({ count: sql<number>`count(*)::int` }).from(fitFolds).where(eq(fitFolds.fitId, fit.id));
  await db
    .update(fits)
    .set({ progress: sql`${fits.progress} || ${JSON.stringify({ foldsDone: count, ...(count >= fit.progress.foldsTotal ? { stage: 'combining' } : {}) })}::jsonb` })
    .where(and(eq(fits.id, fit.id), eq(fits.status, 'running')));
  if (count >= fit.progress.foldsTotal) await deps.send('fit-finish', { fitId: fit.id }, { id: jobId('finish', fit.id) });
}

/** The fold losses combined, with the choices made on the spec's metric (AUC: higher is better). */
function combine(spec: FitSpec, lambda: number[], rows: { fold: number; nTest: number; losses: FoldStoredLosses }[]): FitStoredCv {
  const folds: FoldLosses[] = rows.map((r) => {
    const { statuses, ...losses } = r.losses;
    return { fold: r.fold, nTest: r.nTest, losses, statuses: statuses as FoldLosses['statuses'], support: [] };
  });
  const cv = combineFolds(spec.family, lambda, folds, new Int32Array(0));
  const metric = (spec.metric ?? cv.metric) as CvMetric;
  const curve = cv.curves.find((c) => c.metric === metric) ?? cv.curves[0];
  const lowerIsBetter = metric !== 'auc';
  const choices = chooseLambdas(lambda, { mean: lowerIsBetter ? curve.mean : curve.mean.map((v) => -v), standardError: curve.standardError });
  if (!METRICS[spec.family].includes(metric)) throw new EngineInputError(`metric ${metric} does not apply to a ${spec.family} fit`, 'metric');
  return {
    folds: cv.folds,
    metric,
    mean: curve.mean,
    standardError: curve.standardError,
    minimum: choices.minimum,
    oneStandardError: choices.oneStandardError,
    curves: cv.curves.map((c) => ({ metric: c.metric as CvMetric, mean: c.mean, standardError: c.standardError })),
    unconvergedFolds: rows.filter((r) => r.losses.statuses.some((s) => s !== 'converged')).map((r) => r.fold),
  };
}

async function evaluationInput(db: Database, fit: NonNullable<Awaited<ReturnType<typeof loadFit>>>, results: FitStoredResults, index: number): Promise<EvaluateInput> {
  const [row] = await db.select({ coefficients: fits.coefficients }).from(fits).where(eq(fits.id, fit.id));
  if (!row?.coefficients) throw new Error(`fit ${fit.id} has no stored coefficients`);
  const p = results.terms.length;
  const tables = await tablesOf(db, fit.spec);
  return {
    train: tables.train,
    holdout: tables.holdout,
    spec: fit.spec,
    terms: results.terms,
    encoding: results.encoding,
    intercept: results.intercept[index],
    coefficients: bytesToFloat64(row.coefficients).slice(index * p, (index + 1) * p),
  };
}

async function runFinishStep(deps: FitWorkerDeps, thread: EngineRunner, job: FinishJob): Promise<void> {
  const { db } = deps;
  const fit = await loadFit(db, job.fitId);
  if (!fit || fit.status !== 'running' || !fit.results) return;
  const results = { ...fit.results };
  const L = results.lambda.length;
  const p = results.terms.length;
  let selection: Uint8Array | null = null;
  let foldsUnconverged = false;
  if (fit.progress.foldsTotal > 0) {
    const rows = await db.select().from(fitFolds).where(eq(fitFolds.fitId, fit.id));
    if (rows.length < fit.progress.foldsTotal) return; // a fold's own job sends finish again when it lands
    results.cv = combine(fit.spec, results.lambda, rows);
    foldsUnconverged = results.cv.unconvergedFolds.length > 0;
    selection = new Uint8Array(L * p);
    for (const r of rows) {
      const support = bytesToUint8(r.support);
      for (let i = 0; i < selection.length; i++) selection[i] += support[i];
    }
  }
  const index = results.cv ? results.cv.oneStandardError.index : L - 1;
  const rule = results.cv ? 'one-standard-error' : 'last';
  let evaluation: { state: 'ready' | 'failed'; message: string | null; result: StoredEvaluation | null };
  try {
    const out = await runWatched<StoredEvaluation>(deps, thread, fit.id, { kind: 'evaluate', input: await evaluationInput(db, fit, results, index) });
    if (out === 'cancelled') return;
    evaluation = { state: 'ready', message: null, result: out };
  } catch (error) {
    if (!(error instanceof EngineInputError)) throw error;
    evaluation = { state: 'failed', message: error.message, result: null };
  }
  const unconverged = results.certificates.some((c) => c.status !== 'converged') || foldsUnconverged;
  const cvMs = fit.timings.foldsQueuedAt && results.cv ? Date.now() - fit.timings.foldsQueuedAt : undefined;
  await db.transaction(async (tx) => {
    const updated = await tx
      .update(fits)
      .set({
        status: 'finished',
        results,
        selectionCounts: selection ? uint8ToBytes(selection) : null,
        unconverged,
        message: unconverged ? 'Some solves stopped at their iteration limit: see the certificates.' : null,
        chosenIndex: index,
        chosenRule: rule,
        keyMetrics: keyMetrics(results, index, rule, evaluation.result?.holdout ?? null),
        finishedAt: sql`now()`,
        progress: { ...fit.progress, stage: 'done', foldsDone: fit.progress.foldsTotal },
        timings: { ...fit.timings, ...(cvMs !== undefined ? { cvMs } : {}) },
      })
      .where(and(eq(fits.id, fit.id), eq(fits.status, 'running')))
      .returning({ id: fits.id });
    if (updated.length === 0) return;
    await tx.insert(fitEvaluations).values({ fitId: fit.id, lambdaIndex: index, ...evaluation }).onConflictDoNothing();
  });
}

async function markEvaluation(db: Database, job: EvaluateJob, state: 'ready' | 'failed', message: string | null, result: StoredEvaluation | null = null): Promise<void> {
  await db
    .update(fitEvaluations)
    .set({ state, message, result })
    .where(and(eq(fitEvaluations.fitId, job.fitId), eq(fitEvaluations.lambdaIndex, job.index), eq(fitEvaluations.state, 'waiting')));
}

async function runEvaluateStep(deps: FitWorkerDeps, thread: EngineRunner, job: EvaluateJob): Promise<void> {
  const { db } = deps;
  const fit = await loadFit(db, job.fitId);
  if (!fit || fit.status !== 'finished' || !fit.results) return;
  const [existing] = await db.select({ state: fitEvaluations.state }).from(fitEvaluations).where(and(eq(fitEvaluations.fitId, fit.id), eq(fitEvaluations.lambdaIndex, job.index)));
  if (existing && existing.state !== 'waiting') return;
  const out = await runWatched<StoredEvaluation>(deps, thread, fit.id, { kind: 'evaluate', input: await evaluationInput(db, fit, fit.results, job.index) });
  if (out === 'cancelled') return;
  await markEvaluation(db, job, 'ready', null, out);
  // The version list shows the holdout metric of the chosen lambda.
  const [now] = await db.select({ chosenIndex: fits.chosenIndex, chosenRule: fits.chosenRule }).from(fits).where(eq(fits.id, fit.id));
  if (now?.chosenIndex === job.index && out.holdout) {
    await db
      .update(fits)
      .set({ keyMetrics: keyMetrics(fit.results, job.index, now.chosenRule ?? 'manual', out.holdout) })
      .where(eq(fits.id, fit.id));
  }
}
