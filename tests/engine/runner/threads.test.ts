/**
 * The runner's threads (server/engine-runner/parallel.ts): folds claimed from one shared counter by
 * worker threads and this thread, the design in shared memory, folds running beside the full path,
 * folds fitted here and scored on a worker.
 * Whichever thread runs a fold, the results must be those of one thread, bit for bit.
 */
import { describe, expect, it } from 'vitest';
import { crossValidate, crossValidatePrepared } from '../../../server/engine/cv';
import { attachFoldsBeside, coreToSpare, cpuSnapshot, crossValidateScoringBeside, fitPathAndFolds, scoringBesidePays, SCORING_WORK_THRESHOLD, startFoldWorker, threadsPay, THREAD_WORK_THRESHOLD } from '../../../server/engine-runner';
import { attachFolds, fitPath, fitPathPrepared, plannedGrid, prepareFit } from '../../../server/engine/index';
import { foldAssignment } from '../../../server/engine/cv';
import { createRng } from '../../../server/engine/random';
import { parseCsvText } from '../../../server/tabular/csv';
import type { EngineTable, FitSpec, PathResult } from '../../../server/engine/types';

/** n rows, p correlated columns on different scales and offsets, a few effects (seeded). */
function table(n: number, p: number, seed: number): EngineTable {
  const rng = createRng(seed);
  const names = Array.from({ length: p }, (_, j) => `x${j + 1}`);
  const lines = [['y', ...names].join(',')];
  for (let i = 0; i < n; i++) {
    const x: number[] = [];
    for (let j = 0; j < p; j++) x.push((j > 0 ? 0.5 * x[j - 1] : 0) + rng.normal());
    const y = 2 * x[0] - x[2] + 0.5 * x[p - 1] + rng.normal();
    lines.push([y.toFixed(6), ...x.map((v, j) => (10 * j + v * (1 + j)).toFixed(6))].join(','));
  }
  return parseCsvText(`${lines.join('\n')}\n`, 'threads.csv');
}

const base = (predictors: string[]): FitSpec => ({
  family: 'gaussian', response: 'y', predictors, penalty: 'lasso', standardize: true,
  pathLength: 12, tolerance: 1e-8, maxIterations: 100000, screening: 'strong', missing: 'drop',
  cv: { folds: 5, seed: 4 },
});

describe('fitPathAndFolds: the full path and its folds on this thread and a worker', () => {
  // 80 x 6 is in the Gram form (folds of 64 rows >= 2p); 40 x 30 is not.
  const cases: [string, EngineTable, FitSpec][] = [
    ['Gram form, automatic grid', table(80, 6, 1), base(['x1', 'x2', 'x3', 'x4', 'x5', 'x6'])],
    ['design form, explicit grid', table(40, 30, 2), { ...base(Array.from({ length: 30 }, (_, j) => `x${j + 1}`)), lambda: [2, 1, 0.5, 0.2, 0.1] }],
    ['automatic grid ended by maxTerms (grid unknown before the path)', table(80, 6, 3), { ...base(['x1', 'x2', 'x3', 'x4', 'x5', 'x6']), maxTerms: 2 }],
  ];
  // Everything but the solves' wall-clock times.
  const untimed = (r: PathResult) => ({ ...r, solves: r.solves.map((info) => ({ ...info, timeMs: 0 })) });
  for (const [what, t, s] of cases) {
    it(`${what}: identical to fitPath and crossValidate in one thread`, async () => {
      const path = fitPath(t, s);
      const cv = crossValidate(t, s, path);
      const worker = startFoldWorker();
      try {
        // Every fold on the worker (a known split, so its results are surely compared) ...
        const onWorker = await fitPathAndFolds(s, prepareFit(t, s), worker, false);
        expect(onWorker.foldsOnWorker).toBe(cv.folds);
        expect(untimed(onWorker.path)).toEqual(untimed(path));
        expect(onWorker.cv).toEqual(cv);
        // ... and shared as it happens between this thread and the worker.
        const shared = await fitPathAndFolds(s, prepareFit(t, s), worker);
        expect(untimed(shared.path)).toEqual(untimed(path));
        expect(shared.cv).toEqual(cv);
      } finally {
        await worker.stop();
      }
    }, 30_000);
  }

  it('fold blocks split between this thread and the worker (attachFoldsBeside) equal prepareFit\'s, and the fit on them equals fitPath', async () => {
    const t = table(120, 6, 6);
    const s = { ...base(['x1', 'x2', 'x3', 'x4', 'x5', 'x6']), cv: { folds: 5, seed: 9 } };
    // prepareFit's plan with the rows regrouped by fold, as attachFoldsBeside always makes it.
    const expected = prepareFit(t, s, false);
    attachFolds(t, s, expected, undefined, true);
    expect(expected.folds?.shared.blocks, 'the case must be in the Gram form').toBeDefined();
    const prepared = prepareFit(t, s, false);
    const worker = startFoldWorker();
    try {
      await attachFoldsBeside(t, s, prepared, worker, foldAssignment(t, s, s.cv, prepared.built));
      const plain = (v: unknown): unknown => JSON.parse(JSON.stringify(v, (_k, x: unknown) => (x instanceof Float64Array ? Array.from(x) : x)));
      expect(plain(prepared.folds)).toEqual(plain(expected.folds));
      expect(plain(prepared.crossProducts)).toEqual(plain(expected.crossProducts));
      const both = await fitPathAndFolds(s, prepared, worker);
      const path = fitPath(t, s);
      expect(both.path.coefficients).toEqual(path.coefficients);
      expect(both.cv).toEqual(crossValidate(t, s, path));
    } finally {
      await worker.stop();
    }
  }, 30_000);

  it('folds fitted here and scored on the worker (crossValidateScoringBeside) give crossValidate\'s result, bit for bit', async () => {
    const t = table(150, 5, 8);
    const s = { ...base(['x1', 'x2', 'x3', 'x4', 'x5']), cv: { folds: 5, seed: 2 } };
    const prepared = prepareFit(t, s, false);
    const worker = startFoldWorker();
    try {
      // Without the regrouped rows in shared memory it refuses (the rows would be copied per fold).
      const plain = prepareFit(t, s);
      await expect(crossValidateScoringBeside(s, fitPathPrepared(plain), plain, worker)).rejects.toThrow(/shared memory/);
      await attachFoldsBeside(t, s, prepared, worker, foldAssignment(t, s, s.cv, prepared.built));
      const path = fitPathPrepared(prepared);
      const beside = await crossValidateScoringBeside(s, path, prepared, worker);
      expect(beside).toEqual(crossValidatePrepared(s, path, prepareFit(t, s)));
      expect(beside).toEqual(crossValidate(t, s, fitPath(t, s)));
    } finally {
      await worker.stop();
    }
  }, 30_000);

  it('scores on a worker only in the Gram form (rows regrouped by fold) and from the scoring threshold', () => {
    const s = { ...base(['x1', 'x2', 'x3', 'x4', 'x5']), cv: { folds: 5, seed: 2 } };
    const t = table(150, 5, 8);
    const tall = prepareFit(t, s, false);
    attachFolds(t, s, tall, undefined, true);
    expect(tall.folds?.shared.byFold, 'the Gram form regroups the rows by fold when asked').toBeDefined();
    expect(scoringBesidePays(prepareFit(t, s), 1e9), 'not without the regrouped rows').toBe(false);
    // 150 x 5 x L: the threshold is reached with L = 1e8 / 750 lambdas, not with 12.
    expect(scoringBesidePays(tall, 12)).toBe(false);
    expect(scoringBesidePays(tall, Math.ceil(SCORING_WORK_THRESHOLD / 750))).toBe(true);
    const ws = { ...base(Array.from({ length: 30 }, (_, j) => `x${j + 1}`)), cv: { folds: 5, seed: 2 } };
    const wt = table(40, 30, 2);
    const wide = prepareFit(wt, ws, false);
    attachFolds(wt, ws, wide, undefined, true);
    expect(wide.folds?.shared.byFold).toBeUndefined();
    expect(scoringBesidePays(wide, 1e9)).toBe(false);
  });

  it('plannedGrid is the grid the path then fits, and null when maxTerms may end it early', () => {
    const t = table(80, 6, 5);
    const s = base(['x1', 'x2', 'x3', 'x4', 'x5', 'x6']);
    const prepared = prepareFit(t, s);
    const grid = plannedGrid(prepared);
    expect(grid).toEqual(fitPathPrepared(prepared).lambda);
    expect(plannedGrid(prepareFit(t, { ...s, maxTerms: 2 }))).toBeNull();
  });

  it('a failing fold fails the whole cross-validation with the first failing fold\'s error', async () => {
    // Binomial: every class-1 row is in the first fold (id 2), so that fold's training rows hold
    // class 0 only; the other folds are fine.
    const lines = ['y,x,fold'];
    for (let i = 0; i < 30; i++) lines.push(`${i % 10 === 0 ? 1 : 0},${(i * 0.37) % 5},${i % 10 === 0 ? 2 : (i % 3) + 3}`);
    const t = parseCsvText(`${lines.join('\n')}\n`, 'one-class.csv');
    const s: FitSpec = { ...base(['x']), family: 'binomial', lambda: [0.1, 0.01], cv: { folds: 0, seed: 0, foldColumn: 'fold' } };
    expect(() => crossValidate(t, s, fitPath(t, s))).toThrow(/fold 1: every training row has class 0/);
    const worker = startFoldWorker();
    try {
      await expect(fitPathAndFolds(s, prepareFit(t, s), worker)).rejects.toThrow(/fold 1: every training row has class 0/);
    } finally {
      await worker.stop();
    }
  }, 30_000);
});

describe('threadsPay', () => {
  it('uses a second thread only above the work estimate', () => {
    const prepared = (n: number, p: number) => ({ built: { design: { n, p } } }) as Parameters<typeof threadsPay>[0];
    // The bench shapes (10 folds, 100 lambdas): only 600 x 5000 gains from a worker (THREAD_WORK_THRESHOLD).
    expect(threadsPay(prepared(600, 5000), 10, 100)).toBe(true);
    expect(threadsPay(prepared(20000, 200), 10, 100)).toBe(false);
    expect(threadsPay(prepared(300, 1500), 10, 100)).toBe(false);
    expect(threadsPay(prepared(569, 30), 10, 100)).toBe(false);
    // At the threshold exactly: 10 folds x 100 lambdas x p x min(n, p).
    const p = Math.sqrt(THREAD_WORK_THRESHOLD / 1000);
    expect(threadsPay(prepared(10 * p, p), 10, 100)).toBe(true);
    expect(threadsPay(prepared(10 * p, p), 10, 99)).toBe(false);
  });
});

describe('coreToSpare', () => {
  // 2 cores over a 400 ms window: 800 ms of core time in all; this process used 300 ms of it.
  const since = { idle: 1000, total: 5000, process: 50, cores: 2, at: 0 };
  const after = (idle: number, process = 350) => ({ idle, total: 5800, process, cores: 2, at: 400 });
  it('needs one core and half another left by other processes', () => {
    // Busy 800 - idle; others = busy - 300. Free for this process = 800 - others >= 600.
    expect(coreToSpare(since, after(1000 + 300))).toBe(true); // others 200
    expect(coreToSpare(since, after(1000 + 290))).toBe(false); // others 210
    expect(coreToSpare(since, after(1000))).toBe(false); // others 500
    // This process's own use (e.g. its worker starting) does not count against the spare core.
    expect(coreToSpare(since, after(1000 + 100, 550))).toBe(true); // busy 700, others 200
  });
  it('needs two cores; a window too short to measure assumes they are free', () => {
    expect(coreToSpare(since, { idle: 1000, total: 5050, process: 60, cores: 2, at: 25 })).toBe(true);
    expect(coreToSpare({ ...since, cores: 1 }, { idle: 1000, total: 5050, process: 60, cores: 1, at: 25 })).toBe(false);
  });
  it('reads this machine\'s counters', () => {
    const a = cpuSnapshot();
    expect(a.total).toBeGreaterThan(0);
    expect(a.idle).toBeLessThanOrEqual(a.total);
    expect(a.cores).toBeGreaterThan(0);
  });
});
