/**
 * What folds share (server/engine/cv/foldData.ts): the gaussian Gram form's S(all) - S(held out)
 * must give the folds the fits their own rows give, and with missing: 'impute' each fold must impute
 * from its training rows only.
 */
import { mean } from 'simple-statistics';
import { describe, expect, it } from 'vitest';
import { combineFolds, crossValidate, planCrossValidation, planFolds, runFoldOnDesign } from '../../../server/engine/cv';
import { parseCsvText } from '../../../server/tabular/csv';
import { fitPath } from '../../../server/engine/index';
import { createRng } from '../../../server/engine/random';
import type { FitSpec } from '../../../server/engine/types';
import { expectClose } from '../../support/numbers';

describe('gaussian folds through the cross products of all rows', () => {
  // n = 90 rows, p = 6 columns: training folds of 60 rows are in the Gram form (n >= 2p).
  const rng = createRng(31);
  const lines = ['y,a,b,c,d,e,f,fold'];
  for (let i = 0; i < 90; i++) {
    const x = Array.from({ length: 6 }, () => 50 + 10 * rng.normal());
    lines.push([(x[0] - 2 * x[1] + 0.5 * x[3] + 5 * rng.normal()).toFixed(6), ...x.map((v) => v.toFixed(6)), i % 3].join(','));
  }
  const table = parseCsvText(`${lines.join('\n')}\n`, 'gram.csv');
  const spec: FitSpec = {
    family: 'gaussian', response: 'y', predictors: ['a', 'b', 'c', 'd', 'e', 'f'], penalty: 'elastic-net', l1Share: 0.8,
    standardize: true, pathLength: 12, tolerance: 1e-10, maxIterations: 100000, screening: 'strong', missing: 'drop',
    cv: { folds: 0, seed: 0, foldColumn: 'fold' },
  };
  const path = fitPath(table, spec);

  // The plan with the rows regrouped by fold, as the CLI asks for it (planFolds' `regroup`).
  const regrouped = () => {
    const plan = planCrossValidation(table, spec, path);
    const cv = spec.cv as NonNullable<FitSpec['cv']>;
    return { ...plan, shared: planFolds(table, { ...spec, cv }, plan.built, plan.options, undefined, true).shared };
  };

  it('regroups the rows by fold when asked: each fold\'s rows in ascending order, every column', () => {
    expect(planCrossValidation(table, spec, path).shared.byFold, 'not unless asked (the studio\'s jobs)').toBeUndefined();
    const plan = regrouped();
    const byFold = plan.shared.byFold;
    expect(byFold, 'the plan should carry the rows regrouped by fold in the Gram form').toBeDefined();
    if (!byFold?.y) return;
    const { n, p, x } = plan.built.design;
    let at = 0;
    for (let k = 0; k < plan.folds; k++) {
      expect(byFold.start[k], `fold ${k + 1} starts after the folds before it`).toBe(at);
      for (let i = 0; i < n; i++) {
        if (plan.foldIds[i] !== k) continue;
        for (let j = 0; j < p; j++) expect(byFold.x[j * n + at], `row ${i + 1}, column ${j + 1}`).toBe(x[j * n + i]);
        expect(byFold.y[at], `response of row ${i + 1}`).toBe(plan.built.y[i]);
        at++;
      }
    }
    expect(byFold.start[plan.folds]).toBe(n);
  });

  it('scores the held-out rows where they were regrouped: the same losses, bit for bit, as a copy of them', () => {
    const plan = regrouped();
    const { byFold, ...withoutRows } = plan.shared;
    expect(byFold).toBeDefined();
    for (let k = 0; k < plan.folds; k++) {
      const regrouped = runFoldOnDesign(plan.built.design, plan.built.y, plan.options, plan.foldIds, k, plan.lambda, plan.shared);
      const copied = runFoldOnDesign(plan.built.design, plan.built.y, plan.options, plan.foldIds, k, plan.lambda, withoutRows);
      expect(regrouped.losses, `fold ${k + 1}`).toEqual(copied.losses);
    }
  });

  it('crossValidate uses them and its curve equals the folds fitted from their own rows', () => {
    const plan = planCrossValidation(table, spec, path);
    expect(plan.shared.crossProducts, 'the plan should carry S(all) in the Gram form').toBeDefined();
    const cv = crossValidate(table, spec, path);
    // Direct: no shared data, so every fold builds its Gram from its training rows.
    const direct = combineFolds('gaussian', path.lambda, [0, 1, 2].map((k) => runFoldOnDesign(plan.built.design, plan.built.y, plan.options, plan.foldIds, k, plan.lambda)), plan.foldIds);
    path.lambda.forEach((lambda, l) => {
      expectClose(`CV mse at lambda ${lambda}`, cv.mean[l], direct.mean[l], 1e-8);
      expectClose(`CV se at lambda ${lambda}`, cv.standardError[l], direct.standardError[l], 1e-8);
    });
  });
});

describe('missing: impute learns the fill-in values on each fold\'s training rows', () => {
  // Fold 3's observed x are large, and its rows with a missing x are in fold 1 and 2 as well: the
  // mean over all rows (leaky) differs much from each fold's training mean.
  const X = [0.2, NaN, 0.7, 1.5, -0.4, NaN, -1.6, 0.3, 9.5, 12.0, NaN, 10.7];
  const Y = [1.0, 0.4, 1.9, 2.2, 0.1, 0.9, -1.0, 0.8, 6.1, 9.0, 7.5, 8.2];
  const FOLD = [1, 1, 1, 1, 2, 2, 2, 2, 3, 3, 3, 3];
  const table = parseCsvText(`y,x,fold\n${X.map((x, i) => `${Y[i]},${Number.isNaN(x) ? '' : x},${FOLD[i]}`).join('\n')}\n`, 'impute.csv');
  const LAMBDA = [1, 0.3, 0.05];
  const spec: FitSpec = {
    family: 'gaussian', response: 'y', predictors: ['x'], penalty: 'lasso', standardize: true,
    lambda: LAMBDA, pathLength: LAMBDA.length, tolerance: 1e-12, maxIterations: 100000, screening: 'strong',
    missing: 'impute', cv: { folds: 0, seed: 0, foldColumn: 'fold' },
  };

  /**
   * Closed form (common practice): one standardized column gives the lasso
   * coefficient soft(z, lambda), z = x_s'(y - mean y)/n; b = b_s / sd, b0 = mean y - b mean x.
   * Missing x are filled with the mean of the observed x over `learnOn` rows, in training and
   * held-out rows alike.
   */
  function foldMse(fold: number, lambda: number, learnOn: 'training' | 'all'): number {
    const train = FOLD.map((f, i) => (f !== fold ? i : -1)).filter((i) => i >= 0);
    const test = FOLD.map((f, i) => (f === fold ? i : -1)).filter((i) => i >= 0);
    const source = learnOn === 'training' ? train : X.map((_, i) => i);
    const fill = mean(source.map((i) => X[i]).filter((v) => !Number.isNaN(v)));
    const x = X.map((v) => (Number.isNaN(v) ? fill : v));
    const mx = mean(train.map((i) => x[i]));
    const sd = Math.sqrt(mean(train.map((i) => (x[i] - mx) ** 2)));
    const my = mean(train.map((i) => Y[i]));
    const z = mean(train.map((i) => ((x[i] - mx) / sd) * (Y[i] - my)));
    const b = (Math.sign(z) * Math.max(Math.abs(z) - lambda, 0)) / sd;
    const b0 = my - b * mx;
    return mean(test.map((i) => (Y[i] - b0 - b * x[i]) ** 2));
  }

  const cv = crossValidate(table, spec, fitPath(table, spec));

  it('matches the closed form with training-row means', () => {
    LAMBDA.forEach((lambda, l) => {
      expectClose(`CV mse at lambda ${lambda}`, cv.mean[l], mean([1, 2, 3].map((f) => foldMse(f, lambda, 'training'))), 1e-8);
    });
  });

  it('would differ if the fill-in came from all rows (the check can fail)', () => {
    const leaky = mean([1, 2, 3].map((f) => foldMse(f, LAMBDA[2], 'all')));
    expect(Math.abs(leaky - cv.mean[2]) / cv.mean[2], `leaky ${leaky} vs CV ${cv.mean[2]}`).toBeGreaterThan(0.01);
  });
});
