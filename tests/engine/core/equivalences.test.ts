/**
 * Facts of the method (common practice): groups of size one make the group
 * lasso the lasso; l1Share = 1 makes the elastic net the lasso; a penalty weight of 0 leaves a column
 * unpenalized (in the model at every lambda, and its coefficient is the least-squares one given the
 * others); lambda = 0 is the unpenalized least-squares fit.
 */
import { describe, expect, it } from 'vitest';
import { fitPathOnDesign } from '../../../server/engine/index';
import type { PathResult } from '../../../server/engine/types';
import { linearResponse, logisticResponse, randomDesign } from './data';
import { expectClose } from '../../support/numbers';

const design = randomDesign(90, 15, 41);
const truth = [1.2, -0.6, 0.4, 0, 0, 0.3];
const y = linearResponse(design, truth, 1, 42);
const yBin = logisticResponse(design, truth, 43);

function expectSamePath(a: PathResult, b: PathResult, tol: number, label: string): void {
  expect(a.lambda).toEqual(b.lambda);
  a.lambda.forEach((lambda, k) => {
    expectClose(`${label} intercept at lambda ${lambda}`, a.intercept[k], b.intercept[k], tol);
    for (let j = 0; j < a.coefficients[k].length; j++) {
      expectClose(`${label} coefficient ${j} at lambda ${lambda}`, a.coefficients[k][j], b.coefficients[k][j], tol);
    }
  });
}

describe('equivalences', () => {
  for (const [family, response] of [['gaussian', y], ['binomial', yBin]] as const) {
    it(`${family}: group lasso with groups of size one = lasso`, () => {
      const lasso = fitPathOnDesign(design, response, { family, penalty: 'lasso', standardize: true, pathLength: 20, tolerance: 1e-12 });
      const groups = fitPathOnDesign(design, response, {
        family,
        penalty: 'group-lasso',
        groupOfTerm: Array.from({ length: design.p }, (_, j) => j),
        standardize: true,
        lambda: lasso.lambda,
        tolerance: 1e-12,
      });
      expectSamePath(groups, lasso, 1e-5, 'groups of one vs lasso');
    });

    it(`${family}: elastic net with l1Share = 1 = lasso`, () => {
      const lasso = fitPathOnDesign(design, response, { family, penalty: 'lasso', standardize: true, pathLength: 20, tolerance: 1e-12 });
      const net = fitPathOnDesign(design, response, { family, penalty: 'elastic-net', l1Share: 1, standardize: true, pathLength: 20, tolerance: 1e-12 });
      expectSamePath(net, lasso, 1e-5, 'elastic net l1Share 1 vs lasso');
    });
  }

  it('penalty weight 0 keeps a column in the model at every lambda', () => {
    const factors = Array.from({ length: design.p }, (_, j) => (j === 4 ? 0 : 1));
    const result = fitPathOnDesign(design, y, { family: 'gaussian', penalty: 'lasso', standardize: true, penaltyWeights: factors, pathLength: 20, tolerance: 1e-12 });
    result.coefficients.forEach((coef, k) => expect(coef[4], `x5 at lambda ${result.lambda[k]}`).not.toBe(0));
    // At lambda_max only x5 is in: its coefficient is the simple regression slope cov(x5, y)/var(x5).
    const { n, x } = design;
    const col = x.subarray(4 * n, 5 * n);
    const mx = col.reduce((a, b) => a + b, 0) / n;
    const my = y.reduce((a, b) => a + b, 0) / n;
    let sxy = 0;
    let sxx = 0;
    for (let i = 0; i < n; i++) {
      sxy += (col[i] - mx) * (y[i] - my);
      sxx += (col[i] - mx) ** 2;
    }
    expectClose('unpenalized x5 at lambda_max', result.coefficients[0][4], sxy / sxx, 1e-8);
    expect([...result.coefficients[0]].filter((b, j) => j !== 4 && b !== 0)).toEqual([]);
  });

  it('lambda = 0 gives the least-squares fit (normal equations solved in the test)', () => {
    const small = randomDesign(40, 4, 44);
    const ys = linearResponse(small, [1, -2, 0.5, 0], 0.3, 45);
    const result = fitPathOnDesign(small, ys, { family: 'gaussian', penalty: 'lasso', standardize: true, lambda: [0.1, 0], tolerance: 1e-13, maxIterations: 100000 });
    expect(result.solves[1].status).toBe('converged');
    // Least squares with an intercept: Gaussian elimination on [1 X]'[1 X] b = [1 X]'y.
    const { n, p, x } = small;
    const m = p + 1;
    const col = (a: number, i: number) => (a === 0 ? 1 : x[(a - 1) * n + i]);
    const A = Array.from({ length: m }, (_, a) => Array.from({ length: m + 1 }, (_, b) => {
      let s = 0;
      for (let i = 0; i < n; i++) s += col(a, i) * (b === m ? ys[i] : col(b, i));
      return s;
    }));
    for (let c = 0; c < m; c++) {
      for (let r = c + 1; r < m; r++) {
        const f = A[r][c] / A[c][c];
        for (let b = c; b <= m; b++) A[r][b] -= f * A[c][b];
      }
    }
    const beta = new Array<number>(m).fill(0);
    for (let r = m - 1; r >= 0; r--) {
      let s = A[r][m];
      for (let b = r + 1; b < m; b++) s -= A[r][b] * beta[b];
      beta[r] = s / A[r][r];
    }
    expectClose('least-squares intercept', result.intercept[1], beta[0], 1e-5);
    for (let j = 0; j < p; j++) expectClose(`least-squares coefficient ${j}`, result.coefficients[1][j], beta[j + 1], 1e-5);
  });
});
