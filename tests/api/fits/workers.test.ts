/**
 * Worker processes (`tsx server/worker/main.ts`) on one fit: two processes split its folds, and a
 * process killed mid-fold leaves its job to be retried by another, the fit finishing exactly once and
 * bitwise identical to the undisturbed run. Short job expiry and polling (FAST_QUEUE_ENV) keep it quick.
 */
import type { ChildProcess } from 'node:child_process';
import { eq, sql } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { FitRequestInput } from '../../../shared/fits';
import type { ModelListItemDto } from '../../../shared/models';
import { fitEvaluations, fitFolds, fits } from '../../../server/db/schema/index';
import { signUp, type Session } from '../../support/session';
import { closeFitsApp, createModel, regressionCsv, runFit, spawnWorker, startFitsApp, uploadCsv, waitForFit, type FitsApp } from './support';

let t: FitsApp;
let alice: Session;
let model: ModelListItemDto;
let firstFitId: string;

// A binomial elastic net on 800 x 42: each fold takes about a second, long enough to be caught mid-way.
const spec: FitRequestInput = {
  predictors: ['x1', 'x2', ...Array.from({ length: 40 }, (_, k) => `n${k + 1}`)],
  penalty: 'elastic-net',
  l1Share: 0.5,
  tolerance: 1e-10,
  path: { kind: 'automatic', pathLength: 100 },
  cv: { kind: 'folds', folds: 10, seed: 3 },
};

function ready(child: ChildProcess): Promise<void> {
  return new Promise((resolve, reject) => {
    let out = '';
    child.stdout!.on('data', (d: Buffer) => {
      out += d.toString();
      if (out.includes('fit worker')) resolve();
    });
    child.once('exit', (code) => reject(new Error(`worker exited (${code}) before it was ready`)));
  });
}

function stop(child: ChildProcess, signal: NodeJS.Signals = 'SIGTERM'): Promise<void> {
  if (child.exitCode !== null || child.signalCode !== null) return Promise.resolve();
  return new Promise((resolve) => {
    child.once('exit', () => resolve());
    child.kill(signal);
  });
}

async function foldRows(fitId: string) {
  return t.ctx.db.select({ fold: fitFolds.fold, worker: fitFolds.worker, attempt: fitFolds.attempt }).from(fitFolds).where(eq(fitFolds.fitId, fitId)).orderBy(fitFolds.fold);
}

/** Waits until a fold job of the fit is active (taken by a worker) and its fold is not stored yet. */
async function foldInFlight(fitId: string, timeoutMs = 150_000): Promise<void> {
  const deadline = Date.now() + timeoutMs;
  for (;;) {
    const taken = await t.ctx.db.execute(
      sql`SELECT 1 FROM pgboss.job j WHERE j.name = 'fit-fold' AND j.state = 'active' AND j.data->>'fitId' = ${fitId}
          AND NOT EXISTS (SELECT 1 FROM ${fitFolds} f WHERE f.fit_id = ${fitId} AND f.fold = (j.data->>'fold')::int)`,
    );
    if (taken.rows.length > 0) return;
    if (Date.now() > deadline) throw new Error(`no fold of fit ${fitId} in flight after ${timeoutMs} ms`);
    await new Promise((r) => setTimeout(r, 20));
  }
}

beforeAll(async () => {
  t = await startFitsApp({ inProcessWorker: false });
  alice = await signUp(t.app);
  const data = await uploadCsv(alice, regressionCsv(800, 40, 3), 'Workers');
  model = await createModel(alice, { name: 'Workers', datasetId: data.datasetId, outcome: 'yes', family: 'binomial' });
});
afterAll(async () => closeFitsApp(t));

describe('worker processes', () => {
  it('two worker processes share one fit\'s folds (each fold stored once, by the worker that ran it)', async () => {
    const a = spawnWorker(t, 'worker-a');
    const b = spawnWorker(t, 'worker-b');
    await Promise.all([ready(a), ready(b)]);
    const fit = await waitForFit(alice, (await runFit(alice, model.id, spec)).id, undefined, 150_000);
    expect(fit.status, fit.message ?? '').toBe('finished');
    firstFitId = fit.id;
    const rows = await foldRows(fit.id);
    expect(rows.map((r) => r.fold)).toEqual([0, 1, 2, 3, 4, 5, 6, 7, 8, 9]);
    const workers = new Set(rows.map((r) => r.worker));
    expect([...workers].sort()).toEqual(['worker-a', 'worker-b']);
    await Promise.all([stop(a), stop(b)]);
  }, 180_000);

  it('a worker killed mid-fold: its job is retried by another worker and the fit finishes once, identical to the first run', async () => {
    const c = spawnWorker(t, 'worker-c');
    await ready(c);
    const queued = await runFit(alice, model.id, spec);
    // Wait until C has stored a fold and is working on the next one, then kill it without warning.
    await waitForFit(alice, queued.id, (f) => f.progress.stage === 'folds' && f.progress.foldsDone >= 1, 150_000);
    // ...and C holds a fold job it has not stored yet: killed between storing a fold and taking the
    // next one, C would leave no fold half done (the stored fold's job is retried but skipped).
    await foldInFlight(queued.id);
    await stop(c, 'SIGKILL');
    const killedAt = await foldRows(queued.id);
    expect(killedAt.length).toBeLessThan(10);
    const d = spawnWorker(t, 'worker-d');
    await ready(d);
    const fit = await waitForFit(alice, queued.id, undefined, 150_000);
    expect(fit.status, fit.message ?? '').toBe('finished');
    const rows = await foldRows(queued.id);
    expect(rows.map((r) => r.fold)).toEqual([0, 1, 2, 3, 4, 5, 6, 7, 8, 9]);
    expect(rows.some((r) => r.worker === 'worker-d')).toBe(true);
    // The fold C was running when it died was handed out again (pg-boss retry after the expiry).
    expect(rows.some((r) => r.worker === 'worker-d' && r.attempt >= 2)).toBe(true);
    const evaluations = await t.ctx.db.select().from(fitEvaluations).where(eq(fitEvaluations.fitId, queued.id));
    expect(evaluations).toHaveLength(1);
    const [first, second] = await Promise.all([firstFitId, queued.id].map(async (id) => (await t.ctx.db.select().from(fits).where(eq(fits.id, id)))[0]));
    expect(Buffer.compare(first.coefficients!, second.coefficients!)).toBe(0);
    expect(Buffer.compare(first.selectionCounts!, second.selectionCounts!)).toBe(0);
    expect(first.results!.cv!.mean.every((v, i) => Object.is(v, second.results!.cv!.mean[i]))).toBe(true);
    const retried = await t.ctx.db.execute(sql`SELECT count(*)::int AS n FROM pgboss.job WHERE name = 'fit-fold' AND data->>'fitId' = ${queued.id} AND retry_count > 0`);
    expect((retried.rows[0] as { n: number }).n).toBeGreaterThanOrEqual(1);
    await stop(d);
  }, 240_000);
});
