/**
 * lambda_max (docs/engine.md: "the smallest lambda at which every penalized coefficient is exactly zero", common
 * practice): at lambda_max every penalized coefficient is 0; just below it at least one is not.
 * Also the closed form for the gaussian lasso without penalty weights: max_j |x~_j'(y - mean y)|/n
 * on standardized columns (Friedman, Hastie & Tibshirani 2010, "Regularization paths for generalized
 * linear models via coordinate descent", J. Stat. Softw. 33, section 2.5).
 */
import { describe, expect, it } from 'vitest';
import { computeLambdaMax, fitPathOnDesign } from '../../../server/engine/index';
import type { PathOptions } from '../../../server/engine/types';
import { linearResponse, logisticResponse, randomDesign } from './data';
import { expectClose } from '../../support/numbers';

const design = randomDesign(70, 12, 31);
const gaussianY = linearResponse(design, [1, 0.5, -0.5, 0, 0.2], 1, 32);
const binomialY = logisticResponse(design, [1, 0.5, -0.5, 0, 0.2], 33);
const factors = [0, 1, 1, 2, 1, 1, 0.5, 1, 1, 1, 1, 1];

const variants: { name: string; options: PathOptions; y: Float64Array; penalized: (j: number) => boolean }[] = [
  { name: 'gaussian lasso', options: { family: 'gaussian', penalty: 'lasso', standardize: true }, y: gaussianY, penalized: () => true },
  { name: 'gaussian elastic net 0.3', options: { family: 'gaussian', penalty: 'elastic-net', l1Share: 0.3, standardize: false }, y: gaussianY, penalized: () => true },
  {
    name: 'gaussian lasso with penalty weights (x1 unpenalized)',
    options: { family: 'gaussian', penalty: 'lasso', standardize: true, penaltyWeights: factors },
    y: gaussianY,
    penalized: (j) => factors[j] > 0,
  },
  { name: 'binomial lasso', options: { family: 'binomial', penalty: 'lasso', standardize: true }, y: binomialY, penalized: () => true },
  {
    name: 'binomial lasso with penalty weights (x1 unpenalized)',
    options: { family: 'binomial', penalty: 'lasso', standardize: true, penaltyWeights: factors },
    y: binomialY,
    penalized: (j) => factors[j] > 0,
  },
  {
    name: 'binomial group lasso',
    options: { family: 'binomial', penalty: 'group-lasso', standardize: true, groupOfTerm: [0, 0, 0, 1, 1, 1, 2, 2, 2, 3, 3, 3] },
    y: binomialY,
    penalized: () => true,
  },
];

describe('lambda_max', () => {
  for (const v of variants) {
    it(`${v.name}: all penalized coefficients zero at lambda_max, some non-zero just below`, () => {
      const lambdaMax = computeLambdaMax(design, v.y, v.options);
      const result = fitPathOnDesign(design, v.y, { ...v.options, lambda: [lambdaMax, lambdaMax * 0.99], tolerance: 1e-12 });
      expect(result.lambdaMax).toBe(lambdaMax);
      const atMax = [...result.coefficients[0]].filter((b, j) => v.penalized(j) && b !== 0);
      expect(atMax, `non-zero penalized coefficients at lambda_max ${lambdaMax}`).toEqual([]);
      const below = [...result.coefficients[1]].filter((b, j) => v.penalized(j) && b !== 0);
      expect(below.length, `non-zero penalized coefficients at 0.99 lambda_max`).toBeGreaterThan(0);
    });
  }

  it('gaussian lasso: equals max_j |x~_j\'(y - mean y)| / n on standardized columns', () => {
    const { n, p, x } = design;
    const yMean = gaussianY.reduce((a, b) => a + b, 0) / n;
    let expected = 0;
    for (let j = 0; j < p; j++) {
      let m = 0;
      for (let i = 0; i < n; i++) m += x[j * n + i] / n;
      let v = 0;
      let dot = 0;
      for (let i = 0; i < n; i++) {
        v += (x[j * n + i] - m) ** 2 / n;
        dot += (x[j * n + i] - m) * (gaussianY[i] - yMean);
      }
      expected = Math.max(expected, Math.abs(dot / n / Math.sqrt(v)));
    }
    const got = computeLambdaMax(design, gaussianY, { family: 'gaussian', penalty: 'lasso', standardize: true });
    expectClose('lambda_max', got, expected, 1e-12);
  });
});
