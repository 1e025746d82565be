import { describe, it, expect } from 'vitest';
import { mean, sampleStandardDeviation } from 'simple-statistics';
import {
  combineFolds,
  crossValidate,
  planCrossValidation,
  runFold,
  type FoldLosses,
} from '../../../server/engine/cv';
import { crossValidateAdaptive, crossValidateInWorkers } from '../../../server/engine-runner';
import { parseCsvText } from '../../../server/tabular/csv';
import { fitPath } from '../../../server/engine/index';
import { createRng } from '../../../server/engine/random';
import { EngineInputError, type EngineTable, type FitSpec } from '../../../server/engine/types';
import { expectClose } from '../../support/numbers';

function spec(overrides: Partial<FitSpec>): FitSpec {
  return {
    family: 'gaussian', response: 'y', predictors: ['x'], penalty: 'lasso', standardize: true,
    pathLength: 5, tolerance: 1e-10, maxIterations: 100000, screening: 'strong', missing: 'drop',
    cv: { folds: 3, seed: 1 }, ...overrides,
  };
}

function csv(header: string, rows: (number | string)[][]): EngineTable {
  return parseCsvText(`${header}\n${rows.map((r) => r.join(',')).join('\n')}\n`, 'test.csv');
}

// One predictor; fold 3 holds outlying x values, so its training rows (folds 1, 2) have a much
// smaller mean and sd than all rows: standardizing with all rows would change every fold's fit.
const X = [0.2, -1.1, 0.7, 1.5, -0.4, 0.9, -1.6, 0.3, 9.5, 12.0, 8.1, 10.7];
const Y = [1.0, -0.5, 1.9, 2.2, 0.1, 1.4, -1.0, 0.8, 6.1, 9.0, 5.5, 8.2];
const FOLD = [1, 1, 1, 1, 2, 2, 2, 2, 3, 3, 3, 3];
const oneColumn = csv('y,x,fold', X.map((x, i) => [Y[i], x, FOLD[i]]));
const LAMBDA = [3, 1, 0.3, 0.05];

/**
 * Closed form (common practice): with one standardized column (x_s'x_s/n = 1) the
 * lasso coefficient is soft(z, lambda), z = x_s'(y - mean y)/n; back on the original scale
 * b = b_s / sd, b0 = mean y - b mean x. `learnOn` gives the rows whose mean and sd standardize.
 */
function closedFormFoldMse(fold: number, lambda: number, learnOn: 'training' | 'all'): number {
  const train = FOLD.map((f, i) => (f !== fold ? i : -1)).filter((i) => i >= 0);
  const test = FOLD.map((f, i) => (f === fold ? i : -1)).filter((i) => i >= 0);
  const scaleRows = learnOn === 'training' ? train : X.map((_, i) => i);
  const mx = mean(scaleRows.map((i) => X[i]));
  const sd = Math.sqrt(mean(scaleRows.map((i) => (X[i] - mx) ** 2)));
  const my = mean(train.map((i) => Y[i]));
  // With leaked centring the training column is not centred, so the intercept absorbs its mean.
  const xs = train.map((i) => (X[i] - mx) / sd);
  const xsMean = mean(xs);
  const z = mean(train.map((i, k) => (xs[k] - xsMean) * (Y[i] - my))) / mean(xs.map((v) => (v - xsMean) ** 2));
  const ssx = mean(xs.map((v) => (v - xsMean) ** 2));
  const bs = (Math.sign(z) * Math.max(Math.abs(z) * ssx - lambda, 0)) / ssx;
  const b = bs / sd;
  const b0 = my - b * mean(train.map((i) => X[i]));
  return mean(test.map((i) => (Y[i] - b0 - b * X[i]) ** 2));
}

describe('crossValidate (gaussian, one predictor, folds from a column)', () => {
  const s = spec({ lambda: LAMBDA, pathLength: LAMBDA.length, cv: { folds: 0, seed: 0, foldColumn: 'fold' } });
  const path = fitPath(oneColumn, s);
  const cv = crossValidate(oneColumn, s, path);

  it('matches the closed-form fold errors, standardization learnt on training rows only', () => {
    LAMBDA.forEach((lambda, l) => {
      const perFold = [1, 2, 3].map((f) => closedFormFoldMse(f, lambda, 'training'));
      expectClose(`CV mse at lambda ${lambda}`, cv.mean[l], mean(perFold), 1e-6);
      expectClose(`CV se at lambda ${lambda}`, cv.standardError[l], sampleStandardDeviation(perFold) / Math.sqrt(3), 1e-6);
    });
  });

  it('would differ if centring and scaling leaked from the held-out rows (the check can fail)', () => {
    const leaky = mean([1, 2, 3].map((f) => closedFormFoldMse(f, LAMBDA[1], 'all')));
    expect(Math.abs(leaky - cv.mean[1]) / cv.mean[1]).toBeGreaterThan(0.01);
  });

  it('maps fold ids 1, 2, 3 to 0, 1, 2, and takes the grid from the full-data path', () => {
    expect(cv.folds).toBe(3);
    expect(Array.from(cv.foldIds)).toEqual(FOLD.map((f) => f - 1));
    expect(path.lambda).toEqual(LAMBDA);
  });

  it('gives the same result from separately run, serialized folds (queue jobs)', () => {
    const plan = planCrossValidation(oneColumn, s, path);
    const folds: FoldLosses[] = [2, 0, 1].map((k) => JSON.parse(JSON.stringify(runFold(oneColumn, s, plan.foldIds, k, path.lambda))));
    expect(combineFolds('gaussian', path.lambda, folds, plan.foldIds)).toEqual(cv);
  });

  it('reports mean absolute error too', () => {
    expect(cv.curves.map((c) => c.metric)).toEqual(['mse', 'mae']);
  });
});

function binomialTable(n: number, seed: number): EngineTable {
  const rng = createRng(seed);
  const rows = Array.from({ length: n }, (_, i) => {
    const x1 = rng.normal();
    const x2 = rng.normal();
    const y = i % 10 < 3 ? 1 : 0; // exactly 30% ones
    return [y, x1 + (y ? 1 : 0), x2];
  });
  return csv('y,x1,x2', rows);
}

describe('crossValidate (binomial, random stratified folds)', () => {
  const table = binomialTable(100, 4);
  const s = spec({ family: 'binomial', predictors: ['x1', 'x2'], tolerance: 1e-8, cv: { folds: 5, seed: 9 } });
  const path = fitPath(table, s);
  const cv = crossValidate(table, s, path);

  it('keeps the class proportions in every fold (30 ones over 5 folds: 6 each)', () => {
    const y = Array.from({ length: 100 }, (_, i) => (i % 10 < 3 ? 1 : 0));
    for (let f = 0; f < 5; f++) {
      const rows = y.filter((_, i) => cv.foldIds[i] === f);
      expect(rows.filter((v) => v === 1).length, `ones in fold ${f}`).toBe(6);
      expect(rows.length, `rows in fold ${f}`).toBe(20);
    }
  });

  it('chooses on deviance and reports misclassification and AUC; AUC rises as the fit gains signal', () => {
    expect(cv.metric).toBe('deviance');
    expect(cv.curves.map((c) => c.metric)).toEqual(['deviance', 'misclassification', 'auc']);
    const auc = cv.curves[2].mean;
    expect(auc[auc.length - 1]).toBeGreaterThan(0.6);
    expect(cv.oneStandardError.index).toBeLessThanOrEqual(cv.minimum.index);
    expect(cv.mean[cv.minimum.index]).toBe(Math.min(...cv.mean));
  });

  it('is deterministic for a seed; another seed gives other folds', () => {
    expect(crossValidate(table, s, path)).toEqual(cv);
    const other = crossValidate(table, { ...s, cv: { folds: 5, seed: 10 } }, path);
    expect(Array.from(other.foldIds)).not.toEqual(Array.from(cv.foldIds));
  });

  it('gives identical results in worker threads', async () => {
    expect(await crossValidateInWorkers(table, s, path)).toEqual(cv);
  });
});

describe('bad cross-validation input', () => {
  const s = spec({ cv: { folds: 3, seed: 1 } });
  const path = fitPath(oneColumn, s);
  const cases: [string, Partial<FitSpec>, RegExp][] = [
    ['K < 2', { cv: { folds: 1, seed: 1 } }, /folds must be an integer of at least 2/],
    ['K > n', { cv: { folds: 13, seed: 1 } }, /folds \(13\) cannot exceed the number of usable rows \(12\)/],
    ['an unknown fold column', { cv: { folds: 0, seed: 1, foldColumn: 'nope' } }, /unknown column "nope"/],
    ['a fold column that is a predictor', { predictors: ['x', 'fold'], cv: { folds: 0, seed: 1, foldColumn: 'fold' } }, /fold column "fold" cannot also be the response or a predictor/],
    ['a fold column with fractions', { cv: { folds: 0, seed: 1, foldColumn: 'x' }, predictors: ['fold'] }, /fold column "x" must hold integer fold ids; row 1 has 0\.2/],
  ];
  for (const [what, overrides, message] of cases) {
    it(`rejects ${what}`, () => {
      const bad = { ...s, ...overrides };
      expect(() => crossValidate(oneColumn, bad, path)).toThrow(EngineInputError);
      expect(() => crossValidate(oneColumn, bad, path)).toThrow(message);
    });
  }

  it('rejects a binomial fold whose training rows hold one class', () => {
    // All class-1 rows sit in fold 1, so fold 1's training rows are all class 0.
    const table = csv('y,x,fold', [[1, 0.5, 1], [1, 0.1, 1], [0, 0.3, 1], [0, -0.2, 2], [0, 0.9, 2], [0, 0.4, 3], [0, -1, 3]]);
    const b = spec({ family: 'binomial', lambda: [0.1], pathLength: 1, cv: { folds: 0, seed: 1, foldColumn: 'fold' } });
    const p = fitPath(table, b);
    expect(() => crossValidate(table, b, p)).toThrow(/fold 1: every training row has class 0; a binomial fit needs both classes/);
  });
});

describe('a term constant on a fold\'s training rows', () => {
  // "rare" is 1 only on fold 1's rows, so fold 1's training rows see it constant (all 0): it must get
  // coefficient 0 there, making fold 1's fit the same as a fit without that column.
  const rng = createRng(8);
  const rows = Array.from({ length: 30 }, (_, i) => {
    const fold = (i % 3) + 1;
    const x = rng.normal();
    const rare = fold === 1 && i < 9 ? 1 : 0;
    return [x + 3 * rare + 0.2 * rng.normal(), x, rare, fold];
  });
  const withRare = csv('y,x,rare,fold', rows);
  const withoutRare = csv('y,x,fold', rows.map(([y, x, , f]) => [y, x, f]));
  const s = spec({ lambda: [0.5, 0.1, 0.01], pathLength: 3, cv: { folds: 0, seed: 0, foldColumn: 'fold' } });

  it('gets coefficient 0 there: the fold matches a fit without the column', () => {
    const sWith = { ...s, predictors: ['x', 'rare'] };
    const planWith = planCrossValidation(withRare, sWith, fitPath(withRare, sWith));
    const a = runFold(withRare, sWith, planWith.foldIds, 0, s.lambda as number[]);
    const b = runFold(withoutRare, s, planWith.foldIds, 0, s.lambda as number[]);
    a.losses.mse?.forEach((v, l) => expectClose(`fold 1 mse at lambda ${l}`, v, b.losses.mse?.[l] as number, 1e-6));
    expect(a.statuses.every((st) => st === 'converged')).toBe(true);
  });
});

describe('crossValidateAdaptive', () => {
  const table = binomialTable(60, 6);
  const s = spec({ family: 'binomial', predictors: ['x1', 'x2'], tolerance: 1e-8, cv: { folds: 4, seed: 2 } });
  const path = fitPath(table, s);
  const expected = crossValidate(table, s, path);
  it('gives the in-process result whether it stays in this thread or moves to workers', async () => {
    const here = await crossValidateAdaptive(table, s, path, undefined, Infinity);
    expect(here.workers).toBe(0);
    expect(here.result).toEqual(expected);
    const moved = await crossValidateAdaptive(table, s, path, undefined, 0);
    expect(moved.workers).toBe(2);
    expect(moved.result).toEqual(expected);
  });
});
